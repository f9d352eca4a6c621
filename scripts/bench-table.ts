/**
 * The speed table of the product, measured on the machine it runs on: every row with its target,
 * the measured figure, wall time and CPU time. Run by `npm run bench` (scripts/bench.sh starts a
 * throw-away server for the API row). Environment: BENCH_BATCH_CASES (default 1,000,000),
 * BENCH_ONLY (comma-separated steps: command lines, batch, engine, API, client),
 * BENCH_API_URL / BENCH_TOKEN / BENCH_SERVER_PID (set by bench.sh).
 * No thresholds: the figures are reported, never asserted.
 */
import { spawnSync, execFileSync } from 'node:child_process'
import { mkdtempSync, openSync, readFileSync, rmSync, writeSync, closeSync } from 'node:fs'
import { availableParallelism, tmpdir } from 'node:os'
import { dirname, join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { caseToSI, evaluateCase } from '../server/engine/index.ts'
import { designSI } from '../server/engine/design.ts'
import { designBalancesBatch, balanceBatchOutput } from '../server/engine/batch/balances.ts'
import { optimise } from '../server/engine/optimisation/optimise.ts'
import { loadPreset } from '../server/engine/costing/presets.ts'
import { searchSpecSchema } from '../shared/schemas/search.ts'
import { uncertaintyRow } from './bench-uncertainty.ts'

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..')

export interface Row {
  what: string
  target: string
  measured: string
  wall: string
  cpu: string
}

const median = (xs: number[]) => xs.slice().sort((a, b) => a - b)[Math.floor(xs.length / 2)]!
const pct = (xs: number[], p: number) => xs.slice().sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor((xs.length * p) / 100))]!
const s = (x: number) => `${x.toFixed(x < 1 ? 3 : 2)} s`
const ms = (x: number) => `${x.toFixed(1)} ms`
const k = (x: number) => (x >= 1e6 ? `${(x / 1e6).toFixed(2)}M` : `${(x / 1e3).toFixed(0)}k`)

/** A child process timed by GNU time: wall [s], CPU (user + system) [s], peak RSS [MB]. */
function timed(cmd: string, args: string[], stdoutFile = '/dev/null'): { wall: number; cpu: number; rssMB: number; status: number } {
  const fmtFile = join(tmpdir(), `scrubwright-time-${process.pid}`)
  const out = openSync(stdoutFile, 'w')
  const r = spawnSync('/usr/bin/time', ['-f', '%e %U %S %M', '-o', fmtFile, cmd, ...args], { cwd: root, stdio: ['ignore', out, 'pipe'] })
  closeSync(out)
  const [e, u, sy, m] = readFileSync(fmtFile, 'utf8').trim().split('\n').pop()!.split(' ').map(Number)
  rmSync(fmtFile, { force: true })
  return { wall: e!, cpu: u! + sy!, rssMB: m! / 1024, status: r.status ?? 1 }
}

function cliRows(rows: Row[]): void {
  const npm = process.platform === 'win32' ? 'npm.cmd' : 'npm'
  spawnSync(process.execPath, ['scripts/run-built.mjs', 'design', '--help'], { cwd: root, stdio: 'ignore' }) // build when stale
  for (const [name, file, target] of [
    ['design', 'data/examples/design.json', 0.4],
    ['optimize', 'data/examples/optimize.json', 0.5],
  ] as const) {
    const runs = Array.from({ length: 5 }, () => timed(npm, ['run', '--silent', name, '--', file]))
    const direct = Array.from({ length: 5 }, () => timed(process.execPath, [`dist-server/${name}.mjs`, file]))
    const w = median(runs.map((r) => r.wall))
    rows.push({ what: `\`npm run --silent ${name}\` of one case, wall`, target: `< ${target} s on a quiet machine`, measured: `${s(w)} (node dist-server/${name}.mjs alone: ${s(median(direct.map((r) => r.wall)))}, ${s(median(direct.map((r) => r.cpu)))} CPU)`, wall: s(w), cpu: s(median(runs.map((r) => r.cpu))) })
  }
}

