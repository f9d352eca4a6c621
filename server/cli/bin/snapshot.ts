// Entry of the start-up snapshot of the command lines (dist-server/cli.blob, made by
// scripts/build-server.mjs with `node --build-snapshot`; scripts/cli.sh runs it as
// `node --snapshot-blob dist-server/cli.blob design|optimize|rate|uncertainty ARGS`).
// What runs here at build time is in the snapshot: every module loaded, the schemas built and
// the shipped cost presets parsed. Nothing here may depend on the moment or the machine it runs
// on (environment, clock, open files): the snapshot keeps it as it was at build time.
import v8 from 'node:v8'
import { main as design } from '../design.ts'
import { main as optimize } from '../optimize.ts'
import { main as rate } from '../rate.ts'
import { main as uncertainty } from '../uncertainty.ts'
import { listPresets } from '../../engine/costing/presets.ts'
import { runOptimizeFile } from '../optimize.ts'
import { designOutput } from '../design.ts'
import designExample from '../../../data/examples/design.json' with { type: 'json' }
import optimizeExample from '../../../data/examples/optimize.json' with { type: 'json' }

const commands: Record<string, (argv: string[]) => number> = { design, optimize, rate, uncertainty }

/** Runs one command: args[0] names it, the rest are its own arguments. */
function run(args: string[]): void {
  const [name, ...rest] = args
  const command = name === undefined ? undefined : commands[name]
  if (!command) {
    process.stderr.write(`usage: ${Object.keys(commands).join('|')} [arguments]\n`)
    process.exitCode = 2
    return
  }
  process.exitCode = command(rest)
}

listPresets() // parses and keeps every shipped preset
// One design and one optimisation of the shipped examples: the schemas' parsers are compiled and
// the code they run is already compiled to bytecode when a command starts. (The engine's memos
// hold exact answers only: what they keep from here changes no later result.)
designOutput(designExample)
runOptimizeFile({ ...optimizeExample, search: { ...optimizeExample.search, sensitivity: false } })

if (v8.startupSnapshot.isBuildingSnapshot()) {
  // started from the snapshot there is no script: argv is [node, command, ...arguments]
  v8.startupSnapshot.setDeserializeMainFunction(() => run(process.argv.slice(1)))
} else {
  run(process.argv.slice(2))
}
