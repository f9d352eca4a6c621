import { describe, expect, it } from 'vitest'
import type { ApexOptions } from 'apexcharts'
import { withChartDefaults } from '@/components/charts/chartOptions.ts'

type F = (v: unknown, o?: unknown) => string
const fn = (f: unknown): F => f as F

describe('withChartDefaults: every chart formats numbers and escapes HTML text', () => {
  it('gives axes and tooltips the shared number formatter when the chart has none', () => {
    const o = withChartDefaults({ xaxis: { type: 'numeric' }, yaxis: {} })
    expect(fn((o.yaxis as { labels: { formatter: unknown } }).labels.formatter)(300000)).toMatch(/^300[,. \u202f\u00a0]000$/)
    expect(fn(o.xaxis?.labels?.formatter)('0.97000000000001')).toBe((0.97).toLocaleString())
    expect(fn((o.tooltip?.x as { formatter: unknown }).formatter)(12.3456789)).toBe((12.35).toLocaleString())
  })
  it('keeps a chart’s own axis formatter', () => {
    const own = (v: number) => `${v} m`
    const o = withChartDefaults({ yaxis: [{ labels: { formatter: own } }, {}] })
    const ys = o.yaxis as { labels: { formatter: unknown } }[]
    expect(ys[0]?.labels.formatter).toBe(own)
    expect(fn(ys[1]?.labels.formatter)(1500)).toBe((1500).toLocaleString())
  })
  it('escapes series names in the legend and tooltip, and tooltip values, also through own formatters', () => {
    const name = '<img src=x onerror=alert(1)>'
    const o = withChartDefaults({ tooltip: { y: { formatter: (v: number) => `${v} <USD>` } } } as ApexOptions)
    expect(fn(o.legend?.formatter)(name)).toBe('&lt;img src=x onerror=alert(1)&gt;')
    const y = o.tooltip?.y as { formatter: unknown; title: { formatter: unknown } }
    expect(fn(y.title.formatter)('<b>bold</b>')).toBe('&lt;b&gt;bold&lt;/b&gt;:')
    expect(fn(y.formatter)(5)).toBe('5 &lt;USD&gt;')
    expect(fn((o.tooltip?.x as { formatter: unknown }).formatter)('<b>bold</b>')).toBe('&lt;b&gt;bold&lt;/b&gt;')
  })
})
