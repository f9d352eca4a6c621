import { describe, expect, it } from 'vitest'
import { summaryToPublic } from '../../shared/summaryUnits.ts'
import { readFileSync } from 'node:fs'
import { evaluateCase, COMPONENT_LIBRARY } from '../../server/engine/index.ts'
import { ratingCaseOfDesign } from '../../server/engine/rating/fromDesign.ts'
import { rateCaseToSI, rateSI } from '../../server/engine/rating/rate.ts'
import { monitorMonths, splitCostGap, type MonitorEntry } from '../../server/engine/rating/monitoring.ts'

const raw = JSON.parse(readFileSync('data/examples/design.json', 'utf8')) as Record<string, unknown>
const design = evaluateCase(raw)
// the design as a stored run holds it: the summary in the public units (kmol/h), as the rating case and the log use
const s = summaryToPublic(design.summary)
const rc = rateCaseToSI(ratingCaseOfDesign(raw, s), COMPONENT_LIBRARY)
const atDesign = rateSI(rc)
const ctx = { rating: rc, designRecovery: s.recovery }
const month = (m: string, over: Partial<MonitorEntry> = {}): MonitorEntry => ({ month: m, gasFlow: s.gasFlow, solventFlow: s.solventFlow, inletMoleFraction: null, measuredRecovery: null, ...over })

describe('Monitoring a standing column month by month', () => {
  it('a month at design flows expects the as-built recovery; measuring exactly that gives back the design efficiency (round trip)', () => {
    const { months } = monitorMonths(ctx, [month('2026-01', { measuredRecovery: atDesign.summary.recovery })])
    const m = months[0]!
    expect(m.expectedRecovery).toBeCloseTo(atDesign.summary.recovery, 10)
    expect(m.achievedEfficiency!).toBeCloseTo(atDesign.summary.overallEfficiency, 6)
    expect(m.belowDriftMargin).toBe(false)
    expect(m.insideWindow).toBe(true)
    // the solvent the design recovery needs with the installed (rounded-up) trays is below the design solvent
    expect(m.solventNeeded!).toBeLessThan(s.solventFlow)
    expect(m.solventNeeded!).toBeGreaterThan(0.8 * s.solventFlow)
  })

  it('a lower measured recovery means fewer effective stages: a lower achieved efficiency', () => {
    const { months } = monitorMonths(ctx, [month('2026-01', { measuredRecovery: 0.95 })])
    expect(months[0]!.achievedEfficiency!).toBeLessThan(0.7 * atDesign.summary.overallEfficiency)
    expect(months[0]!.belowDriftMargin).toBe(true)
  })

  it('drift warning after three measured months in a row below the margin, not before; a good month resets it', () => {
    const low = 0.95
    const two = monitorMonths(ctx, [month('2026-01', { measuredRecovery: low }), month('2026-02', { measuredRecovery: low })])
    expect(two.drift.warning).toBe(false)
    const three = monitorMonths(ctx, [month('2026-01', { measuredRecovery: atDesign.summary.recovery }), month('2026-02', { measuredRecovery: low }), month('2026-03'), month('2026-04', { measuredRecovery: low }), month('2026-05', { measuredRecovery: low })])
    // months without a measurement neither count nor break the run
    expect(three.drift.warning).toBe(true)
    expect(three.drift.since).toBe('2026-02')
    expect(three.drift.message).toMatch(/fouling/)
    const reset = monitorMonths(ctx, [month('2026-01', { measuredRecovery: low }), month('2026-02', { measuredRecovery: low }), month('2026-03', { measuredRecovery: atDesign.summary.recovery }), month('2026-04', { measuredRecovery: low })])
    expect(reset.drift.warning).toBe(false)
  })

  it('a month run beyond flooding is flagged outside the window', () => {
    const { months } = monitorMonths(ctx, [month('2026-01', { gasFlow: atDesign.summary.floodingGasFlow * 1.1, solventFlow: s.solventFlow * 1.1 })])
    expect(months[0]!.insideWindow).toBe(false)
    expect(months[0]!.violated).toContain('flooding')
  })

  it('a leaner inlet gas needs less solvent for the design recovery', () => {
    const { months } = monitorMonths(ctx, [month('2026-01'), month('2026-02', { inletMoleFraction: 0.008 })])
    // Kremser: the fraction absorbed depends on A and N only, so the need barely moves with a dilute inlet
    expect(Math.abs(months[1]!.solventNeeded! - months[0]!.solventNeeded!) / months[0]!.solventNeeded!).toBeLessThan(0.02)
    expect(months[1]!.inletMoleFraction).toBe(0.008)
  })
})

describe('Cost-gap split', () => {
  it('the parts add up to the gap; each part has the sign of its cause', () => {
    const g = splitCostGap({
      actualTotal: 12000,
      designAtDesignApproval: 10000,
      designAtDesignInForce: 10500,
      designAtMonthInForce: 11000,
      solventFlow: 400,
      solventNeeded: 350,
      solventPricePerKmol: 0.01,
      hours: 700,
      expectedRecovery: 0.985,
      measuredRecovery: 0.98,
      soluteInKgPerHour: 290,
      lostSolutePricePerKg: 0.6,
    })
    expect(g.gap).toBe(2000)
    expect(g.prices).toBe(500)
    expect(g.throughput).toBe(500)
    expect(g.excessSolvent).toBeCloseTo(50 * 700 * 0.01, 9)
    expect(g.efficiencyLoss).toBeCloseTo(0.005 * 290 * 700 * 0.6, 9)
    expect(g.prices + g.throughput + g.excessSolvent + g.efficiencyLoss + g.other).toBeCloseTo(g.gap, 9)
  })
})
