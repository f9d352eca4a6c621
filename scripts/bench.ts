/**
 * npm run bench: the speed figures of the product on this machine.
 *  - designs per second, dilute (Kremser) path and stage-by-stage path, on one core;
 *  - the batch command line for 10,000 cases;
 *  - one optimisation: median and p95 ms, evaluations versus the dense grid;
 *  - the API: POST /api/v1/designs/optimize under 20 concurrent requests on loopback (autocannon),
 *    when BENCH_API_URL and BENCH_TOKEN are set (scripts/bench.sh starts a server for it).
 * No thresholds here: the figures are reported, and compared with the targets in the README.
 */
import autocannon from 'autocannon'
import { readFileSync } from 'node:fs'
import { benchDesign } from './bench-design.ts'
import { benchOptimise } from './bench-optimise.ts'

/**
 * Three runs of 20 connections for 10 s each: the same case over and over (what re-opening a study
 * looks like: answered from the cache); every request a different case (the gas flow moves by a
 * little each time, so nothing comes from the cache), with the sensitivity study and without it.
 */
async function benchApi(url: string, token: string): Promise<Record<string, number>> {
  const example = JSON.parse(readFileSync('data/examples/optimize.json', 'utf8')) as { case: { gas: { flow: number } }; search?: unknown }
  const baseFlow = Number(example.case.gas.flow)
  let n = 0
  const bodyFor = (flow: number, sensitivity = true) =>
    JSON.stringify({ case: { ...example.case, gas: { ...example.case.gas, flow } }, search: { ...(example.search as object), sensitivity }, costBasis: { preset: 'halvard-cobalt-ridge' } })
  const common = {
    url: `${url}/api/v1/designs/optimize`,
    method: 'POST' as const,
    connections: 20,
    duration: 10,
    headers: { 'content-type': 'application/json', authorization: `Bearer ${token}` },
  }
  // The repeated case first: a distinct-case run leaves work queued on the server when it stops.
  const repeated = await autocannon({ ...common, body: bodyFor(baseFlow) })
  const distinct = await autocannon({ ...common, requests: [{ setupRequest: (req) => ({ ...req, body: bodyFor(baseFlow * (1 + 1e-6 * ++n)) }) }] })
  await new Promise((r) => setTimeout(r, 3000)) // let the server finish what the last run left queued
  const noSens = await autocannon({ ...common, requests: [{ setupRequest: (req) => ({ ...req, body: bodyFor(baseFlow * (1 + 1e-6 * ++n), false) }) }] })
  const out: Record<string, number> = {}
  for (const [name, r] of [['distinct cases', distinct], ['distinct, no sensitivity', noSens], ['repeated case (cache)', repeated]] as const) {
    out[`api optimise, ${name}: requests/s`] = r.requests.average
    out[`api optimise, ${name}: p50 ms`] = r.latency.p50
    out[`api optimise, ${name}: p97.5 ms`] = r.latency.p97_5
    out[`api optimise, ${name}: p99 ms`] = r.latency.p99
    out[`api optimise, ${name}: failed`] = r.non2xx + r.errors
  }
  return out
}

console.log(`Scrubwright speed table (${new Date().toISOString()}, load average ${(await import('node:os')).loadavg().map((x) => x.toFixed(2)).join(' ')})`)
const { benchTable, printTable } = await import('./bench-table.ts')
const rows = await benchTable()
printTable(rows)

const figures: Record<string, number> = {}
if (process.env.BENCH_DETAIL && !process.env.BENCH_SKIP_ENGINE) {
  Object.assign(figures, await benchDesign({ log: true }))
  Object.assign(figures, await benchOptimise({ log: true }))
}
if (process.env.BENCH_DETAIL && process.env.BENCH_API_URL && process.env.BENCH_TOKEN) {
  console.log('\nAPI under 20 concurrent optimise requests for 10 s ...')
  Object.assign(figures, await benchApi(process.env.BENCH_API_URL, process.env.BENCH_TOKEN))
}
if (Object.keys(figures).length) console.log('\nDetail')
for (const [k, v] of Object.entries(figures)) console.log(`  ${k.padEnd(52)} ${Number.isInteger(v) ? v : v.toFixed(2)}`)
