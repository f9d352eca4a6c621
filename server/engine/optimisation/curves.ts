/** Cost curves: TAC against one variable, the others held at the optimum. */
import type { CostBasisData } from '../../../shared/schemas/costBasis.ts'
import { toU, type CurvePoint, type Evaluator, type X } from './evaluator.ts'

/** TAC vs one variable, the others held at the optimum. */
export function curve(ev: Evaluator, basis: CostBasisData, at: X, key: 'u' | 's', values: number[]): CurvePoint[] {
  return values.map((v) => {
    const x = { ...at, [key]: key === 'u' ? toU(v) : v }
    const e = ev.evaluate(x, basis)
    if (!e.feasible || !e.cost || !e.design) {
      return { x: v, feasible: false, tac: null, breakdown: null, actualTrays: null, selectedDiameter: null, reason: e.reason ?? 'infeasible' }
    }
    return {
      x: v,
      feasible: true,
      tac: e.tac,
      breakdown: { ...e.cost.annual },
      actualTrays: e.design.summary.actualTrays,
      selectedDiameter: e.design.summary.selectedDiameter,
    }
  })
}
