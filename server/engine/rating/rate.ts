/**
 * Rating of a standing column: one case plus the as-built column and the solvent flow ->
 * recovery, outlet compositions, percent flood, the tray checks and the operating window.
 *
 * Sequence: equilibrium at column T, P (as the design) -> installed theoretical stages
 * N = trays x E_o (O'Connell iterated on the mean K of the rated ends, or the fixed value)
 * -> outlet by bisection on the balance (balance.ts) -> streams at both ends -> hydraulics
 * at the installed areas (trayState.ts) -> checks (checks.ts) -> window (window.ts).
 *
 * SI inside; molar flows in the answer in kmol/h (the product's public convention).
 */
import type { CaseInput } from '../../../shared/schemas/case.ts'
import { rateBatchSchema, rateCaseSchema, type RateCaseInput, type RatingResult } from '../../../shared/schemas/rating.ts'
import { toSI, UnitError, type QuantityInput, type QuantityKind } from '../../../shared/units.ts'
import type { EngineWarning } from '../contract.ts'
import { CASE_DEFAULTS, normaliseCase, type CaseSI, type ComponentLibrary } from '../case.ts'
import { equilibriumCurveOf } from '../column/equilibrium.ts'
import { chooseMethod } from '../column/balances.ts'
import { InfeasibleDesignError, InvalidInputError } from '../errors.ts'
import { efficiencyOConnell } from '../efficiency/oconnell.ts'
import { densityIdealGas } from '../properties/gas.ts'
import { capacityFactorFair, downcomerAreaFraction, flowParameter, holeAreaFactor, holeAreaFractionTriangular, surfaceTensionFactor } from '../hydraulics/flooding.ts'
import { orificeCoefficient, weirLengthRatio } from '../hydraulics/tray.ts'
import { outletForStages, type BalanceInput, type BalanceOutlet } from './balance.ts'
import { ratingChecks, worstEnd } from './checks.ts'
import { scaleStreams, trayStateAt, type EndStreams, type TrayGeometry } from './trayState.ts'
import { limitGasScale, operatingWindow, type WindowOptions } from './window.ts'

const KMOLH = 3.6 // mol/s -> kmol/h

/** The as-built column in SI; null = not given (filled by a design rule). */
export interface AsBuiltSI {
  diameter: number // m
  actualTrays: number
  traySpacing: number // m
  weirLength: number | null // m
  downcomerAreaFraction: number | null
  activeAreaFraction: number | null
  weirHeight: number | null // m
}

export interface RateCaseSI {
  case: CaseSI
  column: AsBuiltSI
  /** Lean solvent including its solute [mol/s]. */
  solventFlow: number
}

export interface RateOptions {
  window?: WindowOptions
}

// ------------------------------------------------------------------ input

function q(kind: QuantityKind, v: QuantityInput, path: string): number {
  try {
    return toSI(kind, v)
  } catch (e) {
    if (e instanceof UnitError) throw new InvalidInputError(path, e.message)
    throw e
  }
}
function positive(v: number, path: string): number {
  if (!Number.isFinite(v) || v <= 0) throw new InvalidInputError(path, `must be a positive number (got ${v})`)
  return v
}
function within(v: number, lo: number, hi: number, path: string): number {
  if (!Number.isFinite(v) || v <= lo || v > hi) throw new InvalidInputError(path, `must be within (${lo}, ${hi}] (got ${v})`)
  return v
}

/**
 * Normalise a parsed rating case: the design case part through normaliseCase (same defaults,
 * units and checks), the column and the solvent flow here.
 * @throws InvalidInputError (path + reason)
 */
