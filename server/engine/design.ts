/**
 * The design engine: one case in SI -> a DesignResult.
 *
 * Hot path: no zod, no mathjs, no I/O; few allocations (the profile and the result
 * object). Pass { profile: false, detail: false } for the leanest result (optimiser).
 *
 * Sequence: equilibrium at column T, P -> targets on a solute-free basis -> minimum
 * solvent (pinch) and solvent at L/Lmin -> ideal stages (Kremser or stage-by-stage) ->
 * overall efficiency and actual trays -> diameter from Fair flooding at both column
 * ends (spacing from the rule, iterated) -> tray checks -> height -> preliminary shell.
 */
import type { CheckResult, DesignResult, DesignSummary, DesignVariables, EngineIssue, EngineWarning, StageProfilePoint } from './contract.ts'
import type { CaseSI } from './case.ts'
import { InfeasibleDesignError } from './errors.ts'
import { densityIdealGas } from './properties/gas.ts'
import { vapourPressureAntoine } from './properties/vapourPressure.ts'
import { G_ACC } from './properties/constants.ts'
import {
  LinearEquilibrium,
  MargulesRaoultEquilibrium,
  TableEquilibrium,
  henryAtT,
  kFromHenry,
  type EquilibriumCurve,
} from './equilibrium/models.ts'
import { fractionAbsorbedKremser, stagesKremser } from './balances/kremser.ts'
import { eqXofY, eqYofX, stepStages, type SteppingResult } from './balances/stageByStage.ts'
import { minimumSlopeEndPinch, minimumSlopeGeneral } from './balances/minimumSolvent.ts'
import { actualTrays, efficiencyOConnell } from './efficiency/oconnell.ts'
import {
  capacityFactorFair,
  diameterFromFlooding,
  downcomerAreaFraction,
  floodingVelocity,
  flowParameter,
  holeAreaFactor,
  holeAreaFractionTriangular,
  spacingFromRule,
  surfaceTensionFactor,
} from './hydraulics/flooding.ts'
import {
  WEEP_FROUDE_LIMIT,
  clearLiquidHeight,
  downcomerEntranceLoss,
  dryTrayHead,
  entrainmentBenitez,
  frothDensity,
  holeFroudeNumber,
  orificeCoefficient,
  residualHead,
  weirCrestFrancis,
  weirLengthRatio,
  weepVelocityTreybal,
} from './hydraulics/tray.ts'
import { VESSEL_CAUTION, minimumThickness, shellMass, shellThicknessThinWall } from './vessel/shell.ts'

export interface DesignOptions {
  /** Build profile.stages / equilibriumCurve / operatingLine (default true). */
  profile?: boolean
  /** Build the detail section (default true). */
  detail?: boolean
}

/** Reference keys (server/engine/references.ts) of the methods a design uses. */
export const DESIGN_REFERENCES: readonly string[] = Object.freeze([
  'codata2018',
  'iapwsR176',
  'kell1975',
  'iapws2008viscosity',
  'sander2015',
  'kremser1930',
  'benitez2009',
  'treybal1980',
  'fair1961',
  'bennett1983',
  'oconnell1946',
  'seaderHenley2011',
  'sinnott2005',
  'asmeVIII1',
  'fritschCarlson1980',
  'commonPractice',
])

/** Inlet solute mole fraction above which 'auto' uses stage-by-stage (common practice). */
export const CONCENTRATED_GAS_LIMIT = 0.05
const MAX_STAGES = 2000
const KMOLH = 3.6 // mol/s -> kmol/h

// ------------------------------------------------------------------ equilibrium

const tableCache = new WeakMap<object, TableEquilibrium>()

/** Build the equilibrium curve of a case at its column temperature and pressure. */
export function equilibriumCurveOf(c: CaseSI, warnings?: EngineWarning[]): { curve: EquilibriumCurve; K0: number; info: Record<string, number | string> | null } {
  const e = c.equilibrium
  const T = c.columnTemperature
  const P = c.gas.pressure
  switch (e.model) {
    case 'constantK':
      return { curve: new LinearEquilibrium(e.K), K0: e.K, info: null }
    case 'henry': {
      const H = henryAtT(e.Hcp, e.B, T, warnings, 'column.temperature')
      const cw = c.solvent.density / c.solvent.molarMass
      const K = kFromHenry(H, cw, P)
      return { curve: new LinearEquilibrium(K), K0: K, info: warnings ? { HcpAtT: H, solventMolarDensity: cw, K } : null }
    }
    case 'modifiedRaoult': {
      const Psat = e.vapourPressure ?? vapourPressureAntoine(e.antoine!, T, warnings, 'equilibrium.antoine')
      const k = Psat / P
      const K0 = e.gammaInf * k
      const curve = e.activityModel === 'margules' ? new MargulesRaoultEquilibrium(e.gammaInf, k) : new LinearEquilibrium(K0)
      return { curve, K0, info: warnings ? { vapourPressure: Psat, gammaInf: e.gammaInf, K0 } : null }
    }
    case 'table': {
      let t = tableCache.get(e)
      if (!t) {
        t = new TableEquilibrium(e.x, e.y)
        tableCache.set(e, t)
      }
      return { curve: t, K0: t.K0, info: null }
    }
  }
}

