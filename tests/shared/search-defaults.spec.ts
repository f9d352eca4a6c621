import { describe, expect, it } from 'vitest'
import { searchSpecSchema, systemSearchDefaults } from '../../shared/schemas/search.ts'
import { convert } from '../../shared/units.ts'

// Round limits of US practice (common practice, no source), checked in inches and feet with the
// exact factors of NIST SP 811 (2008), appendix B: 1 in = 0.0254 m, 1 ft = 0.3048 m.
describe('search limits offered per unit system', () => {
  it('US spacings are whole inches: 18, 20, 24, 30, 36 in', () => {
    expect(systemSearchDefaults.US.traySpacings.map((m) => Number(convert(m, 'm', 'in').toFixed(9)))).toEqual([18, 20, 24, 30, 36])
  })
  it('US diameter and height are 20 ft and 175 ft', () => {
    expect(convert(systemSearchDefaults.US.maxDiameter, 'm', 'ft')).toBeCloseTo(20, 9)
    expect(convert(systemSearchDefaults.US.maxHeight, 'm', 'ft')).toBeCloseTo(175, 9)
  })
  it('SI values are the schema defaults, and both sets pass the schema', () => {
    const d = searchSpecSchema.parse({})
    expect([...systemSearchDefaults.SI.traySpacings]).toEqual(d.traySpacings)
    expect(systemSearchDefaults.SI.maxDiameter).toBe(d.maxDiameter)
    expect(systemSearchDefaults.SI.maxHeight).toBe(d.maxHeight)
    for (const sys of ['SI', 'US'] as const) {
      const x = systemSearchDefaults[sys]
      expect(searchSpecSchema.safeParse({ traySpacings: [...x.traySpacings], maxDiameter: x.maxDiameter, maxHeight: x.maxHeight }).success).toBe(true)
    }
  })
})