export function normaliseRateCase(input: RateCaseInput, library: ComponentLibrary): RateCaseSI {
  const { column, solventFlow, ...rest } = input
  const common: NonNullable<CaseInput['column']> = {}
  if (column.temperature !== undefined) common.temperature = column.temperature
  if (column.diameterStep !== undefined) common.diameterStep = column.diameterStep
  if (column.topAllowance !== undefined) common.topAllowance = column.topAllowance
  if (column.bottomAllowance !== undefined) common.bottomAllowance = column.bottomAllowance
  // the targets are not used by a rating; placeholders satisfy the design normalisation
  const c = normaliseCase({ ...rest, recovery: 0.5, solventFactor: 1.5, column: common } as CaseInput, library)
  const D = within(q('length', column.diameter, 'column.diameter'), 0, 20, 'column.diameter')
  const t = within(q('length', column.traySpacing, 'column.traySpacing'), 0, 3, 'column.traySpacing')
  const trays = column.actualTrays
  if (!Number.isInteger(trays) || trays < 1) throw new InvalidInputError('column.actualTrays', `must be a whole number of trays, at least 1 (got ${trays})`)
  const Lw = column.weirLength === undefined ? null : positive(q('length', column.weirLength, 'column.weirLength'), 'column.weirLength')
  if (Lw !== null && Lw >= D) throw new InvalidInputError('column.weirLength', `must be shorter than the diameter ${D} m (got ${Lw} m)`)
  const AdAt = column.downcomerAreaFraction === undefined ? null : within(column.downcomerAreaFraction, 0, 0.4, 'column.downcomerAreaFraction')
  const AaAt = column.activeAreaFraction === undefined ? null : within(column.activeAreaFraction, 0, 1, 'column.activeAreaFraction')
  if (AaAt !== null && AdAt !== null && AaAt > 1 - 2 * AdAt + 1e-9) {
    throw new InvalidInputError('column.activeAreaFraction', `cannot exceed 1 - 2 x downcomerAreaFraction = ${(1 - 2 * AdAt).toFixed(3)} (got ${AaAt})`)
  }
  const hw = column.weirHeight === undefined ? null : within(q('smallLength', column.weirHeight, 'column.weirHeight'), 0, 0.3, 'column.weirHeight')
  if (hw !== null) c.tray.weirHeight = hw
  if (hw !== null && input.tray?.downcomerClearance === undefined) {
    c.tray.downcomerClearance = Math.max(hw - CASE_DEFAULTS.tray.downcomerClearanceBelowWeir, 0.5 * hw)
  }
  if (c.tray.spacing !== 'auto' && Math.abs(c.tray.spacing - t) > 1e-9) {
    c.warnings.push({ code: 'spacingIgnored', message: `tray.spacing (${c.tray.spacing} m) differs from column.traySpacing (${t} m); the installed spacing is used`, path: 'tray.spacing' })
  }
  const L0 = positive(q('molarFlow', solventFlow, 'solventFlow'), 'solventFlow')
  // weir height from the tray section when the column does not give it
  const weirHeight = hw ?? (input.tray?.weirHeight !== undefined ? c.tray.weirHeight : null)
  return { case: c, column: { diameter: D, actualTrays: trays, traySpacing: t, weirLength: Lw, downcomerAreaFraction: AdAt, activeAreaFraction: AaAt, weirHeight }, solventFlow: L0 }
}

/** Parse (zod) and normalise one raw rating case; paths prefixed with `prefix`. */
export function rateCaseToSI(raw: unknown, library: ComponentLibrary, prefix = ''): RateCaseSI {
  const r = rateCaseSchema.safeParse(raw)
  if (!r.success) {
    const issues = r.error.issues.map((i) => ({ path: prefix + i.path.map(String).join('.'), code: 'invalidInput', message: i.message }))
    const first = issues[0] ?? { path: prefix, message: 'invalid input' }
    throw new InvalidInputError(first.path, first.message, issues)
  }
  try {
    return normaliseRateCase(r.data, library)
  } catch (e) {
    if (e instanceof InvalidInputError && prefix) throw new InvalidInputError(prefix + e.path, e.reason, e.issues.map((i) => ({ ...i, path: prefix + i.path })))
    throw e
  }
}

/** Parse a batch { cases: [...] } or a bare array of rating cases. */
export function rateBatchToSI(raw: unknown, library: ComponentLibrary): RateCaseSI[] {
  const list = Array.isArray(raw) ? { cases: raw } : raw
  const r = rateBatchSchema.safeParse(list)
  if (!r.success) {
    const issues = r.error.issues.map((i) => ({ path: i.path.map(String).join('.'), code: 'invalidInput', message: i.message }))
    throw new InvalidInputError(issues[0]?.path ?? 'cases', issues[0]?.message ?? 'invalid input', issues)
  }
  return r.data.cases.map((c, i) => rateCaseToSI(c, library, `cases.${i}.`))
}

// ------------------------------------------------------------------ rating

