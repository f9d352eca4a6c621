/**
 * Batches through the compiled design command (node scripts/run-built.mjs design, the same as
 * `npm run --silent design`): every case gets its own slot, a refused case never stops the others,
 * NDJSON in and out, a summary-only output, and large files read as a stream.
 * Rule checked: each case is answered on its own (product rule for batches, no outside source).
 */
import { spawnSync } from 'node:child_process'
import { mkdtempSync, readFileSync, writeFileSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'

const dir = mkdtempSync(join(tmpdir(), 'scrubwright-batch-'))
afterAll(() => rmSync(dir, { recursive: true, force: true }))

function run(args: string[], env: Record<string, string> = {}) {
  return spawnSync(process.execPath, ['scripts/run-built.mjs', 'design', ...args], { encoding: 'utf8', timeout: 120000, env: { ...process.env, ...env } })
}

const good = JSON.parse(readFileSync('data/examples/design.json', 'utf8')) as Record<string, unknown>
const badUnit = { ...good, gas: { ...(good.gas as object), flow: { value: 3, unit: 'bushel/h' } } }
// lean solvent already richer than the gas leaving at the target: valid input, no design
const infeasible = { ...good, solvent: { ...(typeof good.solvent === 'string' ? { name: good.solvent } : (good.solvent as object)), soluteMoleFraction: 0.05 } }

type Slot = { summary?: { recovery: number; totalAnnualCost?: number }; error?: { code: string; message: string; issues: { path: string; message: string }[] } }

describe('design command line: batches that keep going', { timeout: 120000 }, () => {
  it('a refused case gets an error slot, the others their design; exit 2 and stderr names which', () => {
    const f = join(dir, 'mixed.json')
    writeFileSync(f, JSON.stringify({ cases: [good, badUnit, infeasible, { ...good, recovery: 0.95 }] }))
    const r = run([f])
    expect(r.status).toBe(2)
    const out = JSON.parse(r.stdout) as Slot[]
    expect(out).toHaveLength(4)
    expect(out[0]!.summary).toBeDefined()
    expect(out[1]!.error!.code).toBe('invalidInput')
    expect(out[1]!.error!.issues[0]!.path).toMatch(/^cases\.1\.gas\.flow/)
    expect(out[1]!.error!.issues[0]!.message).toMatch(/unit/)
    expect(out[2]!.error!.code).toBe('infeasibleDesign')
    expect(out[2]!.error!.issues.length).toBeGreaterThan(0)
    expect(out[3]!.summary!.recovery).toBe(0.95)
    expect(r.stderr).toMatch(/2 of 4 cases refused/)
    expect(r.stderr).toMatch(/cases 1, 2\b/)
  })
  it('all designed: exit 0, nothing on stderr', () => {
    const f = join(dir, 'ok.json')
    writeFileSync(f, JSON.stringify({ cases: [good, { ...good, recovery: 0.95 }] }))
    const r = run([f])
    expect(r.status).toBe(0)
    expect(r.stderr).toBe('')
    expect(JSON.parse(r.stdout)).toHaveLength(2)
  })
  it('NDJSON in gives NDJSON out, one line per input line, a broken line refused on its own', () => {
    const f = join(dir, 'cases.ndjson')
    writeFileSync(f, [JSON.stringify(good), '{ "gas": ', JSON.stringify({ ...good, recovery: 0.9 }), ''].join('\n'))
    const r = run([f])
    expect(r.status).toBe(2)
    const lines = r.stdout.trim().split('\n').map((l) => JSON.parse(l) as Slot)
    expect(lines).toHaveLength(3)
    expect(lines[0]!.summary).toBeDefined()
    expect(lines[1]!.error!.code).toBe('invalidJson')
    expect(lines[2]!.summary!.recovery).toBe(0.9)
    expect(r.stderr).toMatch(/1 of 3 cases refused: cases 1\b/)
  })
  it('--summary keeps each slot to the summary; --ndjson writes lines for a JSON batch', () => {
    const f = join(dir, 'two.json')
    writeFileSync(f, JSON.stringify({ cases: [good, infeasible] }))
    const r = run([f, '--summary', '--ndjson'])
    expect(r.status).toBe(2)
    const lines = r.stdout.trim().split('\n').map((l) => JSON.parse(l) as Record<string, unknown>)
    expect(Object.keys(lines[0]!)).toEqual(['summary'])
    expect(Object.keys(lines[1]!)).toEqual(['error'])
  })
  it('a large file is read as a stream, with a cost basis written after the cases', () => {
    const f = join(dir, 'stream.json')
    const cases = Array.from({ length: 30 }, (_, i) => ({ ...good, name: `case "${i}" {[`, recovery: 0.9 + i * 0.002 }))
    cases[7] = badUnit as unknown as typeof cases[number]
    writeFileSync(f, JSON.stringify({ cases, costBasis: { preset: 'halvard-cobalt-ridge' } }, null, 1))
    const whole = run([f, '--summary'])
    const streamed = run([f, '--summary'], { SCRUBWRIGHT_STREAM_BYTES: '0' })
    expect(streamed.status).toBe(2)
    expect(streamed.stdout).toBe(whole.stdout)
    const out = JSON.parse(streamed.stdout) as Slot[]
    expect(out).toHaveLength(30)
    expect(out[0]!.summary!.totalAnnualCost).toBeGreaterThan(0)
    expect(out[7]!.error!.issues[0]!.path).toMatch(/^cases\.7\./)
    expect(streamed.stderr).toMatch(/1 of 30 cases refused: cases 7\b/)
  })
  it('a large NDJSON file and a bare array stream too', () => {
    const nd = join(dir, 'stream.ndjson')
    writeFileSync(nd, Array.from({ length: 12 }, (_, i) => JSON.stringify({ ...good, recovery: 0.9 + i * 0.005 })).join('\n') + '\n')
    const r = run([nd, '--summary'], { SCRUBWRIGHT_STREAM_BYTES: '0' })
    expect(r.status).toBe(0)
    expect(r.stdout.trim().split('\n')).toHaveLength(12)
    const arr = join(dir, 'array.json')
    writeFileSync(arr, JSON.stringify([good, good, infeasible]))
    const a = run([arr, '--summary'], { SCRUBWRIGHT_STREAM_BYTES: '0' })
    expect(a.status).toBe(2)
    expect((JSON.parse(a.stdout) as Slot[]).map((s) => Object.keys(s)[0])).toEqual(['summary', 'summary', 'error'])
  })
})
