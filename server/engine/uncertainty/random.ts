/**
 * Reproducible random numbers and the standard normal distribution for the uncertainty engine.
 *
 * Generator: xoshiro128** (32-bit state words, period 2^128 - 1), its state filled from the seed by
 * splitmix32; uniform numbers in [0, 1) with 32 random bits. Same seed -> same stream on every
 * platform (only 32-bit integer arithmetic through Math.imul and >>> 0).
 * Source: blackman2021 (xoshiro/xoroshiro generators).
 *
 * Normal quantile: Acklam's rational approximation (relative error below 1.15e-9 over (0, 1)).
 * Normal CDF from erfc in the Chebyshev-fitted form of press2007 section 6.2 (fractional error
 * below 1.2e-7); it is used only for the ends of a truncated distribution, where that is ample.
 * Source: press2007 section 6.2 (erfc); acklam2003 (normal quantile).
 */

/** A seeded generator of uniform numbers in [0, 1). */
export interface Rng {
  next(): number
}

/** splitmix32: spreads a 32-bit seed over the generator's state. */
function splitmix32(a: number): () => number {
  let s = a >>> 0
  return () => {
    s = (s + 0x9e3779b9) >>> 0
    let z = s
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0
    return (z ^ (z >>> 16)) >>> 0
  }
}

/**
 * xoshiro128** seeded from a non-negative integer.
 * Example: the first draw of seedRng(1) lies in [0, 1) and is the same on every run.
 */
export function seedRng(seed: number): Rng {
  const sm = splitmix32(seed)
  let a = sm(), b = sm(), c = sm(), d = sm()
  if ((a | b | c | d) === 0) a = 1
  return {
    next(): number {
      const r = Math.imul(rotl(Math.imul(b, 5), 7), 9) >>> 0
      const t = (b << 9) >>> 0
      c ^= a
      d ^= b
      b ^= c
      a ^= d
      c ^= t
      d = rotl(d, 11)
      a >>>= 0; b >>>= 0; c >>>= 0; d >>>= 0
      return r / 4294967296
    },
  }
}

function rotl(x: number, k: number): number {
  return ((x << k) | (x >>> (32 - k))) >>> 0
}

/** Complementary error function, fractional error < 1.2e-7 (press2007 section 6.2). */
export function erfc(x: number): number {
  const z = Math.abs(x)
  const t = 1 / (1 + 0.5 * z)
  const r =
    t *
    Math.exp(
      -z * z -
        1.26551223 +
        t * (1.00002368 + t * (0.37409196 + t * (0.09678418 + t * (-0.18628806 + t * (0.27886807 + t * (-1.13520398 + t * (1.48851587 + t * (-0.82215223 + t * 0.17087277)))))))),
    )
  return x >= 0 ? r : 2 - r
}

/** Standard normal CDF Phi(x) = erfc(-x / sqrt 2) / 2. Example: normalCdf(1.959964) = 0.975 */
export function normalCdf(x: number): number {
  return 0.5 * erfc(-x / Math.SQRT2)
}

const A = [-3.969683028665376e1, 2.209460984245205e2, -2.759285104469687e2, 1.38357751867269e2, -3.066479806614716e1, 2.506628277459239]
const B = [-5.447609879822406e1, 1.615858368580409e2, -1.556989798598866e2, 6.680131188771972e1, -1.328068155288572e1]
const C = [-7.784894002430293e-3, -3.223964580411365e-1, -2.400758277161838, -2.549732539343734, 4.374664141464968, 2.938163982698783]
const D = [7.784695709041462e-3, 3.224671290700398e-1, 2.445134137142996, 3.754408661907416]
const P_LOW = 0.02425

/**
 * Standard normal quantile Phi^-1(p), 0 < p < 1 (acklam2003; relative error < 1.15e-9).
 * Example: normalQuantile(0.975) = 1.959964
 */
export function normalQuantile(p: number): number {
  if (p <= 0) return -Infinity
  if (p >= 1) return Infinity
  if (p < P_LOW) {
    const q = Math.sqrt(-2 * Math.log(p))
    return (((((C[0]! * q + C[1]!) * q + C[2]!) * q + C[3]!) * q + C[4]!) * q + C[5]!) / ((((D[0]! * q + D[1]!) * q + D[2]!) * q + D[3]!) * q + 1)
  }
  if (p > 1 - P_LOW) {
    const q = Math.sqrt(-2 * Math.log(1 - p))
    return -(((((C[0]! * q + C[1]!) * q + C[2]!) * q + C[3]!) * q + C[4]!) * q + C[5]!) / ((((D[0]! * q + D[1]!) * q + D[2]!) * q + D[3]!) * q + 1)
  }
  const q = p - 0.5
  const r = q * q
  return ((((((A[0]! * r + A[1]!) * r + A[2]!) * r + A[3]!) * r + A[4]!) * r + A[5]!) * q) / (((((B[0]! * r + B[1]!) * r + B[2]!) * r + B[3]!) * r + B[4]!) * r + 1)
}
