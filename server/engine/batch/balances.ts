/**
 * Many designs at once (grids, Monte Carlo, sweeps): the material balance of the design, that is
 * minimum solvent, solvent, absorption factor and ideal stages, for whole arrays of cases with a
 * straight equilibrium line y = K x, by the dilute Kremser method or stage by stage on the
 * solute-free basis. Structure of arrays (Float64Array in, Float64Array out), one loop, no
 * allocation per case in the Kremser path; each case does exactly the arithmetic of the scalar
 * design (designSI), so the answers are the same numbers (tests/engine/batch-balances.spec.ts).
 *
 * Equations: solute-free ratios X = x/(1-x), Y = y/(1-y); L'min/V' = (Y_in - Y_1)/(X*_N - X_0)
 * at the rich-end pinch (Kremser) or the general pinch (stage by stage); L' = f L'min;
 * Kremser: N = ln[((y_in - K x0)/(y_1 - K x0))(1 - 1/A) + 1/A] / ln A with A from the geometric
 * mean of the ends. Units: SI, flows in mol/s in and out (as the design summary).
 * Validity: straight equilibrium line; Kremser for dilute gas (y_in <= 0.05).
 * Source: kremser1930; benitez2009 ch. 5; treybal1980 ch. 8 (solute-free basis).
 * Example: designBalancesBatch({ gasFlow: [116.67], yIn: [0.015], x0: [0], K: [0.62],
 *   recovery: [0.985], solventFactor: [1.35] }, 'kremser') gives 10.15 ideal stages.
 */
import type { EquilibriumCurve } from '../equilibrium/models.ts'
import { stagesKremser } from '../balances/kremser.ts'
import { minimumSlope } from '../balances/minimumSolvent.ts'
import { stepStages } from '../balances/stageByStage.ts'

/** Why a case has no answer (0: it has one). The codes are the scalar design's issue codes. */
export const BATCH_STATUS = ['ok', 'invalidInput', 'leanSolventLoaded', 'equilibriumOutOfRange', 'noPinch', 'richAboveEquilibrium', 'pinch', 'tooManyStages'] as const
export type BatchStatus = (typeof BATCH_STATUS)[number]
const S = Object.fromEntries(BATCH_STATUS.map((s, i) => [s, i])) as Record<BatchStatus, number>

type NumArray = Float64Array | readonly number[]

export interface BalanceBatchInput {
  /** Gas flow [mol/s]. */
  gasFlow: NumArray
  /** Inlet gas solute mole fraction [-]. */
  yIn: NumArray
  /** Lean solvent solute mole fraction [-]. */
  x0: NumArray
  /** Equilibrium ratio K = y/x [-]. */
  K: NumArray
  /** Fraction of the solute absorbed [-], 0 < r < 1. */
  recovery: NumArray
  /** Solvent over minimum solvent [-], > 1. */
  solventFactor: NumArray
}

export interface BalanceBatchOutput {
  /** Minimum lean solvent [mol/s]. */
  minimumSolventFlow: Float64Array
  /** Lean solvent [mol/s]. */
  solventFlow: Float64Array
  /** Absorption factor, geometric mean of the ends [-]. */
  absorptionFactor: Float64Array
  /** Ideal stages [-]. */
  theoreticalStages: Float64Array
  /** Outlet gas solute mole fraction [-]. */
  outletGasSoluteMoleFraction: Float64Array
  /** Rich solvent solute mole fraction [-]. */
  richSolventSoluteMoleFraction: Float64Array
  /** 0 when the case has an answer, else the index into BATCH_STATUS (the outputs are 0). */
  status: Uint8Array
}

const MAX_STAGES = 2000

/** y = K x with K changed case by case (one object for the whole batch). */
class StraightLine implements EquilibriumCurve {
  readonly linear = true
  K0 = 1
  readonly xMax = 1
  y(x: number): number {
    return this.K0 * x
  }
  x(y: number): number {
    return y / this.K0
  }
}

