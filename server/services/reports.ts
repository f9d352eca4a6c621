import { Run, ReviewEvent, Site } from '../db/models/index.ts'
import { findStudy, listOptions } from './studies.ts'
import { userNames } from './people.ts'
import { basisInForce } from './cost-bases.ts'
import { QUANTITY_KINDS } from '../../shared/units.ts'
import { VESSEL_CAUTION } from '../engine/vessel/shell.ts'
import type { DesignResult, DesignSummary } from '../../shared/schemas/results.ts'
import type { CostBreakdown } from '../engine/costing/index.ts'
import type { OptimiseResult, CurvePoint } from '../engine/optimisation/index.ts'
import type { ReportModel, RunMeta, ValueRow, CostRow, CurveSeries, ReviewRow } from './reports/model.ts'
import { fmt } from './reports/format.ts'
import { renderPdf } from './reports/pdf.ts'
import { renderXlsx } from './reports/xlsx.ts'

export type { ReportModel, RunMeta, ValueRow, CostRow, CurveSeries, ReviewRow }
export { fmt, money } from './reports/format.ts'

/**
 * Study reports: one data model gathered from the database (study, newest design and optimise
 * runs, options, sign-off history) and rendered as a printable PDF or a spreadsheet.
 */

/** Always printed: the vessel numbers are for costing, not for construction (the engine's one caution text). */
export { VESSEL_CAUTION }

type PricedDesign = DesignResult & { totalAnnualCost?: number; costBreakdown?: CostBreakdown }

const U = QUANTITY_KINDS
/** Units of bare numbers in a case, by field path (the case units). */
const CASE_UNITS: Record<string, string> = {
  'gas.flow': U.molarFlow.caseUnit,
  'gas.temperature': U.temperature.caseUnit,
  'gas.pressure': U.pressure.caseUnit,
  'gas.soluteMoleFraction': 'mol/mol',
  'gas.carrierMolarMass': U.molarMass.caseUnit,
  'gas.viscosity': U.gasViscosity.caseUnit,
  'solute.molarMass': U.molarMass.caseUnit,
  'solvent.temperature': U.temperature.caseUnit,
  'solvent.soluteMoleFraction': 'mol/mol',
  'solvent.molarMass': U.molarMass.caseUnit,
  'solvent.density': U.density.caseUnit,
  'solvent.viscosity': U.viscosity.caseUnit,
  'solvent.surfaceTension': U.surfaceTension.caseUnit,
  'equilibrium.K': '-',
  'equilibrium.Hcp': U.henrySolubility.caseUnit,
  'equilibrium.B': U.inverseTemperatureSlope.caseUnit,
  'equilibrium.gammaInf': '-',
  'equilibrium.vapourPressure': U.pressure.caseUnit,
  recovery: '-',
  solventFactor: 'L/Lmin',
  'tray.holeDiameter': U.smallLength.caseUnit,
  'tray.holePitch': U.smallLength.caseUnit,
  'tray.thickness': U.smallLength.caseUnit,
  'tray.spacing': U.length.caseUnit,
  'tray.floodFraction': '-',
  'tray.foamingFactor': '-',
  'tray.weirHeight': U.smallLength.caseUnit,
  'tray.downcomerClearance': U.smallLength.caseUnit,
  'efficiency.value': '-',
  'column.temperature': U.temperature.caseUnit,
  'column.diameterStep': U.length.caseUnit,
  'column.topAllowance': U.length.caseUnit,
  'column.bottomAllowance': U.length.caseUnit,
  'vessel.designPressure': `${U.pressureGauge.caseUnit} (gauge)`,
  'vessel.allowableStress': U.stress.caseUnit,
  'vessel.jointEfficiency': '-',
  'vessel.corrosionAllowance': U.smallLength.caseUnit,
  'vessel.materialDensity': U.density.caseUnit,
}

