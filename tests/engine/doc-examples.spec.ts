/**
 * Every doc-block example written as `Example: name(numbers) = value` is run here against the
 * exported function of its own file, so the documentation cannot drift from the code. The
 * tolerance is half a unit in the last digit printed. Rule (not a published check): the doc
 * example and the function agree; the published checks are in the other spec files.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'

const ROOT = 'server/engine'
const EXAMPLE = /Example:\s*([A-Za-z_$][\w$]*)\(([-+0-9.eE,\s]*)\)\s*=\s*([-+]?[0-9][0-9.eE+-]*)/

function files(dir: string): string[] {
  return readdirSync(dir).flatMap((f) => {
    const p = join(dir, f)
    return statSync(p).isDirectory() ? files(p) : p.endsWith('.ts') ? [p] : []
  })
}

interface Ex {
  file: string
  fn: string
  args: number[]
  expected: number
  tolerance: number
}

function halfUnit(printed: string): number {
  const m = /^[-+]?(\d*)\.?(\d*)(?:[eE]([-+]?\d+))?$/.exec(printed)
  const decimals = m?.[2]?.length ?? 0
  const exp = m?.[3] ? Number(m[3]) : 0
  return 0.5 * Math.pow(10, exp - decimals)
}

const examples: Ex[] = []
for (const file of files(ROOT)) {
  for (const line of readFileSync(file, 'utf8').split('\n')) {
    const m = EXAMPLE.exec(line)
    if (!m) continue
    const args = m[2]!.trim() === '' ? [] : m[2]!.split(',').map((a) => Number(a.trim()))
    examples.push({ file, fn: m[1]!, args, expected: Number(m[3]), tolerance: halfUnit(m[3]!) })
  }
}

describe('doc-block examples run against their functions', () => {
  it('there are runnable examples across the correlation modules', () => {
    expect(examples.length).toBeGreaterThanOrEqual(25)
    for (const dir of ['hydraulics', 'properties', 'balances', 'equilibrium', 'vessel', 'efficiency']) {
      expect(examples.some((e) => e.file.includes(`/${dir}/`))).toBe(true)
    }
  })
  for (const e of examples) {
    it(`${e.file}: ${e.fn}(${e.args.join(', ')}) = ${e.expected}`, async () => {
      const mod = (await import(/* @vite-ignore */ `../../${e.file}`)) as Record<string, unknown>
      const f = mod[e.fn]
      expect(typeof f, `${e.fn} is exported by ${e.file}`).toBe('function')
      const got = (f as (...a: number[]) => number)(...e.args)
      expect(Math.abs(got - e.expected), `${e.fn} gave ${got}`).toBeLessThanOrEqual(e.tolerance * (1 + 1e-9))
    })
  }
})
