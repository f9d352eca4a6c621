import { Run, ReviewEvent, Site } from '../db/models/index.ts'
import { AppError } from '../errors.ts'
import { findStudy, listOptions, recommendedRun } from './studies.ts'
import { userNames } from './people.ts'
import { basisInForce } from './cost-bases.ts'
import { siteLibrary } from './runs.ts'
import { caseFromRequest } from './engine-gateway.ts'
import { listEntries } from './operating.ts'
import { VESSEL_CAUTION } from '../engine/vessel/shell.ts'
import type { CaseSI } from '../engine/case.ts'
import type { DesignResult } from '../../shared/schemas/results.ts'
import type { CostBreakdown } from '../engine/costing/index.ts'
import type { CostBasisData } from '../../shared/schemas/costBasis.ts'
import type { OptimiseResult, CurvePoint } from '../engine/optimisation/index.ts'
import type { ReportModel, RunMeta, Row, RowGroup, CostRow, CurveSeries, ReviewRow, OperatingPart, ReportSection } from './reports/model.ts'
import { DisplayUnits, plain, type UnitSystem } from './reports/units.ts'
import { inputGroups, summaryGroups, dataSheetGroups, checkRows, costRows } from './reports/rows.ts'
import { renderPdf } from './reports/pdf.ts'
import { studyConfidence } from './reports/confidence.ts'
import { renderXlsx } from './reports/xlsx.ts'
import { quantityText } from '../../shared/quantityText.ts'

export type { ReportModel, RunMeta, Row, RowGroup, CostRow, CurveSeries, ReviewRow, OperatingPart, ReportSection }
export { fmt, money } from './reports/format.ts'

/**
 * Study reports: one data model gathered from the database (study, newest design and optimise
 * runs, options, operating log of an approved study, sign-off history), in the reader's unit
 * system with the screens' labels, rendered as a printable PDF or a workbook.
 */

/** Always printed: the vessel numbers are for costing, not for construction (the engine's one caution text). */
export { VESSEL_CAUTION }

/** Printed with every report: the results are preliminary and what governs is local code. */
export const REPORT_CAUTION =
  'Study estimate: the sizes, pressures and costs in this report are preliminary. Pressure equipment, relief, area classification and the handling of flammable, toxic or asphyxiant gases are governed by the local codes and regulations and must be designed and signed by licensed engineers.'

type PricedDesign = DesignResult & { totalAnnualCost?: number; costBreakdown?: CostBreakdown }

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
    xLabel: key === 'recovery' ? 'Recovery' : 'Solvent factor L / Lmin',
    xUnit: key === 'recovery' ? '%' : '×',
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

/** The case a run used, normalised (defaults and library values filled); null when its inputs do not form a case. */
function caseOf(inputs: unknown, library: Awaited<ReturnType<typeof siteLibrary>>): CaseSI | null {
  try {
    return caseFromRequest(inputs, library, 'inputs')
  } catch (e) {
    if (e instanceof AppError) return null
    throw e
  }
}

