/** Number formatting for tables and summaries (browser locale, fixed significant digits). */

export function fmtNumber(v: number | null | undefined, digits = 3): string {
  if (v == null || !Number.isFinite(v)) return '–'
  const a = Math.abs(v)
  if (a !== 0 && (a < 1e-3 || a >= 1e12)) return v.toExponential(digits - 1)
  const decimals = a === 0 ? 0 : Math.max(0, digits - 1 - Math.floor(Math.log10(a)))
  return v.toLocaleString(undefined, { maximumFractionDigits: Math.min(decimals, 6), minimumFractionDigits: 0 })
}

export function fmtFixed(v: number | null | undefined, decimals = 2): string {
  if (v == null || !Number.isFinite(v)) return '–'
  return v.toLocaleString(undefined, { maximumFractionDigits: decimals, minimumFractionDigits: decimals })
}

export function fmtMoney(v: number | null | undefined): string {
  if (v == null || !Number.isFinite(v)) return '–'
  return Math.round(v).toLocaleString()
}

export function fmtPercent(fraction: number | null | undefined, decimals = 1): string {
  if (fraction == null || !Number.isFinite(fraction)) return '–'
  return (fraction * 100).toLocaleString(undefined, { maximumFractionDigits: decimals, minimumFractionDigits: decimals })
}

export function fmtDateTime(iso: string | null | undefined): string {
  if (!iso) return '–'
  const d = new Date(iso)
  if (Number.isNaN(d.getTime())) return '–'
  return d.toLocaleString(undefined, { year: 'numeric', month: 'short', day: 'numeric', hour: '2-digit', minute: '2-digit' })
}

export function fmtDate(iso: string | null | undefined): string {
  if (!iso) return '–'
  const d = new Date(iso)
  if (Number.isNaN(d.getTime())) return '–'
  return d.toLocaleDateString(undefined, { year: 'numeric', month: 'short', day: 'numeric' })
}

/**
 * The one number formatter of chart axes and tooltips: thousands separators, `digits`
 * significant digits (whole numbers from 1000 up), no trailing zeros, an exponent only for the
 * very small or very large. Text (a category label) is returned as is.
 */
export function fmtChart(v: unknown, digits = 4, locale?: string): string {
  if (typeof v === 'string') {
    const t = v.trim()
    if (t === '' || !/^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(t)) return v
    return fmtChart(Number(t), digits, locale)
  }
  if (typeof v !== 'number' || !Number.isFinite(v)) return v == null ? '' : String(v)
  const a = Math.abs(v)
  if (a === 0) return '0'
  if (a < 1e-4 || a >= 1e12) return v.toExponential(Math.max(0, digits - 2)).replace(/\.?0+e/, 'e')
  if (a >= 10 ** digits) return Math.round(v).toLocaleString(locale)
  return v.toLocaleString(locale, { maximumSignificantDigits: digits })
}

/** Apexcharts formatters built on fmtChart (axis labels and tooltip values). */
export const chartFormatter = (digits = 4) => (v: unknown): string => fmtChart(v, digits)

/** Text made safe for an HTML sink (apexcharts sets legend and tooltip text as HTML). */
export function escapeHtml(v: unknown): string {
  return String(v ?? '')
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;')
}
