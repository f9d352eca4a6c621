// The first download of the built client: the JavaScript and CSS that index.html loads (entry,
// module preloads, style sheets), in bytes raw, gzip and brotli (the precompressed copies).
import { readFileSync, existsSync } from 'node:fs'
import { join } from 'node:path'
import { gzipSync } from 'node:zlib'

export function clientFirstLoad(dist = 'dist') {
  const html = readFileSync(join(dist, 'index.html'), 'utf8')
  const files = [...html.matchAll(/(?:src|href)="\/?(assets\/[^"]+\.(?:js|css))"/g)].map((m) => m[1])
  let raw = 0, gz = 0, br = 0
  for (const f of new Set(files)) {
    const data = readFileSync(join(dist, f))
    raw += data.length
    gz += existsSync(join(dist, f + '.gz')) ? readFileSync(join(dist, f + '.gz')).length : gzipSync(data, { level: 9 }).length
    br += existsSync(join(dist, f + '.br')) ? readFileSync(join(dist, f + '.br')).length : data.length
  }
  return { files: new Set(files).size, raw, gzip: gz, brotli: br }
}

if (process.argv[1] && import.meta.url.endsWith(process.argv[1].split('/').pop())) {
  const r = clientFirstLoad(process.argv[2] ?? 'dist')
  console.log(`first load: ${r.files} files, ${(r.raw / 1024).toFixed(1)} KB raw, ${(r.gzip / 1024).toFixed(1)} KB gzip, ${(r.brotli / 1024).toFixed(1)} KB brotli`)
}