/** The operating log of an approved study: each month rated and priced, its cost gap split into causes. */
async function operatingPart(siteId: number, studyId: number, u: DisplayUnits): Promise<OperatingPart | null> {
  let log: Awaited<ReturnType<typeof listEntries>>
  try {
    log = await listEntries(siteId, studyId)
  } catch (e) {
    if (!(e instanceof AppError)) throw e
    return { designRunId: 0, costBasisVersion: null, flowUnit: u.unit('molarFlow'), months: [], drift: null, issue: e.message, toDate: { actual: 0, reference: 0, gap: 0 } }
  }
  if (!log.design || !log.months.length) return null
  const mon = log.monitoring
  const f = (kmolh: number) => u.fromSI('molarFlow', kmolh / 3.6)
  const months = log.months.map((m, i) => {
    const r = mon?.months[i]
    const g = r?.costGap ?? null
    return {
      month: m.month,
      gasFlow: f(log.entries[i]!.gasFlow),
      solventFlow: f(log.entries[i]!.solventFlow),
      solventNeeded: r?.solventNeeded == null ? null : f(r.solventNeeded),
      expectedRecovery: r ? r.expectedRecovery * 100 : NaN,
      measuredRecovery: m.recovery === null ? null : m.recovery * 100,
      achievedEfficiency: r?.achievedEfficiency == null ? null : r.achievedEfficiency * 100,
      designEfficiency: r ? r.designEfficiency * 100 : NaN,
      percentFlood: r ? r.percentFlood : m.percentFloodEstimate,
      insideWindow: r ? r.insideWindow : true,
      outside: r ? r.violated.map((v) => (v === 'downcomerBackup' ? 'downcomer backup' : v)) : [],
      reference: g ? g.reference : null,
      actual: m.actual.total,
      gap: g ? g.gap : null,
      prices: g ? g.prices : null,
      throughput: g ? g.throughput : null,
      excessSolvent: g ? g.excessSolvent : null,
      efficiencyLoss: g ? g.efficiencyLoss : null,
      other: g ? g.other : null,
    }
  })
  const sum = (k: 'actual' | 'reference' | 'gap') => months.reduce((a, m) => a + (m[k] ?? 0), 0)
  return {
    designRunId: log.design.runId,
    costBasisVersion: log.design.costBasisVersion,
    flowUnit: u.unit('molarFlow'),
    months: months.map((m) => ({ ...m, expectedRecovery: Number.isFinite(m.expectedRecovery) ? m.expectedRecovery : 0, designEfficiency: Number.isFinite(m.designEfficiency) ? m.designEfficiency : 0 })),
    drift: mon?.drift.message ?? null,
    issue: log.monitoringIssue,
    toDate: { actual: sum('actual'), reference: sum('reference'), gap: sum('gap') },
  }
}

/**
 * Sections other features add to the report (e.g. the confidence of the result): each is a
 * titled table with notes, printed after the operating log and given its own sheet in the
 * workbook. Add a feature's section here; return nothing when it does not apply to the study.
 */
/** The value of a search variable on its bound, as the reader sees it: a percentage, a factor or a spacing in their units. */
function boundValueText(variable: string, value: number, u: DisplayUnits): string {
  if (variable === 'recovery' || variable === 'floodFraction') return `${Number((100 * value).toPrecision(4))} %`
  if (variable === 'traySpacing') return `${Number(u.fromSI('smallLength', value).toPrecision(4))} ${u.unit('smallLength')}`
  return String(Number(value.toPrecision(4)))
}

async function featureSections(ctx: { siteId: number; studyId: number; units: DisplayUnits; design: DesignResult | null; optimisation: OptimiseResult | null }): Promise<ReportSection[]> {
  const out: ReportSection[] = []
  const o = ctx.optimisation
  if (o && (o.sensitivity?.length || o.boundHits?.length)) {
    const names: Record<string, string> = { recovery: 'Recovery', solventFactor: 'Solvent factor L/Lmin', floodFraction: 'Fraction of flood', traySpacing: 'Tray spacing' }
    out.push({
      key: 'sensitivity',
      title: 'Sensitivity of the optimum',
      notes: [
        'Each price or setting moved down and up from its base value and the design optimised again at that value; the values actually used are listed (a value may be rounded or capped, e.g. operating hours at 8,760 h/yr).',
        ...(o.boundHits ?? []).map((h) => `The optimum sits on the ${h.bound} bound of ${names[h.variable] ?? h.variable} (${boundValueText(h.variable, h.value, ctx.units)}): ${quantityText(h.advice, ctx.units.system)}`),
        ...(o.sensitivity ?? []).flatMap((e) => [e.lowLimited ? `${e.label}, low: ${e.lowNote}` : '', e.highLimited ? `${e.label}, high: ${e.highNote}` : ''].filter(Boolean)),
      ],
      columns: [
        { title: 'Item' }, { title: 'Unit' }, { title: 'Base value' },
        { title: 'Low value used' }, { title: 'Low change', unit: '%' }, { title: 'TAC at low' },
        { title: 'High value used' }, { title: 'High change', unit: '%' }, { title: 'TAC at high' },
      ],
      rows: (o.sensitivity ?? []).map((e) => [e.label, e.unit, e.baseValue, e.lowValue, 100 * e.lowChange, e.low.tac, e.highValue, 100 * e.highChange, e.high.tac]),
    })
  }
  return out
}