/** Flatten a case into (path, value, unit) rows for display. */
export function inputRows(inputs: unknown): ValueRow[] {
  const out: ValueRow[] = []
  const walk = (v: unknown, path: string) => {
    if (v === null || v === undefined) return
    if (typeof v === 'number' || typeof v === 'string' || typeof v === 'boolean') {
      out.push({ key: path, label: path, value: typeof v === 'boolean' ? String(v) : v, unit: typeof v === 'number' ? (CASE_UNITS[path] ?? '-') : '' })
      return
    }
    if (Array.isArray(v)) {
      if (path === 'equilibrium.points') {
        out.push({ key: path, label: path, value: `${v.length} x-y points (table)`, unit: 'mol/mol' })
        return
      }
      v.forEach((item, i) => walk(item, `${path}.${i}`))
      return
    }
    if (typeof v === 'object') {
      const o = v as Record<string, unknown>
      if (typeof o.value === 'number' && typeof o.unit === 'string' && Object.keys(o).length === 2) {
        out.push({ key: path, label: path, value: o.value, unit: o.unit })
        return
      }
      for (const [k, child] of Object.entries(o)) walk(child, path ? `${path}.${k}` : k)
    }
  }
  walk(inputs, '')
  return out
}

/** Design summary rows: key, label, value in the display unit, unit. */
const SUMMARY_ROWS: { key: keyof DesignSummary & string; label: string; unit: string; scale?: number }[] = [
  { key: 'recovery', label: 'Recovery (target)', unit: '%', scale: 100 },
  { key: 'achievedRecovery', label: 'Recovery reached with the trays', unit: '%', scale: 100 },
  { key: 'theoreticalStages', label: 'Theoretical stages', unit: '-' },
  { key: 'overallEfficiency', label: 'Overall tray efficiency', unit: '%', scale: 100 },
  { key: 'actualTrays', label: 'Actual trays', unit: '-' },
  { key: 'selectedDiameter', label: 'Column diameter (selected)', unit: 'm' },
  { key: 'diameter', label: 'Column diameter (calculated)', unit: 'm' },
  { key: 'traySpacing', label: 'Tray spacing', unit: 'm' },
  { key: 'columnHeight', label: 'Column height (tangent to tangent)', unit: 'm' },
  { key: 'percentFlood', label: 'Percent of flood', unit: '%' },
  { key: 'floodFraction', label: 'Design fraction of flood', unit: '-' },
  { key: 'pressureDropPerTray', label: 'Pressure drop per tray', unit: 'Pa' },
  { key: 'columnPressureDrop', label: 'Column pressure drop', unit: 'Pa' },
  { key: 'minimumSolventFlow', label: 'Minimum solvent flow', unit: 'kmol/h' },
  { key: 'solventFlow', label: 'Solvent flow', unit: 'kmol/h' },
  { key: 'solventFactor', label: 'Solvent factor L/Lmin', unit: '-' },
  { key: 'absorptionFactor', label: 'Absorption factor', unit: '-' },
  { key: 'solventMassFlow', label: 'Solvent mass flow', unit: 'kg/h' },
  { key: 'solventVolumetricFlow', label: 'Solvent volumetric flow', unit: 'm³/h' },
  { key: 'gasFlow', label: 'Gas flow (inlet)', unit: 'kmol/h' },
  { key: 'gasVolumetricFlow', label: 'Gas volumetric flow (inlet)', unit: 'm³/s' },
  { key: 'gasDensity', label: 'Gas density', unit: 'kg/m³' },
  { key: 'outletGasSoluteMoleFraction', label: 'Solute in cleaned gas', unit: 'mol/mol' },
  { key: 'richSolventSoluteMoleFraction', label: 'Solute in rich solvent', unit: 'mol/mol' },
  { key: 'soluteInGas', label: 'Solute in feed gas', unit: 'kg/h' },
  { key: 'soluteAbsorbed', label: 'Solute recovered', unit: 'kg/h' },
  { key: 'soluteLost', label: 'Solute lost with the gas', unit: 'kg/h' },
  { key: 'flowParameter', label: 'Flow parameter', unit: '-' },
  { key: 'capacityFactor', label: 'Capacity factor', unit: 'm/s' },
  { key: 'floodingVelocity', label: 'Flooding velocity', unit: 'm/s' },
  { key: 'downcomerAreaFraction', label: 'Downcomer area fraction', unit: '-' },
  { key: 'holeAreaFraction', label: 'Hole area / active area', unit: '-' },
  { key: 'operatingPressure', label: 'Operating pressure', unit: 'kPa', scale: 1e-3 },
  { key: 'designPressure', label: 'Design pressure (gauge)', unit: 'kPa', scale: 1e-3 },
  { key: 'shellThickness', label: 'Shell thickness (preliminary)', unit: 'mm', scale: 1e3 },
  { key: 'shellMass', label: 'Shell and heads mass (preliminary)', unit: 'kg' },
]

