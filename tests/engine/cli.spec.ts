import { spawnSync } from 'node:child_process'
import { mkdtempSync, readFileSync, writeFileSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { main } from '../../server/cli/design.ts'

const tsx = join(process.cwd(), 'node_modules/tsx/dist/cli.mjs')
const cli = join(process.cwd(), 'server/cli/design.ts')
const dir = mkdtempSync(join(tmpdir(), 'scrubwright-cli-'))
afterAll(() => rmSync(dir, { recursive: true, force: true }))

function spawnCli(file: string) {
  return spawnSync(process.execPath, [tsx, cli, file], { encoding: 'utf8', timeout: 60000 })
}
/** In-process run of the same main() the command calls. */
function runInProcess(file: string) {
  let stdout = ''
  let stderr = ''
  const status = main([file], (s) => (stdout += s), (s) => (stderr += s))
  return { status, stdout, stderr }
}

describe('design command line (child process)', { timeout: 60000 }, () => {
  it('prints the design of data/examples/design.json and exits 0', () => {
    const r = spawnCli('data/examples/design.json')
    expect(r.status).toBe(0)
    const out = JSON.parse(r.stdout) as { summary: { selectedDiameter: number; actualTrays: number } }
    expect(out.summary.selectedDiameter).toBeGreaterThan(1)
    expect(out.summary.actualTrays).toBeGreaterThan(5)
  })
  it('bad input: exit code 2 and the field path on stderr', () => {
    const f = join(dir, 'bad.json')
    writeFileSync(
      f,
      JSON.stringify({ gas: { flow: { value: 3, unit: 'bushel/h' }, temperature: 30, pressure: 100, soluteMoleFraction: 0.01, carrier: 'air' }, solute: 'ethanol', solvent: 'water', equilibrium: { model: 'constantK', K: 1 }, recovery: 0.9, solventFactor: 1.3 }),
    )
    const r = spawnCli(f)
    expect(r.status).toBe(2)
    expect(r.stderr).toContain('gas.flow')
    expect(r.stdout).toBe('')
  })
})

describe('design command line (in process)', () => {
  it('a batch file gives an array in order', () => {
    const r = runInProcess('data/examples/design-batch.json')
    expect(r.status).toBe(0)
    const out = JSON.parse(r.stdout) as { summary: { recovery: number } }[]
    expect(out).toHaveLength(4)
    expect(out[1]!.summary.recovery).toBe(0.995)
  })
  it('every example file designs', () => {
    for (const f of ['design.json', 'design-acetone.json', 'design-table.json']) expect(runInProcess(`data/examples/${f}`).status).toBe(0)
  })
  it('not JSON or a missing file: exit code 2', () => {
    const f = join(dir, 'broken.json')
    writeFileSync(f, '{ "gas": ')
    expect(runInProcess(f).status).toBe(2)
    expect(runInProcess(join(dir, 'nope.json')).status).toBe(2)
  })
  it('an infeasible design: exit code 2 with the reason', () => {
    const f = join(dir, 'infeasible.json')
    // lean solvent already richer than the gas leaving at the target: valid input, no design
    const c = { gas: { flow: 100, temperature: 30, pressure: 100, soluteMoleFraction: 0.01, carrier: 'air' }, solute: 'ethanol', solvent: { name: 'water', soluteMoleFraction: 0.05 }, equilibrium: { model: 'constantK', K: 1 }, recovery: 0.9, solventFactor: 1.5 }
    writeFileSync(f, JSON.stringify(c))
    const r = runInProcess(f)
    expect(r.status).toBe(2)
    expect(r.stderr).toContain('leanSolventLoaded')
    // L/Lmin at or below 1 is refused as input, in the case's words
    const g = join(dir, 'below-minimum.json')
    writeFileSync(g, JSON.stringify({ ...c, solvent: 'water', solventFactor: 0.8 }))
    const b = runInProcess(g)
    expect(b.status).toBe(2)
    expect(b.stderr).toContain('0.8: L/Lmin must be above 1')
  })
  it('a cost basis beside the case adds totalAnnualCost and costBreakdown to each summary', () => {
    const one = JSON.parse(readFileSync('data/examples/design.json', 'utf8')) as Record<string, unknown>
    const f = join(dir, 'priced.json')
    writeFileSync(f, JSON.stringify({ cases: [one, { ...one, recovery: 0.95 }], costBasis: { preset: 'halvard-cobalt-ridge' } }))
    const r = runInProcess(f)
    expect(r.status).toBe(0)
    const out = JSON.parse(r.stdout) as { summary: { totalAnnualCost: number; costBreakdown: { totalAnnualCost: number } } }[]
    expect(out).toHaveLength(2)
    for (const d of out) {
      expect(d.summary.totalAnnualCost).toBeGreaterThan(0)
      expect(d.summary.costBreakdown.totalAnnualCost).toBe(d.summary.totalAnnualCost)
    }
    const bad = join(dir, 'priced-bad.json')
    writeFileSync(bad, JSON.stringify({ ...one, costBasis: { preset: 'nope' } }))
    const b = runInProcess(bad)
    expect(b.status).toBe(2)
    expect(b.stderr).toContain('costBasis.preset')
  })
  it('usage without a file: exit code 2', () => {
    expect(main([], () => {}, () => {})).toBe(2)
  })
})

describe('rate command line', () => {
  const rateCli = join(process.cwd(), 'server/cli/rate.ts')
  it('prints the rating of data/examples/rate.json and exits 0', () => {
    const r = spawnSync(process.execPath, [tsx, rateCli, 'data/examples/rate.json'], { encoding: 'utf8', timeout: 60000 })
    expect(r.status).toBe(0)
    const out = JSON.parse(r.stdout) as { summary: { recovery: number; percentFlood: number }; window: { inside: boolean } }
    expect(out.summary.recovery).toBeGreaterThan(0.9)
    expect(out.summary.percentFlood).toBeGreaterThan(80)
  })
  it('a batch gives an array; bad input exits 2 with the field path', async () => {
    const { main: rateMain } = await import('../../server/cli/rate.ts')
    const rating = JSON.parse(readFileSync('data/examples/rate.json', 'utf8')) as Record<string, unknown>
    const f = join(dir, 'rate-batch.json')
    writeFileSync(f, JSON.stringify({ cases: [rating, { ...rating, solventFlow: 400 }] }))
    let stdout = ''
    let stderr = ''
    expect(rateMain([f], (s) => (stdout += s), (s) => (stderr += s))).toBe(0)
    expect(JSON.parse(stdout)).toHaveLength(2)
    const bad = join(dir, 'rate-bad.json')
    writeFileSync(bad, JSON.stringify({ ...rating, column: { ...(rating.column as object), diameter: { value: 2, unit: 'kg' } } }))
    stdout = ''
    expect(rateMain([bad], (s) => (stdout += s), (s) => (stderr += s))).toBe(2)
    expect(stderr).toContain('column.diameter')
    expect(stdout).toBe('')
  })
})

describe('design command line: words for people', () => {
  // The engine writes lengths in its notes as tokens of SI values; the command line is an edge and
  // words them in SI, the case file's units (a gas flow this large needs a column beyond 8 m).
  it('a large column is noted with its diameter in metres, never a raw token', () => {
    const ex = JSON.parse(readFileSync('data/examples/design.json', 'utf8')) as Record<string, unknown>
    const f = join(dir, 'large.json')
    const gas = { ...(ex.gas as Record<string, unknown>), flow: 60000 }
    writeFileSync(f, JSON.stringify({ ...ex, gas }))
    const r = runInProcess(f)
    expect(r.status).toBe(0)
    const out = JSON.parse(r.stdout) as { warnings: { code: string; message: string }[] }
    const large = out.warnings.find((w) => w.code === 'largeDiameter')
    expect(large, JSON.stringify(out.warnings)).toBeDefined()
    expect(large!.message).toMatch(/Diameter [\d.]+ m is beyond/)
    for (const w of out.warnings) expect(w.message).not.toMatch(/\{\w+:/)
  })
})
