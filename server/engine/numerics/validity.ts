/**
 * Validity ranges as data, and the out-of-range warning (never a silent clamp).
 */
import type { EngineWarning } from '../contract.ts'

export interface ValidityRange {
  /** Name of the argument the range applies to. */
  arg: string
  min: number
  max: number
  unit: string
}

/** Push an 'outsideValidity' warning when value is outside [r.min, r.max]. */
export function checkRange(
  warnings: EngineWarning[] | undefined,
  what: string,
  r: ValidityRange,
  value: number,
  path?: string,
): void {
  if (warnings && (value < r.min || value > r.max)) {
    const u = r.unit === '-' ? '' : ' ' + r.unit
    warnings.push({
      code: 'outsideValidity',
      message: `${what}: ${r.arg} = ${fmt(value)}${u} is outside the validity range ${fmt(r.min)} to ${fmt(r.max)}${u}; result extrapolated`,
      path,
    })
  }
}

export function fmt(v: number): string {
  if (!Number.isFinite(v)) return String(v)
  const a = Math.abs(v)
  if (a !== 0 && (a < 1e-3 || a >= 1e6)) return v.toExponential(3)
  return String(Math.round(v * 10000) / 10000)
}
