/** Input checks and unit conversion with the field path of each value, used while normalising a case. */
import { toSI, UnitError, type QuantityInput, type QuantityKind } from '../../../shared/units.ts'
import type { EngineWarning } from '../contract.ts'
import { InvalidInputError } from '../errors.ts'

export class Ctx {
  warnings: EngineWarning[] = []
  q(kind: QuantityKind, v: QuantityInput, path: string): number {
    try {
      return toSI(kind, v)
    } catch (e) {
      if (e instanceof UnitError) throw new InvalidInputError(path, e.message)
      throw e
    }
  }
  positive(v: number, path: string, what = 'must be a positive number'): number {
    if (!Number.isFinite(v) || v <= 0) throw new InvalidInputError(path, `${what} (got ${v})`)
    return v
  }
  range(v: number, lo: number, hi: number, path: string, loOpen = false, hiOpen = false): number {
    const okLo = loOpen ? v > lo : v >= lo
    const okHi = hiOpen ? v < hi : v <= hi
    if (!Number.isFinite(v) || !okLo || !okHi) {
      throw new InvalidInputError(path, `must be within ${loOpen ? '(' : '['}${lo}, ${hi}${hiOpen ? ')' : ']'} (got ${v})`)
    }
    return v
  }
  absTemp(v: number, path: string): number {
    if (!Number.isFinite(v) || v <= 0) throw new InvalidInputError(path, `temperature must be above absolute zero (got ${v} K)`)
    return v
  }
  note(message: string, path?: string) {
    this.warnings.push({ code: 'defaultUsed', message, path })
  }
}

export function nonNeg(v: number, path: string): number {
  if (!Number.isFinite(v) || v < 0) throw new InvalidInputError(path, `must be a number >= 0 (got ${v})`)
  return v
}