// ------------------------------------------------------------------ hydraulics

interface EndStreams {
  gasMol: number // mol/s
  gasMass: number // kg/s
  rhoV: number
  Q: number // m3/s
  liqMass: number // kg/s
  qL: number // m3/s
}

interface EndSizing {
  FLV: number
  CF: number
  C: number
  vF: number
  AdAt: number
  D: number
}

function sizeEnd(s: EndStreams, t: number, rhoL: number, FST: number, FF: number, FHA: number, f: number, warnings: EngineWarning[] | undefined, out: EndSizing): void {
  const FLV = flowParameter(s.liqMass, s.gasMass, s.rhoV, rhoL)
  const CF = capacityFactorFair(t, FLV, warnings, 'flowParameter')
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

interface TrayHydraulics {
  vo: number
  va: number
  Ks: number
  phiE: number
  hL: number
  hd: number
  hSigma: number
  ht: number
  dP: number
  Fr: number
  entrainment: number // kg liquid / kg gas
  psi: number // fractional entrainment e/(L+e)
  how: number
  h2: number
  backup: number
  backupLimit: number
  residence: number
  fractionFlood: number
}

function trayHydraulics(
  s: EndStreams,
  sz: EndSizing,
  t: number,
  rhoL: number,
  sigma: number,
  Aa: number,
  Ah: number,
  AhAa: number,
  An: number,
  Ad: number,
  Lw: number,
  c: CaseSI,
  Co: number,
): TrayHydraulics {
  const tr = c.tray
  const vo = s.Q / Ah
  const va = s.Q / Aa
  const Ks = va * Math.sqrt(s.rhoV / (rhoL - s.rhoV))
  const phiE = frothDensity(Ks)
  const hL = clearLiquidHeight(phiE, tr.weirHeight, s.qL, Lw)
  const hd = dryTrayHead(vo, Co, s.rhoV, rhoL, AhAa)
  const hSigma = residualHead(sigma, rhoL, tr.holeDiameter)
  const ht = hd + hL + hSigma
  const dP = ht * G_ACC * rhoL
  const Fr = holeFroudeNumber(s.rhoV, vo, rhoL, hL)
  const E = entrainmentBenitez(hL, tr.holeDiameter, phiE, Ks, AhAa, t, rhoL, s.rhoV)
  const eMass = E * s.gasMass
  const psi = eMass / (s.liqMass + eMass)
  const how = weirCrestFrancis(s.qL, Lw)
  const Ada = Math.min(Lw * tr.downcomerClearance, Ad)
  const h2 = downcomerEntranceLoss(s.qL, Ada)
  const backup = tr.weirHeight + how + ht + h2
  const backupLimit = 0.5 * (t + tr.weirHeight)
  const residence = (Ad * backup) / s.qL
  const fractionFlood = s.Q / An / sz.vF
  return { vo, va, Ks, phiE, hL, hd, hSigma, ht, dP, Fr, entrainment: E, psi, how, h2, backup, backupLimit, residence, fractionFlood }
}

// ------------------------------------------------------------------ main

/**
 * Design one absorber.
 * @param c the case in SI (from normaliseCase)
 * @param vars optimiser overrides: recovery, solventFactor, traySpacing [m], floodFraction, actualTrays
 * @throws InfeasibleDesignError with structured issues
 */
export function designSI(c: CaseSI, vars?: Partial<DesignVariables>, opts?: DesignOptions): DesignResult {
  const wantProfile = opts?.profile !== false
  const wantDetail = opts?.detail !== false
  const warnings: EngineWarning[] = c.warnings.length ? c.warnings.slice() : []

  const recovery = vars?.recovery ?? c.recovery
  const solventFactor = vars?.solventFactor ?? c.solventFactor
  const floodFraction = vars?.floodFraction ?? c.tray.floodFraction
  const spacingIn = vars?.traySpacing ?? c.tray.spacing

  const issues: EngineIssue[] = []
  if (!(recovery > 0 && recovery < 1)) issues.push({ path: 'recovery', code: 'recoveryOutOfRange', message: `Recovery must be between 0 and 1 (exclusive); got ${recovery}` })
  if (!(solventFactor > 1)) issues.push({ path: 'solventFactor', code: 'belowMinimumSolvent', message: `The solvent factor L/Lmin must be above 1 (at 1 the column needs infinitely many stages); got ${solventFactor}` })
  if (!(floodFraction > 0 && floodFraction < 1)) issues.push({ path: 'tray.floodFraction', code: 'floodFractionOutOfRange', message: `The design fraction of flood must be between 0 and 1; got ${floodFraction}` })
  if (spacingIn !== 'auto' && !(spacingIn > 0)) issues.push({ path: 'tray.spacing', code: 'invalidSpacing', message: `Tray spacing must be positive; got ${spacingIn}` })
  if (vars?.actualTrays !== undefined && !(vars.actualTrays >= 1 && Number.isInteger(vars.actualTrays))) {
    issues.push({ path: 'actualTrays', code: 'invalidTrayCount', message: `The tray count must be a positive integer; got ${vars.actualTrays}` })
  }
  if (issues.length) throw new InfeasibleDesignError(issues)

  // ---- equilibrium
  const T = c.columnTemperature
  const P = c.gas.pressure
  const eqb = equilibriumCurveOf(c, warnings)
  const eq = eqb.curve

  // ---- targets, solute-free basis
  const V = c.gas.flow
  const yIn = c.gas.soluteMoleFraction
  const Vp = V * (1 - yIn)
  const YIn = yIn / (1 - yIn)
  const Y1 = (1 - recovery) * YIn
  const y1 = Y1 / (1 + Y1)
  const x0 = c.solvent.soluteMoleFraction
  const X0 = x0 / (1 - x0)
  const yEqLean = eq.y(x0)
  if (y1 <= yEqLean) {
    throw new InfeasibleDesignError([
      {
        path: 'solvent.soluteMoleFraction',
        code: 'leanSolventLoaded',
        message: `The lean solvent is already too loaded: the target outlet gas y = ${y1.toExponential(4)} is at or below the gas in equilibrium with the lean solvent (K x0 = ${yEqLean.toExponential(4)}); lower the recovery or use cleaner solvent`,
      },
    ])
  }
  const xStarN = eq.x(yIn)
  if (!(xStarN > 0 && xStarN < 0.99) || Math.abs(eq.y(xStarN) - yIn) > 1e-7 * yIn) {
    throw new InfeasibleDesignError([
      { path: 'equilibrium', code: 'equilibriumOutOfRange', message: `No liquid is in equilibrium with the inlet gas (y = ${yIn}): the model gives x* = ${xStarN.toPrecision(4)}; the gas may be above its dew point or the equilibrium model does not apply at this composition` },
    ])
  }
  if (xStarN > eq.xMax) {
    warnings.push({ code: 'equilibriumExtrapolated', message: `The equilibrium table ends at x = ${eq.xMax}; it is extrapolated linearly to x* = ${xStarN.toFixed(5)} in equilibrium with the inlet gas`, path: 'equilibrium.points' })
  }

  // ---- method
  let method: 'kremser' | 'stageByStage'
  if (c.method === 'auto') {
    method = !eq.linear || yIn > CONCENTRATED_GAS_LIMIT ? 'stageByStage' : 'kremser'
  } else method = c.method
  if (method === 'kremser' && (!eq.linear || yIn > CONCENTRATED_GAS_LIMIT)) {
    warnings.push({
      code: 'kremserOutsideValidity',
      message: !eq.linear ? 'Kremser used with a curved equilibrium line: the dilute K (slope at x = 0) is used; stage-by-stage is recommended' : `Kremser used with inlet solute mole fraction ${yIn} above ${CONCENTRATED_GAS_LIMIT} (concentrated gas); stage-by-stage is recommended`,
      path: 'method',
    })
  }

  // ---- minimum solvent and solvent
  const pinch = method === 'kremser' ? minimumSlopeEndPinch(eq, Y1, X0, YIn) : minimumSlopeGeneral(eq, Y1, X0, YIn)
  if (!(pinch.slope > 0) || !Number.isFinite(pinch.slope)) {
    throw new InfeasibleDesignError([{ path: 'equilibrium', code: 'noPinch', message: 'No minimum solvent rate could be found for this equilibrium and target' }])
  }
  const LpMin = pinch.slope * Vp
  const slope = solventFactor * pinch.slope
  const Lp = slope * Vp // solute-free solvent, mol/s
  const L0 = Lp * (1 + X0) // lean solvent incl. its solute
  const Lmin0 = LpMin * (1 + X0)
  const XN = X0 + (YIn - Y1) / slope
  const xN = XN / (1 + XN)
  const XstarN = xStarN / (1 - xStarN)
  if (XN > XstarN * (1 + 1e-9)) {
    throw new InfeasibleDesignError([{ path: 'solventFactor', code: 'richAboveEquilibrium', message: `The rich solvent (x = ${xN.toExponential(4)}) would be above equilibrium with the inlet gas (x* = ${xStarN.toExponential(4)}); use more solvent` }])
  }
  const LN = Lp * (1 + XN)
  const V1 = Vp * (1 + Y1)
  const absorbed = Vp * (YIn - Y1) // mol/s

  // absorption factor (reported): geometric mean of the ends, secant K at each end
  const Ktop = x0 > 0 ? yEqLean / x0 : eqb.K0
  const Kbot = eq.y(xN) / xN
  const Atop = L0 / (Ktop * V1)
  const Abot = LN / (Kbot * V)
  const A = Math.sqrt(Atop * Abot)

  // ---- ideal stages
  let N: number
  let stepRes: SteppingResult | null = null
  if (method === 'kremser') {
    const K = eqb.K0
    const Ak = Math.sqrt((L0 / (K * V1)) * (LN / (K * V)))
    N = stagesKremser(yIn, y1, K * x0, Ak)
    if (!Number.isFinite(N)) {
      const hint = !eq.linear || yIn > CONCENTRATED_GAS_LIMIT ? '; the Kremser equation does not hold for this concentrated or curved case: use "method": "stageByStage"' : ''
      throw new InfeasibleDesignError([{ path: 'solventFactor', code: 'pinch', message: `The target cannot be reached with this solvent rate: the Kremser absorption factor ${Ak.toFixed(4)} is too small for the recovery${hint}` }])
    }
  } else {
    stepRes = stepStages(eq, true, Y1, X0, YIn, slope, MAX_STAGES, wantProfile ? { N: 0, steps: 0, x: [], y: [] } : null)
    if (!stepRes) {
      throw new InfeasibleDesignError([{ path: 'solventFactor', code: 'tooManyStages', message: `More than ${MAX_STAGES} ideal stages are needed (operating line pinches the equilibrium curve); raise the solvent factor or lower the recovery` }])
    }
    N = stepRes.N
  }
  if (N < 1e-6) N = 1e-6

  // ---- efficiency and trays
  const rhoL = c.solvent.density
  const muL = c.solvent.viscosity
  const sigma = c.solvent.surfaceTension
  let Eo: number
  const Kmean = 0.5 * (Ktop + Kbot)
  if (c.efficiency.model === 'fixed') Eo = c.efficiency.value
  else Eo = efficiencyOConnell(Kmean, c.solvent.molarMass, muL, rhoL, warnings, 'efficiency')
  const traysRequired = actualTrays(N, Eo)
  let trays = traysRequired
  let achievedRecovery = recovery
  if (vars?.actualTrays !== undefined) {
    if (vars.actualTrays < traysRequired) {
      throw new InfeasibleDesignError([{ path: 'actualTrays', code: 'tooFewTrays', message: `${vars.actualTrays} trays are fewer than the ${traysRequired} needed for recovery ${recovery}` }])
    }
    trays = vars.actualTrays
    achievedRecovery = recoveryWithStages(eq, method, eqb.K0, V, Vp, yIn, YIn, X0, x0, Lp, trays * Eo, recovery)
  }

  // ---- streams at the two ends
  const Ms = c.solute.molarMass
  const Mc = c.gas.carrierMolarMass
  const Mv = c.solvent.molarMass
  const MGbot = yIn * Ms + (1 - yIn) * Mc
  const MGtop = y1 * Ms + (1 - y1) * Mc
  const rhoVbot = densityIdealGas(P, MGbot, c.gas.temperature)
  const rhoVtop = densityIdealGas(P, MGtop, T)
  if (!(rhoL > rhoVbot && rhoL > rhoVtop)) {
    throw new InfeasibleDesignError([{ path: 'solvent.density', code: 'flooding', message: 'The liquid is not denser than the gas: no counter-current flow is possible' }])
  }
  const leanMass = Lp * Mv + Lp * X0 * Ms
  const richMass = leanMass + absorbed * Ms
  const bot: EndStreams = { gasMol: V, gasMass: V * MGbot, rhoV: rhoVbot, Q: (V * MGbot) / rhoVbot, liqMass: richMass, qL: richMass / rhoL }
  const top: EndStreams = { gasMol: V1, gasMass: V1 * MGtop, rhoV: rhoVtop, Q: (V1 * MGtop) / rhoVtop, liqMass: leanMass, qL: leanMass / rhoL }

  // ---- diameter (Fair), spacing iteration
  const tr = c.tray
  const AhAa = holeAreaFractionTriangular(tr.holeDiameter, tr.holePitch)
  const FST = surfaceTensionFactor(sigma)
  const FF = tr.foamingFactor
  const FHA = holeAreaFactor(AhAa, warnings, 'tray.holePitch')
  const step = c.column.diameterStep
  const sBot: EndSizing = { FLV: 0, CF: 0, C: 0, vF: 0, AdAt: 0, D: 0 }
  const sTop: EndSizing = { FLV: 0, CF: 0, C: 0, vF: 0, AdAt: 0, D: 0 }
  let t: number
  let Dcalc: number
  let spacingIterations = 0
  if (spacingIn === 'auto') {
    const rule = tr.spacingRule
    t = rule[0]!.spacing
    let tPrev = NaN
    for (;;) {
      spacingIterations++
      sizeEnd(bot, t, rhoL, FST, FF, FHA, floodFraction, undefined, sBot)
      sizeEnd(top, t, rhoL, FST, FF, FHA, floodFraction, undefined, sTop)
      Dcalc = Math.max(sBot.D, sTop.D)
      if (!Number.isFinite(Dcalc)) break
      const Dsel = roundUp(Dcalc, step)
  // validity of the Fair correlation (Perry / Fair): holes <= 13 mm, weir < 15 % of spacing
  if (tr.holeDiameter > 0.013) warnings.push({ code: 'outsideValidity', message: `Fair flooding correlation: hole diameter ${(tr.holeDiameter * 1000).toFixed(1)} mm above its 13 mm limit`, path: 'tray.holeDiameter' })
  if (tr.weirHeight > 0.15 * t) warnings.push({ code: 'outsideValidity', message: `Fair flooding correlation: weir height ${(tr.weirHeight * 1000).toFixed(0)} mm above 15 % of the tray spacing`, path: 'tray.weirHeight' })
      const tNew = spacingFromRule(rule, Dsel)
      if (tNew === t) break
      if (tNew === tPrev || spacingIterations >= 20) {
        // oscillation between two spacings: take the larger and warn
        const lo = Math.min(t, tNew)
        t = Math.max(t, tNew)
        warnings.push({ code: 'spacingOscillation', message: `Tray spacing and diameter did not settle (oscillating between ${lo} and ${t} m); the larger spacing ${t} m is used`, path: 'tray.spacing' })
        break
      }
      tPrev = t
      t = tNew
    }
  } else {
    t = spacingIn
  }
  sizeEnd(bot, t, rhoL, FST, FF, FHA, floodFraction, undefined, sBot)
  sizeEnd(top, t, rhoL, FST, FF, FHA, floodFraction, undefined, sTop)
  const designEndIsBottom = sBot.D >= sTop.D
  const sD = designEndIsBottom ? sBot : sTop
  const streamsD = designEndIsBottom ? bot : top
  // warnings of the correlations, once, at the design end
  sizeEnd(streamsD, t, rhoL, FST, FF, FHA, floodFraction, warnings, sD)
  Dcalc = sD.D
  if (!(sD.C > 0) || !Number.isFinite(Dcalc)) {
    throw new InfeasibleDesignError([
      { path: 'tray.spacing', code: 'flooding', message: `No diameter satisfies the flooding limit: the capacity factor is ${sD.C.toFixed(4)} m/s at flow parameter ${sD.FLV.toFixed(3)} and spacing ${t} m (too much liquid for the gas); use a larger spacing or less solvent` },
    ])
  }
  const Dsel = roundUp(Dcalc, step)
  if (spacingIn === 'auto' && Dsel > tr.spacingRule[tr.spacingRule.length - 1]!.maxDiameter) {
    warnings.push({ code: 'spacingRuleExceeded', message: `Diameter ${Dsel.toFixed(2)} m is beyond the spacing rule; its last row is used`, path: 'tray.spacingRule' })
  }
  if (Dsel > 8) warnings.push({ code: 'largeDiameter', message: `Diameter ${Dsel.toFixed(2)} m is beyond common tray-column practice (8 m); consider parallel columns`, path: 'gas.flow' })

  // ---- tray geometry at the selected diameter
  const AdAt = Math.max(sBot.AdAt, sTop.AdAt)
  const At = 0.25 * Math.PI * Dsel * Dsel
  const Ad = AdAt * At
  const An = At - Ad
  const Aa = At - 2 * Ad
  const Ah = AhAa * Aa
  const Lw = weirLengthRatio(AdAt) * Dsel
  const Co = orificeCoefficient(tr.holeDiameter, tr.thickness)
  if (tr.holeDiameter / tr.thickness < 1) warnings.push({ code: 'outsideValidity', message: 'Orifice coefficient: hole diameter / plate thickness below 1 (outside the chart)', path: 'tray.thickness' })
  const hBot = trayHydraulics(bot, sBot, t, rhoL, sigma, Aa, Ah, AhAa, An, Ad, Lw, c, Co)
  const hTop = trayHydraulics(top, sTop, t, rhoL, sigma, Aa, Ah, AhAa, An, Ad, Lw, c, Co)
  const hD = designEndIsBottom ? hBot : hTop
  // turndown: the lowest gas rate at design liquid rate, at the end that weeps first
  const tdf = tr.turndownFraction
  const sLow = hTop.Fr <= hBot.Fr ? top : bot
  const turn: EndStreams = { gasMol: sLow.gasMol * tdf, gasMass: sLow.gasMass * tdf, rhoV: sLow.rhoV, Q: sLow.Q * tdf, liqMass: sLow.liqMass, qL: sLow.qL }
  // second weeping method (Treybal eq. 6.46), when the gas viscosity is known
  const lwRatio = Lw / Dsel
  const Zflow = Dsel * Math.sqrt(1 - lwRatio * lwRatio)
  const weepV = c.gas.viscosity ? weepVelocityTreybal(c.gas.viscosity, sigma, top.rhoV, rhoL, tr.holeDiameter, tr.thickness, Aa, tr.holePitch, Zflow) : 0
  const hTurn = trayHydraulics(turn, hTop.Fr <= hBot.Fr ? sTop : sBot, t, rhoL, sigma, Aa, Ah, AhAa, An, Ad, Lw, c, Co)

  // ---- checks (worst end for each)
  const dPtray = Math.max(hBot.dP, hTop.dP)
  const dPcol = trays * 0.5 * (hBot.dP + hTop.dP)
  const Fr = Math.min(hBot.Fr, hTop.Fr)
  const psi = Math.max(hBot.psi, hTop.psi)
  const backupRatio = Math.max(hBot.backup / hBot.backupLimit, hTop.backup / hTop.backupLimit)
  const hB = hBot.backup / hBot.backupLimit >= hTop.backup / hTop.backupLimit ? hBot : hTop
  const residence = Math.min(hBot.residence, hTop.residence)
  const fracFlood = Math.max(hBot.fractionFlood, hTop.fractionFlood)
  const checks: CheckResult[] = [
    {
      key: 'flooding',
      source: 'Fair flooding correlation (fair1961 via treybal1980 / benitez2009); 85 % limit: commonPractice',
      label: 'Percent of flood',
      status: fracFlood < 0.85 ? 'pass' : fracFlood < 1 ? 'warn' : 'fail',
      value: 100 * fracFlood,
      limit: 85,
      unit: '%',
      advice: fracFlood < 0.85 ? undefined : 'Increase the diameter or the tray spacing, or lower the gas load',
    },
    {
      key: 'pressureDropPerTray',
      source: 'dry tray (Liebson orifice fit) + clear liquid (bennett1983) + residual head, benitez2009 ch. 4; 1000 Pa limit: commonPractice',
      label: 'Pressure drop per tray',
      status: dPtray <= 1000 ? 'pass' : dPtray <= 1500 ? 'warn' : 'fail',
      value: dPtray,
      limit: 1000,
      unit: 'Pa',
      advice: dPtray <= 1000 ? undefined : 'Increase the hole area (larger holes or smaller pitch) or lower the weir',
    },
    {
      key: 'weeping',
      source: 'hole Froude number >= 0.5, benitez2009 ch. 4 (Illus. 4.8)',
      label: 'Weeping (hole Froude number)',
      status: Fr >= WEEP_FROUDE_LIMIT ? 'pass' : Fr >= 0.8 * WEEP_FROUDE_LIMIT ? 'warn' : 'fail',
      value: Fr,
      limit: WEEP_FROUDE_LIMIT,
      unit: '-',
      advice: Fr >= WEEP_FROUDE_LIMIT ? undefined : 'Reduce the hole area (smaller holes, larger pitch, blanking) or the weir height',
    },
    {
      key: 'entrainment',
      source: 'fractional entrainment from benitez2009 eqs 4.45-4.47; 0.10 limit: commonPractice',
      label: 'Fractional entrainment',
      status: psi <= 0.1 ? 'pass' : psi <= 0.15 ? 'warn' : 'fail',
      value: psi,
      limit: 0.1,
      unit: '-',
      advice: psi <= 0.1 ? undefined : 'Lower the fraction of flood or increase the tray spacing',
    },
    {
      key: 'turndown',
      source: 'hole Froude number >= 0.5 (benitez2009) at the turndown gas rate; turndown fraction: commonPractice',
      label: `Weeping at turndown (${Math.round(100 * tdf)} % of design gas)`,
      status: hTurn.Fr >= WEEP_FROUDE_LIMIT ? 'pass' : 'warn',
      value: hTurn.Fr,
      limit: WEEP_FROUDE_LIMIT,
      unit: '-',
      advice: hTurn.Fr >= WEEP_FROUDE_LIMIT ? undefined : 'The trays may weep at the lowest gas rate: reduce the hole area or accept a smaller turndown range',
    },
    {
      key: 'downcomerBackup',
      source: 'backup = weir + crest (Francis, sinnott2005) + tray head + apron loss (treybal1980); limit (t + hw)/2, sinnott2005',
      label: 'Downcomer backup',
      status: backupRatio <= 0.9 ? 'pass' : backupRatio <= 1 ? 'warn' : 'fail',
      value: hB.backup,
      limit: hB.backupLimit,
      unit: 'm',
      advice: backupRatio <= 0.9 ? undefined : 'Increase the tray spacing or the downcomer clearance, or reduce the tray pressure drop',
    },
    {
      key: 'downcomerResidence',
      source: 'residence = A_d h_backup / q_L, sinnott2005; >= 3 s: commonPractice',
      label: 'Downcomer residence time',
      status: residence >= 3 ? 'pass' : residence >= 2 ? 'warn' : 'fail',
      value: residence,
      limit: 3,
      unit: 's',
      advice: residence >= 3 ? undefined : 'Increase the downcomer area',
    },
  ]

  // ---- height and vessel
  const height = trays * t + c.column.topAllowance + c.column.bottomAllowance
  const ves = c.vessel
  const R = 0.5 * Dsel
  const Pd = ves.designPressure
  const tCalc = shellThicknessThinWall(Pd, R, ves.allowableStress, ves.jointEfficiency, ves.corrosionAllowance)
  const tMin = minimumThickness(ves.minimumThickness, Dsel)
  const tShell = tCalc > tMin ? tCalc : tMin
  if (Pd > 0.385 * ves.allowableStress * ves.jointEfficiency || tCalc - ves.corrosionAllowance > 0.5 * R) {
    warnings.push({ code: 'outsideValidity', message: 'Thin-wall shell formula outside its validity (P > 0.385 S E or t > R/2): use the thick-wall formulas', path: 'vessel.designPressure' })
  }
  const mShell = shellMass(Dsel, height, tShell, ves.materialDensity)
  if (height / Dsel > 30) warnings.push({ code: 'slenderColumn', message: `Height/diameter = ${(height / Dsel).toFixed(1)} above 30 (common practice limit); check wind load or split the column`, path: 'tray.spacing' })
  if (height > 53) warnings.push({ code: 'tallColumn', message: `Column height ${height.toFixed(1)} m above about 53 m (175 ft, common practice limit)`, path: 'tray.spacing' })

  const cautions = [VESSEL_CAUTION, ...c.cautions]

  // ---- summary
  const summary: DesignSummary = {
    minimumSolventFlow: Lmin0 * KMOLH,
    solventFlow: L0 * KMOLH,
    absorptionFactor: A,
    theoreticalStages: N,
    actualTrays: trays,
    outletGasSoluteMoleFraction: y1,
    richSolventSoluteMoleFraction: xN,
    gasDensity: streamsD.rhoV,
    flowParameter: sD.FLV,
    capacityFactor: sD.C,
    floodingVelocity: sD.vF,
    downcomerAreaFraction: AdAt,
    holeAreaFraction: AhAa,
    traySpacing: t,
    diameter: Dcalc,
    selectedDiameter: Dsel,
    pressureDropPerTray: dPtray,
    columnPressureDrop: dPcol,
    columnHeight: height,
    recovery,
    solventFactor,
    floodFraction,
    gasFlow: V * KMOLH,
    gasVolumetricFlow: bot.Q,
    solventMassFlow: leanMass * 3600,
    solventVolumetricFlow: (leanMass / rhoL) * 3600,
    soluteInGas: V * yIn * Ms * 3600,
    soluteAbsorbed: absorbed * Ms * 3600,
    soluteLost: Vp * Y1 * Ms * 3600,
    operatingPressure: P,
    designPressure: Pd,
    shellThickness: tShell,
    shellMass: mShell,
    percentFlood: 100 * hD.fractionFlood,
    overallEfficiency: Eo,
    achievedRecovery,

  }

  // ---- profile
  const stages: StageProfilePoint[] = []
  const equilibriumCurve: { x: number; y: number }[] = []
  const operatingLine: { x: number; y: number }[] = []
  if (wantProfile) {
    if (stepRes) {
      for (let i = 0; i < stepRes.x.length; i++) stages.push({ stage: i + 1, x: stepRes.x[i]!, y: stepRes.y[i]! })
    } else {
      // Kremser: the ideal-stage compositions from the straight operating line
      const nSt = Math.min(Math.ceil(N), 500)
      let y = y1
      const LV = (L0 + LN) / (V1 + V) // mean L/V
      for (let i = 0; i < nSt; i++) {
        const x = eq.x(y)
        stages.push({ stage: i + 1, x, y })
        y = y1 + LV * (x - x0)
      }
    }
    const xEnd = Math.max(xN, xStarN) * 1.1
    for (let i = 0; i <= 20; i++) {
      const x = (xEnd * i) / 20
      equilibriumCurve.push({ x, y: eq.y(x) })
    }
    for (let i = 0; i <= 10; i++) {
      const X = X0 + ((XN - X0) * i) / 10
      const Y = Y1 + slope * (X - X0)
      operatingLine.push({ x: X / (1 + X), y: Y / (1 + Y) })
    }
  }

  const result: DesignResult = {
    summary,
    checks,
    warnings,
    cautions,
    profile: { method, stages, equilibriumCurve, operatingLine },
    detail: wantDetail
      ? {
          units: 'SI (molar flows in detail: mol/s)',
          references: DESIGN_REFERENCES,
          equilibrium: { model: c.equilibrium.model, temperature: T, pressure: P, K0: eqb.K0, Ktop, Kbottom: Kbot, xStarBottom: xStarN, parameters: eqb.info },
          balances: {
            method,
            inletGas: V,
            outletGas: V1,
            leanSolvent: L0,
            richSolvent: LN,
            solventFreeGas: Vp,
            solventFreeSolvent: Lp,
            minimumSolventSlope: pinch.slope,
            operatingSlope: slope,
            pinchX: pinch.Xpinch / (1 + pinch.Xpinch),
            tangentPinch: pinch.tangent,
            absorptionFactorTop: Atop,
            absorptionFactorBottom: Abot,
            soluteAbsorbed: absorbed,
          },
          efficiency: {
            model: c.efficiency.model,
            overallEfficiency: Eo,
            Kmean,
            traysRequired,
            trays,
            // information: Colburn's entrainment correction E_a = E/(1 + E psi/(1 - psi)) with the worst-end psi
            // (Ludwig p. 200; applied to the overall efficiency as an approximation); not used for the tray count
            entrainmentCorrectedEfficiency: Eo / (1 + (Eo * psi) / (1 - psi)),
          },
          hydraulics: {
            designEnd: designEndIsBottom ? 'bottom' : 'top',
            spacingIterations,
            surfaceTensionFactor: FST,
            foamingFactor: FF,
            holeAreaFactor: FHA,
            orificeCoefficient: Co,
            activeArea: Aa,
            holeArea: Ah,
            downcomerArea: Ad,
            towerArea: At,
            netArea: An,
            weirLength: Lw,
            bottom: { streams: bot, sizing: sBot, tray: hBot },
            top: { streams: top, sizing: sTop, tray: hTop },
            turndown: { fraction: tdf, tray: hTurn },
            // cross-check: hole velocity below which the tray weeps (Treybal eq. 6.46); 0 when the gas viscosity is unknown
            weepHoleVelocityTreybal: weepV,
            liquidFlowDistance: Zflow,
          },
          vessel: { designPressure: Pd, thicknessCalculated: tCalc, thicknessMinimum: tMin, thickness: tShell, mass: mShell, height },
        }
      : {},
  }
  const detailChecksum = wantDetail
    ? sumStreams(bot) + sumStreams(top) + sumSizing(sBot) + sumSizing(sTop) + sumTray(hBot) + sumTray(hTop) + sumTray(hTurn) + Atop + Abot + Kbot + Ktop + tCalc + pinch.Xpinch + infoSum(eqb.info) + weepV
    : 0
  guardFinite(result, detailChecksum)
  return result
}

/** Recovery reached with a given number of ideal stages at the fixed solvent rate. */
function recoveryWithStages(
  eq: EquilibriumCurve,
  method: 'kremser' | 'stageByStage',
  K: number,
  V: number,
  Vp: number,
  yIn: number,
  YIn: number,
  X0: number,
  x0: number,
  Lp: number,
  Navail: number,
  rTarget: number,
): number {
  const s = Lp / Vp
  if (method === 'kremser') {
    // absorption factor at the design point is kept (dilute)
    const A = (Lp * (1 + X0)) / (K * V)
    const f = fractionAbsorbedKremser(A, Navail)
    const y1 = yIn - f * (yIn - K * x0)
    const Y1 = y1 / (1 - y1)
    return Math.max(rTarget, 1 - Y1 / YIn)
  }
  // bisection on the outlet Y1 (more stages -> lower Y1), operating slope fixed
  let lo = eqYofX(eq, X0) // can't go below the lean-solvent equilibrium
  let hi = (1 - rTarget) * YIn
  for (let i = 0; i < 50; i++) {
    const mid = 0.5 * (lo + hi)
    const XN = X0 + (YIn - mid) / s
    const feasible = XN <= eqXofY(eq, YIn)
    const r = feasible ? stepStages(eq, true, mid, X0, YIn, s, MAX_STAGES, null) : null
    if (r && r.N <= Navail) hi = mid
    else lo = mid
  }
  return Math.max(rTarget, 1 - hi / YIn)
}

function roundUp(D: number, step: number): number {
  return Math.ceil(D / step - 1e-9) * step
}

/** No NaN or Infinity leaves the engine. */
function guardFinite(r: DesignResult, detailChecksum: number): void {
  const s = r.summary as unknown as Record<string, unknown>
  for (const k in s) {
    const v = s[k]
    if (typeof v === 'number' && !Number.isFinite(v)) throw nonFinite(`summary.${k}`)
  }
  for (let i = 0; i < r.checks.length; i++) {
    const ch = r.checks[i]!
    if (!Number.isFinite(ch.value) || !Number.isFinite(ch.limit)) throw nonFinite(`checks.${ch.key}`)
  }
  const st = r.profile.stages
  for (let i = 0; i < st.length; i++) if (!Number.isFinite(st[i]!.x) || !Number.isFinite(st[i]!.y)) throw nonFinite('profile.stages')
  if (!Number.isFinite(detailChecksum)) {
    // slow path, only when something in the detail is not finite: replace it by null
    const d = r.detail as Record<string, unknown>
    for (const k in d) scrub(d[k])
  }
}

function infoSum(info: Record<string, number | string> | null): number {
  let s = 0
  if (info) for (const k in info) if (typeof info[k] === 'number') s += info[k] as number
  return s
}

function sumStreams(s: EndStreams): number {
  return s.gasMol + s.gasMass + s.rhoV + s.Q + s.liqMass + s.qL
}
function sumSizing(s: EndSizing): number {
  return s.FLV + s.CF + s.C + s.vF + s.AdAt + s.D
}
function sumTray(h: TrayHydraulics): number {
  return (
    h.vo + h.va + h.Ks + h.phiE + h.hL + h.hd + h.hSigma + h.ht + h.dP + h.Fr + h.entrainment + h.psi + h.how + h.h2 + h.backup + h.backupLimit + h.residence + h.fractionFlood
  )
}

function scrub(o: unknown): void {
  if (o === null || typeof o !== 'object') return
  const rec = o as Record<string, unknown>
  for (const k in rec) {
    const v = rec[k]
    if (typeof v === 'number') {
      if (!Number.isFinite(v)) rec[k] = null
    } else if (v && typeof v === 'object') scrub(v)
  }
}

function nonFinite(where: string): InfeasibleDesignError {
  return new InfeasibleDesignError([{ path: where, code: 'numericalFailure', message: `The calculation produced a non-finite number at ${where}; the inputs are probably far outside the correlations' ranges` }])
}
