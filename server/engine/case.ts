/**
 * The case in SI (CaseSI) and its normalisation from a parsed case file.
 *
 * SI conventions inside the engine:
 *   molar flows mol/s; mass flows kg/s; temperatures K; pressures Pa (absolute unless
 *   the name says gauge); lengths m; densities kg/m3; viscosities Pa s; surface tension
 *   N/m; molar masses kg/mol; Henry H^cp mol/(m3 Pa); stresses Pa. Fractions are 0..1.
 *
 * normaliseCase resolves library names, applies defaults, converts units (once, here)
 * and checks signs and ranges, throwing InvalidInputError with the field path.
 */
import type { CaseInput } from '../../shared/schemas/case.ts'
import { InvalidInputError } from './errors.ts'
import type { EngineWarning } from './contract.ts'
import { densityWater, surfaceTensionWater, viscosityWater } from './properties/water.ts'
import { MMHG } from './properties/constants.ts'
import { validateTable } from './equilibrium/models.ts'
import { findComponent, type ComponentLibrary, type LibraryComponent } from './caseParts/library.ts'
import type { AntoineSI } from './properties/vapourPressure.ts'
import type { QuantityInput, QuantityKind } from '../../shared/units.ts'
import { DEFAULT_SPACING_RULE, type SpacingRuleRow } from './hydraulics/flooding.ts'
import { DEFAULT_MIN_THICKNESS } from './vessel/shell.ts'
import type { CaseSI, EquilibriumSI } from './caseParts/types.ts'
import { CASE_DEFAULTS } from './caseParts/defaults.ts'
import { HAZARD_CAUTIONS, cap } from './caseParts/hazards.ts'
import { Ctx, nonNeg } from './caseParts/checks.ts'

export { findComponent, mergeLibraries, type ComponentLibrary, type LibraryComponent, type LibraryValue } from './caseParts/library.ts'
export type { CaseSI, EquilibriumSI } from './caseParts/types.ts'
export { CASE_DEFAULTS } from './caseParts/defaults.ts'

/** An x–y table measured more than this far [K] from the column temperature is warned about (common practice, no source). */
export const TABLE_TEMPERATURE_TOLERANCE = 2

function needProp(path: string): never {
  throw new InvalidInputError(path, `missing: give the solvent ${path.split('.')[1]} or use "water" (which has property correlations)`)
}

/** A length of the case in SI, or its default when left out. */
function len(c: Ctx, v: QuantityInput | undefined, def: number, path: string, kind: QuantityKind = 'smallLength'): number {
  return v === undefined ? def : c.positive(c.q(kind, v, path), path)
}

/**
 * Resolve names, apply defaults, convert to SI and check the input.
 * @throws InvalidInputError (path + reason)
 */
