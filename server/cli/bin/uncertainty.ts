// Entry of the compiled uncertainty command (dist-server/uncertainty.mjs).
import { main } from '../uncertainty.ts'

process.exitCode = main(process.argv.slice(2))
