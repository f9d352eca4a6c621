/**
 * Bench row of the uncertainty propagation: 10,000 Latin hypercube samples of the demo optimise
 * case (K, efficiency, gas flow, inlet fraction, electricity price uncertain), each rating the
 * nominal design's column; median of 7 runs after 2 warm-up runs, wall and CPU, one core.
 */
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { caseToSI } from '../server/engine/index.ts'
import { loadPreset } from '../server/engine/costing/presets.ts'
import { parseUncertainty, uncertaintySI } from '../server/engine/uncertainty/index.ts'
import type { Row } from './bench-table.ts'

export function uncertaintyRow(rows: Row[], root: string): void {
  const ex = JSON.parse(readFileSync(join(root, 'data/examples/uncertainty.json'), 'utf8')) as { case: Record<string, unknown>; uncertainty?: unknown }
  const c = caseToSI(ex.case)
  const basis = loadPreset('halvard-cobalt-ridge')
  const spec = parseUncertainty({ ...(ex.uncertainty as object), samples: 10000 })
  for (let i = 0; i < 2; i++) uncertaintySI(c, basis, spec)
  const walls: number[] = []
  const cpus: number[] = []
  let p = 0
  for (let i = 0; i < 7; i++) {
    const c0 = process.cpuUsage()
    const t0 = performance.now()
    p = uncertaintySI(c, basis, spec).probabilityMeetsTarget
    walls.push(performance.now() - t0)
    const d = process.cpuUsage(c0)
    cpus.push((d.user + d.system) / 1000)
  }
  const med = (xs: number[]) => xs.slice().sort((a, b) => a - b)[Math.floor(xs.length / 2)]!
  rows.push({
    what: 'uncertainty propagation, 10,000 samples (design + ratings + statistics), median',
    target: '< 0.5 s on one core',
    measured: `${med(walls).toFixed(0)} ms (${((1000 * med(cpus)) / 10000).toFixed(1)} µs CPU per sample; P(meets target) ${p.toFixed(3)})`,
    wall: `${med(walls).toFixed(1)} ms`,
    cpu: `${med(cpus).toFixed(1)} ms`,
  })
}
