/**
 * The finite-number guard reads the design's numbers field by field (summaryChecksum,
 * detailChecksum) instead of walking the result: every number the result carries must be in
 * those sums, or a NaN there would leave the engine unnoticed. Each number of a real design
 * result is set to NaN in turn and the sum must become NaN. Rule of the product (no outside
 * reference): no NaN or Infinity leaves the engine.
 */
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { caseToSI } from '../../server/engine/index.ts'
import { designSI } from '../../server/engine/design.ts'
import { detailChecksum, type DesignDetail } from '../../server/engine/column/detail.ts'
import { numericSum, summaryChecksum } from '../../server/engine/column/guard.ts'
import type { DesignSummary } from '../../server/engine/contract.ts'

/** Paths of every number in an object tree. */
function numberPaths(o: unknown, path: string[] = []): string[][] {
  if (typeof o === 'number') return [path]
  if (o === null || typeof o !== 'object') return []
  return Object.entries(o as Record<string, unknown>).flatMap(([k, v]) => numberPaths(v, [...path, k]))
}

function withNaN<T>(o: T, path: string[]): T {
  const copy = structuredClone(o) as Record<string, unknown>
  let at = copy
  for (const k of path.slice(0, -1)) at = at[k] as Record<string, unknown>
  at[path[path.length - 1]!] = NaN
  return copy as T
}

const raw = JSON.parse(readFileSync('data/examples/design.json', 'utf8')) as Record<string, unknown>
const cases = {
  'dilute, constant K': caseToSI(raw),
  'stage by stage, x-y table': caseToSI(JSON.parse(readFileSync('data/examples/design-table.json', 'utf8'))),
  'acetone, modified Raoult': caseToSI(JSON.parse(readFileSync('data/examples/design-acetone.json', 'utf8'))),
}

describe('design guard: every number of the result is in the checksums', () => {
  for (const [name, c] of Object.entries(cases)) {
    const r = designSI(c)
    const detail = r.detail as DesignDetail

    it(`${name}: a NaN anywhere in the detail makes its checksum NaN`, () => {
      const paths = numberPaths(detail)
      expect(paths.length).toBeGreaterThan(80)
      expect(Number.isFinite(detailChecksum(detail))).toBe(true)
      for (const p of paths) expect(detailChecksum(withNaN(detail, p)), p.join('.')).toBeNaN()
    })

    it(`${name}: the detail checksum is the sum of the detail's numbers`, () => {
      const a = detailChecksum(detail)
      const b = numericSum(detail)
      expect(Math.abs(a - b)).toBeLessThanOrEqual(1e-12 * Math.abs(b))
    })

    it(`${name}: a NaN anywhere in the summary makes its checksum NaN`, () => {
      const paths = numberPaths(r.summary)
      expect(paths.length).toBeGreaterThanOrEqual(37)
      expect(Number.isFinite(summaryChecksum(r.summary))).toBe(true)
      for (const p of paths) expect(summaryChecksum(withNaN<DesignSummary>(r.summary, p)), p.join('.')).toBeNaN()
    })
  }
})

describe('repeated designs of one case are the same (the hot path keeps the last curve, method note and efficiency)', () => {
  // Henry model at 70 °C (outside its 0-60 °C validity: a warning each design); ethanol Henry
  // constants are library values, not a published check here
  const hot = { ...raw, gas: { ...(raw.gas as object), temperature: 70 }, solvent: { ...(raw.solvent as object), temperature: 70 }, equilibrium: { model: 'henry', Hcp: 1.9, B: 6600 } }
  for (const [name, c] of Object.entries({ ...cases, 'Henry outside its range': caseToSI(hot) })) {
    it(name, () => {
      const first = designSI(c, { recovery: 0.97 })
      designSI(c, { recovery: 0.9, solventFactor: 1.6 })
      const again = designSI(c, { recovery: 0.97 })
      expect(again).toEqual(first)
      if (name.startsWith('Henry')) expect(first.warnings.some((w) => w.path === 'column.temperature')).toBe(true)
    })
  }
})
