import type { ApexOptions } from 'apexcharts'
import { escapeHtml, fmtChart } from '@/utils/format.ts'

type Fmt = (v: unknown, opts?: unknown) => unknown
type AxisLike = { labels?: { formatter?: Fmt } } & Record<string, unknown>

/** An axis with its labels formatted by fmtChart unless the chart gave its own formatter. */
function axis<T>(a: T | undefined): T {
  const ax = (a ?? {}) as AxisLike
  if (ax.labels?.formatter) return ax as T
  return { ...ax, labels: { ...ax.labels, formatter: (v: unknown) => fmtChart(v) } } as T
}

/** Wrap a formatter so its text reaches an HTML sink escaped. */
function escaped(own: Fmt | undefined, fallback: Fmt): Fmt {
  return (v, opts) => escapeHtml(own ? own(v, opts) : fallback(v, opts))
}

/**
 * Defaults every chart shares: axis labels and tooltip values through the one number formatter
 * (fmtChart), and every text apexcharts writes as HTML (legend, tooltip title, series names and
 * values) escaped, so a name like "<b>bold</b>" stays text. Axis labels and annotations are SVG
 * text and need no escaping.
 */
export function withChartDefaults(o: ApexOptions): ApexOptions {
  const tt = o.tooltip ?? {}
  const ttX = (tt.x ?? {}) as { formatter?: Fmt }
  const ttY = tt.y
  const ys = Array.isArray(ttY) ? ttY : [ttY ?? {}]
  const yOut = ys.map((y) => {
    const yy = (y ?? {}) as { formatter?: Fmt; title?: { formatter?: Fmt } }
    return {
      ...yy,
      formatter: escaped(yy.formatter, (v) => fmtChart(v)),
      title: { ...yy.title, formatter: escaped(yy.title?.formatter, (name) => (name ? `${String(name)}:` : '')) },
    }
  })
  const legend = o.legend ?? {}
  return {
    ...o,
    xaxis: axis(o.xaxis),
    yaxis: Array.isArray(o.yaxis) ? o.yaxis.map((y) => axis(y)) : axis(o.yaxis),
    legend: { ...legend, formatter: escaped(legend.formatter as Fmt | undefined, (name) => name) as never },
    tooltip: {
      ...tt,
      x: { ...ttX, formatter: escaped(ttX.formatter, (v) => fmtChart(v)) } as never,
      y: (Array.isArray(ttY) ? yOut : yOut[0]) as never,
    },
  }
}
