/** Number formatting used in both renderings: up to `sig` significant digits, thousands separated. */
export function fmt(v: number, sig = 4): string {
  if (!Number.isFinite(v)) return String(v)
  if (v === 0) return '0'
  const a = Math.abs(v)
  const digits = a >= 1000 ? 0 : Math.max(0, Math.min(6, sig - 1 - Math.floor(Math.log10(a))))
  return v.toLocaleString('en-US', { maximumFractionDigits: digits, minimumFractionDigits: 0 })
}

/** Money: whole units with thousands separators, e.g. "USD 123,457". */
export function money(v: number, currency: string): string {
  return `${currency} ${Math.round(v).toLocaleString('en-US')}`
}

/**
 * A spreadsheet display format showing about `sig` significant digits of v, with thousands
 * separators (the cell keeps the full number): 1.4500000000000002 with 4 -> '#,##0.000'.
 */
export function numFmt(v: number, sig = 4): string {
  if (!Number.isFinite(v) || v === 0) return '#,##0.####'
  const a = Math.abs(v)
  const digits = a >= 1000 ? 0 : Math.max(0, Math.min(8, sig - 1 - Math.floor(Math.log10(a))))
  return digits === 0 ? '#,##0' : `#,##0.${'0'.repeat(digits)}`
}

/** Money cells: whole currency units with separators. */
export const MONEY_FMT = '#,##0'
