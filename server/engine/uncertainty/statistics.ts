/**
 * Statistics of a sample: mean and percentiles, the sampling error of a probability, rank
 * correlation of inputs with an output (the tornado of what drives the spread), a histogram.
 *
 * Percentiles: linear interpolation between order statistics at h = (n - 1) p (the usual
 * "type 7" definition). Probability: p = k / n; its standard error sqrt(p (1 - p) / (n - 1)) is
 * that of simple random sampling, an upper bound for a Latin hypercube (owen1997), and the 95 %
 * Wilson score interval (wilson1927) stays inside [0, 1] when p is 0 or 1. Rank correlation:
 * Spearman's rho = the Pearson correlation of the ranks (spearman1904), ties given their mean
 * rank; the share of the spread is rho^2 / sum rho^2 (the inputs are drawn independently).
 */
import type { Spread } from '../../../shared/schemas/uncertainty.ts'

/** Mean and 5th, 50th and 95th percentiles of the finite values (all 0 when there are none). */
export function spreadOf(values: Float64Array): Spread {
  const v = values.filter((x) => Number.isFinite(x)).sort()
  const n = v.length
  if (n === 0) return { mean: 0, p05: 0, p50: 0, p95: 0 }
  let sum = 0
  for (let i = 0; i < n; i++) sum += v[i]!
  return { mean: sum / n, p05: percentileSorted(v, 0.05), p50: percentileSorted(v, 0.5), p95: percentileSorted(v, 0.95) }
}

/** Percentile p of sorted values, linear between order statistics. */
export function percentileSorted(sorted: Float64Array, p: number): number {
  const n = sorted.length
  if (n === 1) return sorted[0]!
  const h = (n - 1) * p
  const i = Math.floor(h)
  const j = Math.min(n - 1, i + 1)
  return sorted[i]! + (h - i) * (sorted[j]! - sorted[i]!)
}

/** The sampling error of a probability estimated as k / n. */
export function proportionError(k: number, n: number): { standardError: number; low95: number; high95: number } {
  const p = k / n
  const z = 1.959963984540054
  const z2 = z * z
  const centre = (p + z2 / (2 * n)) / (1 + z2 / n)
  const half = (z / (1 + z2 / n)) * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n))
  return { standardError: Math.sqrt((p * (1 - p)) / Math.max(1, n - 1)), low95: k === 0 ? 0 : Math.max(0, centre - half), high95: k === n ? 1 : Math.min(1, centre + half) }
}

/** Ranks 0..n-1 of the values (ties share their mean rank; non-finite values rank last, in order). */
export function ranksOf(values: Float64Array): Float64Array {
  const n = values.length
  const idx = new Uint32Array(n)
  for (let i = 0; i < n; i++) idx[i] = i
  const key = (i: number) => (Number.isFinite(values[i]!) ? values[i]! : Infinity)
  idx.sort((a, b) => key(a) - key(b) || a - b)
  const r = new Float64Array(n)
  let i = 0
  while (i < n) {
    let j = i
    while (j + 1 < n && key(idx[j + 1]!) === key(idx[i]!)) j++
    const mean = 0.5 * (i + j)
    for (let k = i; k <= j; k++) r[idx[k]!] = mean
    i = j + 1
  }
  return r
}

/** Pearson correlation of two equal-length arrays; 0 when either does not vary. */
export function correlation(a: ArrayLike<number>, b: ArrayLike<number>): number {
  const n = a.length
  let ma = 0, mb = 0
  for (let i = 0; i < n; i++) {
    ma += a[i]!
    mb += b[i]!
  }
  ma /= n
  mb /= n
  let sab = 0, saa = 0, sbb = 0
  for (let i = 0; i < n; i++) {
    const da = a[i]! - ma
    const db = b[i]! - mb
    sab += da * db
    saa += da * da
    sbb += db * db
  }
  return saa > 0 && sbb > 0 ? sab / Math.sqrt(saa * sbb) : 0
}

/** Equal-width histogram of the finite values over [min, max] (widened when all are equal). */
export function histogramOf(values: Float64Array, bins: number): { edges: number[]; counts: number[] } {
  let lo = Infinity, hi = -Infinity
  for (const x of values) {
    if (!Number.isFinite(x)) continue
    if (x < lo) lo = x
    if (x > hi) hi = x
  }
  if (!Number.isFinite(lo)) return { edges: [0, 1], counts: [0] }
  if (hi - lo < 1e-12 * Math.max(1, Math.abs(hi))) {
    const w = Math.max(1e-6, 1e-3 * Math.abs(hi))
    lo -= w
    hi += w
  }
  const width = (hi - lo) / bins
  const edges = Array.from({ length: bins + 1 }, (_, i) => lo + i * width)
  edges[bins] = hi
  const counts = new Array<number>(bins).fill(0)
  for (const x of values) {
    if (!Number.isFinite(x)) continue
    const k = Math.min(bins - 1, Math.floor((x - lo) / width))
    counts[k]!++
  }
  return { edges, counts }
}
