/**
 * Words that hold quantities (the optimiser's advice, the design's notes) read in the person's
 * units: the engine writes each quantity as an SI value with its kind, and the edge (the client,
 * the report) words it in SI or US customary units with shared/units.ts.
 * Factors: 1 in = 0.0254 m, 1 ft = 0.3048 m exactly (NIST SP 811, B.8).
 */
import { describe, expect, it } from 'vitest'
import { boundHits } from '../../server/engine/optimisation/bounds.ts'
import { searchSpecSchema } from '../../shared/schemas/search.ts'
import { quantityText } from '../../shared/quantityText.ts'

describe('quantities in words, in the person’s units', () => {
  it('a {kind:SI value} token is shown in the display unit of the system', () => {
    expect(quantityText('spacing {smallLength:0.4572} here', 'US')).toBe('spacing 18 in here')
    expect(quantityText('spacing {smallLength:0.4572} here', 'SI')).toBe('spacing 457.2 mm here')
    expect(quantityText('height {length:53}', 'US')).toBe('height 173.9 ft')
    expect(quantityText('flow {molarFlow:1}', 'SI')).toBe('flow 3.6 kmol/h')
    expect(quantityText('no tokens, {braces} kept and {nokind:1}', 'US')).toBe('no tokens, {braces} kept and {nokind:1}')
  })

  it('the optimiser’s advice on the smallest tray spacing offered reads in inches for a US reader, millimetres in SI, never metres', () => {
    const search = searchSpecSchema.parse({ traySpacings: [0.4572, 0.508, 0.6096] })
    const hit = boundHits({ recovery: 0.95, solventFactor: 1.5, floodFraction: 0.75, traySpacing: 0.4572 }, search, [0.9, 0.999]).find((h) => h.variable === 'traySpacing')
    expect(hit?.bound).toBe('lower')
    expect(hit?.value).toBe(0.4572)
    const us = quantityText(hit!.advice, 'US')
    expect(us).toContain('(18 in)')
    expect(us).not.toMatch(/\d m\b/)
    expect(quantityText(hit!.advice, 'SI')).toContain('(457.2 mm)')
    const top = boundHits({ recovery: 0.95, solventFactor: 1.5, floodFraction: 0.75, traySpacing: 0.6096 }, search, [0.9, 0.999]).find((h) => h.variable === 'traySpacing')
    expect(quantityText(top!.advice, 'US')).toContain('(24 in)')
  })
})