export function summaryRows(s: DesignSummary): ValueRow[] {
  const out: ValueRow[] = []
  for (const r of SUMMARY_ROWS) {
    const v = s[r.key]
    if (typeof v === 'number' && Number.isFinite(v)) out.push({ key: r.key, label: r.label, value: v * (r.scale ?? 1), unit: r.unit })
  }
  return out
}

function costRows(b: CostBreakdown): CostRow[] {
  const rows: CostRow[] = b.capital.map((c) => ({
    key: c.key, label: c.label, kind: 'capital' as const, size: `${fmt(c.size, 4)} ${c.sizeUnit}`, purchased: c.purchased, installed: c.installed, annual: c.annual,
  }))
  for (const o of b.operating) rows.push({ key: o.key, label: o.label, kind: 'operating', size: `${fmt(o.quantity, 4)} ${o.quantityUnit}`, purchased: null, installed: null, annual: o.annual })
  return rows
}

const CAPITAL_KEYS = new Set(['shell', 'platforms', 'trays', 'pump', 'motor', 'blower'])

function series(key: 'recovery' | 'solventFactor', pts: CurvePoint[], optimumX: number, optimumTac: number): CurveSeries {
  const scale = key === 'recovery' ? 100 : 1
  const points = pts
    .filter((p): p is CurvePoint & { tac: number } => p.feasible && typeof p.tac === 'number')
    .map((p) => {
      let capital = 0
      let operating = 0
      for (const [k, v] of Object.entries(p.breakdown ?? {})) {
        if (CAPITAL_KEYS.has(k)) capital += v
        else operating += v
      }
      return { x: p.x * scale, tac: p.tac, capital, operating, actualTrays: p.actualTrays }
    })
  return {
    key,
    title: key === 'recovery' ? 'Total annualised cost vs recovery' : 'Total annualised cost vs solvent factor',
    xLabel: key === 'recovery' ? 'Recovery' : 'Solvent factor L/Lmin',
    xUnit: key === 'recovery' ? '%' : '-',
    points,
    infeasible: pts.length - points.length,
    optimumX: optimumX * scale,
    optimumTac,
  }
}

function meta(r: Run, who: Map<number, string>): RunMeta {
  return {
    id: r.id, kind: r.kind, createdAt: r.createdAt, createdByName: r.createdBy ? (who.get(r.createdBy) ?? null) : null,
    costBasisVersion: r.costBasisVersion, engineVersion: r.engineVersion,
  }
}

