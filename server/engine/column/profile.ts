/**
 * The stage profile and the operating diagram's curves: the stages exactly as counted (the last
 * one with the fraction counted), the equilibrium curve and the operating line.
 */
import type { DesignResult, StageProfilePoint } from '../contract.ts'
import type { EquilibriumCurve } from '../equilibrium/models.ts'
import { LAST_STAGE_CONVENTION } from '../balances/stageByStage.ts'
import type { Balances } from './balances.ts'

export function buildProfile(eq: EquilibriumCurve, b: Balances, want: boolean): DesignResult['profile'] {
  const stages: StageProfilePoint[] = []
  const equilibriumCurve: { x: number; y: number }[] = []
  const operatingLine: { x: number; y: number }[] = []
  if (want) {
    if (b.stepping) {
      for (let i = 0; i < b.stepping.x.length; i++) stages.push({ stage: i + 1, x: b.stepping.x[i]!, y: b.stepping.y[i]! })
    } else {
      // Kremser: the ideal-stage compositions from the straight operating line
      const nSt = Math.min(Math.ceil(b.N), 500)
      let y = b.y1
      const LV = (b.L0 + b.LN) / (b.V1 + b.V) // mean L/V
      for (let i = 0; i < nSt; i++) {
        const x = eq.x(y)
        stages.push({ stage: i + 1, x, y })
        y = b.y1 + LV * (x - b.x0)
      }
    }
    const xEnd = Math.max(b.xN, b.xStarN) * 1.1
    for (let i = 0; i <= 20; i++) {
      const x = (xEnd * i) / 20
      equilibriumCurve.push({ x, y: eq.y(x) })
    }
    for (let i = 0; i <= 10; i++) {
      const X = b.X0 + ((b.XN - b.X0) * i) / 10
      const Y = b.Y1 + b.slope * (X - b.X0)
      operatingLine.push({ x: X / (1 + X), y: Y / (1 + Y) })
    }
  }
  return {
    method: b.method,
    methodNote: b.choice.note,
    theoreticalStages: b.N,
    lastStageFraction: b.lastStageFraction,
    lastStageConvention: LAST_STAGE_CONVENTION,
    stages,
    equilibriumCurve,
    operatingLine,
  }
}
