/**
 * The plain-case reader (server/engine/caseParts/plainCase.ts) is a shortcut past zod: whenever it
 * answers, caseSchema must accept the case and return the same object; whenever caseSchema
 * refuses a case, the reader must not answer. Checked on the example cases and on each of them
 * changed field by field (bad numbers, units, unknown keys, missing fields). Rule of the product
 * (no outside reference): the same case gives the same answer whichever way it was read.
 */
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { caseSchema } from '../../shared/schemas/case.ts'
import { readPlainCase } from '../../server/engine/caseParts/plainCase.ts'
import { caseToSI } from '../../server/engine/index.ts'
import { designSI } from '../../server/engine/design.ts'

type Obj = Record<string, unknown>
const read = (f: string) => JSON.parse(readFileSync(`data/examples/${f}`, 'utf8')) as Obj
const examples: Record<string, Obj> = {
  design: read('design.json'),
  acetone: read('design-acetone.json'),
  table: read('design-table.json'),
  optimise: { recovery: 0.95, solventFactor: 1.5, ...(read('optimize.json').case as Obj) },
  uncertainty: { recovery: 0.95, solventFactor: 1.5, ...(read('uncertainty.json').case as Obj) },
  ...Object.fromEntries((read('design-batch.json').cases as Obj[]).map((c, i) => [`batch ${i}`, c])),
}

/** The case with one change at a path (undefined: the key removed). */
function changed(o: Obj, path: string[], value: unknown): Obj {
  const copy = structuredClone(o)
  let at = copy
  for (const k of path.slice(0, -1)) at = at[k] as Obj
  const last = path[path.length - 1]!
  if (value === undefined) delete at[last]
  else at[last] = value
  return copy
}

/** Paths of every leaf of a case. */
function leaves(o: unknown, path: string[] = []): string[][] {
  if (o === null || typeof o !== 'object') return [path]
  return Object.entries(o as Obj).flatMap(([k, v]) => leaves(v, [...path, k]))
}

const BAD_VALUES: unknown[] = [undefined, -1, 0, 1.5, 1e9, NaN, Infinity, '', 'x', null, true, [], {}, { value: 1, unit: 'm' }, { value: 1, unit: 'kmol/h' }, 'auto']

/** The reader agrees with the schema: same object when it answers, silent when the schema refuses. */
function agrees(raw: unknown, label: string): void {
  const plain = readPlainCase(raw)
  const z = caseSchema.safeParse(raw)
  if (plain !== null) {
    expect(z.success, `${label}: the reader answered a case the schema refuses`).toBe(true)
    expect(plain, label).toStrictEqual(z.data)
  }
}

describe('plain-case reader', () => {
  it('reads the example design case without zod, to what the schema returns', () => {
    const raw = examples.design!
    const plain = readPlainCase(raw)
    expect(plain).not.toBeNull()
    expect(plain).toStrictEqual(caseSchema.parse(raw))
  })

  it('designs the same whichever way the case was read', () => {
    const raw = examples.design!
    const viaZod = designSI(caseToSI({ ...raw, gas: { ...(raw.gas as Obj), flow: { value: 420, unit: 'kmol/h' } } }))
    const viaPlain = designSI(caseToSI(raw))
    expect(JSON.stringify(viaPlain)).toBe(JSON.stringify(viaZod))
  })

  for (const [name, raw] of Object.entries(examples)) {
    it(`${name}: agrees with the schema, and on every field changed`, () => {
      agrees(raw, name)
      for (const p of leaves(raw)) {
        for (const v of BAD_VALUES) agrees(changed(raw, p, v), `${p.join('.')} = ${JSON.stringify(v)}`)
      }
      for (const section of ['gas', 'solvent', 'tray', 'equilibrium', 'efficiency', 'column', 'vessel']) {
        if (typeof raw[section] === 'object') agrees(changed(raw, [section, 'typo'], 1), `${section}.typo`)
        agrees(changed(raw, [section], undefined), `${section} left out`)
        agrees(changed(raw, [section], 'water'), `${section} a string`)
      }
      agrees(changed(raw, ['extra'], { any: 'thing' }), 'unknown top-level key')
    })
  }

  it('leaves units, tables and spacing rules to the schema', () => {
    const raw = examples.design!
    expect(readPlainCase({ ...raw, gas: { ...(raw.gas as Obj), flow: { value: 420, unit: 'kmol/h' } } })).toBeNull()
    expect(readPlainCase(examples.table)).toBeNull()
    expect(readPlainCase({ ...raw, tray: { ...(raw.tray as Obj), spacingRule: [{ maxDiameter: 1, spacing: 0.5 }] } })).toBeNull()
    expect(readPlainCase(null)).toBeNull()
    expect(readPlainCase([raw])).toBeNull()
  })
})
