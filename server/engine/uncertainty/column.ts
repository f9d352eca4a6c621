/**
 * The built column of an uncertainty study, fixed once: the case designed at nominal values
 * (trays, diameter and solvent flow then stay), its installed geometry, the parts of its cost
 * that do not change with the world around it, and a fast rating of one sample of that world.
 *
 * The rating is the standing-column path (../rating/): the same balance (Kremser with the
 * geometric-mean absorption factor of the ends, or stage by stage), the same O'Connell efficiency
 * and the same tray hydraulics at the installed areas. Only the work that does not depend on the
 * sample (equilibrium model, geometry, capital cost) is done once here. For the Kremser method
 * the outlet is found from the closed form y_1 = K x_0 + (y_in - K x_0)(1 - 1/A)/(A^N - 1/A)
 * (kremser1930), iterated on A (which depends weakly on the outlet through the end flows) instead
 * of by bisection; the tests hold it to the bisection of the rating path. Every sample keeps the
 * balance method of the nominal design, so that no sample jumps between methods.
 */
import type { CostBasisData } from '../../../shared/schemas/costBasis.ts'
import type { DesignResult } from '../contract.ts'
import type { CaseSI } from '../case.ts'
import { costDesign } from '../costing/costDesign.ts'
import { efficiencyOConnell } from '../efficiency/oconnell.ts'
import type { EquilibriumCurve } from '../equilibrium/models.ts'
import { outletForStages, type BalanceInput, type BalanceOutlet } from '../rating/balance.ts'
import { balanceOf, endStreams, geometryOf, type AsBuiltSI } from '../rating/rate.ts'
import { trayStateAt, type TrayGeometry, type TrayState } from '../rating/trayState.ts'
import { isEngineError } from '../errors.ts'
import { eqXofY } from '../balances/stageByStage.ts'


/** The multipliers of one sample (1 = nominal). */
export interface SampleMultipliers {
  K: number
  efficiency: number
  gasFlow: number
  soluteMoleFraction: number
  electricity: number
  solventCost: number
  productValue: number
  emissionCharge: number
  capitalCost: number
}

/** What a rated sample gives. `percentFlood` is Infinity beyond the flooding correlation; NaN = the rating failed. */
export interface SampleRating {
  recovery: number
  percentFlood: number
  totalAnnualCost: number
  /** Solute released with the cleaned gas [kg/h]. */
  soluteLost: number
  overallEfficiency: number
}

/** y = m f(x): a case's equilibrium with K scaled by m (one object, m changed per sample). */
class ScaledCurve implements EquilibriumCurve {
  m = 1
  constructor(readonly base: EquilibriumCurve) {}
  get linear(): boolean {
    return this.base.linear
  }
  get K0(): number {
    return this.m * this.base.K0
  }
  get xMax(): number {
    return this.base.xMax
  }
  y(x: number): number {
    return this.m * this.base.y(x)
  }
  x(y: number): number {
    return this.base.x(y / this.m)
  }
}

export interface FixedColumn {
  c: CaseSI
  design: DesignResult
  column: AsBuiltSI
  geometry: TrayGeometry
  nominal: BalanceInput
  curve: ScaledCurve
  /** Fixed parts of the cost [currency/yr] and the constants of the variable parts. */
  cost: {
    currency: string
    annualisedCapital: number
    solvent: number
    pumpElectricity: number
    hours: number
    electricityPrice: number
    productValue: number
    emissionCharge: number
    blowerAllowance: number
    blowerEfficiency: number
    nominalTotalAnnualCost: number
  }
  /** The design's overall efficiency (the upper truncation of the efficiency multiplier is 1 / this). */
  designEfficiency: number
}

/** Fix the built column of a design (the summary of designSI at nominal values). */
export function fixColumn(c: CaseSI, design: DesignResult, basis: CostBasisData): FixedColumn {
  const s = design.summary
  const L0 = s.solventFlow // mol/s: the engine's summary is SI
  const { b } = balanceOf(c, L0)
  const curve = new ScaledCurve(b.eq)
  const column: AsBuiltSI = {
    diameter: s.selectedDiameter,
    actualTrays: s.actualTrays,
    traySpacing: s.traySpacing,
    weirLength: null,
    downcomerAreaFraction: s.downcomerAreaFraction,
    activeAreaFraction: null,
    weirHeight: c.tray.weirHeight,
  }
  const out = outletForStages(b, s.actualTrays * (s.overallEfficiency ?? 1))
  const { bot, top } = endStreams(c, b, out)
  const geometry = geometryOf(c, column, bot, top, [])
  const cb = costDesign(s, basis)
  const d = basis.drives
  return {
    c,
    design,
    column,
    geometry,
    nominal: { ...b, eq: curve },
    curve,
    cost: {
      currency: cb.currency,
      annualisedCapital: cb.annualisedCapital,
      solvent: cb.annual.solvent,
      pumpElectricity: cb.annual.pumpElectricity,
      hours: basis.general.operatingHours,
      electricityPrice: basis.utilities.electricityPrice,
      productValue: basis.utilities.productValue,
      emissionCharge: basis.utilities.emissionCharge,
      blowerAllowance: d.blowerPressureAllowance,
      blowerEfficiency: d.blowerEfficiency * d.blowerMotorEfficiency,
      nominalTotalAnnualCost: cb.totalAnnualCost,
    },
    designEfficiency: s.overallEfficiency ?? (c.efficiency.model === 'fixed' ? c.efficiency.value : 1),
  }
}