export function normaliseCase(input: CaseInput, library: ComponentLibrary): CaseSI {
  const c = new Ctx()
  const cautions: string[] = []

  // ---- solute
  let soluteName: string | null = null
  let soluteLib: LibraryComponent | null = null
  let soluteM: number | null = null
  const sIn = input.solute
  const soluteObj = typeof sIn === 'string' ? { name: sIn } : sIn
  if (soluteObj.name !== undefined) {
    const f = findComponent(library, soluteObj.name)
    if (!f) throw new InvalidInputError(typeof sIn === 'string' ? 'solute' : 'solute.name', `unknown component "${soluteObj.name}" (not in the component library)`)
    soluteName = f[0]
    soluteLib = f[1]
  }
  if (soluteObj.molarMass !== undefined) soluteM = c.positive(c.q('molarMass', soluteObj.molarMass, 'solute.molarMass'), 'solute.molarMass')
  else if (soluteLib?.molarMass) soluteM = soluteLib.molarMass.value / 1000
  if (soluteM === null) throw new InvalidInputError('solute.molarMass', 'missing: give molarMass or a library component name')
  const soluteHazards = soluteLib?.hazards?.flags ?? []
  const soluteLabel = soluteName ?? 'The solute'
  for (const h of soluteHazards) {
    const f = HAZARD_CAUTIONS[h]
    if (f) cautions.push(f(cap(soluteLabel), 'solute'))
  }
  if (!soluteLib) cautions.push('The solute is not from the component library: check its hazards (flammability, toxicity) on its safety data sheet.')

  // ---- gas
  const g = input.gas
  const gasFlow = c.positive(c.q('molarFlow', g.flow, 'gas.flow'), 'gas.flow')
  const gasT = c.absTemp(c.q('temperature', g.temperature, 'gas.temperature'), 'gas.temperature')
  const P = c.positive(c.q('pressure', g.pressure, 'gas.pressure'), 'gas.pressure', 'absolute pressure must be positive')
  const y0 = c.range(g.soluteMoleFraction, 0, 1, 'gas.soluteMoleFraction', true, true)
  let carrierName: string | null = null
  let carrierLib: LibraryComponent | null = null
  if (g.carrier !== undefined) {
    const f = findComponent(library, g.carrier)
    if (!f) throw new InvalidInputError('gas.carrier', `unknown component "${g.carrier}" (not in the component library)`)
    carrierName = f[0]
    carrierLib = f[1]
  }
  let carrierM: number
  if (g.carrierMolarMass !== undefined) carrierM = c.positive(c.q('molarMass', g.carrierMolarMass, 'gas.carrierMolarMass'), 'gas.carrierMolarMass')
  else if (carrierLib?.molarMass) carrierM = carrierLib.molarMass.value / 1000
  else throw new InvalidInputError('gas.carrierMolarMass', 'missing: give carrierMolarMass or gas.carrier (a library component)')
  let gasMu: number | null = null
  if (g.viscosity !== undefined) gasMu = c.positive(c.q('gasViscosity', g.viscosity, 'gas.viscosity'), 'gas.viscosity')
  else if (carrierLib?.gasViscosity) gasMu = carrierLib.gasViscosity.value
  for (const h of carrierLib?.hazards?.flags ?? []) {
    const f = HAZARD_CAUTIONS[h]
    if (f) cautions.push(f(cap(carrierName ?? 'The carrier gas'), 'carrier'))
  }

  // ---- solvent
  const svIn = input.solvent
  const sv = typeof svIn === 'string' ? { name: svIn } : svIn
  let solventName: string | null = null
  let solventLib: LibraryComponent | null = null
  if (sv.name !== undefined) {
    const f = findComponent(library, sv.name)
    if (!f) throw new InvalidInputError(typeof svIn === 'string' ? 'solvent' : 'solvent.name', `unknown component "${sv.name}" (not in the component library)`)
    solventName = f[0]
    solventLib = f[1]
  }
  let solvT: number
  if (sv.temperature !== undefined) solvT = c.absTemp(c.q('temperature', sv.temperature, 'solvent.temperature'), 'solvent.temperature')
  else {
    solvT = gasT
    c.note('Solvent temperature not given: the gas inlet temperature is used', 'solvent.temperature')
  }
  const x0 = sv.soluteMoleFraction !== undefined ? c.range(sv.soluteMoleFraction, 0, 1, 'solvent.soluteMoleFraction', false, true) : 0
  const correl = solventLib?.liquidCorrelations?.value === 'water'
  const colT = input.column?.temperature !== undefined ? c.absTemp(c.q('temperature', input.column.temperature, 'column.temperature'), 'column.temperature') : solvT
  let solvM: number
  if (sv.molarMass !== undefined) solvM = c.positive(c.q('molarMass', sv.molarMass, 'solvent.molarMass'), 'solvent.molarMass')
  else if (solventLib?.molarMass) solvM = solventLib.molarMass.value / 1000
  else solvM = needProp('solvent.molarMass')
  const propWarnings: EngineWarning[] = []
  const rhoL = sv.density !== undefined ? c.positive(c.q('density', sv.density, 'solvent.density'), 'solvent.density') : correl ? densityWater(colT, propWarnings, 'solvent.temperature') : needProp('solvent.density')
  const muL = sv.viscosity !== undefined ? c.positive(c.q('viscosity', sv.viscosity, 'solvent.viscosity'), 'solvent.viscosity') : correl ? viscosityWater(colT, propWarnings, 'solvent.temperature') : needProp('solvent.viscosity')
  const sigma =
    sv.surfaceTension !== undefined
      ? c.positive(c.q('surfaceTension', sv.surfaceTension, 'solvent.surfaceTension'), 'solvent.surfaceTension')
      : correl
        ? surfaceTensionWater(colT, propWarnings, 'solvent.temperature')
        : needProp('solvent.surfaceTension')
  // only one warning per validity problem
  if (propWarnings.length) c.warnings.push(propWarnings[0]!)
  if (!(solvM > 0)) throw new InvalidInputError('solvent.molarMass', 'must be positive')

  // ---- equilibrium
  const e = input.equilibrium
  let eq: EquilibriumSI
  switch (e.model) {
    case 'constantK':
      eq = { model: 'constantK', K: c.positive(e.K, 'equilibrium.K') }
      break
    case 'henry': {
      let Hcp: number
      let B: number
      if (e.Hcp !== undefined) Hcp = c.positive(c.q('henrySolubility', e.Hcp, 'equilibrium.Hcp'), 'equilibrium.Hcp')
      else if (soluteLib?.henry) Hcp = soluteLib.henry.Hcp
      else throw new InvalidInputError('equilibrium.Hcp', 'missing: give Hcp or a library solute with Henry data')
      if (e.B !== undefined) B = c.q('inverseTemperatureSlope', e.B, 'equilibrium.B')
      else if (soluteLib?.henry && e.Hcp === undefined) B = soluteLib.henry.B
      else {
        B = 0
        c.note("Temperature dependence of the Henry constant (d ln H / d(1/T)) not given: the constant is taken as independent of temperature", 'equilibrium.B')
      }
      if (!Number.isFinite(B)) throw new InvalidInputError('equilibrium.B', 'must be a finite number')
      if (solventName !== 'water' && e.Hcp === undefined) {
        c.warnings.push({ code: 'henrySolvent', message: 'Library Henry constants are for water as solvent', path: 'equilibrium' })
      }
      eq = { model: 'henry', Hcp, B }
      break
    }
    case 'modifiedRaoult': {
      let gammaInf: number
      if (e.gammaInf !== undefined) gammaInf = c.positive(e.gammaInf, 'equilibrium.gammaInf')
      else if (soluteLib?.gammaInfWater) gammaInf = soluteLib.gammaInfWater.value
      else throw new InvalidInputError('equilibrium.gammaInf', 'missing: give gammaInf or a library solute with an infinite-dilution activity coefficient')
      const activityModel = e.activityModel ?? 'constant'
      if (activityModel === 'margules' && Math.log(gammaInf) >= 2) {
        throw new InvalidInputError('equilibrium.activityModel', `the two-suffix Margules form needs gammaInf < e^2 = 7.39 (no liquid-liquid split); got ${gammaInf}`)
      }
      let antoine: AntoineSI | null = null
      let Psat: number | null = null
      if (e.vapourPressure !== undefined) Psat = c.positive(c.q('pressure', e.vapourPressure, 'equilibrium.vapourPressure'), 'equilibrium.vapourPressure')
      else if (e.antoine) {
        antoine = { A: e.antoine.A, B: e.antoine.B, C: e.antoine.C, Tmin: (e.antoine.Tmin ?? -273.15) + 273.15, Tmax: (e.antoine.Tmax ?? 1e4) + 273.15 }
      } else if (soluteLib?.antoine) {
        const a = soluteLib.antoine
        antoine = { A: a.A, B: a.B, C: a.C, Tmin: a.Tmin + 273.15, Tmax: a.Tmax + 273.15 }
      } else throw new InvalidInputError('equilibrium.antoine', 'missing: give antoine constants, vapourPressure, or a library solute with Antoine constants')
      if (antoine) {
        const t = colT - 273.15
        const p = MMHG * Math.pow(10, antoine.A - antoine.B / (antoine.C + t))
        if (!Number.isFinite(p) || p <= 0) throw new InvalidInputError('equilibrium.antoine', `gives no valid vapour pressure at ${t.toFixed(1)} degC`)
      }
      eq = { model: 'modifiedRaoult', gammaInf, activityModel, antoine, vapourPressure: Psat }
      break
    }
    case 'table': {
      const xs = e.points.map((p) => p[0])
      const ys = e.points.map((p) => p[1])
      const bad = validateTable(xs, ys)
      if (bad) throw new InvalidInputError(`equilibrium.points.${bad.index}`, bad.reason)
      if (xs[0]! > 0) {
        xs.unshift(0)
        ys.unshift(0)
        c.note('The equilibrium table does not start at x = 0: the origin (0, 0) was added', 'equilibrium.points')
      }
      if (e.temperature !== undefined) {
        const tTable = c.absTemp(c.q('temperature', e.temperature, 'equilibrium.temperature'), 'equilibrium.temperature')
        if (Math.abs(tTable - colT) > TABLE_TEMPERATURE_TOLERANCE) {
          c.warnings.push({
            code: 'tableTemperature',
            message: `The x–y table was measured at ${(tTable - 273.15).toFixed(1)} °C but the column runs at ${(colT - 273.15).toFixed(1)} °C: equilibrium depends strongly on temperature`,
            path: 'equilibrium.temperature',
          })
        }
      }
      eq = { model: 'table', x: xs, y: ys }
      break
    }
  }

  // ---- targets
  const recovery = input.recovery
  if (!Number.isFinite(recovery) || recovery <= 0 || recovery >= 1) throw new InvalidInputError('recovery', `must be within (0, 1) (got ${recovery})`)
  const solventFactor = input.solventFactor
  if (!Number.isFinite(solventFactor) || solventFactor <= 0) throw new InvalidInputError('solventFactor', `must be a positive number (got ${solventFactor})`)

  // ---- tray
  const t = input.tray ?? {}
  const D = CASE_DEFAULTS.tray
  const holeDiameter = len(c, t.holeDiameter, D.holeDiameter, 'tray.holeDiameter')
  const holePitch = len(c, t.holePitch, D.holePitch, 'tray.holePitch')
  if (holePitch <= holeDiameter) throw new InvalidInputError('tray.holePitch', 'must be larger than the hole diameter')
  const thickness = len(c, t.thickness, D.thickness, 'tray.thickness')
  const weirHeight = len(c, t.weirHeight, D.weirHeight, 'tray.weirHeight')
  const downcomerClearance =
    t.downcomerClearance !== undefined
      ? c.positive(c.q('smallLength', t.downcomerClearance, 'tray.downcomerClearance'), 'tray.downcomerClearance')
      : Math.max(weirHeight - D.downcomerClearanceBelowWeir, 0.5 * weirHeight)
  const spacing: number | 'auto' = t.spacing === undefined || t.spacing === 'auto' ? 'auto' : c.positive(c.q('length', t.spacing, 'tray.spacing'), 'tray.spacing')
  const floodFraction = t.floodFraction !== undefined ? c.range(t.floodFraction, 0, 1, 'tray.floodFraction', true, true) : D.floodFraction
  const turndownFraction = t.turndownFraction !== undefined ? c.range(t.turndownFraction, 0, 1, 'tray.turndownFraction', true, false) : D.turndownFraction
  const foamingFactor = t.foamingFactor !== undefined ? c.range(t.foamingFactor, 0, 1.5, 'tray.foamingFactor', true, false) : D.foamingFactor
  let spacingRule: SpacingRuleRow[]
  if (t.spacingRule) {
    spacingRule = t.spacingRule.map((r, i) => ({
      maxDiameter: c.positive(c.q('length', r.maxDiameter, `tray.spacingRule.${i}.maxDiameter`), `tray.spacingRule.${i}.maxDiameter`),
      spacing: c.positive(c.q('length', r.spacing, `tray.spacingRule.${i}.spacing`), `tray.spacingRule.${i}.spacing`),
    }))
    for (let i = 1; i < spacingRule.length; i++) {
      if (spacingRule[i]!.maxDiameter <= spacingRule[i - 1]!.maxDiameter) {
        throw new InvalidInputError(`tray.spacingRule.${i}.maxDiameter`, 'rows must be sorted by increasing maxDiameter')
      }
    }
  } else spacingRule = DEFAULT_SPACING_RULE.map((r) => ({ ...r }))

  // ---- efficiency
  const ef = input.efficiency ?? { model: 'oconnell' as const }
  const efficiency: CaseSI['efficiency'] = ef.model === 'fixed' ? { model: 'fixed', value: c.range(ef.value, 0, 1, 'efficiency.value', true, false) } : { model: 'oconnell' }

  // ---- column
  const col = input.column ?? {}
  const column = {
    diameterStep: len(c, col.diameterStep, CASE_DEFAULTS.column.diameterStep, 'column.diameterStep', 'length'),
    topAllowance: col.topAllowance === undefined ? CASE_DEFAULTS.column.topAllowance : nonNeg(c.q('length', col.topAllowance, 'column.topAllowance'), 'column.topAllowance'),
    bottomAllowance:
      col.bottomAllowance === undefined ? CASE_DEFAULTS.column.bottomAllowance : nonNeg(c.q('length', col.bottomAllowance, 'column.bottomAllowance'), 'column.bottomAllowance'),
  }

  // ---- vessel
  const v = input.vessel ?? {}
  const V = CASE_DEFAULTS.vessel
  const opGauge = Math.max(P - 101325, 0)
  if (P < 101325) {
    c.warnings.push({ code: 'vacuum', message: 'The column runs below atmospheric pressure: the shell must also be checked for external pressure (vacuum), which the preliminary estimate does not cover', path: 'gas.pressure' })
  }
  let designPressure: number
  if (v.designPressure !== undefined) {
    designPressure = c.q('pressureGauge', v.designPressure, 'vessel.designPressure')
    if (!Number.isFinite(designPressure) || designPressure < 0) throw new InvalidInputError('vessel.designPressure', 'must be a gauge pressure >= 0 (vacuum design is out of scope)')
    if (designPressure < opGauge) c.warnings.push({ code: 'designPressureBelowOperating', message: 'The vessel design pressure is below the operating gauge pressure', path: 'vessel.designPressure' })
  } else designPressure = Math.max(V.designPressureMarginFactor * opGauge, opGauge + V.designPressureMarginAdd)
  const allowableStress = v.allowableStress !== undefined ? c.positive(c.q('stress', v.allowableStress, 'vessel.allowableStress'), 'vessel.allowableStress') : V.allowableStress
  const jointEfficiency = v.jointEfficiency !== undefined ? c.range(v.jointEfficiency, 0, 1, 'vessel.jointEfficiency', true, false) : V.jointEfficiency
  const corrosionAllowance = v.corrosionAllowance !== undefined ? nonNeg(c.q('smallLength', v.corrosionAllowance, 'vessel.corrosionAllowance'), 'vessel.corrosionAllowance') : V.corrosionAllowance
  const materialDensity = v.materialDensity !== undefined ? c.positive(c.q('density', v.materialDensity, 'vessel.materialDensity'), 'vessel.materialDensity') : V.materialDensity
  const minimumThickness = v.minimumThickness
    ? v.minimumThickness.map((r, i) => ({
        maxDiameter: c.positive(c.q('length', r.maxDiameter, `vessel.minimumThickness.${i}.maxDiameter`), `vessel.minimumThickness.${i}.maxDiameter`),
        thickness: c.positive(c.q('smallLength', r.thickness, `vessel.minimumThickness.${i}.thickness`), `vessel.minimumThickness.${i}.thickness`),
      }))
    : DEFAULT_MIN_THICKNESS.map((r) => ({ ...r }))

  return {
    name: typeof input.name === 'string' ? input.name : undefined,
    gas: { flow: gasFlow, temperature: gasT, pressure: P, soluteMoleFraction: y0, carrierMolarMass: carrierM, carrierName, viscosity: gasMu },
    solute: { name: soluteName, molarMass: soluteM, hazards: soluteHazards.slice() },
    solvent: { name: solventName, temperature: solvT, soluteMoleFraction: x0, molarMass: solvM, density: rhoL, viscosity: muL, surfaceTension: sigma },
    equilibrium: eq,
    columnTemperature: colT,
    recovery,
    solventFactor,
    tray: { holeDiameter, holePitch, thickness, spacing, floodFraction, foamingFactor, weirHeight, downcomerClearance, turndownFraction, spacingRule },
    efficiency,
    method: input.method ?? 'auto',
    column,
    vessel: { designPressure, allowableStress, jointEfficiency, corrosionAllowance, materialDensity, minimumThickness },
    warnings: c.warnings,
    cautions,
  }
}
