import { describe, expect, it } from 'vitest'
import { fmtChart, fmtNumber } from '@/utils/format.ts'

// Expected strings follow the en-US number format of ECMA-402 (Intl.NumberFormat): comma as the
// thousands separator, period as the decimal mark.
describe('fmtChart: chart axes and tooltips', () => {
  it('large numbers get thousands separators and no decimals (was "300000.000000000000")', () => {
    expect(fmtChart(300000, 4, 'en-US')).toBe('300,000')
    expect(fmtChart('300000.000000000000', 4, 'en-US')).toBe('300,000')
    expect(fmtChart(1234567.89, 4, 'en-US')).toBe('1,234,568')
    expect(fmtChart(-45210.4, 4, 'en-US')).toBe('-45,210')
  })
  it('small numbers keep a few significant digits without trailing zeros', () => {
    expect(fmtChart(97.00000000001, 4, 'en-US')).toBe('97')
    expect(fmtChart(1.476378, 4, 'en-US')).toBe('1.476')
    expect(fmtChart(0.012345, 3, 'en-US')).toBe('0.0123')
    expect(fmtChart(0, 4, 'en-US')).toBe('0')
  })
  it('very small or very large numbers use an exponent', () => {
    expect(fmtChart(2.5e-6, 4, 'en-US')).toBe('2.5e-6')
    expect(fmtChart(3e13, 4, 'en-US')).toBe('3e+13')
  })
  it('category labels pass through unchanged', () => {
    expect(fmtChart('Solvent pump', 4, 'en-US')).toBe('Solvent pump')
    expect(fmtChart('<b>x</b>', 4, 'en-US')).toBe('<b>x</b>')
    expect(fmtChart(undefined)).toBe('')
  })
})

describe('fmtNumber: numbers in tables', () => {
  // A yearly solvent volume in US units runs to tens of millions of gallons: a reader expects
  // thousands separators there, not "3.00e+7" (ECMA-402 en-US grouping).
  it('tens of millions keep separators; only beyond a trillion an exponent', () => {
    expect(fmtNumber(30026544.4).replace(/\D/g, '')).toBe('30026544')
    expect(fmtNumber(30026544.4)).not.toMatch(/e/)
    expect(fmtNumber(2.5e13)).toBe('2.50e+13')
    expect(fmtNumber(0.0004)).toBe('4.00e-4')
  })
})
