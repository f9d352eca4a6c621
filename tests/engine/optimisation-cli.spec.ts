/**
 * The `optimize` command line: output shape, exit codes and field paths for bad input.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { afterAll, describe, expect, it } from 'vitest'
import { main } from '../../server/cli/optimize.ts'

const example = fileURLToPath(new URL('../../data/examples/optimize.json', import.meta.url))
const dir = mkdtempSync(join(tmpdir(), 'scrubwright-optimize-'))
afterAll(() => rmSync(dir, { recursive: true, force: true }))

function run(args: string[]) {
  let out = ''
  let err = ''
  const code = main(args, (s) => (out += s), (s) => (err += s))
  return { code, out, err }
}
function runWith(content: unknown) {
  const f = join(dir, `case-${Math.random().toString(36).slice(2)}.json`)
  writeFileSync(f, JSON.stringify(content))
  return run([f])
}
const base = {
  case: {
    gas: { flow: 420, temperature: 32, pressure: 115, soluteMoleFraction: 0.015, carrier: 'carbon dioxide' },
    solute: 'ethanol',
    solvent: 'water',
    equilibrium: { model: 'constantK', K: 0.62 },
  },
  search: { sensitivity: false },
}

describe('npm run optimize -- FILE.json', { timeout: 60_000 }, () => {
  it('prints the optimum, evaluations, curves and sensitivity for the example file', () => {
    const r = run(['--', example])
    expect(r.code).toBe(0)
    const j = JSON.parse(r.out) as Record<string, Record<string, unknown>>
    for (const k of ['recovery', 'solventFactor', 'traySpacing', 'floodFraction', 'actualTrays', 'selectedDiameter', 'totalAnnualCost', 'breakdown']) {
      expect(j.optimum).toHaveProperty(k)
    }
    expect(j.evaluations).toBeGreaterThan(0)
    expect(Array.isArray(j.curves?.recovery)).toBe(true)
    expect(Array.isArray(j.curves?.solventFactor)).toBe(true)
    expect(Array.isArray(j.sensitivity)).toBe(true)
    expect((j.sensitivity as unknown as unknown[]).length).toBeGreaterThan(5)
  })

  it('omitted cost basis -> the demo basis; recovery and solvent factor may be left out of the case', () => {
    const r = runWith(base)
    expect(r.code).toBe(0)
    const j = JSON.parse(r.out) as { costBasis: { name: string }; sensitivity: unknown[] }
    expect(j.costBasis.name).toMatch(/Cobalt Ridge/)
    expect(j.sensitivity).toEqual([])
  })

  it('a preset by name', () => {
    const r = runWith({ ...base, costBasis: { preset: 'turton-3rd-cepci397' } })
    expect(r.code).toBe(0)
    expect((JSON.parse(r.out) as { costBasis: { targetIndex: number } }).costBasis.targetIndex).toBe(397)
  })

  it('a preset with changes merged field by field', () => {
    const r = runWith({ ...base, costBasis: { preset: 'halvard-marrow-bay', utilities: { electricityPrice: 0.2 } } })
    expect(r.code).toBe(0)
    const j = JSON.parse(r.out) as { costBasis: { name: string }; optimum: { breakdown: { operating: { key: string; quantity: number; annual: number }[] } } }
    expect(j.costBasis.name).toMatch(/Marrow Bay/)
    const pump = j.optimum.breakdown.operating.find((o) => o.key === 'pumpElectricity')
    expect(pump?.annual).toBeCloseTo((pump?.quantity ?? 0) * 0.2, 6)
    const bad = runWith({ ...base, costBasis: { preset: 'halvard-marrow-bay', capital: { interestRate: 2 } } })
    expect(bad.code).toBe(2)
    expect(bad.err).toContain('costBasis.capital.interestRate')
  })

  it('bad input exits 2 with the field path on stderr', () => {
    const cases: [unknown, string][] = [
      [{ ...base, search: { recovery: { min: 1.5 } } }, 'search.recovery.min'],
      [{ ...base, costBasis: { preset: 'no-such-basis' } }, 'costBasis.preset'],
      [{ ...base, costBasis: { name: 'x' } }, 'costBasis.general'],
      [{ ...base, case: { ...base.case, gas: { ...base.case.gas, flow: 'lots' } } }, 'case.gas.flow'],
      [{ search: {} }, 'case'],
      [{ ...base, extra: 1 }, 'extra'],
    ]
    for (const [content, path] of cases) {
      const r = runWith(content)
      expect(r.code).toBe(2)
      expect(r.err).toContain(path)
    }
  })

  it('an unreachable emission limit exits 3 (infeasible)', () => {
    const r = runWith({ ...base, search: { sensitivity: false, emissionLimit: 0.001, recovery: { max: 0.99 } } })
    expect(r.code).toBe(2)
    expect(r.err).toContain('search.emissionLimit')
  })

  it('a missing file or no argument exits 2', () => {
    expect(run([join(dir, 'missing.json')]).code).toBe(2)
    expect(run([]).code).toBe(2)
  })
})
