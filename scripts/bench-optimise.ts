/**
 * Optimiser benchmark: `npx tsx scripts/bench-optimise.ts`
 *
 * For the two demo cases (Cobalt Ridge ethanol with its demo cost basis; Marrow Bay acetone
 * with its basis and an emission limit) it prints the median and p95 wall time of one
 * optimisation (search + cost curves), the same with the sensitivity tornado, the design
 * evaluations per optimisation, and the ratio to a dense brute-force grid over the same
 * variables (61 recoveries × 31 solvent factors × 11 fractions of flood × 5 spacings), whose
 * optimum is computed once to report the TAC agreement.
 * Targets: median < 30 ms, p95 < 80 ms per optimisation including curves. The process CPU time
 * per optimisation is printed as well: on a shared, loaded machine wall time includes waiting.
 * `benchOptimise()` is exported for the top-level bench script.
 */
import { readFileSync } from 'node:fs'
import { dirname, join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { caseToSI } from '../server/engine/index.ts'
import { loadPreset } from '../server/engine/costing/presets.ts'
import { bruteForce, optimise } from '../server/engine/optimisation/optimise.ts'
import { searchSpecSchema, type SearchSpecInput } from '../shared/schemas/search.ts'

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..')

function quantile(xs: number[], q: number): number {
  const s = xs.slice().sort((a, b) => a - b)
  return s[Math.min(s.length - 1, Math.floor(q * s.length))] ?? Number.NaN
}

interface BenchCase {
  key: string
  caseRaw: unknown
  preset: string
  search: SearchSpecInput
}

function cases(): BenchCase[] {
  const ex = JSON.parse(readFileSync(join(root, 'data/examples/optimize.json'), 'utf8')) as { case: unknown; search: SearchSpecInput }
  const acetone = JSON.parse(readFileSync(join(root, 'data/examples/design-acetone.json'), 'utf8')) as Record<string, unknown>
  return [
    { key: 'cobaltRidge', caseRaw: ex.case, preset: 'halvard-cobalt-ridge', search: ex.search },
    { key: 'marrowBay', caseRaw: acetone, preset: 'halvard-marrow-bay', search: { emissionLimit: 5, maxDiameter: 5 } },
  ]
}

export async function benchOptimise(options: { runs?: number; log?: boolean; brute?: boolean } = {}): Promise<Record<string, number>> {
  const runs = options.runs ?? 40
  const log = options.log ?? true
  const out: Record<string, number> = {}
  for (const bc of cases()) {
    const c = caseToSI(bc.caseRaw)
    const basis = loadPreset(bc.preset)
    const plain = searchSpecSchema.parse({ ...bc.search, sensitivity: false })
    const withSens = searchSpecSchema.parse({ ...bc.search, sensitivity: true })
    // warm-up
    for (let i = 0; i < 5; i++) optimise(c, basis, plain)
    const ms: number[] = []
    const cpu: number[] = []
    const msSens: number[] = []
    const evals: number[] = []
    const sensEvals: number[] = []
    let tac = 0
    for (let i = 0; i < runs; i++) {
      const c0 = process.cpuUsage()
      const t0 = performance.now()
      const r = optimise(c, basis, plain)
      ms.push(performance.now() - t0)
      const dc = process.cpuUsage(c0)
      cpu.push((dc.user + dc.system) / 1000)
      evals.push(r.evaluations)
      tac = r.optimum.totalAnnualCost
    }
    for (let i = 0; i < Math.max(5, Math.floor(runs / 4)); i++) {
      const t0 = performance.now()
      const r = optimise(c, basis, withSens)
      msSens.push(performance.now() - t0)
      sensEvals.push(r.stats.sensitivityEvaluations)
    }
    const k = bc.key
    out[`${k}.medianMs`] = quantile(ms, 0.5)
    out[`${k}.p95Ms`] = quantile(ms, 0.95)
    out[`${k}.cpuMedianMs`] = quantile(cpu, 0.5)
    out[`${k}.cpuP95Ms`] = quantile(cpu, 0.95)
    out[`${k}.withSensitivity.medianMs`] = quantile(msSens, 0.5)
    out[`${k}.withSensitivity.p95Ms`] = quantile(msSens, 0.95)
    out[`${k}.evaluations`] = quantile(evals, 0.5)
    out[`${k}.sensitivityEvaluations`] = quantile(sensEvals, 0.5)
    const res = { recovery: 61, solventFactor: 31, floodFraction: 11 }
    const gridEvals = res.recovery * res.solventFactor * res.floodFraction * plain.traySpacings.length
    out[`${k}.denseGridEvaluations`] = gridEvals
    out[`${k}.gridToOptimiserRatio`] = gridEvals / (out[`${k}.evaluations`] ?? 1)
    if (options.brute !== false) {
      const t0 = performance.now()
      const b = bruteForce(c, basis, plain, res)
      out[`${k}.denseGridMs`] = performance.now() - t0
      out[`${k}.tacOptimiserOverGrid`] = b.best ? tac / b.best.totalAnnualCost : Number.NaN
    }
    if (log) {
      console.log(
        `${k}: optimisation median ${out[`${k}.medianMs`]?.toFixed(1)} ms, p95 ${out[`${k}.p95Ms`]?.toFixed(1)} ms ` +
          `(CPU time median ${out[`${k}.cpuMedianMs`]?.toFixed(1)} ms, p95 ${out[`${k}.cpuP95Ms`]?.toFixed(1)} ms) ` +
          `(with sensitivity: median ${out[`${k}.withSensitivity.medianMs`]?.toFixed(1)} ms, p95 ${out[`${k}.withSensitivity.p95Ms`]?.toFixed(1)} ms); ` +
          `${out[`${k}.evaluations`]} design evaluations per optimisation (+${out[`${k}.sensitivityEvaluations`]} for sensitivity) vs ${gridEvals} on the dense grid ` +
          `(${out[`${k}.gridToOptimiserRatio`]?.toFixed(0)}× fewer)` +
          (out[`${k}.tacOptimiserOverGrid`] !== undefined
            ? `; TAC optimiser / grid = ${out[`${k}.tacOptimiserOverGrid`]?.toFixed(5)} (grid took ${out[`${k}.denseGridMs`]?.toFixed(0)} ms)`
            : ''),
      )
    }
  }
  return out
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  await benchOptimise()
}
