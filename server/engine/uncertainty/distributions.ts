/**
 * Distributions of multipliers and Latin hypercube sampling.
 *
 * Each uncertain input is a multiplier m on its nominal value, drawn from a lognormal
 * (ln m ~ N(ln median, sigma^2)), normal (mean, sd = relativeSd x mean), uniform (low, high) or
 * triangular (low, mode, high) distribution, truncated to the range the quantity allows
 * [lo, hi] (a positive flow, an efficiency of at most 1): the quantile of the truncated
 * distribution is Q(F(lo) + u (F(hi) - F(lo))).
 *
 * Latin hypercube (mckay1979): for n samples and each input, the unit interval is cut into n
 * equal strata, each stratum is used exactly once, in a random order (a seeded permutation), at
 * a random point inside it: u_i = (pi(i) + v_i) / n. Every input has its own stream of the
 * seeded generator, so adding or removing one input leaves the draws of the others unchanged,
 * and two designs rated with the same seed see the same world (common random numbers).
 * Source: mckay1979; blackman2021 (the generator, ./random.ts).
 */
import type { Distribution } from '../../../shared/schemas/uncertainty.ts'
import { normalCdf, normalQuantile, seedRng } from './random.ts'

/** A sampled distribution: its CDF and quantile on the untruncated support. */
interface Law {
  cdf(x: number): number
  quantile(p: number): number
}

function lawOf(d: Exclude<Distribution, { distribution: 'fixed' }>): Law {
  switch (d.distribution) {
    case 'lognormal':
      return { cdf: (x) => (x <= 0 ? 0 : normalCdf(Math.log(x / d.median) / d.sigma)), quantile: (p) => d.median * Math.exp(d.sigma * normalQuantile(p)) }
    case 'normal': {
      const sd = d.relativeSd * d.mean
      return { cdf: (x) => normalCdf((x - d.mean) / sd), quantile: (p) => d.mean + sd * normalQuantile(p) }
    }
    case 'uniform':
      return { cdf: (x) => Math.min(1, Math.max(0, (x - d.low) / (d.high - d.low))), quantile: (p) => d.low + p * (d.high - d.low) }
    case 'triangular': {
      const { low: a, mode: c, high: b } = d
      const fc = (c - a) / (b - a)
      return {
        cdf: (x) => (x <= a ? 0 : x >= b ? 1 : x <= c ? ((x - a) * (x - a)) / ((b - a) * (c - a)) : 1 - ((b - x) * (b - x)) / ((b - a) * (b - c))),
        quantile: (p) => (p < fc ? a + Math.sqrt(p * (b - a) * (c - a)) : b - Math.sqrt((1 - p) * (b - a) * (b - c))),
      }
    }
  }
}

/** The quantile of a distribution truncated to [lo, hi], and the range it draws from. */
export interface Sampler {
  quantile(u: number): number
  range: [number, number]
  /** Probability mass of the untruncated distribution inside [lo, hi]. */
  mass: number
}

/**
 * A sampler of a multiplier truncated to [lo, hi].
 * @returns null when the distribution puts no mass inside [lo, hi]
 */
export function samplerOf(d: Exclude<Distribution, { distribution: 'fixed' }>, lo: number, hi: number): Sampler | null {
  const law = lawOf(d)
  const Flo = law.cdf(lo)
  const Fhi = Number.isFinite(hi) ? law.cdf(hi) : 1
  const mass = Fhi - Flo
  if (!(mass > 1e-12)) return null
  const clampTo = (x: number) => Math.min(hi, Math.max(lo, x))
  const qlo = clampTo(Flo > 0 ? law.quantile(Flo) : Math.max(lo, law.quantile(1e-12)))
  const qhi = clampTo(Fhi < 1 ? law.quantile(Fhi) : law.quantile(1 - 1e-12))
  return {
    quantile: (u) => clampTo(law.quantile(Flo + u * mass)),
    range: [Math.max(lo, qlo), Math.min(hi, qhi)],
    mass,
  }
}

/**
 * Latin hypercube draws of one input: n multipliers and their ranks (the stratum of each sample,
 * 0..n-1, which is also the rank of the multiplier because the quantile is increasing).
 * @param stream a number that separates the inputs' random streams (their index)
 */
export function latinHypercube(s: Sampler, n: number, seed: number, stream: number): { values: Float64Array; ranks: Uint32Array } {
  const rng = seedRng((seed + Math.imul(stream + 1, 0x9e3779b9)) >>> 0)
  const ranks = new Uint32Array(n)
  for (let i = 0; i < n; i++) ranks[i] = i
  // Fisher-Yates shuffle: a uniformly random order of the strata
  for (let i = n - 1; i > 0; i--) {
    const j = Math.floor(rng.next() * (i + 1))
    const t = ranks[i]!
    ranks[i] = ranks[j]!
    ranks[j] = t
  }
  const values = new Float64Array(n)
  for (let i = 0; i < n; i++) values[i] = s.quantile((ranks[i]! + rng.next()) / n)
  return { values, ranks }
}
