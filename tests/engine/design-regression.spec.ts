/**
 * Regression snapshots (kept apart from the published checks): the summaries of the
 * example case files, rounded to 6 significant digits. A change here is not an error by
 * itself; review it and update with `npx vitest run --project engine -u`. The summaries are the
 * public ones (the engine's SI summary through shared/summaryUnits.ts), so this also pins the units
 * of the answer.
 */
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { summaryToPublic } from '../../shared/summaryUnits.ts'
import { evaluateBatch, evaluateCase } from '../../server/engine/index.ts'

function round(o: unknown): unknown {
  if (typeof o === 'number') return Number(o.toPrecision(6))
  if (Array.isArray(o)) return o.map(round)
  if (o && typeof o === 'object') return Object.fromEntries(Object.entries(o).map(([k, v]) => [k, round(v)]))
  return o
}

describe('regression: example case files', () => {
  for (const f of ['design.json', 'design-acetone.json', 'design-table.json']) {
    it(f, () => {
      const r = evaluateCase(JSON.parse(readFileSync(`data/examples/${f}`, 'utf8')))
      // the summary as the public answer carries it (kmol/h, kg/h, m3/h), converted as the edges do
      expect(round({ summary: summaryToPublic(r.summary), checks: r.checks.map((c) => [c.key, c.status, c.value]), method: r.profile.method })).toMatchSnapshot()
    })
  }
  it('design-batch.json', () => {
    const r = evaluateBatch(JSON.parse(readFileSync('data/examples/design-batch.json', 'utf8')))
    expect(round(r.map((x) => ('summary' in x ? [x.summary.selectedDiameter, x.summary.actualTrays, x.summary.theoreticalStages] : x)))).toMatchSnapshot()
  })
})