/** The balance of a rating: flows, equilibrium and the method the design would use. */
export function balanceOf(c: CaseSI, L0: number, warnings?: EngineWarning[]): { b: BalanceInput; linear: boolean } {
  const eqb = equilibriumCurveOf(c, warnings)
  const eq = eqb.curve
  const yIn = c.gas.soluteMoleFraction
  const xStar = eq.x(yIn)
  if (!(xStar > 0 && xStar < 0.99) || Math.abs(eq.y(xStar) - yIn) > 1e-7 * yIn) {
    throw new InfeasibleDesignError([{ path: 'equilibrium', code: 'equilibriumOutOfRange', message: `No liquid is in equilibrium with the inlet gas (y = ${yIn}); the equilibrium model does not apply at this composition` }])
  }
  const x0 = c.solvent.soluteMoleFraction
  const X0 = x0 / (1 - x0)
  // the same choice of method as the design, with its note
  const choice = chooseMethod(c.method, eq, yIn, xStar, X0, xStar / (1 - xStar))
  const method = choice.method
  if (warnings && method === 'kremser' && !choice.kremserValid) warnings.push({ code: 'kremserOutsideValidity', message: choice.note, path: 'method' })
  return { b: { eq, method, K0: eqb.K0, V: c.gas.flow, yIn, L0, x0 }, linear: eq.linear }
}

/**
 * Overall efficiency and outlet at the installed trays. O'Connell depends on the mean K of
 * the two ends, which depends on the outlet: fixed-point iteration (a few steps; K varies
 * weakly along a dilute column).
 */
export function installedOutlet(c: CaseSI, b: BalanceInput, trays: number, warnings?: EngineWarning[]): { out: BalanceOutlet; Eo: number } {
  const eff = c.efficiency
  if (eff.model === 'fixed') return { out: outletForStages(b, trays * eff.value), Eo: eff.value }
  const M = c.solvent.molarMass
  const mu = c.solvent.viscosity
  const rho = c.solvent.density
  let Eo = efficiencyOConnell(b.K0, M, mu, rho)
  let out = outletForStages(b, trays * Eo)
  for (let i = 0; i < 30; i++) {
    const E2 = efficiencyOConnell(0.5 * (out.Ktop + out.Kbot), M, mu, rho)
    const done = Math.abs(E2 - Eo) < 1e-10
    Eo = E2
    out = outletForStages(b, trays * Eo)
    if (done) break
  }
  efficiencyOConnell(0.5 * (out.Ktop + out.Kbot), M, mu, rho, warnings, 'efficiency')
  return { out, Eo }
}

/** The streams at the two ends of a rated column. */
export function endStreams(c: CaseSI, b: BalanceInput, out: BalanceOutlet): { bot: EndStreams; top: EndStreams } {
  const P = c.gas.pressure
  const Ms = c.solute.molarMass
  const Mc = c.gas.carrierMolarMass
  const Mv = c.solvent.molarMass
  const rhoL = c.solvent.density
  const Vp = b.V * (1 - b.yIn)
  const X0 = b.x0 / (1 - b.x0)
  const Lp = b.L0 / (1 + X0)
  const Y1 = out.y1 / (1 - out.y1)
  const YIn = b.yIn / (1 - b.yIn)
  const V1 = Vp * (1 + Y1)
  const MGbot = b.yIn * Ms + (1 - b.yIn) * Mc
  const MGtop = out.y1 * Ms + (1 - out.y1) * Mc
  const rhoVbot = densityIdealGas(P, MGbot, c.gas.temperature)
  const rhoVtop = densityIdealGas(P, MGtop, c.columnTemperature)
  if (!(rhoL > rhoVbot && rhoL > rhoVtop)) {
    throw new InfeasibleDesignError([{ path: 'solvent.density', code: 'flooding', message: 'The liquid is not denser than the gas: no counter-current flow is possible' }])
  }
  const leanMass = Lp * Mv + Lp * X0 * Ms
  const richMass = leanMass + Vp * (YIn - Y1) * Ms
  return {
    bot: { gasMol: b.V, gasMass: b.V * MGbot, rhoV: rhoVbot, Q: (b.V * MGbot) / rhoVbot, liqMass: richMass, qL: richMass / rhoL },
    top: { gasMol: V1, gasMass: V1 * MGtop, rhoV: rhoVtop, Q: (V1 * MGtop) / rhoVtop, liqMass: leanMass, qL: leanMass / rhoL },
  }
}

