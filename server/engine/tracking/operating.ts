/**
 * Operating-cost tracking: prices one month of a running absorber with the cost basis in force and
 * sets it against the approved design at the same throughput.
 *
 * Method (our own bookkeeping, no published correlation involved):
 *  - hours in the month h = days × 24 × (operating hours per year / 8760)
 *  - recovery from the measured outlet gas, on a solute-free basis (exact for a non-absorbed carrier):
 *        r = 1 − [y_out/(1 − y_out)] / [y_in/(1 − y_in)]
 *  - actual month cost = solvent m³ × solvent cost + electricity kWh × price
 *        + solute lost kg × (product value + emission charge) + capital share
 *    where electricity is the logged power × h, or, when no power is logged, the design's pump and
 *    blower power scaled by the solvent and gas flow ratios;
 *  - design month cost at the same throughput φ = G/G_design: the approved design's operating items
 *    (priced with the same basis) × φ × h / (operating hours per year) + the same capital share;
 *  - capital share = annualised capital × days / 365 (capital is spent; it is the same in both);
 *  - flags (screening only): percent flood scales with the gas volumetric rate at fixed T and P,
 *    %F ≈ %F_design × φ (the liquid load changes the flow parameter only weakly); a gas rate below
 *    60 % of design risks weeping (common practice, no source); the solvent-to-gas ratio below the
 *    design's minimum (L/G)_min cannot reach the target; recovery below the design target;
 *  - a gas flow above the design's (the trays were sized for it); a solvent flow below what the
 *    design needs for its recovery at the month's gas flow, L < (L/G)_design × G: at the installed
 *    stages the recovery rises with the absorption factor A = L/(mG) (Kremser), so a lower L/G
 *    than the design's gives less than the design recovery.
 */
import type { DesignSummary } from '../contract.ts'
import type { CostBreakdown } from '../costing/costDesign.ts'

/** One month of the operating log, in SI (the service converts the logged kmol/h). */
export interface OperatingEntryInput {
  month: string // YYYY-MM-01
  gasFlow: number // mol/s
  solventFlow: number // mol/s
  outletMoleFraction?: number | null
  recovery?: number | null
  powerKw?: number | null
}

export interface TrackingContext {
  /** The approved design's summary in SI (a stored run's goes through summaryToSI). */
  design: DesignSummary
  /** The approved design priced with the basis in force for the month. */
  designCost: CostBreakdown
  inletMoleFraction: number // y_in of the design case
  soluteMolarMass: number // kg/mol
  operatingHoursPerYear: number
  prices: { electricity: number; solvent: number; product: number; emission: number } // per kWh, per m³, per kg, per kg
}

export interface TrackingFlag {
  code: 'gasAboveDesign' | 'solventBelowDesign' | 'floodingRisk' | 'weepingRisk' | 'solventBelowMinimum' | 'recoveryBelowTarget' | 'noRecoveryMeasured'
  severity: 'warn' | 'fail'
  message: string
}

export interface MonthResult {
  month: string
  hours: number
  throughputRatio: number
  recovery: number | null
  actual: { solvent: number; electricity: number; lostProduct: number; emission: number; capital: number; total: number }
  design: { solvent: number; electricity: number; lostProduct: number; emission: number; capital: number; total: number }
  gap: number // actual − design
  soluteLostKg: number
  percentFloodEstimate: number
  flags: TrackingFlag[]
}

const SECONDS_PER_HOUR = 3600

export function daysInMonth(month: string): number {
  const [y, m] = month.split('-').map(Number) as [number, number]
  return new Date(Date.UTC(y, m, 0)).getUTCDate()
}

/** Recovery from inlet and outlet gas mole fractions (solute-free basis). */
export function recoveryFromOutlet(yIn: number, yOut: number): number {
  const Yin = yIn / (1 - yIn)
  const Yout = yOut / (1 - yOut)
  return 1 - Yout / Yin
}