function batchRow(rows: Row[]): void {
  const n = Number(process.env.BENCH_BATCH_CASES ?? 1_000_000)
  const dir = mkdtempSync(join(tmpdir(), 'scrubwright-bench-batch-'))
  try {
    const file = join(dir, 'cases.ndjson')
    const base = JSON.parse(readFileSync(join(root, 'data/examples/design.json'), 'utf8')) as Record<string, unknown>
    const fd = openSync(file, 'w')
    let buf = ''
    for (let i = 0; i < n; i++) {
      buf += JSON.stringify({ ...base, recovery: 0.9 + (i % 90) / 1000, solventFactor: 1.2 + (i % 50) / 100 }) + '\n'
      if (buf.length > 1 << 20) {
        writeSync(fd, buf)
        buf = ''
      }
    }
    writeSync(fd, buf)
    closeSync(fd)
    const r = timed(process.execPath, ['dist-server/design.mjs', file, '--summary'])
    rows.push({
      what: `batch of ${n.toLocaleString('en')} cases (NDJSON in and out, --summary)`,
      target: '1,000,000 cases stream in constant memory, < 300 MB RSS',
      measured: `${r.status === 0 ? 'all designed' : `exit ${r.status}`}; peak RSS ${r.rssMB.toFixed(0)} MB; ${k(n / r.wall)} cases/s wall, ${k(n / r.cpu)} per CPU-s`,
      wall: s(r.wall),
      cpu: s(r.cpu),
    })
  } finally {
    rmSync(dir, { recursive: true, force: true })
  }
}

/** Runs fn repeatedly for about `seconds` of CPU; returns calls per CPU-second, wall and CPU. */
function perCpuSecond(fn: (i: number) => void, seconds = 1.5): { rate: number; wall: number; cpu: number } {
  for (let i = 0; i < 2000; i++) fn(i)
  const c0 = process.cpuUsage()
  const t0 = performance.now()
  let n = 0
  let cpu = 0
  while (cpu < seconds) {
    for (let j = 0; j < 500; j++) fn(n++)
    const d = process.cpuUsage(c0)
    cpu = (d.user + d.system) / 1e6
  }
  return { rate: n / cpu, wall: (performance.now() - t0) / 1000, cpu }
}

