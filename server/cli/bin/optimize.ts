// Entry of the compiled optimize command (dist-server/optimize.mjs).
import { main } from '../optimize.ts'

process.exitCode = main(process.argv.slice(2))
