/**
 * The portfolio CSV guards against formula injection (the OWASP "CSV injection" advice: a cell
 * starting with = + - @ tab or carriage return gets a leading apostrophe), and stays plain CSV
 * (RFC 4180 quoting) that papaparse reads back.
 */
import { describe, it, expect } from 'vitest'
import Papa from 'papaparse'
import { toCsv } from '@/utils/csv.ts'

interface Row { name: string; tac: number | null }
const cols = [
  { title: 'Study', value: (r: Row) => r.name },
  { title: 'TAC', value: (r: Row) => r.tac },
]

describe('toCsv', () => {
  it('puts an apostrophe before text that a spreadsheet would run as a formula', () => {
    const text = toCsv(cols, [
      { name: '=HYPERLINK("http://x","y")', tac: 1 },
      { name: '+1', tac: 2 },
      { name: '-2+3', tac: 3 },
      { name: '@SUM(A1)', tac: 4 },
      { name: 'Plain, with "quotes"', tac: -5.5 },
    ])
    const back = Papa.parse<string[]>(text.trim()).data
    expect(back[0]).toEqual(['Study', 'TAC'])
    expect(back.slice(1).map((r) => r[0])).toEqual(["'=HYPERLINK(\"http://x\",\"y\")", "'+1", "'-2+3", "'@SUM(A1)", 'Plain, with "quotes"'])
    // numbers, negative ones too, are left as numbers
    expect(back.slice(1).map((r) => r[1])).toEqual(['1', '2', '3', '4', '-5.5'])
  })

  it('writes blanks for missing values and CRLF line ends', () => {
    const text = toCsv(cols, [{ name: 'A', tac: null }])
    expect(text).toBe('Study,TAC\r\nA,')
  })
})