/** Inverse of the Kremser equation: outlet gas y_1 reached by N stages at absorption factor A. */
export function kremserOutlet(yIn: number, yEqLean: number, A: number, N: number): number {
  if (Math.abs(A - 1) < 1e-9) return (yIn + N * yEqLean) / (N + 1)
  return yEqLean + ((yIn - yEqLean) * (1 - 1 / A)) / (Math.pow(A, N) - 1 / A)
}

/**
 * Outlet of a dilute straight-line column (the rating path's Kremser balance), by fixed-point
 * iteration on the end flows; null when it does not settle (the caller then bisects).
 */
function kremserFast(b: BalanceInput, N: number): BalanceOutlet | null {
  const K = b.K0
  const Vp = b.V * (1 - b.yIn)
  const YIn = b.yIn / (1 - b.yIn)
  const X0 = b.x0 / (1 - b.x0)
  const Lp = b.L0 / (1 + X0)
  const s = Lp / Vp
  const yEq = K * b.x0
  let A = b.L0 / (K * b.V)
  let Y1 = 0
  let y1 = kremserOutlet(b.yIn, yEq, A, N)
  for (let it = 0; it < 60; it++) {
    Y1 = y1 / (1 - y1)
    const XN = X0 + (YIn - Y1) / s
    A = Math.sqrt((b.L0 / (K * Vp * (1 + Y1))) * ((Lp * (1 + XN)) / (K * b.V)))
    const next = kremserOutlet(b.yIn, yEq, A, N)
    const done = Math.abs(next - y1) <= 1e-14 * b.yIn
    y1 = next
    if (done) {
      Y1 = y1 / (1 - y1)
      const XNf = X0 + (YIn - Y1) / s
      if (!(Y1 > 0) || !(XNf < eqXofY(b.eq, YIn))) return null
      const xN = XNf / (1 + XNf)
      return { y1, xN, recovery: 1 - Y1 / YIn, N, absorptionFactor: A, Ktop: K, Kbot: K }
    }
  }
  return null
}

/** Working storage reused from sample to sample. */
export interface Scratch {
  b: BalanceInput
  sb: TrayState
  st: TrayState
}

export function scratchOf(fc: FixedColumn): Scratch {
  return { b: { ...fc.nominal }, sb: {} as TrayState, st: {} as TrayState }
}

/** Rate the fixed column in one sampled world (the overall efficiency kept at most 1). */
export function rateSample(fc: FixedColumn, m: SampleMultipliers, w: Scratch, out: SampleRating): SampleRating {
  const c = fc.c
  const nb = fc.nominal
  const b = w.b
  fc.curve.m = m.K
  b.K0 = nb.K0 * m.K
  b.V = nb.V * m.gasFlow
  b.yIn = nb.yIn * m.soluteMoleFraction
  out.recovery = NaN
  out.percentFlood = NaN
  out.totalAnnualCost = NaN
  out.soluteLost = NaN
  let Eo: number
  if (c.efficiency.model === 'fixed') Eo = c.efficiency.value * m.efficiency
  else Eo = efficiencyOConnell(b.K0, c.solvent.molarMass, c.solvent.viscosity, c.solvent.density) * m.efficiency
  Eo = Math.min(1, Eo)
  const trays = fc.column.actualTrays
  let o: BalanceOutlet
  try {
    const xStar = fc.curve.x(b.yIn)
    if (!(xStar > 0 && xStar < 0.99)) return out
    let fast = b.method === 'kremser' ? kremserFast(b, trays * Eo) : null
    if (fast === null) fast = outletForStages(b, trays * Eo)
    o = fast
    // O'Connell on the mean K of the ends: iterate as the rating path does when the line curves
    if (c.efficiency.model === 'oconnell' && !fc.curve.linear) {
      for (let i = 0; i < 30; i++) {
        const E2 = Math.min(1, efficiencyOConnell(0.5 * (o.Ktop + o.Kbot), c.solvent.molarMass, c.solvent.viscosity, c.solvent.density) * m.efficiency)
        const done = Math.abs(E2 - Eo) < 1e-10
        Eo = E2
        o = outletForStages(b, trays * Eo)
        if (done) break
      }
    }
  } catch (e) {
    if (isEngineError(e)) return out
    throw e
  }
  out.recovery = o.recovery
  out.overallEfficiency = Eo
  const Vp = b.V * (1 - b.yIn)
  const Y1 = o.y1 / (1 - o.y1)
  out.soluteLost = Vp * Y1 * c.solute.molarMass * 3600
  let bot, top
  try {
    ;({ bot, top } = endStreams(c, b, o))
  } catch (e) {
    if (isEngineError(e)) return out
    throw e
  }
  const sb = trayStateAt(bot, fc.geometry, w.sb)
  const st = trayStateAt(top, fc.geometry, w.st)
  const flood = Math.max(sb.fractionFlood, st.fractionFlood)
  out.percentFlood = Number.isFinite(flood) ? 100 * flood : Infinity
  const dP = trays * 0.5 * (sb.dP + st.dP)
  const k = fc.cost
  const blowerKWh = ((bot.Q * (dP + k.blowerAllowance)) / k.blowerEfficiency / 1000) * k.hours
  const lostKg = out.soluteLost * k.hours
  const tac =
    k.annualisedCapital * m.capitalCost +
    k.solvent * m.solventCost +
    k.pumpElectricity * m.electricity +
    blowerKWh * k.electricityPrice * m.electricity +
    lostKg * (k.productValue * m.productValue + k.emissionCharge * m.emissionCharge)
  out.totalAnnualCost = Number.isFinite(tac) ? tac : NaN
  return out
}