function engineRows(rows: Row[]): void {
  const raw = JSON.parse(readFileSync(join(root, 'data/examples/design.json'), 'utf8')) as Record<string, unknown>
  const c = caseToSI(raw)
  let sink = 0
  const full = perCpuSecond((i) => {
    sink += designSI(c, { recovery: 0.95 + (i % 40) * 0.001, solventFactor: 1.2 + (i % 17) * 0.02 }).summary.actualTrays
  })
  rows.push({ what: 'full design, one core (full result)', target: '>= 600k per CPU-second', measured: `${k(full.rate)} per CPU-second`, wall: s(full.wall), cpu: s(full.cpu) })
  const raws = Array.from({ length: 680 }, (_, i) => ({ ...raw, recovery: 0.95 + (i % 40) * 0.001, solventFactor: 1.2 + (i % 17) * 0.02 }))
  const rawRate = perCpuSecond((i) => {
    sink += evaluateCase(raws[i % raws.length]).summary.actualTrays
  })
  rows.push({ what: 'raw case to design (parse + units + design)', target: '<= 2x the design itself', measured: `${(full.rate / rawRate.rate).toFixed(2)}x (${k(rawRate.rate)} per CPU-second)`, wall: s(rawRate.wall), cpu: s(rawRate.cpu) })

  const n = 1_000_000
  let seed = 12345
  const rnd = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648)
  const arr = (a: number, b: number) => Float64Array.from({ length: n }, () => a + rnd() * (b - a))
  const input = { gasFlow: arr(10, 1000), yIn: arr(0.001, 0.05), x0: new Float64Array(n), K: arr(0.3, 3), recovery: arr(0.6, 0.99), solventFactor: arr(1.1, 3) }
  const out = balanceBatchOutput(n)
  const res: string[] = []
  let wall = 0
  let cpuT = 0
  for (const [method, count] of [['kremser', n], ['stageByStage', 100_000]] as const) {
    const sub = Object.fromEntries(Object.entries(input).map(([key, v]) => [key, v.subarray(0, count)])) as typeof input
    designBalancesBatch(sub, method, out)
    const c0 = process.cpuUsage()
    const t0 = performance.now()
    for (let r = 0; r < 3; r++) designBalancesBatch(sub, method, out)
    const d = process.cpuUsage(c0)
    const cpu = (d.user + d.system) / 1e6
    wall += (performance.now() - t0) / 1000
    cpuT += cpu
    res.push(`${method === 'kremser' ? 'dilute (Kremser)' : 'stage-by-stage'} ${k((3 * count) / cpu)} per CPU-second`)
  }
  rows.push({ what: 'many designs at once (typed arrays, material balance)', target: '>= 3M dilute designs per CPU-second, same answers as the scalar path (test)', measured: res.join('; '), wall: s(wall), cpu: s(cpuT) })

  const ex = JSON.parse(readFileSync(join(root, 'data/examples/optimize.json'), 'utf8')) as { case: Record<string, unknown>; search?: Record<string, unknown> }
  const oc = caseToSI({ recovery: 0.95, solventFactor: 1.5, ...ex.case })
  const basis = loadPreset('halvard-cobalt-ridge')
  const search = searchSpecSchema.parse({ ...(ex.search ?? {}), sensitivity: true })
  for (let i = 0; i < 3; i++) optimise(oc, basis, search)
  const walls: number[] = []
  const cpus: number[] = []
  let evals = 0
  for (let i = 0; i < 15; i++) {
    const c0 = process.cpuUsage()
    const t0 = performance.now()
    evals = optimise(oc, basis, search).evaluations
    walls.push(performance.now() - t0)
    const d = process.cpuUsage(c0)
    cpus.push((d.user + d.system) / 1000)
  }
  rows.push({ what: 'optimisation with sensitivity, median', target: '<= 25 ms quiet', measured: `${ms(median(walls))} (${evals} evaluations)`, wall: ms(median(walls)), cpu: ms(median(cpus)) })
  if (sink === -1) console.log(sink)
}

function serverCpuSeconds(pid: string | undefined): number {
  if (!pid) return NaN
  try {
    const f = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ')
    return (Number(f[11]) + Number(f[12])) / 100
  } catch {
    return NaN
  }
}

