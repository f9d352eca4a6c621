/**
 * A lean design ({ profile: false, detail: false }, what the optimiser and the uncertainty studies
 * ask for) skips the parts only the detail shows (the whole turndown tray, the second weeping
 * method): its summary, checks and warnings must be those of the full design, to the bit. Rule of
 * the product (no outside reference): one design, one answer, whoever asks.
 */
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { caseToSI } from '../../server/engine/index.ts'
import { designSI } from '../../server/engine/design.ts'

const read = (f: string) => JSON.parse(readFileSync(`data/examples/${f}`, 'utf8')) as Record<string, unknown>
const cases = {
  'dilute, constant K': caseToSI(read('design.json')),
  'stage by stage, x-y table': caseToSI(read('design-table.json')),
  'acetone, modified Raoult': caseToSI(read('design-acetone.json')),
}
const LEAN = { profile: false, detail: false }

describe('lean design: the same summary, checks and warnings as the full one', () => {
  for (const [name, c] of Object.entries(cases)) {
    it(name, () => {
      let compared = 0
      for (const recovery of [0.9, 0.95, 0.99]) {
        for (const solventFactor of [1.1, 1.4, 2.5]) {
          for (const floodFraction of [0.5, 0.7, 0.85]) {
            const vars = { recovery, solventFactor, floodFraction }
            let full
            try {
              full = designSI(c, vars)
            } catch {
              expect(() => designSI(c, vars, LEAN)).toThrow()
              continue
            }
            const lean = designSI(c, vars, LEAN)
            expect(lean.summary).toStrictEqual(full.summary)
            expect(lean.checks).toStrictEqual(full.checks)
            expect(lean.warnings).toStrictEqual(full.warnings)
            compared++
          }
        }
      }
      expect(compared).toBeGreaterThan(10)
    })
  }
})
