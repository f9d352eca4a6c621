/**
 * The design engine: one case in SI -> a DesignResult. An orchestrator of the topic modules in
 * column/:
 *   equilibrium at column T, P (column/equilibrium.ts) -> balances: targets on a solute-free
 *   basis, method choice, minimum solvent from the exact pinch, solvent at L/Lmin, ideal stages
 *   (column/balances.ts) -> overall efficiency and actual trays -> diameter from Fair flooding at
 *   both column ends with the spacing rule and Fair's validity as data (column/sizing.ts) -> tray
 *   state at the selected diameter (column/trays.ts) -> checks with limits as data
 *   (column/checks.ts) -> height -> the one vessel model (vessel/shell.ts) -> profile
 *   (column/profile.ts).
 *
 * Hot path: no zod, no mathjs, no I/O; few allocations. Pass { profile: false, detail: false }
 * for the leanest result (optimiser).
 */
import { summaryInSI, type DesignResult, type DesignSummary, type DesignVariables, type EngineIssue, type EngineWarning } from './contract.ts'
import type { CaseSI } from './case.ts'
import type { ReferenceKey } from './references.ts'
import { InfeasibleDesignError } from './errors.ts'
import { actualTrays, efficiencyOConnell, efficiencyOConnellWarnings, efficiencyWithEntrainment } from './efficiency/oconnell.ts'
import { memoLast4 } from './numerics/memo.ts'
import { VESSEL_CAUTION, vesselShell } from './vessel/shell.ts'
import { equilibriumCurveOf } from './column/equilibrium.ts'
import { KREMSER_STRAIGHTNESS_TOLERANCE, lastStageConvention, recoveryWithStages, solveBalances } from './column/balances.ts'
import { endStreams, sizeColumn } from './column/sizing.ts'
import { trayState } from './column/trays.ts'
import { trayChecks } from './column/checks.ts'
import { buildProfile } from './column/profile.ts'
import { guardFinite } from './column/guard.ts'
import { detailChecksum, type DesignDetail } from './column/detail.ts'
import { quantityToken } from './words.ts'

export { equilibriumCurveOf } from './column/equilibrium.ts'

export interface DesignOptions {
  /** Build profile.stages / equilibriumCurve / operatingLine (default true). */
  profile?: boolean
  /** Build the detail section (default true). */
  detail?: boolean
}

/** Reference keys (server/engine/references.ts) of the methods a design uses. */
export const DESIGN_REFERENCES: readonly ReferenceKey[] = Object.freeze<ReferenceKey[]>([
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
  'liebson1957',
  'colburn1936',
  'ludwig1997',
  'iupac2021',
  'commonPractice',
])

/** O'Connell efficiency of the last (K, M, mu, rho): with a constant K it is the same for every design of a case. */
const oconnellOf = memoLast4((K, M, mu, rho) => efficiencyOConnell(K, M, mu, rho))

function overallEfficiency(c: CaseSI, Kmean: number, warnings: EngineWarning[]): number {
  if (c.efficiency.model === 'fixed') return c.efficiency.value
  const s = c.solvent
  efficiencyOConnellWarnings(Kmean, s.molarMass, s.viscosity, s.density, warnings, 'efficiency')
  return oconnellOf(Kmean, s.molarMass, s.viscosity, s.density)
}