export async function buildReport(siteId: number, studyId: number, generatedBy: string): Promise<ReportModel> {
  const s = await findStudy(siteId, studyId)
  const site = await Site.findByPk(siteId, { attributes: ['id', 'name'] })
  const [designRun, optRun] = await Promise.all([
    Run.findOne({ where: { studyId, kind: 'design' }, order: [['id', 'DESC']] }),
    Run.findOne({ where: { studyId, kind: 'optimize' }, order: [['id', 'DESC']] }),
  ])
  const events = await ReviewEvent.findAll({ where: { studyId }, order: [['id', 'ASC']] })
  const who = await userNames([designRun?.createdBy ?? null, optRun?.createdBy ?? null, ...events.map((e) => e.userId)])
  const opt = optRun ? (optRun.result as OptimiseResult) : null

  let design: ReportModel['design'] = null
  let breakdown: CostBreakdown | null = null
  let cautions: string[] = []
  if (designRun) {
    const r = designRun.result as PricedDesign
    design = { run: meta(designRun, who), source: `design run #${designRun.id}`, summary: summaryRows(r.summary), raw: r.summary, checks: r.checks, warnings: r.warnings.map((w) => w.message) }
    breakdown = r.costBreakdown ?? null
    cautions = r.cautions
  } else if (optRun && opt) {
    const d = opt.optimum.design
    design = { run: meta(optRun, who), source: `the optimum of optimisation run #${optRun.id}`, summary: summaryRows(d.summary), raw: d.summary, checks: d.checks, warnings: d.warnings.map((w) => w.message) }
    breakdown = opt.optimum.breakdown
  }
  if (opt) cautions = [...cautions, ...opt.cautions]

  const options = await listOptions(studyId)
  const optionRows = options.map((o) => ({ ...o, tac: o.summary?.totalAnnualCost ?? null }))

  const currentInputs = JSON.stringify(s.inputs)
  const inputsNote = designRun && JSON.stringify(designRun.inputs) !== currentInputs
    ? `The study's inputs changed after design run #${designRun.id}; the design below is for the inputs of that run.`
    : null

  const currency = breakdown?.currency ?? opt?.optimum.breakdown.currency ?? ''
  const generatedAt = new Date()
  const inForce = await basisInForce(siteId)
  return {
    generatedAt,
    costBasisInForce: inForce ? { version: inForce.version, effectiveDate: inForce.effectiveDate } : null,
    generatedBy,
    site: { id: siteId, name: site?.name ?? `Site ${siteId}` },
    study: {
      id: s.id, name: s.name, description: s.description, status: s.status, revision: s.revision,
      ownerName: (s as typeof s & { owner?: { name: string } }).owner?.name ?? '', updatedAt: s.updatedAt,
    },
    inputs: inputRows(s.inputs),
    inputsNote,
    design,
    costs: breakdown
      ? {
          currency: breakdown.currency, costIndex: breakdown.costIndex, rows: costRows(breakdown), annualisedCapital: breakdown.annualisedCapital,
          operatingCost: breakdown.operatingCost, totalAnnualCost: breakdown.totalAnnualCost, costPerKgRecovered: breakdown.costPerKgRecovered,
          soluteRecoveredPerYear: breakdown.soluteRecoveredPerYear, capitalRecoveryFactor: breakdown.capitalRecoveryFactor, installedCapital: breakdown.installedCapital,
        }
      : null,
    optimise: optRun && opt
      ? {
          run: meta(optRun, who), recovery: opt.optimum.recovery, solventFactor: opt.optimum.solventFactor, traySpacing: opt.optimum.traySpacing,
          floodFraction: opt.optimum.floodFraction, actualTrays: opt.optimum.actualTrays, selectedDiameter: opt.optimum.selectedDiameter,
          totalAnnualCost: opt.optimum.totalAnnualCost, evaluations: opt.evaluations,
        }
      : null,
    curves: opt
      ? [
          series('recovery', opt.curves.recovery, opt.optimum.recovery, opt.optimum.totalAnnualCost),
          series('solventFactor', opt.curves.solventFactor, opt.optimum.solventFactor, opt.optimum.totalAnnualCost),
        ]
      : [],
    currency,
    options: optionRows,
    recommendedOptionId: s.recommendedOptionId,
    review: events.map((e) => ({ kind: e.kind, who: who.get(e.userId) ?? `user ${e.userId}`, at: e.createdAt, body: e.body })),
    // The report's own vessel caution stands for the engine's wordings of the same warning.
    cautions: [VESSEL_CAUTION, ...new Set(cautions.filter((c) => c !== VESSEL_CAUTION))],
  }
}

/** A file name that is safe in a Content-Disposition header and on every file system. */
export function reportFileName(m: ReportModel, ext: 'pdf' | 'xlsx'): string {
  const base = `${m.study.name}-rev${m.study.revision}`
    .normalize('NFKD')
    .replace(/[^\w.-]+/g, '-')
    .replace(/-+/g, '-')
    .replace(/^[-.]+|[-.]+$/g, '')
    .slice(0, 80)
  return `${base || `study-${m.study.id}`}.${ext}`
}

export async function studyReportPdf(siteId: number, studyId: number, generatedBy: string): Promise<{ fileName: string; body: Buffer }> {
  const m = await buildReport(siteId, studyId, generatedBy)
  return { fileName: reportFileName(m, 'pdf'), body: await renderPdf(m) }
}

export async function studyReportXlsx(siteId: number, studyId: number, generatedBy: string): Promise<{ fileName: string; body: Buffer }> {
  const m = await buildReport(siteId, studyId, generatedBy)
  return { fileName: reportFileName(m, 'xlsx'), body: await renderXlsx(m) }
}
