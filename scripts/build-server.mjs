// Compiles the server and the command lines to plain JavaScript in dist-server/ (esbuild: one
// bundle per entry, shared code split into chunks, npm packages left in node_modules), and the
// start-up snapshot of the command lines (cli.blob, see snapshotId below and scripts/cli.sh).
// `npm run build` runs it after the client build; scripts/run-built.mjs runs it on demand when
// the sources are newer than the build.
import { build } from 'esbuild'
import { execFile } from 'node:child_process'
import { promisify } from 'node:util'
import { mkdirSync, renameSync, rmSync, statSync, writeFileSync, existsSync } from 'node:fs'
import { dirname, join } from 'node:path'
import { fileURLToPath, pathToFileURL } from 'node:url'

export const ROOT = join(dirname(fileURLToPath(import.meta.url)), '..')
export const OUT = join(ROOT, 'dist-server')

/** The command lines: every package bundled in (a command starts in a fraction of a second). */
export const CLI_ENTRIES = {
  design: 'server/cli/bin/design.ts',
  optimize: 'server/cli/bin/optimize.ts',
  rate: 'server/cli/bin/rate.ts',
  uncertainty: 'server/cli/bin/uncertainty.ts',
}
/** The server: npm packages stay in node_modules. */
export const ENTRIES = {
  index: 'server/index.ts',
  'db-cli': 'server/db/cli.ts',
  'optimise-worker': 'server/workers/optimise-worker.ts',
}

/**
 * zod re-exports every message locale (about 260 kB of a command line's 900 kB); the product
 * speaks English only, so the command lines get the English locale alone.
 */
const englishOnly = {
  name: 'zod-english-only',
  setup(b) {
    b.onResolve({ filter: /locales\/index\.js$/ }, (args) =>
      args.importer.includes(`${join('node_modules', 'zod')}`) ? { path: 'zod-locales', namespace: 'zod-locales' } : undefined,
    )
    b.onLoad({ filter: /.*/, namespace: 'zod-locales' }, () => ({
      contents: `export { default as en } from ${JSON.stringify(join(ROOT, 'node_modules/zod/v4/locales/en.js'))}`,
      loader: 'js',
      resolveDir: ROOT,
    }))
  },
}

/**
 * What the start-up snapshot is valid for: a snapshot only loads in the very node binary that made
 * it (scripts/cli.sh compares this line, written beside the blob, before it uses the blob) and
 * holds the absolute path of the project it was built in (mathjs is found from there).
 */
export function snapshotId(nodePath = process.execPath) {
  const st = statSync(nodePath)
  return `${ROOT} ${st.size} ${Math.floor(st.mtimeMs / 1000)}`
}

/**
 * The command lines as one CommonJS bundle run into a V8 start-up snapshot (node --build-snapshot):
 * `node --snapshot-blob dist-server/cli.blob design FILE` starts with every module already
 * loaded, the schemas built and the cost presets parsed. Returns false (and leaves no blob) when
 * this node cannot make one; the command lines then run from the plain bundles.
 */
async function buildSnapshot(dir, quiet) {
  const bundle = join(dir, 'cli-snapshot.cjs')
  await build({
    absWorkingDir: ROOT,
    entryPoints: [join(ROOT, 'server/cli/bin/snapshot.ts')],
    outfile: bundle,
    bundle: true,
    format: 'cjs',
    platform: 'node',
    target: 'node20',
    plugins: [englishOnly],
    minifyWhitespace: true,
    minifySyntax: true,
    // the bundle's own place once dist-server/ is swapped in (units.ts finds mathjs from it)
    define: { 'import.meta.url': JSON.stringify(pathToFileURL(join(OUT, 'cli-snapshot.cjs')).href) },
    logLevel: quiet ? 'error' : 'warning',
  })
  const blob = join(dir, 'cli.blob')
  try {
    await promisify(execFile)(process.execPath, ['--snapshot-blob', blob, '--build-snapshot', bundle], { cwd: ROOT, env: { ...process.env, NODE_OPTIONS: '' } })
  } catch (e) {
    rmSync(blob, { force: true })
    console.warn(`[scrubwright] no start-up snapshot of the command lines (they run from the plain bundles): ${String(e.stderr || e.message).trim().split('\n')[0]}`)
    return false
  }
  writeFileSync(join(dir, 'cli.blob.id'), snapshotId() + '\n')
  return true
}

/** Build into a fresh folder, then swap it in, so a command never starts from a half-written build. */
export async function buildServer({ quiet = false } = {}) {
  const t0 = Date.now()
  const tmp = `${OUT}.tmp-${process.pid}`
  rmSync(tmp, { recursive: true, force: true })
  mkdirSync(tmp, { recursive: true })
  const common = {
    absWorkingDir: ROOT,
    outdir: tmp,
    outExtension: { '.js': '.mjs' },
    bundle: true,
    splitting: true,
    format: 'esm',
    platform: 'node',
    target: 'node20',
    chunkNames: 'chunk-[hash]',
    sourcemap: 'linked',
    logLevel: quiet ? 'error' : 'warning',
  }
  const entries = (e) => Object.fromEntries(Object.entries(e).map(([k, v]) => [k, join(ROOT, v)]))
  await Promise.all([
    build({ ...common, entryPoints: entries(ENTRIES), packages: 'external' }),
    build({ ...common, entryPoints: entries(CLI_ENTRIES), chunkNames: 'cli-[hash]', plugins: [englishOnly], minifyWhitespace: true, minifySyntax: true }),
    buildSnapshot(tmp, quiet),
  ])
  writeFileSync(join(tmp, 'BUILT'), new Date().toISOString() + '\n')
  const old = `${OUT}.old-${process.pid}`
  if (existsSync(OUT)) renameSync(OUT, old)
  renameSync(tmp, OUT)
  rmSync(old, { recursive: true, force: true })
  if (!quiet) console.log(`[scrubwright] server and command lines built to dist-server/ in ${Date.now() - t0} ms`)
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  await buildServer()
}