async function apiRow(rows: Row[]): Promise<void> {
  const url = process.env.BENCH_API_URL
  const token = process.env.BENCH_TOKEN
  if (!url || !token) {
    rows.push({ what: 'API, 50 concurrent optimisations of different cases', target: 'cheap requests p95 < 50 ms; bounded queue, 503 + Retry-After beyond; workers = cores', measured: 'not run (no database here: run through `npm run bench`)', wall: '-', cpu: '-' })
    return
  }
  const ex = JSON.parse(readFileSync(join(root, 'data/examples/optimize.json'), 'utf8')) as { case: { gas: { flow: number } }; search?: object }
  const headers = { 'content-type': 'application/json', authorization: `Bearer ${token}` }
  const cpu0 = serverCpuSeconds(process.env.BENCH_SERVER_PID)
  const t0 = performance.now()
  let done = false
  const me: number[] = []
  const poll = (async () => {
    while (!done) {
      const a = performance.now()
      await fetch(`${url}/api/v1/auth/me`, { headers }).then((r) => r.arrayBuffer())
      me.push(performance.now() - a)
      await new Promise((r) => setTimeout(r, 20))
    }
  })()
  const opt: { ms: number; status: number; retryAfter: string | null }[] = []
  await Promise.all(
    Array.from({ length: 50 }, async (_, i) => {
      const a = performance.now()
      const body = JSON.stringify({ case: { ...ex.case, gas: { ...ex.case.gas, flow: ex.case.gas.flow * (1 + 0.001 * (i + 1) + Math.random() * 1e-6) } }, search: ex.search, costBasis: { preset: 'halvard-cobalt-ridge' } })
      const r = await fetch(`${url}/api/v1/designs/optimize`, { method: 'POST', headers, body })
      await r.arrayBuffer()
      opt.push({ ms: performance.now() - a, status: r.status, retryAfter: r.headers.get('retry-after') })
    }),
  )
  done = true
  await poll
  const wall = (performance.now() - t0) / 1000
  const cpu = serverCpuSeconds(process.env.BENCH_SERVER_PID) - cpu0
  const ok = opt.filter((o) => o.status === 200)
  const busy = opt.filter((o) => o.status === 503)
  rows.push({
    what: 'API, 50 concurrent optimisations of different cases',
    target: 'cheap requests p95 < 50 ms while optimisations queue; bounded queue, 503 + Retry-After beyond; workers = cores',
    measured: `/auth/me p95 ${ms(pct(me, 95))} (${me.length} requests); optimise: ${ok.length} answered (p95 ${ok.length ? ms(pct(ok.map((o) => o.ms), 95)) : '-'}), ${busy.length} refused 503 (Retry-After ${busy[0]?.retryAfter ?? '-'} s, p95 ${busy.length ? ms(pct(busy.map((o) => o.ms), 95)) : '-'}), other ${opt.length - ok.length - busy.length}; ${availableParallelism()} cores`,
    wall: s(wall),
    cpu: Number.isFinite(cpu) ? `${s(cpu)} (server)` : '-',
  })
}

async function clientRow(rows: Row[]): Promise<void> {
  // always a fresh build: a dist/ left from older sources would be measured otherwise
  execFileSync('npx', ['vite', 'build', '--logLevel', 'error'], { cwd: root, stdio: 'inherit' })
  const { clientFirstLoad } = (await import(join(root, 'scripts/client-size.mjs'))) as { clientFirstLoad: (dist: string) => { files: number; raw: number; gzip: number; brotli: number } }
  const r = clientFirstLoad(join(root, 'dist'))
  rows.push({ what: 'client, first load (JS + CSS that index.html loads)', target: '<= 170 KB gzip; precompressed brotli + gzip; immutable caching of hashed files', measured: `${(r.gzip / 1024).toFixed(1)} KB gzip (${(r.brotli / 1024).toFixed(1)} KB brotli, ${(r.raw / 1024).toFixed(0)} KB raw, ${r.files} files); .br/.gz written at build, /assets/ served immutable`, wall: '-', cpu: '-' })
}

export async function benchTable(): Promise<Row[]> {
  const rows: Row[] = []
  // BENCH_ONLY=API,client measures only those rows (a quick look while working on one of them)
  const only = process.env.BENCH_ONLY?.split(',').map((x) => x.trim())
  const step = async (name: string, f: (r: Row[]) => void | Promise<void>) => {
    if (only && !only.includes(name)) return
    process.stdout.write(`  measuring: ${name} ...\n`)
    await f(rows)
  }
  await step('command lines', cliRows)
  await step('batch', batchRow)
  await step('engine', engineRows)
  await step('uncertainty', (r) => uncertaintyRow(r, root))
  await step('API', apiRow)
  await step('client', clientRow)
  return rows
}

export function printTable(rows: Row[]): void {
  console.log('\n| what | target | measured | wall | CPU |\n|---|---|---|---|---|')
  for (const r of rows) console.log(`| ${r.what} | ${r.target} | ${r.measured} | ${r.wall} | ${r.cpu} |`)
}