export function priceMonth(e: OperatingEntryInput, ctx: TrackingContext): MonthResult {
  const d = ctx.design
  const days = daysInMonth(e.month)
  const hours = days * 24 * (ctx.operatingHoursPerYear / 8760)
  const yearFraction = hours / ctx.operatingHoursPerYear
  const phi = e.gasFlow / d.gasFlow
  const solventRatio = e.solventFlow / d.solventFlow

  let recovery: number | null = null
  if (e.recovery !== null && e.recovery !== undefined) recovery = e.recovery
  else if (e.outletMoleFraction !== null && e.outletMoleFraction !== undefined) recovery = recoveryFromOutlet(ctx.inletMoleFraction, e.outletMoleFraction)

  const seconds = hours * SECONDS_PER_HOUR
  const m3PerMol = d.solventVolumetricFlow / d.solventFlow
  const solventM3 = e.solventFlow * m3PerMol * seconds
  const c = ctx.designCost
  const designPumpKw = c.power.pumpElectric / 1000
  const designBlowerKw = c.power.blowerElectric / 1000
  const kw = e.powerKw ?? designPumpKw * solventRatio + designBlowerKw * phi
  const soluteIn = e.gasFlow * ctx.inletMoleFraction * ctx.soluteMolarMass // kg/s
  // Without a measurement the design recovery is assumed, and flagged.
  const r = recovery ?? d.recovery
  const lostKg = soluteIn * (1 - r) * seconds
  const capital = (c.annualisedCapital * days) / 365

  const actual = {
    solvent: solventM3 * ctx.prices.solvent,
    electricity: kw * hours * ctx.prices.electricity,
    lostProduct: lostKg * ctx.prices.product,
    emission: lostKg * ctx.prices.emission,
    capital,
    total: 0,
  }
  actual.total = actual.solvent + actual.electricity + actual.lostProduct + actual.emission + actual.capital

  const scale = phi * yearFraction
  const design = {
    solvent: c.annual.solvent * scale,
    electricity: (c.annual.pumpElectricity + c.annual.blowerElectricity) * scale,
    lostProduct: c.annual.lostProduct * scale,
    emission: c.annual.emissionCharge * scale,
    capital,
    total: 0,
  }
  design.total = design.solvent + design.electricity + design.lostProduct + design.emission + design.capital

  const flags: TrackingFlag[] = []
  // A relative margin of 1e-6 keeps a month logged at exactly the design numbers unflagged.
  if (phi > 1 + 1e-6) flags.push({ code: 'gasAboveDesign', severity: 'warn', message: `Gas flow ${(phi * 100).toFixed(0)} % of design: above the flow the column was designed for.` })
  const lgDesign = d.solventFlow / d.gasFlow
  const solventNeeded = lgDesign * e.gasFlow
  if (e.solventFlow < solventNeeded * (1 - 1e-6)) {
    flags.push({
      code: 'solventBelowDesign',
      severity: 'warn',
      message: `Solvent flow ${((e.solventFlow / solventNeeded) * 100).toFixed(0)} % of what the design needs for its ${(d.recovery * 100).toFixed(1)} % recovery at this gas flow (solvent-to-gas ratio ${(e.solventFlow / e.gasFlow).toFixed(3)}, design ${lgDesign.toFixed(3)}).`,
    })
  }
  const pf = d.percentFlood * phi
  if (pf >= 100) flags.push({ code: 'floodingRisk', severity: 'fail', message: `Gas rate ${(phi * 100).toFixed(0)} % of design puts the trays at about ${pf.toFixed(0)} % of flood.` })
  else if (pf > 90) flags.push({ code: 'floodingRisk', severity: 'warn', message: `Gas rate ${(phi * 100).toFixed(0)} % of design puts the trays at about ${pf.toFixed(0)} % of flood.` })
  if (phi < 0.6) flags.push({ code: 'weepingRisk', severity: 'warn', message: `Gas rate only ${(phi * 100).toFixed(0)} % of design: below the usual turndown, trays may weep.` })
  const lgActual = e.solventFlow / e.gasFlow
  const lgMin = d.minimumSolventFlow / d.gasFlow
  if (lgActual < lgMin) flags.push({ code: 'solventBelowMinimum', severity: 'fail', message: `Solvent-to-gas ratio ${lgActual.toFixed(3)} is below the minimum ${lgMin.toFixed(3)} for the design recovery.` })
  if (recovery === null) flags.push({ code: 'noRecoveryMeasured', severity: 'warn', message: 'No outlet measurement: the design recovery was assumed.' })
  else if (recovery < d.recovery - 1e-4) flags.push({ code: 'recoveryBelowTarget', severity: 'warn', message: `Recovery ${(recovery * 100).toFixed(2)} % is below the design ${(d.recovery * 100).toFixed(2)} %.` })

  return {
    month: e.month,
    hours,
    throughputRatio: phi,
    recovery,
    actual,
    design,
    gap: actual.total - design.total,
    soluteLostKg: lostKg,
    percentFloodEstimate: pf,
    flags,
  }
}