/** Output arrays for n cases. */
export function balanceBatchOutput(n: number): BalanceBatchOutput {
  return {
    minimumSolventFlow: new Float64Array(n),
    solventFlow: new Float64Array(n),
    absorptionFactor: new Float64Array(n),
    theoreticalStages: new Float64Array(n),
    outletGasSoluteMoleFraction: new Float64Array(n),
    richSolventSoluteMoleFraction: new Float64Array(n),
    status: new Uint8Array(n),
  }
}

/** Material balances of n cases; `out` may be reused between calls. */
export function designBalancesBatch(input: BalanceBatchInput, method: 'kremser' | 'stageByStage', out?: BalanceBatchOutput): BalanceBatchOutput {
  const n = input.gasFlow.length
  for (const k of ['yIn', 'x0', 'K', 'recovery', 'solventFactor'] as const) {
    if (input[k].length !== n) throw new RangeError(`${k} has ${input[k].length} values, gasFlow ${n}`)
  }
  const o = out && out.status.length >= n ? out : balanceBatchOutput(n)
  const eq = new StraightLine()
  const { gasFlow, yIn: yInA, x0: x0A, K: KA, recovery: rA, solventFactor: fA } = input
  for (let i = 0; i < n; i++) {
    const V = gasFlow[i]!
    const yIn = yInA[i]!
    const x0 = x0A[i]!
    const K = KA[i]!
    const recovery = rA[i]!
    const solventFactor = fA[i]!
    let status = 0
    // the same checks, in the same order, as the scalar design
    if (!(recovery > 0 && recovery < 1) || !(solventFactor > 1) || !(V > 0) || !(K > 0) || !(yIn > 0 && yIn < 1) || !(x0 >= 0 && x0 < 1)) status = S.invalidInput
    let Lmin0 = 0, L0 = 0, A = 0, N = 0, y1 = 0, xN = 0
    if (status === 0) {
      eq.K0 = K
      const Vp = V * (1 - yIn)
      const YIn = yIn / (1 - yIn)
      const Y1 = (1 - recovery) * YIn
      y1 = Y1 / (1 + Y1)
      const X0 = x0 / (1 - x0)
      const yEqLean = K * x0
      const xStarN = yIn / K
      if (y1 <= yEqLean) status = S.leanSolventLoaded
      else if (!(xStarN > 0 && xStarN < 0.99) || Math.abs(K * xStarN - yIn) > 1e-7 * yIn) status = S.equilibriumOutOfRange
      else {
        const sMin = minimumSlope(eq, Y1, X0, YIn).slope // the exact solute-free pinch (end or tangent), whatever the method
        if (!(sMin > 0) || !Number.isFinite(sMin)) status = S.noPinch
        else {
          const LpMin = sMin * Vp
          const slope = solventFactor * sMin
          const Lp = slope * Vp
          L0 = Lp * (1 + X0)
          Lmin0 = LpMin * (1 + X0)
          const XN = X0 + (YIn - Y1) / slope
          xN = XN / (1 + XN)
          const XstarN = xStarN / (1 - xStarN)
          if (XN > XstarN * (1 + 1e-9)) status = S.richAboveEquilibrium
          else {
            const LN = Lp * (1 + XN)
            const V1 = Vp * (1 + Y1)
            const Ktop = x0 > 0 ? yEqLean / x0 : K
            const Kbot = (K * xN) / xN
            A = Math.sqrt((L0 / (Ktop * V1)) * (LN / (Kbot * V)))
            if (method === 'kremser') {
              const Ak = Math.sqrt((L0 / (K * V1)) * (LN / (K * V)))
              N = stagesKremser(yIn, y1, K * x0, Ak)
              if (!Number.isFinite(N)) status = S.pinch
            } else {
              const r = stepStages(eq, true, Y1, X0, YIn, slope, MAX_STAGES, null)
              if (!r) status = S.tooManyStages
              else N = r.N
            }
            if (N < 1e-6) N = 1e-6
          }
        }
      }
    }
    if (status !== 0) Lmin0 = L0 = A = N = y1 = xN = 0
    o.status[i] = status
    o.minimumSolventFlow[i] = Lmin0
    o.solventFlow[i] = L0
    o.absorptionFactor[i] = A
    o.theoreticalStages[i] = N
    o.outletGasSoluteMoleFraction[i] = y1
    o.richSolventSoluteMoleFraction[i] = xN
  }
  return o
}
