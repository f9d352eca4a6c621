// Runs a compiled entry of dist-server/ (design, optimize, index, db-cli), building it first when
// it is missing or older than any source it is made from (server/, shared/, data/, package-lock).
// Usage: node scripts/run-built.mjs design FILE.json
import { readdirSync, statSync, openSync, closeSync, rmSync, existsSync } from 'node:fs'
import { join } from 'node:path'
import { pathToFileURL, fileURLToPath } from 'node:url'
import { dirname } from 'node:path'

const ROOT = join(dirname(fileURLToPath(import.meta.url)), '..')
const OUT = join(ROOT, 'dist-server')

function newest(dir) {
  let t = 0
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    const p = join(dir, e.name)
    if (e.isDirectory()) t = Math.max(t, newest(p))
    else if (/\.(ts|json|mjs)$/.test(e.name)) t = Math.max(t, statSync(p).mtimeMs)
  }
  return t
}

/** True when dist-server/ is missing or older than its sources. */
export function isStale() {
  let built
  try {
    built = statSync(join(OUT, 'BUILT')).mtimeMs
  } catch {
    return true
  }
  const src = Math.max(newest(join(ROOT, 'server')), newest(join(ROOT, 'shared')), newest(join(ROOT, 'data')), statSync(join(ROOT, 'package-lock.json')).mtimeMs, statSync(join(ROOT, 'scripts/build-server.mjs')).mtimeMs)
  return src > built
}

/** Build when stale; one builder at a time (a lock file), the others wait for it. */
export async function ensureBuilt() {
  if (!isStale()) return
  const lock = join(ROOT, '.dist-server.lock')
  for (let i = 0; ; i++) {
    let fd
    try {
      fd = openSync(lock, 'wx')
    } catch {
      // another process builds; a lock older than two minutes is left over from a crash
      try {
        if (Date.now() - statSync(lock).mtimeMs > 120_000) rmSync(lock, { force: true })
      } catch {
        /* gone meanwhile */
      }
      await new Promise((r) => setTimeout(r, 100))
      if (i > 1200) throw new Error('timed out waiting for another build of dist-server/')
      continue
    }
    try {
      if (isStale()) {
        const { buildServer } = await import('./build-server.mjs')
        await buildServer({ quiet: true })
      }
    } finally {
      closeSync(fd)
      rmSync(lock, { force: true })
    }
    return
  }
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const [name, ...args] = process.argv.slice(2)
  if (!name) {
    console.error('usage: node scripts/run-built.mjs design|optimize|index|db-cli [args]')
    process.exit(2)
  }
  await ensureBuilt()
  const entry = join(OUT, `${name}.mjs`)
  if (!existsSync(entry)) {
    console.error(`no compiled entry ${name}`)
    process.exit(2)
  }
  process.argv = [process.argv[0], entry, ...args]
  await import(pathToFileURL(entry).href)
}
