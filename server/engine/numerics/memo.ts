/**
 * Remember the last call of a pure function of numbers. The design calls some correlations with
 * the same arguments design after design (the weir length at the minimum downcomer fraction, the
 * surface-tension factor of one solvent): the memo returns the value computed before, the same
 * number, without the transcendental calls. One entry: no growth, nothing to evict.
 */
export function memoLast1(fn: (a: number) => number): (a: number) => number {
  let lastA = NaN
  let lastV = NaN
  return (a: number): number => {
    if (a === lastA) return lastV
    const v = fn(a)
    lastA = a
    lastV = v
    return v
  }
}

export function memoLast2(fn: (a: number, b: number) => number): (a: number, b: number) => number {
  let lastA = NaN
  let lastB = NaN
  let lastV = NaN
  return (a: number, b: number): number => {
    if (a === lastA && b === lastB) return lastV
    const v = fn(a, b)
    lastA = a
    lastB = b
    lastV = v
    return v
  }
}

export function memoLast4(fn: (a: number, b: number, c: number, d: number) => number): (a: number, b: number, c: number, d: number) => number {
  let lastA = NaN
  let lastB = NaN
  let lastC = NaN
  let lastD = NaN
  let lastV = NaN
  return (a: number, b: number, c: number, d: number): number => {
    if (a === lastA && b === lastB && c === lastC && d === lastD) return lastV
    const v = fn(a, b, c, d)
    lastA = a
    lastB = b
    lastC = c
    lastD = d
    lastV = v
    return v
  }
}
