/**
 * Design-engine benchmark: `npx tsx scripts/bench-design.ts`
 *
 * Prints designs/second for the dilute (Kremser) path and the stage-by-stage path
 * (warm-up, then ~1.5 s timed per round, median of 3 rounds) and the wall time of the
 * batch CLI for 10,000 cases (temp file, child process). Targets: >= 100,000
 * dilute and >= 10,000 stage-by-stage designs/s on one core.
 * `benchDesign()` is exported for the top-level bench script.
 */
import { execFileSync } from 'node:child_process'
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { dirname, join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { caseToSI } from '../server/engine/index.ts'
import { designSI } from '../server/engine/design.ts'
import type { CaseSI } from '../server/engine/case.ts'

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..')

function median(xs: number[]): number {
  const s = xs.slice().sort((a, b) => a - b)
  return s[Math.floor(s.length / 2)]!
}

/** designs per second for one case, varying recovery and solvent factor slightly. */
function rate(c: CaseSI, seconds: number, rounds: number, opts: { profile: boolean; detail: boolean }): number {
  let sink = 0
  const run = (n: number) => {
    for (let i = 0; i < n; i++) {
      const r = designSI(c, { recovery: 0.95 + (i % 40) * 0.001, solventFactor: 1.2 + (i % 17) * 0.02 }, opts)
      sink += r.summary.actualTrays
    }
  }
  // warm-up
  const w0 = performance.now()
  while (performance.now() - w0 < 300) run(100)
  const rates: number[] = []
  for (let k = 0; k < rounds; k++) {
    let n = 0
    const t0 = performance.now()
    let t1 = t0
    while (t1 - t0 < seconds * 1000) {
      run(200)
      n += 200
      t1 = performance.now()
    }
    rates.push((n * 1000) / (t1 - t0))
  }
  if (sink < 0) console.log(sink)
  return median(rates)
}

export async function benchDesign(options: { seconds?: number; rounds?: number; cliCases?: number; log?: boolean } = {}): Promise<Record<string, number>> {
  const seconds = options.seconds ?? 1.5
  const rounds = options.rounds ?? 3
  const cliCases = options.cliCases ?? 10000
  const log = options.log ?? true
  const demo = JSON.parse(readFileSync(join(root, 'data/examples/design.json'), 'utf8')) as Record<string, unknown>
  const dilute = caseToSI(demo)
  const sbs = caseToSI({ ...demo, method: 'stageByStage' })
  const table = caseToSI(JSON.parse(readFileSync(join(root, 'data/examples/design-table.json'), 'utf8')))
  const out: Record<string, number> = {}
  out['design.kremser.perSecond'] = rate(dilute, seconds, rounds, { profile: true, detail: true })
  out['design.kremser.lean.perSecond'] = rate(dilute, seconds, rounds, { profile: false, detail: false })
  out['design.stageByStage.perSecond'] = rate(sbs, seconds, rounds, { profile: true, detail: true })
  out['design.stageByStage.table.perSecond'] = rate(table, seconds, rounds, { profile: true, detail: true })
  if (log) {
    console.log(`dilute (Kremser), full result:      ${out['design.kremser.perSecond']!.toFixed(0)} designs/s (target >= 100000)`)
    console.log(`dilute (Kremser), no profile/detail: ${out['design.kremser.lean.perSecond']!.toFixed(0)} designs/s`)
    console.log(`stage-by-stage, linear K:            ${out['design.stageByStage.perSecond']!.toFixed(0)} designs/s (target >= 10000)`)
    console.log(`stage-by-stage, x-y table:           ${out['design.stageByStage.table.perSecond']!.toFixed(0)} designs/s`)
  }
  if (cliCases > 0) {
    const dir = mkdtempSync(join(tmpdir(), 'scrubwright-bench-'))
    try {
      const cases = []
      for (let i = 0; i < cliCases; i++) cases.push({ ...demo, recovery: 0.9 + (i % 90) * 0.001, solventFactor: 1.2 + (i % 50) * 0.01 })
      const file = join(dir, 'batch.json')
      writeFileSync(file, JSON.stringify({ cases }))
      const t0 = performance.now()
      const stdout = execFileSync(process.execPath, [join(root, 'node_modules/tsx/dist/cli.mjs'), join(root, 'server/cli/design.ts'), file], {
        cwd: root,
        maxBuffer: 1 << 30,
      })
      const dt = (performance.now() - t0) / 1000
      const n = (JSON.parse(stdout.toString('utf8')) as unknown[]).length
      if (n !== cliCases) throw new Error(`CLI returned ${n} results for ${cliCases} cases`)
      out['design.cli.batch10k.seconds'] = dt
      if (log) console.log(`CLI batch of ${cliCases} cases:          ${dt.toFixed(2)} s (process start, parse, design, JSON output)`)
    } finally {
      rmSync(dir, { recursive: true, force: true })
    }
  }
  return out
}

if (process.argv[1] && fileURLToPath(import.meta.url) === resolve(process.argv[1])) {
  await benchDesign()
}
