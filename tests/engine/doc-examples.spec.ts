/**
 * Every doc-block example written as `Example: name(arguments)[.field] = value` is run here against
 * the exported function of its own file, so the documentation cannot drift from the code. The
 * arguments are JavaScript literals (numbers, strings, arrays, objects); `.field` or `[i]` picks a
 * number out of a result that is an object or an array. The tolerance is half a unit in the last
 * digit printed. Rule (not a published check): the doc example and the function agree; the
 * published checks are in the other spec files.
 *
 * Coverage: every exported function of a correlation module whose doc block names a source has such
 * an example (so a new correlation cannot be added without one), and every `Source:` names a key of
 * the bibliographies (server/engine/references.ts, server/engine/costing/references.ts).
 */
import { readdirSync, readFileSync, statSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { REFERENCES } from '../../server/engine/references.ts'
import { costingReferences } from '../../server/engine/costing/references.ts'

const ROOT = 'server/engine'
const EXAMPLE = /Example:\s*([A-Za-z_$][\w$]*)\((.*?)\)((?:\.[A-Za-z_$][\w$]*|\[\d+\])*)\s*=\s*([-+]?[0-9][0-9.eE+-]*)/
/** The modules that hold correlations (one documented function each). */
const CORRELATION_MODULES = /\/(hydraulics|properties|balances|equilibrium|vessel|efficiency)\/|costing\/correlations\.ts$/

function files(dir: string): string[] {
  return readdirSync(dir).flatMap((f) => {
    const p = join(dir, f)
    return statSync(p).isDirectory() ? files(p) : p.endsWith('.ts') ? [p] : []
  })
}

interface Ex {
  file: string
  fn: string
  argsText: string
  pick: string
  expected: number
  tolerance: number
}

function halfUnit(printed: string): number {
  const m = /^[-+]?(\d*)\.?(\d*)(?:[eE]([-+]?\d+))?$/.exec(printed)
  const decimals = m?.[2]?.length ?? 0
  const exp = m?.[3] ? Number(m[3]) : 0
  return 0.5 * Math.pow(10, exp - decimals)
}

/** The literal arguments of an example (our own source text, evaluated as JavaScript literals). */
function literalArgs(text: string): unknown[] {
  return text.trim() === '' ? [] : (new Function(`return [${text}]`)() as unknown[])
}

/** Follow `.field` / `[i]` into a result. */
function picked(value: unknown, pick: string): unknown {
  let v = value
  for (const m of pick.matchAll(/\.([A-Za-z_$][\w$]*)|\[(\d+)\]/g)) v = (v as Record<string, unknown>)[m[1] ?? Number(m[2])]
  return v
}

const examples: Ex[] = []
const sources: { file: string; line: number; text: string }[] = []
/** Exported functions of the correlation modules whose doc block names a source. */
const documented: { file: string; fn: string; hasExample: boolean }[] = []
for (const file of files(ROOT)) {
  const text = readFileSync(file, 'utf8')
  const lines = text.split('\n')
  lines.forEach((line, i) => {
    const m = EXAMPLE.exec(line)
    if (m) examples.push({ file, fn: m[1]!, argsText: m[2]!, pick: m[3]!, expected: Number(m[4]), tolerance: halfUnit(m[4]!) })
    const s = /Source:\s*(.*)/.exec(line)
    if (s) sources.push({ file, line: i + 1, text: `${s[1]!} ${lines[i + 1] ?? ''}` })
  })
  if (!CORRELATION_MODULES.test(file)) continue
  for (const m of text.matchAll(/\/\*\*((?:(?!\*\/)[\s\S])*)\*\/\s*export function ([A-Za-z_$][\w$]*)/g)) {
    if (!/Source:/.test(m[1]!)) continue
    const fn = m[2]!
    documented.push({ file, fn, hasExample: examples.some((e) => e.file === file && e.fn === fn) })
  }
}

const KEYS = new Set<string>([...Object.keys(REFERENCES), ...Object.keys(costingReferences)])

describe('every correlation cites a key and carries a runnable example', () => {
  it('every `Source:` in the engine names a bibliography key (or says no source is needed)', () => {
    expect(sources.length).toBeGreaterThan(50)
    for (const s of sources) {
      const words = s.text.match(/[A-Za-z][A-Za-z0-9]*/g) ?? []
      const where = `${s.file}:${s.line} "${s.text.trim()}"`
      expect(words.some((w) => KEYS.has(w)) || /none needed/.test(s.text), `${where} names no key`).toBe(true)
      // an author-year word (e.g. fair1961) that is not a key is a citation to a missing entry
      for (const w of words.filter((x) => /^[a-z]+[A-Za-z]*\d{4}$/.test(x))) expect(KEYS.has(w), `${where}: ${w} is not a key`).toBe(true)
    }
  })
  it('every sourced function of a correlation module has an example the next block runs', () => {
    expect(documented.length).toBeGreaterThanOrEqual(40)
    const missing = documented.filter((d) => !d.hasExample).map((d) => `${d.file}: ${d.fn}`)
    expect(missing).toEqual([])
  })
})

describe('doc-block examples run against their functions', () => {
  it('there are runnable examples across the correlation modules', () => {
    expect(examples.length).toBeGreaterThanOrEqual(25)
    for (const dir of ['hydraulics', 'properties', 'balances', 'equilibrium', 'vessel', 'efficiency']) {
      expect(examples.some((e) => e.file.includes(`/${dir}/`))).toBe(true)
    }
  })
  for (const e of examples) {
    it(`${e.file}: ${e.fn}(${e.argsText})${e.pick} = ${e.expected}`, async () => {
      const mod = (await import(/* @vite-ignore */ `../../${e.file}`)) as Record<string, unknown>
      const f = mod[e.fn]
      expect(typeof f, `${e.fn} is exported by ${e.file}`).toBe('function')
      const got = picked((f as (...a: unknown[]) => unknown)(...literalArgs(e.argsText)), e.pick)
      expect(typeof got, `${e.fn}(...)${e.pick} is a number`).toBe('number')
      expect(Math.abs((got as number) - e.expected), `${e.fn} gave ${String(got)}`).toBeLessThanOrEqual(e.tolerance * (1 + 1e-9))
    })
  }
})
