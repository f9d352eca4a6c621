/**
 * The design command's quick path (server/cli/designOne.ts): one plain case, with no cost basis or
 * a shipped preset named alone, is printed without loading the schemas. Reference: the command's
 * full path (designOutput + formatOutput, which parses with the shared case schema); the quick
 * path must print exactly the same text, and leave everything else (null) to the full path.
 */
import { readFileSync, readdirSync, mkdtempSync, rmSync } from 'node:fs'
import { isDeepStrictEqual } from 'node:util'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { build, type Metafile } from 'esbuild'
import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { quickDesignText } from '../../server/cli/designOne.ts'
import { designOutput, formatOutput, isBatch } from '../../server/cli/design.ts'
import { costBasisFrom } from '../../server/cli/input.ts'
import { PRESET_DATA } from '../../server/engine/costing/presetData.ts'
import { hasPreset, listPresets } from '../../server/engine/costing/presets.ts'
import { costBasisSchema } from '../../shared/schemas/costBasis.ts'

const fullText = (raw: unknown): string => formatOutput(designOutput(raw))
const examples = readdirSync('data/examples')
  .filter((f) => f.startsWith('design') && f.endsWith('.json'))
  .map((f) => ({ f, raw: JSON.parse(readFileSync(join('data/examples', f), 'utf8')) as Record<string, unknown> }))
  .filter(({ raw }) => !isBatch(raw))

describe('design command quick path', () => {
  it('prints exactly what the full path prints for every single-case example (with its preset, without one, with each shipped preset)', () => {
    expect(examples.length).toBeGreaterThanOrEqual(2)
    let quick = 0
    for (const { f, raw } of examples) {
      const { costBasis: _basis, ...bare } = raw
      const variants = [raw, bare, ...Object.keys(PRESET_DATA).map((preset) => ({ ...bare, costBasis: { preset } }))]
      for (const v of variants) {
        const text = quickDesignText(JSON.stringify(v))
        if (text === null) continue
        quick++
        expect(text, f).toBe(fullText(v))
      }
    }
    // the shipped design example and its preset variants do take the quick path
    expect(quickDesignText(readFileSync('data/examples/design.json', 'utf8'))).not.toBeNull()
    expect(quick).toBeGreaterThanOrEqual(6)
  })

  it('prints what the full path prints for plain cases across recovery, solvent factor, flow and K', () => {
    const base = JSON.parse(readFileSync('data/examples/design.json', 'utf8')) as Record<string, unknown> & { gas: Record<string, unknown> }
    fc.assert(
      fc.property(fc.double({ min: 0.5, max: 0.995, noNaN: true }), fc.double({ min: 1.05, max: 3, noNaN: true }), fc.double({ min: 20, max: 5000, noNaN: true }), fc.double({ min: 0.05, max: 5, noNaN: true }), (recovery, solventFactor, flow, K) => {
        const v = { ...base, recovery, solventFactor, gas: { ...base.gas, flow }, equilibrium: { model: 'constantK', K } }
        const text = quickDesignText(JSON.stringify(v))
        let full: string | null
        try {
          full = fullText(v)
        } catch {
          full = null // refused: the quick path must have left it to the full path
        }
        if (full === null) expect(text).toBeNull()
        else if (text !== null) expect(text).toBe(full)
      }),
      { numRuns: 60 },
    )
  })

  it('leaves to the full path: batches, units, changed or full cost bases, unknown presets, bad JSON and refused cases', () => {
    const raw = JSON.parse(readFileSync('data/examples/design.json', 'utf8')) as Record<string, unknown> & { gas: Record<string, unknown> }
    const no = [
      '{ not json',
      JSON.stringify([raw]),
      JSON.stringify({ cases: [raw] }),
      JSON.stringify({ ...raw, gas: { ...raw.gas, flow: { value: 420, unit: 'kmol/h' } } }),
      JSON.stringify({ ...raw, costBasis: { preset: 'halvard-cobalt-ridge', general: { annualHours: 8000 } } }),
      JSON.stringify({ ...raw, costBasis: { preset: 'constructor' } }),
      JSON.stringify({ ...raw, costBasis: { preset: 'toString' } }),
      JSON.stringify({ ...raw, costBasis: PRESET_DATA['halvard-cobalt-ridge'] }),
      JSON.stringify({ ...raw, solventFactor: 0.9 }),
      JSON.stringify({ ...raw, gas: { ...raw.gas, unknownField: 1 } }),
    ]
    for (const text of no) expect(quickDesignText(text), text.slice(0, 80)).toBeNull()
  })

  it('every shipped preset is stored exactly as the cost-basis schema reads it (so the quick path may price with it as stored)', () => {
    for (const [key, data] of Object.entries(PRESET_DATA)) expect(isDeepStrictEqual(costBasisSchema.parse(data), data), key).toBe(true)
    expect(listPresets().map((p) => p.key).sort()).toEqual(Object.keys(PRESET_DATA).sort())
  })

  it('names every object has are not presets (unknown preset, not a crash)', () => {
    for (const key of ['constructor', 'toString', '__proto__', 'hasOwnProperty']) {
      expect(hasPreset(key), key).toBe(false)
      expect(() => costBasisFrom({ preset: key }), key).toThrow(/unknown preset/)
    }
  })

  it('the compiled quick path loads neither zod nor mathjs (the full command is a separate, dynamically imported chunk)', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'scrubwright-quick-'))
    try {
      const r = await build({ entryPoints: { design: 'server/cli/bin/design.ts' }, outdir: dir, outExtension: { '.js': '.mjs' }, bundle: true, splitting: true, format: 'esm', platform: 'node', target: 'node20', metafile: true, write: false, logLevel: 'silent' })
      const outputs: Metafile['outputs'] = r.metafile.outputs
      const entry = Object.keys(outputs).find((o) => outputs[o]!.entryPoint?.endsWith('server/cli/bin/design.ts'))!
      const seen = new Set<string>()
      const visit = (o: string) => {
        if (seen.has(o)) return
        seen.add(o)
        for (const i of outputs[o]!.imports) if (i.kind === 'import-statement' && !i.external) visit(i.path)
      }
      visit(entry)
      const inputs = [...seen].flatMap((o) => Object.keys(outputs[o]!.inputs))
      expect(inputs.some((i) => i.includes('server/engine/design.ts'))).toBe(true)
      expect(inputs.filter((i) => /node_modules\/(zod|mathjs)\//.test(i))).toEqual([])
      // and the full command is still reachable (dynamic import)
      expect(outputs[entry]!.imports.some((i) => i.kind === 'dynamic-import')).toBe(true)
    } finally {
      rmSync(dir, { recursive: true, force: true })
    }
  })
})