/** Resolve the installed geometry; fills absent items by the design rules and lists them. */
export function geometryOf(c: CaseSI, col: AsBuiltSI, bot: EndStreams, top: EndStreams, filled: RatingResult['filled'], warnings?: EngineWarning[]): TrayGeometry {
  const D = col.diameter
  const rhoL = c.solvent.density
  const tr = c.tray
  let AdAt: number
  if (col.downcomerAreaFraction !== null) AdAt = col.downcomerAreaFraction
  else if (col.weirLength !== null) {
    // segmental downcomer behind a weir of this length: theta = 2 asin(L_w/D), A_d/A_t = (theta - sin theta)/(2 pi) (benitez2009 ch. 4)
    const th = 2 * Math.asin(col.weirLength / D)
    AdAt = (th - Math.sin(th)) / (2 * Math.PI)
    filled.push({ path: 'column.downcomerAreaFraction', value: AdAt, unit: '-', rule: 'segment behind the given weir length: (theta - sin theta)/(2 pi), theta = 2 asin(L_w/D)' })
  } else {
    const fBot = flowParameter(bot.liqMass, bot.gasMass, bot.rhoV, rhoL)
    const fTop = flowParameter(top.liqMass, top.gasMass, top.rhoV, rhoL)
    AdAt = Math.max(downcomerAreaFraction(fBot), downcomerAreaFraction(fTop))
    filled.push({ path: 'column.downcomerAreaFraction', value: AdAt, unit: '-', rule: 'design rule from the flow parameter at these flows (benitez2009 eq. 4.34)' })
  }
  let Lw: number
  if (col.weirLength !== null) Lw = col.weirLength
  else {
    Lw = weirLengthRatio(AdAt) * D
    filled.push({ path: 'column.weirLength', value: Lw, unit: 'm', rule: 'segmental downcomer chord for the downcomer area (benitez2009 ch. 4)' })
  }
  const At = 0.25 * Math.PI * D * D
  const Ad = AdAt * At
  let AaAt: number
  if (col.activeAreaFraction !== null) AaAt = col.activeAreaFraction
  else {
    AaAt = 1 - 2 * AdAt
    filled.push({ path: 'column.activeAreaFraction', value: AaAt, unit: '-', rule: 'tower area less two downcomers, no calming zones (treybal1980 ch. 6)' })
  }
  if (!(AaAt > 0) || AaAt > 1 - 2 * AdAt + 1e-9) {
    throw new InvalidInputError('column.activeAreaFraction', `must leave room for the two downcomers: at most ${(1 - 2 * AdAt).toFixed(3)} (got ${AaAt.toFixed(3)})`)
  }
  if (col.weirHeight === null) filled.push({ path: 'column.weirHeight', value: tr.weirHeight, unit: 'm', rule: 'case default weir height (sinnott2005: 40-50 mm above atmospheric pressure)' })
  const Aa = AaAt * At
  const AhAa = holeAreaFractionTriangular(tr.holeDiameter, tr.holePitch)
  const FHA = holeAreaFactor(AhAa, warnings, 'tray.holePitch')
  const t = col.traySpacing
  if (warnings) {
    if (tr.holeDiameter > 0.013) warnings.push({ code: 'outsideValidity', message: `Fair flooding correlation: hole diameter ${(tr.holeDiameter * 1000).toFixed(1)} mm above its 13 mm limit`, path: 'tray.holeDiameter' })
    if (tr.weirHeight > 0.15 * t) warnings.push({ code: 'outsideValidity', message: `Fair flooding correlation: weir height ${(tr.weirHeight * 1000).toFixed(0)} mm above 15 % of the tray spacing`, path: 'column.weirHeight' })
    if (tr.holeDiameter / tr.thickness < 1) warnings.push({ code: 'outsideValidity', message: 'Orifice coefficient: hole diameter / plate thickness below 1 (outside the chart)', path: 'tray.thickness' })
  }
  return {
    D,
    t,
    At,
    Ad,
    An: At - Ad,
    Aa,
    Ah: AhAa * Aa,
    AhAa,
    AdAt,
    Lw,
    hw: tr.weirHeight,
    clearance: tr.downcomerClearance,
    dO: tr.holeDiameter,
    Co: orificeCoefficient(tr.holeDiameter, tr.thickness),
    rhoL,
    sigma: c.solvent.surfaceTension,
    capacityFactors: surfaceTensionFactor(c.solvent.surfaceTension) * tr.foamingFactor * FHA,
  }
}

