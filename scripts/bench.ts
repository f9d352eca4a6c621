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

async function benchApi(url: string, token: string): Promise<Record<string, number>> {
  const example = JSON.parse(readFileSync('data/examples/optimize.json', 'utf8')) as Record<string, unknown>
  const body = JSON.stringify({ case: example.case, search: example.search, costBasis: { preset: 'halvard-cobalt-ridge' } })
  const result = await autocannon({
    url: `${url}/api/v1/designs/optimize`,
    method: 'POST',
    connections: 20,
    duration: 10,
    headers: { 'content-type': 'application/json', authorization: `Bearer ${token}` },
    body,
  })
  const non2xx = result.non2xx + result.errors
  return {
    'api optimise: requests/s': result.requests.average,
    'api optimise: latency p50 ms': result.latency.p50,
    'api optimise: latency p97.5 ms': result.latency.p97_5,
    'api optimise: latency p99 ms': result.latency.p99,
    'api optimise: failed requests': non2xx,
  }
}

const figures: Record<string, number> = {}
Object.assign(figures, await benchDesign({ log: true }))
Object.assign(figures, await benchOptimise({ log: true }))
if (process.env.BENCH_API_URL && process.env.BENCH_TOKEN) {
  console.log('\nAPI under 20 concurrent optimise requests for 10 s ...')
  Object.assign(figures, await benchApi(process.env.BENCH_API_URL, process.env.BENCH_TOKEN))
}
console.log('\nSummary')
for (const [k, v] of Object.entries(figures)) console.log(`  ${k.padEnd(52)} ${Number.isInteger(v) ? v : v.toFixed(2)}`)
