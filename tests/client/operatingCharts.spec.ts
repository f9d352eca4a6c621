/**
 * The operating log's charts format their numbers like every other chart: axis labels and
 * tooltip values through the shared chart formatter (fmtChart: thousands separators, a few
 * significant digits), never a chart's own toFixed that rounds 12.5 % to 13.
 */
import { describe, expect, it, vi } from 'vitest'
import { defineComponent, h } from 'vue'
import { flushPromises, mount } from '@vue/test-utils'
import type { ApexOptions } from 'apexcharts'
import { withChartDefaults } from '@/components/charts/chartOptions.ts'
import { fmtChart } from '@/utils/format.ts'
import type { Monitoring } from '@/api/rating.ts'
import type { MonthResult } from '@/api/operating.ts'
import { testVuetify } from './helpers.ts'

const drawn: ApexOptions[] = []
vi.mock('@/components/charts/AppChart.vue', () => ({
  __esModule: true,
  default: defineComponent({
    props: { options: { type: Object, required: true }, series: Array, type: String, height: Number, description: String },
    setup(props) {
      drawn.push(props.options as ApexOptions)
      return () => h('div')
    },
  }),
}))

const OperatingEfficiencyChart = (await import('@/components/operating/OperatingEfficiencyChart.vue')).default
const StudyOperatingChart = (await import('@/components/operating/StudyOperatingChart.vue')).default
const OperatingCostGapChart = (await import('@/components/operating/OperatingCostGapChart.vue')).default

type F = (v: unknown, o?: unknown) => string
/** The options as AppChart draws them (the shared defaults applied). */
async function optionsOf(component: unknown, props: Record<string, unknown>): Promise<ApexOptions> {
  drawn.length = 0
  mount(component as never, { props: props as never, global: { plugins: [testVuetify()] } })
  await flushPromises()
  await vi.waitFor(() => expect(drawn.length).toBe(1))
  return withChartDefaults(drawn[0]!)
}
const yLabels = (o: ApexOptions): F[] => (Array.isArray(o.yaxis) ? o.yaxis : [o.yaxis]).map((y) => (y as { labels: { formatter: F } }).labels.formatter)
const tooltipY = (o: ApexOptions): F => (o.tooltip!.y as { formatter: F }).formatter

const monitoring = {
  drift: { margin: 0.15, run: 3, warning: false, since: null, message: null },
  months: [{ month: '2026-01', achievedEfficiency: 0.4525, designEfficiency: 0.5, costGap: { throughput: 1234.5, excessSolvent: 0, efficiencyLoss: 0, prices: 0, other: 0, gap: 1234.5 } }],
} as unknown as Monitoring

describe('operating charts use the shared chart formatter', () => {
  it('tray efficiency: axis labels keep their decimals, the tooltip reads in the locale with separators', async () => {
    const o = await optionsOf(OperatingEfficiencyChart, { monitoring })
    expect(yLabels(o)[0]!(12.5)).toBe(fmtChart(12.5))
    expect(tooltipY(o)(45.25)).toBe(`${fmtChart(45.25, 3)} %`)
    expect(tooltipY(o)(null)).toBe('not measured')
  })

  it('cost per month and the cost gap: axis labels through fmtChart', async () => {
    const months = [{ month: '2026-01', actual: { total: 12500.4 }, design: { total: 11800 }, gap: 700.4 }] as unknown as MonthResult[]
    for (const f of yLabels(await optionsOf(StudyOperatingChart, { months, currency: 'USD' }))) expect(f(1250.5)).toBe(fmtChart(1250.5))
    for (const f of yLabels(await optionsOf(OperatingCostGapChart, { monitoring, currency: 'USD' }))) expect(f(0.25)).toBe(fmtChart(0.25))
  })
})