/**
 * Rate one standing column.
 * @throws InvalidInputError | InfeasibleDesignError | ConvergenceError
 */
export function rateSI(r: RateCaseSI, opts?: RateOptions): RatingResult {
  const c = r.case
  const col = r.column
  const warnings: EngineWarning[] = c.warnings.slice()
  const { b } = balanceOf(c, r.solventFlow, warnings)
  const { out, Eo } = installedOutlet(c, b, col.actualTrays, warnings)
  const { bot, top } = endStreams(c, b, out)
  const filled: RatingResult['filled'] = []
  const g = geometryOf(c, col, bot, top, filled, warnings)
  const sb = trayStateAt(bot, g)
  const st = trayStateAt(top, g)
  const w = worstEnd(sb, st)
  if (!Number.isFinite(w.fractionFlood)) {
    throw new InfeasibleDesignError([
      { path: 'solventFlow', code: 'flooding', message: `The liquid load is beyond the flooding correlation (flow parameter ${Math.max(sb.FLV, st.FLV).toFixed(2)}): the column floods with this much solvent for this gas` },
    ])
  }
  // Fair validity warnings, once, at the end nearer flood
  const fEnd = sb.fractionFlood >= st.fractionFlood ? sb : st
  capacityFactorFair(g.t, fEnd.FLV, warnings, 'flowParameter')
  const tdf = c.tray.turndownFraction
  const low = sb.Fr <= st.Fr ? bot : top
  const sTurn = trayStateAt(scaleStreams(low, tdf, 1), g)
  const checks = ratingChecks(w, sTurn, tdf)

  const gasFlow = b.V * KMOLH
  const solventFlow = r.solventFlow * KMOLH
  const weepScale = limitGasScale('weeping', bot, top, g, 1)
  const weepingGasFlow = weepScale === null ? 0 : weepScale * gasFlow
  const windowOpts = opts?.window
  const window = operatingWindow(bot, top, g, gasFlow, solventFlow, windowOpts)

  const result: RatingResult = {
    summary: {
      recovery: out.recovery,
      outletGasSoluteMoleFraction: out.y1,
      richSolventSoluteMoleFraction: out.xN,
      theoreticalStages: out.N,
      overallEfficiency: Eo,
      percentFlood: 100 * w.fractionFlood,
      floodingGasFlow: gasFlow / w.fractionFlood,
      weepingGasFlow,
      pressureDropPerTray: w.dP,
      columnPressureDrop: col.actualTrays * 0.5 * (sb.dP + st.dP),
    },
    operation: {
      gasFlow,
      solventFlow,
      inletGasSoluteMoleFraction: b.yIn,
      absorptionFactor: out.absorptionFactor,
      method: b.method,
      flowParameter: fEnd.FLV,
      floodingVelocity: fEnd.vF,
    },
    column: {
      diameter: g.D,
      actualTrays: col.actualTrays,
      traySpacing: g.t,
      weirLength: g.Lw,
      downcomerAreaFraction: g.AdAt,
      activeAreaFraction: g.Aa / g.At,
      weirHeight: g.hw,
      holeAreaFraction: g.AhAa,
      towerArea: g.At,
      netArea: g.An,
      activeArea: g.Aa,
      holeArea: g.Ah,
      downcomerArea: g.Ad,
    },
    filled,
    checks,
    window,
    warnings,
    cautions: c.cautions.slice(),
  }
  guardFinite(result)
  return result
}

/** No NaN or Infinity leaves the engine. */
function guardFinite(r: RatingResult): void {
  const bad = (o: unknown, path: string): string | null => {
    if (typeof o === 'number') return Number.isFinite(o) ? null : path
    if (Array.isArray(o)) {
      for (let i = 0; i < o.length; i++) {
        const p = bad(o[i], `${path}.${i}`)
        if (p) return p
      }
      return null
    }
    if (o && typeof o === 'object') {
      for (const k of Object.keys(o)) {
        const p = bad((o as Record<string, unknown>)[k], path ? `${path}.${k}` : k)
        if (p) return p
      }
    }
    return null
  }
  const where = bad({ summary: r.summary, operation: r.operation, column: r.column, checks: r.checks, window: r.window }, '')
  if (where) {
    throw new InfeasibleDesignError([{ path: where, code: 'numericalFailure', message: `The rating produced a non-finite number at ${where}; the inputs are probably far outside the correlations' ranges` }])
  }
}
