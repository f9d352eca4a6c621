/**
 * Optimiser answers that read right.
 * Rules checked: each sensitivity bar carries the value actually used (the operating hours
 * cannot exceed the 8,760 hours of a year, so +20 % is capped and says so); each re-optimised bar
 * is never worse than the base design simply re-priced; a bar's TAC equals a full, independent
 * re-optimisation at the same value (the outside reference: the whole optimiser run again from
 * scratch with the changed cost basis); an optimum on a search bound is reported with advice.
 * The case is the product's invented Cobalt Ridge demo.
 */
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { caseToSI } from '../../server/engine/index.ts'
import { loadPreset } from '../../server/engine/costing/presets.ts'
import { optimise } from '../../server/engine/optimisation/optimise.ts'
import { boundHits } from '../../server/engine/optimisation/bounds.ts'
import { groupThousands } from '../../server/engine/optimisation/sensitivity.ts'
import { searchSpecSchema, type SearchSpecInput } from '../../shared/schemas/search.ts'

const example = JSON.parse(readFileSync('data/examples/optimize.json', 'utf8')) as { case: Record<string, unknown>; search: SearchSpecInput }

describe('sensitivity bars and bound hits on the Cobalt Ridge demo', { timeout: 300_000 }, () => {
  const c = caseToSI(example.case)
  const basis = loadPreset('halvard-cobalt-ridge')
  const r = optimise(c, basis, searchSpecSchema.parse({ ...example.search, sensitivity: true }))
  const noSens = searchSpecSchema.parse({ ...example.search, sensitivity: false })
  const entry = (k: string) => r.sensitivity.find((e) => e.item === k)!

  it('operating hours +20 % is capped at 8,760 h/yr and the bar says so; -20 % is the full step', () => {
    const e = entry('operatingHours')
    expect(e.highValue).toBe(8760)
    expect(e.highLimited).toBe(true)
    expect(e.highChange).toBeCloseTo(8760 / e.baseValue - 1, 12)
    expect(e.highNote).toMatch(/8,760 h\/yr/)
    expect(e.highNote).toMatch(/hours in a year/)
    expect(e.lowValue).toBeCloseTo(0.8 * e.baseValue, 9)
    expect(e.lowLimited).toBe(false)
    expect(e.lowNote).toMatch(/^\u221220 %/)
  })
  it('every bar: the value used is in the answer, and re-optimising is never worse than re-pricing', () => {
    expect(r.sensitivity.length).toBeGreaterThan(5)
    for (const e of r.sensitivity) {
      expect(e.low.value).toBe(e.lowValue)
      expect(e.high.value).toBe(e.highValue)
      expect(e.lowNote.length).toBeGreaterThan(3)
      expect(e.highNote.length).toBeGreaterThan(3)
      expect(e.low.tac).toBeLessThanOrEqual(e.low.repricedTac + 1e-6)
      expect(e.high.tac).toBeLessThanOrEqual(e.high.repricedTac + 1e-6)
    }
  })
  for (const [item, side] of [
    ['operatingHours', 'low'],
    ['operatingHours', 'high'],
    ['electricityPrice', 'high'],
    ['productValue', 'high'],
  ] as const) {
    it(`${item} ${side}: the bar equals a full, independent re-optimisation at the value used (within 0.1 %)`, () => {
      const e = entry(item)
      const v = side === 'low' ? e.lowValue : e.highValue
      const b = loadPreset('halvard-cobalt-ridge')
      if (item === 'operatingHours') b.general.operatingHours = v
      else if (item === 'electricityPrice') b.utilities.electricityPrice = v
      else b.utilities.productValue = v
      const full = optimise(c, b, noSens).optimum.totalAnnualCost
      const bar = side === 'low' ? e.low.tac : e.high.tac
      expect(Math.abs(bar / full - 1)).toBeLessThan(1e-3)
    })
  }
  it('an optimum on a search bound is named with its bound and advice', () => {
    for (const h of r.boundHits) {
      expect(['lower', 'upper']).toContain(h.bound)
      expect(h.advice.length).toBeGreaterThan(20)
    }
    const o = r.optimum
    const hitFlood = Math.abs(o.floodFraction - noSens.floodFraction.max) < 1e-9
    expect(r.boundHits.some((h) => h.variable === 'floodFraction' && h.bound === 'upper')).toBe(hitFlood)
  })
})

describe('bound hits, rule by rule (no optimisation)', () => {
  const search = searchSpecSchema.parse({ ...example.search })
  it('solvent factor on its upper bound, fraction of flood inside: one hit with advice to widen', () => {
    const hits = boundHits({ recovery: 0.95, solventFactor: search.solventFactor.max, floodFraction: 0.7, traySpacing: 0.6 }, search, [0.9, 0.999])
    expect(hits).toEqual([{ variable: 'solventFactor', bound: 'upper', value: search.solventFactor.max, advice: expect.stringMatching(/raise it/) }])
  })
  it('recovery on a lower bound set by the emission limit: the advice says the limit sets it', () => {
    const s = searchSpecSchema.parse({ ...example.search, emissionLimit: 1 })
    const hits = boundHits({ recovery: 0.95, solventFactor: 2, floodFraction: 0.7, traySpacing: 0.6 }, s, [0.95, 0.999])
    expect(hits[0]?.variable).toBe('recovery')
    expect(hits[0]?.advice).toMatch(/emission limit/)
  })
  it('inside every range: no hit', () => {
    expect(boundHits({ recovery: 0.95, solventFactor: 2, floodFraction: 0.7, traySpacing: 0.6 }, search, [0.9, 0.999])).toEqual([])
  })
})

describe('numbers in the sensitivity notes', () => {
  it('thousands are grouped exactly as Intl.NumberFormat en-GB groups them', () => {
    const intl = new Intl.NumberFormat('en-GB')
    const values = [0, -0, 7, -7, 999, 1000, -1000, 8760, 12345, 123456, 1234567, -98765432, 1.234e9, 9.999e20, 1.234e21, 5e-7, 1234.5, -0.25]
    for (let i = 0; i < 200; i++) values.push(Number((((i * 7919) % 1000) * 10 ** (i % 19) * (i % 2 ? -1 : 1)).toPrecision(4)))
    for (const v of values) expect(groupThousands(v), String(v)).toBe(intl.format(v))
  })
})
