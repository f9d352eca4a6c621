/**
 * Column sizing: streams at the two ends, Fair flooding diameter at both ends, the tray spacing
 * (fixed, or from the spacing rule iterated with the diameter), and the validity of the Fair
 * correlation as data, checked once per design.
 *
 * Source: fair1961 via treybal1980 ch. 6 / benitez2009 ch. 4 (capacity, diameter, A_d/A_t);
 * spacing rule treybal1980 Table 6.1.
 */
import type { CaseSI } from '../case.ts'
import type { EngineWarning } from '../contract.ts'
import { InfeasibleDesignError } from '../errors.ts'
import { densityIdealGas } from '../properties/gas.ts'
import { cite } from '../references.ts'
import {
  capacityFactorFair,
  capacityFactorFairWarnings,
  diameterFromFlooding,
  downcomerAreaFraction,
  floodingVelocity,
  flowParameter,
  holeAreaFactor,
  holeAreaFractionTriangular,
  spacingFromRule,
  surfaceTensionFactor,
} from '../hydraulics/flooding.ts'
import type { Balances } from './balances.ts'
import { memoLast1 } from '../numerics/memo.ts'
import { quantityToken } from '../words.ts'

const surfaceTensionFactorOf = memoLast1(surfaceTensionFactor)

export interface EndStreams {
  gasMol: number // mol/s
  gasMass: number // kg/s
  rhoV: number // kg/m3
  Q: number // m3/s
  liqMass: number // kg/s
  qL: number // m3/s
}

export interface EndSizing {
  FLV: number
  CF: number
  C: number
  vF: number
  AdAt: number
  D: number
}

/** Validity of the Fair flooding correlation, as data (fair1961 as quoted by Perry; treybal1980). */
export const FAIR_VALIDITY = {
  /** largest hole diameter [m] */
  holeDiameterMax: { value: 0.013, unit: 'm', source: cite`${'fair1961'} (holes up to 13 mm)` },
  /** largest weir height as a fraction of the tray spacing [-] */
  weirToSpacingMax: { value: 0.15, unit: '-', source: cite`${'fair1961'} (weir below 15 % of the spacing)` },
} as const

/** The Fair validity notes for a tray at spacing t, once per design whatever the spacing mode. */
export function fairValidityWarnings(holeDiameter: number, weirHeight: number, t: number, warnings: EngineWarning[]): void {
  const hMax = FAIR_VALIDITY.holeDiameterMax.value
  if (holeDiameter > hMax) {
    warnings.push({ code: 'outsideValidity', message: `Fair flooding correlation: hole diameter ${(holeDiameter * 1000).toFixed(1)} mm is above its ${hMax * 1000} mm limit; the flooding capacity is extrapolated`, path: 'tray.holeDiameter' })
  }
  const wMax = FAIR_VALIDITY.weirToSpacingMax.value
  if (weirHeight > wMax * t) {
    warnings.push({ code: 'outsideValidity', message: `Fair flooding correlation: weir height ${(weirHeight * 1000).toFixed(0)} mm is above ${wMax * 100} % of the ${(t * 1000).toFixed(0)} mm tray spacing; the flooding capacity is extrapolated`, path: 'tray.weirHeight' })
  }
}

/** Streams at the bottom (inlet gas, rich liquid) and the top (outlet gas, lean liquid). */
export function endStreams(c: CaseSI, b: Balances): { bot: EndStreams; top: EndStreams; leanMass: number } {
  const P = c.gas.pressure
  const Ms = c.solute.molarMass
  const Mc = c.gas.carrierMolarMass
  const Mv = c.solvent.molarMass
  const rhoL = c.solvent.density
  const MGbot = b.yIn * Ms + (1 - b.yIn) * Mc
  const MGtop = b.y1 * Ms + (1 - b.y1) * Mc
  const rhoVbot = densityIdealGas(P, MGbot, c.gas.temperature)
  const rhoVtop = densityIdealGas(P, MGtop, c.columnTemperature)
  if (!(rhoL > rhoVbot && rhoL > rhoVtop)) {
    throw new InfeasibleDesignError([{ path: 'solvent.density', code: 'flooding', message: 'The liquid is not denser than the gas: no counter-current flow is possible' }])
  }
  const leanMass = b.Lp * Mv + b.Lp * b.X0 * Ms
  const richMass = leanMass + b.absorbed * Ms
  const bot: EndStreams = { gasMol: b.V, gasMass: b.V * MGbot, rhoV: rhoVbot, Q: (b.V * MGbot) / rhoVbot, liqMass: richMass, qL: richMass / rhoL }
  const top: EndStreams = { gasMol: b.V1, gasMass: b.V1 * MGtop, rhoV: rhoVtop, Q: (b.V1 * MGtop) / rhoVtop, liqMass: leanMass, qL: leanMass / rhoL }
  return { bot, top, leanMass }
}

