/**
 * The optimum on a search bound. When the lowest-cost point sits on the edge of the range
 * searched, a lower cost may lie beyond it: the answer names the variable and the bound and
 * advises widening the range (or says what sets the bound when it is not a choice). A length in
 * the advice is a token of its SI value (shared/quantityText.ts): the reader's edge words it in
 * their units.
 */
import type { SearchSpec } from '../../../shared/schemas/search.ts'
import type { BoundHit } from './evaluator.ts'
import { quantityToken } from '../words.ts'

/** A variable is on a bound when within this fraction of its range of it (the polish stops 1e-3 inside a cell). */
export const BOUND_TOLERANCE = 2e-3

const pct = (v: number): string => `${Number((100 * v).toPrecision(4))} %`
const spacing = (m: number): string => quantityToken('smallLength', m)

/**
 * Bound hits of an optimum.
 * @param rBounds the recovery bounds searched (the lower one may come from the emission limit)
 */
export function boundHits(
  opt: { recovery: number; solventFactor: number; floodFraction: number; traySpacing: number },
  search: SearchSpec,
  rBounds: [number, number],
): BoundHit[] {
  const out: BoundHit[] = []
  const near = (v: number, b: number, lo: number, hi: number) => Math.abs(v - b) <= BOUND_TOLERANCE * Math.max(hi - lo, 1e-12)
  const [rLo, rHi] = rBounds
  if (rHi > rLo) {
    if (near(opt.recovery, rLo, rLo, rHi)) {
      const byLimit = search.emissionLimit !== undefined && rLo > search.recovery.min + 1e-12
      out.push({
        variable: 'recovery',
        bound: 'lower',
        value: rLo,
        advice: byLimit
          ? `The optimum recovers the least the emission limit allows (${pct(rLo)}): the limit, not cost, sets the recovery.`
          : `The optimum sits on the lowest recovery searched (${pct(rLo)}): lower the recovery range's minimum to see whether a lower cost lies beyond it.`,
      })
    } else if (near(opt.recovery, rHi, rLo, rHi)) {
      out.push({ variable: 'recovery', bound: 'upper', value: rHi, advice: `The optimum sits on the highest recovery searched (${pct(rHi)}): raise the recovery range's maximum to see whether a lower cost lies beyond it.` })
    }
  }
  const s = search.solventFactor
  if (s.max > s.min) {
    if (near(opt.solventFactor, s.min, s.min, s.max)) {
      out.push({ variable: 'solventFactor', bound: 'lower', value: s.min, advice: `The optimum sits on the smallest solvent factor searched (L/Lmin = ${s.min}): lower it (keeping it above 1) to see whether a lower cost lies beyond it.` })
    } else if (near(opt.solventFactor, s.max, s.min, s.max)) {
      out.push({ variable: 'solventFactor', bound: 'upper', value: s.max, advice: `The optimum sits on the largest solvent factor searched (L/Lmin = ${s.max}): raise it to see whether a lower cost lies beyond it.` })
    }
  }
  const f = search.floodFraction
  if (f.max > f.min) {
    if (near(opt.floodFraction, f.min, f.min, f.max)) {
      out.push({ variable: 'floodFraction', bound: 'lower', value: f.min, advice: `The optimum sits on the lowest fraction of flood searched (${pct(f.min)}): lower it to see whether a lower cost lies beyond it.` })
    } else if (near(opt.floodFraction, f.max, f.min, f.max)) {
      out.push({
        variable: 'floodFraction',
        bound: 'upper',
        value: f.max,
        advice: `The optimum sits on the highest fraction of flood searched (${pct(f.max)}): a higher design approach to flood would give a smaller column, but keep a margin for load swings and foaming; widen the range only if the operation allows it.`,
      })
    }
  }
  const ts = search.traySpacings
  if (ts.length > 1) {
    const lo = Math.min(...ts)
    const hi = Math.max(...ts)
    if (opt.traySpacing === lo) out.push({ variable: 'traySpacing', bound: 'lower', value: lo, advice: `The optimum takes the smallest tray spacing offered (${spacing(lo)}): add a smaller spacing to the list to see whether it costs less (access for maintenance usually needs ${spacing(0.45)} or more).` })
    else if (opt.traySpacing === hi) out.push({ variable: 'traySpacing', bound: 'upper', value: hi, advice: `The optimum takes the largest tray spacing offered (${spacing(hi)}): add a larger spacing to the list to see whether it costs less.` })
  }
  return out
}