function checkVariables(recovery: number, solventFactor: number, floodFraction: number, spacingIn: number | 'auto', actualTraysVar: number | undefined): void {
  const issues: EngineIssue[] = []
  if (!(recovery > 0 && recovery < 1)) issues.push({ path: 'recovery', code: 'recoveryOutOfRange', message: `Recovery must be between 0 and 1 (exclusive); got ${recovery}` })
  if (!(solventFactor > 1)) issues.push({ path: 'solventFactor', code: 'belowMinimumSolvent', message: `The solvent factor L/Lmin must be above 1 (at 1 the column needs infinitely many stages); got ${solventFactor}` })
  if (!(floodFraction > 0 && floodFraction < 1)) issues.push({ path: 'tray.floodFraction', code: 'floodFractionOutOfRange', message: `The design fraction of flood must be between 0 and 1; got ${floodFraction}` })
  if (spacingIn !== 'auto' && !(spacingIn > 0)) issues.push({ path: 'tray.spacing', code: 'invalidSpacing', message: `Tray spacing must be positive; got ${spacingIn}` })
  if (actualTraysVar !== undefined && !(actualTraysVar >= 1 && Number.isInteger(actualTraysVar))) {
    issues.push({ path: 'actualTrays', code: 'invalidTrayCount', message: `The tray count must be a positive integer; got ${actualTraysVar}` })
  }
  if (issues.length) throw new InfeasibleDesignError(issues)
}

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
  checkVariables(recovery, solventFactor, floodFraction, spacingIn, vars?.actualTrays)

  // ---- equilibrium and balances
  const eqb = equilibriumCurveOf(c, warnings)
  const eq = eqb.curve
  const b = solveBalances(c, eq, eqb.K0, recovery, solventFactor, wantProfile, warnings)

  // ---- efficiency and trays
  const rhoL = c.solvent.density
  const Kmean = 0.5 * (b.Ktop + b.Kbot)
  const Eo = overallEfficiency(c, Kmean, warnings)
  const traysRequired = actualTrays(b.N, Eo)
  let trays = traysRequired
  let achievedRecovery = recovery
  if (vars?.actualTrays !== undefined) {
    if (vars.actualTrays < traysRequired) {
      throw new InfeasibleDesignError([{ path: 'actualTrays', code: 'tooFewTrays', message: `${vars.actualTrays} trays are fewer than the ${traysRequired} needed for recovery ${recovery}` }])
    }
    trays = vars.actualTrays
    achievedRecovery = recoveryWithStages(eq, b, eqb.K0, trays * Eo, recovery)
  }

  // ---- sizing and tray state
  const { bot, top, leanMass } = endStreams(c, b)
  const sz = sizeColumn(c, bot, top, spacingIn, floodFraction, warnings)
  const t = sz.t
  const ts = trayState(c, sz, bot, top, warnings, wantDetail)
  const checks = trayChecks(ts)
  const hBot = ts.bottom
  const hTop = ts.top
  const sD = sz.designEndIsBottom ? sz.sBot : sz.sTop
  const streamsD = sz.designEndIsBottom ? bot : top
  const fractionFloodAchieved = Math.max(hBot.fractionFlood, hTop.fractionFlood)
  const dPtray = Math.max(hBot.dP, hTop.dP)
  const dPcol = trays * 0.5 * (hBot.dP + hTop.dP)
  const psi = Math.max(hBot.psi, hTop.psi)

  // ---- height and vessel
  const Dsel = sz.Dsel
  const height = trays * t + c.column.topAllowance + c.column.bottomAllowance
  const ves = vesselShell(c.vessel, Dsel, height)
  if (!ves.thinWallValid) {
    warnings.push({ code: 'outsideValidity', message: 'The thin-wall shell formula is outside its validity (design pressure above 0.385 S E, or a wall above half the radius): use the thick-wall formulas', path: 'vessel.designPressure' })
  }
  if (height / Dsel > 30) warnings.push({ code: 'slenderColumn', message: `Height/diameter = ${(height / Dsel).toFixed(1)} above 30 (common practice limit); check wind load or split the column`, path: 'tray.spacing' })
  if (height > 53) warnings.push({ code: 'tallColumn', message: `Column height ${quantityToken('length', height)} above about ${quantityToken('length', 53)} (common practice limit)`, path: 'tray.spacing' })

  const Ms = c.solute.molarMass
  // SI like everything in the engine; the edges give the public answer its kmol/h and kg/h
  // (shared/summaryUnits.ts)
  const summary: DesignSummary = summaryInSI({
    minimumSolventFlow: b.Lmin0,
    solventFlow: b.L0,
    absorptionFactor: b.A,
    theoreticalStages: b.N,
    actualTrays: trays,
    outletGasSoluteMoleFraction: b.y1,
    richSolventSoluteMoleFraction: b.xN,
    gasDensity: streamsD.rhoV,
    flowParameter: sD.FLV,
    capacityFactor: sD.C,
    floodingVelocity: sD.vF,
    downcomerAreaFraction: ts.geometry.AdAt,
    holeAreaFraction: sz.AhAa,
    traySpacing: t,
    diameter: sz.Dcalc,
    selectedDiameter: Dsel,
    pressureDropPerTray: dPtray,
    columnPressureDrop: dPcol,
    columnHeight: height,
    recovery,
    solventFactor,
    floodFraction,
    gasFlow: b.V,
    gasVolumetricFlow: bot.Q,
    solventMassFlow: leanMass,
    solventVolumetricFlow: leanMass / rhoL,
    soluteInGas: b.V * b.yIn * Ms,
    soluteAbsorbed: b.absorbed * Ms,
    soluteLost: b.Vp * b.Y1 * Ms,
    operatingPressure: c.gas.pressure,
    designPressure: c.vessel.designPressure,
    shellThickness: ves.thickness,
    shellMass: ves.mass,
    percentFlood: 100 * fractionFloodAchieved,
    fractionOfFloodTarget: floodFraction,
    overallEfficiency: Eo,
    achievedRecovery,
  })

  const detail: DesignDetail | null = wantDetail
    ? {
        units: 'SI (molar flows in detail: mol/s)',
        references: DESIGN_REFERENCES,
        equilibrium: { model: c.equilibrium.model, temperature: c.columnTemperature, pressure: c.gas.pressure, K0: eqb.K0, Ktop: b.Ktop, Kbottom: b.Kbot, xStarBottom: b.xStarN, parameters: eqb.info },
        balances: {
          method: b.method,
          methodNote: b.choice.note,
          straightness: b.choice.straightness,
          straightnessTolerance: KREMSER_STRAIGHTNESS_TOLERANCE,
          inletGas: b.V,
          outletGas: b.V1,
          leanSolvent: b.L0,
          richSolvent: b.LN,
          solventFreeGas: b.Vp,
          solventFreeSolvent: b.Lp,
          minimumSolventSlope: b.pinch.slope,
          operatingSlope: b.slope,
          pinchX: b.pinch.Xpinch / (1 + b.pinch.Xpinch),
          tangentPinch: b.pinch.tangent,
          absorptionFactorTop: b.Atop,
          absorptionFactorBottom: b.Abot,
          soluteAbsorbed: b.absorbed,
          theoreticalStages: b.N,
          lastStageFraction: b.lastStageFraction,
          lastStageConvention,
        },
        efficiency: {
          model: c.efficiency.model,
          overallEfficiency: Eo,
          Kmean,
          traysRequired,
          trays,
          // information: Colburn's entrainment correction with the worst-end psi (efficiency/oconnell.ts,
          // colburn1936); not used for the tray count
          entrainmentCorrectedEfficiency: efficiencyWithEntrainment(Eo, psi),
        },
        hydraulics: {
          designEnd: sz.designEndIsBottom ? 'bottom' : 'top',
          spacingIterations: sz.spacingIterations,
          fractionOfFloodTarget: floodFraction,
          fractionOfFloodAchieved: fractionFloodAchieved,
          surfaceTensionFactor: sz.FST,
          foamingFactor: sz.FF,
          holeAreaFactor: sz.FHA,
          orificeCoefficient: ts.geometry.Co,
          activeArea: ts.geometry.Aa,
          holeArea: ts.geometry.Ah,
          downcomerArea: ts.geometry.Ad,
          towerArea: ts.geometry.At,
          netArea: ts.geometry.An,
          weirLength: ts.geometry.Lw,
          bottom: { streams: bot, sizing: sz.sBot, tray: hBot },
          top: { streams: top, sizing: sz.sTop, tray: hTop },
          turndown: { fraction: ts.turndownFraction, tray: ts.turndown! },
          // cross-check: hole velocity below which the tray weeps (Treybal eq. 6.46); 0 when the gas viscosity is unknown
          weepHoleVelocityTreybal: ts.weepV,
          liquidFlowDistance: ts.Zflow,
        },
        vessel: { designPressure: c.vessel.designPressure, thicknessCalculated: ves.thicknessCalculated, thicknessMinimum: ves.thicknessMinimum, thickness: ves.thickness, mass: ves.mass, height },
      }
    : null

  const result: DesignResult = {
    summary,
    checks,
    warnings,
    cautions: [VESSEL_CAUTION, ...c.cautions],
    profile: buildProfile(eq, b, wantProfile),
    detail: detail ?? {},
  }
  guardFinite(result, detail ? detailChecksum(detail) : 0)
  return result
}