function sizeEnd(s: EndStreams, t: number, rhoL: number, FST: number, FF: number, FHA: number, f: number, out: EndSizing): void {
  const FLV = flowParameter(s.liqMass, s.gasMass, s.rhoV, rhoL)
  const CF = capacityFactorFair(t, FLV)
  const C = CF * FST * FF * FHA
  const vF = C > 0 ? floodingVelocity(C, rhoL, s.rhoV) : 0
  const AdAt = downcomerAreaFraction(FLV)
  out.FLV = FLV
  out.CF = CF
  out.C = C
  out.vF = vF
  out.AdAt = AdAt
  out.D = vF > 0 ? diameterFromFlooding(s.Q, f, vF, AdAt) : Infinity
}

export interface Sizing {
  t: number
  Dcalc: number
  Dsel: number
  sBot: EndSizing
  sTop: EndSizing
  designEndIsBottom: boolean
  spacingIterations: number
  FST: number
  FF: number
  FHA: number
  AhAa: number
}

function roundUp(D: number, step: number): number {
  return Math.ceil(D / step - 1e-9) * step
}

/**
 * Diameter from Fair flooding at both ends at the design fraction of flood; spacing fixed or
 * from the rule (iterated with the diameter).
 * @throws InfeasibleDesignError when no diameter satisfies the flooding limit
 */
export function sizeColumn(c: CaseSI, bot: EndStreams, top: EndStreams, spacingIn: number | 'auto', floodFraction: number, warnings: EngineWarning[]): Sizing {
  const tr = c.tray
  const rhoL = c.solvent.density
  const AhAa = holeAreaFractionTriangular(tr.holeDiameter, tr.holePitch)
  const FST = surfaceTensionFactorOf(c.solvent.surfaceTension)
  const FF = tr.foamingFactor
  const FHA = holeAreaFactor(AhAa, warnings, 'tray.holePitch')
  const step = c.column.diameterStep
  const sBot: EndSizing = { FLV: 0, CF: 0, C: 0, vF: 0, AdAt: 0, D: 0 }
  const sTop: EndSizing = { FLV: 0, CF: 0, C: 0, vF: 0, AdAt: 0, D: 0 }
  let t: number
  let spacingIterations = 0
  let sizedAt = NaN // the spacing sBot and sTop hold
  if (spacingIn === 'auto') {
    const rule = tr.spacingRule
    t = rule[0]!.spacing
    let tPrev = NaN
    for (;;) {
      spacingIterations++
      sizeEnd(bot, t, rhoL, FST, FF, FHA, floodFraction, sBot)
      sizeEnd(top, t, rhoL, FST, FF, FHA, floodFraction, sTop)
      sizedAt = t
      const D = Math.max(sBot.D, sTop.D)
      if (!Number.isFinite(D)) break
      const tNew = spacingFromRule(rule, roundUp(D, step))
      if (tNew === t) break
      if (tNew === tPrev || spacingIterations >= 20) {
        // oscillation between two spacings: take the larger and warn
        const lo = Math.min(t, tNew)
        t = Math.max(t, tNew)
        warnings.push({ code: 'spacingOscillation', message: `Tray spacing and diameter did not settle (oscillating between ${quantityToken('smallLength', lo)} and ${quantityToken('smallLength', t)}); the larger spacing ${quantityToken('smallLength', t)} is used`, path: 'tray.spacing' })
        break
      }
      tPrev = t
      t = tNew
    }
  } else {
    t = spacingIn
  }
  fairValidityWarnings(tr.holeDiameter, tr.weirHeight, t, warnings)
  if (t !== sizedAt) {
    sizeEnd(bot, t, rhoL, FST, FF, FHA, floodFraction, sBot)
    sizeEnd(top, t, rhoL, FST, FF, FHA, floodFraction, sTop)
  }
  const designEndIsBottom = sBot.D >= sTop.D
  const sD = designEndIsBottom ? sBot : sTop
  // warnings of the correlations, once, at the design end
  capacityFactorFairWarnings(t, sD.FLV, warnings, 'flowParameter')
  const Dcalc = sD.D
  if (!(sD.C > 0) || !Number.isFinite(Dcalc)) {
    throw new InfeasibleDesignError([
      { path: 'tray.spacing', code: 'flooding', message: `No diameter satisfies the flooding limit: the capacity factor is ${sD.C.toFixed(4)} m/s at flow parameter ${sD.FLV.toFixed(3)} and spacing ${t} m (too much liquid for the gas); use a larger spacing or less solvent` },
    ])
  }
  const Dsel = roundUp(Dcalc, step)
  if (spacingIn === 'auto' && Dsel > tr.spacingRule[tr.spacingRule.length - 1]!.maxDiameter) {
    warnings.push({ code: 'spacingRuleExceeded', message: `Diameter ${quantityToken('length', Dsel)} is beyond the spacing rule; its last row is used`, path: 'tray.spacingRule' })
  }
  if (Dsel > 8) warnings.push({ code: 'largeDiameter', message: `Diameter ${quantityToken('length', Dsel)} is beyond common tray-column practice (${quantityToken('length', 8)}); consider parallel columns`, path: 'gas.flow' })
  return { t, Dcalc, Dsel, sBot, sTop, designEndIsBottom, spacingIterations, FST, FF, FHA, AhAa }
}
