// Entry of the compiled rate command (dist-server/rate.mjs).
import { main } from '../rate.ts'

process.exitCode = main(process.argv.slice(2))
