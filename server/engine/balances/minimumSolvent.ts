/**
 * Minimum solvent rate (pinch) on a solute-free basis.
 *
 * The operating line Y = Y1 + s (X - X0) must stay above the equilibrium curve Y*(X)
 * between X0 and the rich end. With Y reaching Yin at X_N = X0 + (Yin - Y1)/s, the
 * smallest feasible slope is
 *   s_min = max over X in (X0, X*_N] of (Y*(X) - Y1)/(X - X0),  X*_N = X*(Yin),
 * which is the rich-end pinch when the maximum is at X*_N, and a tangent pinch when it
 * is inside the interval (curved equilibrium). L'_min = s_min V'.
 *
 * Source: benitez2009 ch. 5 (L'min/V' = (Y_{N+1} - Y_1)/(X*_N - X_0)); treybal1980 ch. 8
 * (tangent pinch for curved equilibrium lines).
 * Example: linear K = 0.62, y_in = 1e-5, recovery 0.985, x0 = 0: rich-end pinch,
 *   s_min = (Yin - Y1)/X*_N = K r = 0.6107 (dilute limit)
 */
import type { EquilibriumCurve } from '../equilibrium/models.ts'
import { eqXofY, eqYofX } from './stageByStage.ts'

export interface MinSlope {
  slope: number
  /** X at the pinch */
  Xpinch: number
  tangent: boolean
}

/**
 * The exact pinch on the solute-free basis, for every equilibrium model and method: a scan of
 * (Y*(X) - Y1)/(X - X0) over (X0, X*_N], then a golden-section refinement around the best grid
 * point. The rich-end pinch is the answer when the largest value is at X*_N; otherwise the pinch
 * is a tangent one.
 */
export function minimumSlope(eq: EquilibriumCurve, Y1: number, X0: number, Yin: number, gridPoints = 48): MinSlope {
  const XN = eqXofY(eq, Yin)
  const span = XN - X0
  let best = (Yin - Y1) / span
  let bestX = XN
  let bestI = gridPoints
  for (let i = 1; i < gridPoints; i++) {
    const X = X0 + (span * i) / gridPoints
    const g = (eqYofX(eq, X) - Y1) / (X - X0)
    if (g > best) {
      best = g
      bestX = X
      bestI = i
    }
  }
  if (bestI === gridPoints) return { slope: best, Xpinch: XN, tangent: false }
  // golden-section refinement on [X_{i-1}, X_{i+1}]
  let a = X0 + (span * (bestI - 1)) / gridPoints
  let b = X0 + (span * (bestI + 1)) / gridPoints
  if (a <= X0) a = X0 + span * 1e-9
  const r = 0.6180339887498949
  let c = b - r * (b - a)
  let d = a + r * (b - a)
  let gc = (eqYofX(eq, c) - Y1) / (c - X0)
  let gd = (eqYofX(eq, d) - Y1) / (d - X0)
  for (let k = 0; k < 40 && b - a > 1e-12 * span; k++) {
    if (gc > gd) {
      b = d
      d = c
      gd = gc
      c = b - r * (b - a)
      gc = (eqYofX(eq, c) - Y1) / (c - X0)
    } else {
      a = c
      c = d
      gc = gd
      d = a + r * (b - a)
      gd = (eqYofX(eq, d) - Y1) / (d - X0)
    }
  }
  const g = Math.max(gc, gd)
  if (g > best) {
    best = g
    bestX = gc > gd ? c : d
  }
  return { slope: best, Xpinch: bestX, tangent: true }
}