/**
 * Gather the report.
 * @param reader the person asking: their name is printed and their unit system used
 */
export async function buildReport(siteId: number, studyId: number, reader: { name: string; unitSystem?: UnitSystem }): Promise<ReportModel> {
  const u = new DisplayUnits(reader.unitSystem ?? 'SI')
  const s = await findStudy(siteId, studyId)
  const site = await Site.findByPk(siteId, { attributes: ['id', 'name'] })
  const [designRun, optRun] = await Promise.all([
    Run.findOne({ where: { studyId, kind: 'design' }, order: [['id', 'DESC']] }),
    Run.findOne({ where: { studyId, kind: 'optimize' }, order: [['id', 'DESC']] }),
  ])
  const events = await ReviewEvent.findAll({ where: { studyId }, order: [['id', 'ASC']] })
  const recommended = await recommendedRun(s)
  const who = await userNames([designRun?.createdBy ?? null, optRun?.createdBy ?? null, recommended?.createdBy ?? null, ...events.map((e) => e.userId)])
  const opt = optRun ? (optRun.result as OptimiseResult) : null
  const library = await siteLibrary(siteId)
  const options = await listOptions(studyId)

  let design: ReportModel['design'] = null
  let designResult: DesignResult | null = null
  let designInputs: unknown = s.inputs
  let breakdown: CostBreakdown | null = null
  let cautions: string[] = []
  // The design the report describes: the recommended option's once there is one (what was submitted
  // or approved), else the newest design run, else the optimum of the newest optimisation.
  const source = recommended ?? designRun ?? optRun
  if (source?.kind === 'design') {
    const r = source.result as PricedDesign
    designResult = r
    breakdown = r.costBreakdown ?? null
  } else if (source?.kind === 'optimize') {
    const o = source.result as OptimiseResult
    designResult = o.optimum.design
    breakdown = o.optimum.breakdown
  }
  if (source && designResult) {
    designInputs = source.inputs
    const what = source.kind === 'design' ? `design run #${source.id}` : `the optimum of optimisation run #${source.id}`
    const recommendedName = recommended ? options.find((o) => o.id === s.recommendedOptionId)?.name : undefined
    design = {
      run: meta(source, who), source: recommendedName ? `the recommended option "${recommendedName}" (${what})` : what,
      groups: summaryGroups(designResult, u), raw: designResult.summary, checks: checkRows(designResult.checks, u), warnings: designResult.warnings.map((w) => quantityText(w.message, u.system)),
    }
    cautions = designResult.cautions
  }
  if (opt) cautions = [...cautions, ...opt.cautions]

  const studyCase = caseOf(s.inputs, library)
  const designCase = designResult ? caseOf(designInputs, library) : null
  if (studyCase) cautions = [...cautions, ...studyCase.cautions]

  const optionRows = options.map((o) => ({
    ...o,
    tac: o.summary?.totalAnnualCost ?? null,
    diameter: typeof o.summary?.selectedDiameter === 'number' ? u.fromSI('length', o.summary.selectedDiameter) : null,
  }))

  const currentInputs = JSON.stringify(s.inputs)
  const inputsNote = source && JSON.stringify(source.inputs) !== currentInputs
    ? `The study's inputs changed after run #${source.id}; the design below is for the inputs of that run.`
    : studyCase ? null : "The study's inputs do not yet form a complete case; the form shows what is missing."

  const currency = breakdown?.currency ?? opt?.optimum.breakdown.currency ?? ''
  const inForce = await basisInForce(siteId)
  const o = opt?.optimum
  const optRows: Row[] = o
    ? [
        plain('recovery', 'Recovery of the solute', o.recovery * 100, '%'),
        plain('solventFactor', 'Solvent factor L / Lmin', o.solventFactor, '×', 3),
        u.row('traySpacing', 'Tray spacing', 'length', o.traySpacing, 3),
        plain('floodFraction', 'Design approach to flood', o.floodFraction * 100, '%', 3),
        plain('actualTrays', 'Actual trays', o.actualTrays, ''),
        u.row('selectedDiameter', 'Diameter, selected', 'length', o.selectedDiameter, 3),
      ]
    : []
  return {
    generatedAt: new Date(),
    generatedBy: reader.name,
    unitSystem: u.system,
    costBasisInForce: inForce ? { version: inForce.version, effectiveDate: inForce.effectiveDate } : null,
    site: { id: siteId, name: site?.name ?? `Site ${siteId}` },
    study: {
      id: s.id, name: s.name, description: s.description, status: s.status, revision: s.revision,
      ownerName: (s as typeof s & { owner?: { name: string } }).owner?.name ?? '', updatedAt: s.updatedAt,
    },
    dataSheet: designResult && designCase ? dataSheetGroups(designCase, designResult, u) : [],
    inputs: studyCase ? inputGroups(studyCase, s.inputs, u) : [],
    inputsNote,
    design,
    profile: designResult
      ? {
          methodNote: designResult.profile.methodNote ?? '',
          theoreticalStages: designResult.profile.theoreticalStages ?? designResult.summary.theoreticalStages,
          lastStageFraction: designResult.profile.lastStageFraction ?? 1,
          stages: designResult.profile.stages.map((p) => ({ stage: p.stage, x: p.x, y: p.y })),
          equilibrium: designResult.profile.equilibriumCurve.map((p) => ({ x: p.x, y: p.y })),
          operating: designResult.profile.operatingLine.map((p) => ({ x: p.x, y: p.y })),
        }
      : null,
    costs: breakdown
      ? {
          currency: breakdown.currency, costIndex: breakdown.costIndex, rows: costRows(breakdown, u), annualisedCapital: breakdown.annualisedCapital,
          operatingCost: breakdown.operatingCost, totalAnnualCost: breakdown.totalAnnualCost, costPerKgRecovered: breakdown.costPerKgRecovered,
          soluteRecoveredPerYear: breakdown.soluteRecoveredPerYear, capitalRecoveryFactor: breakdown.capitalRecoveryFactor, installedCapital: breakdown.installedCapital,
        }
      : null,
    optimise: optRun && o ? { run: meta(optRun, who), rows: optRows, totalAnnualCost: o.totalAnnualCost, evaluations: opt.evaluations } : null,
    curves: opt && o
      ? [
          series('recovery', opt.curves.recovery, o.recovery, o.totalAnnualCost),
          series('solventFactor', opt.curves.solventFactor, o.solventFactor, o.totalAnnualCost),
        ]
      : [],
    currency,
    options: optionRows,
    recommendedOptionId: s.recommendedOptionId,
    operating: s.status === 'approved' ? await operatingPart(siteId, studyId, u) : null,
    sections: await featureSections({ siteId, studyId, units: u, design: designResult, optimisation: opt }),
    review: events.map((e) => ({ kind: e.kind, who: who.get(e.userId) ?? `user ${e.userId}`, at: e.createdAt, body: e.body })),
    // The report's own vessel caution stands for the engine's wordings of the same warning.
    cautions: [VESSEL_CAUTION, ...new Set(cautions.filter((c) => c !== VESSEL_CAUTION)), REPORT_CAUTION],
    confidence: design ? await studyConfidence(siteId, designRun ? designRun.inputs : s.inputs, inForce?.data as CostBasisData | undefined, u) : null,
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

export async function studyReportPdf(siteId: number, studyId: number, reader: { name: string; unitSystem: UnitSystem }): Promise<{ fileName: string; body: Buffer }> {
  const m = await buildReport(siteId, studyId, reader)
  return { fileName: reportFileName(m, 'pdf'), body: await renderPdf(m) }
}

export async function studyReportXlsx(siteId: number, studyId: number, reader: { name: string; unitSystem: UnitSystem }): Promise<{ fileName: string; body: Buffer }> {
  const m = await buildReport(siteId, studyId, reader)
  return { fileName: reportFileName(m, 'xlsx'), body: await renderXlsx(m) }
}
