// Entry of the compiled design command (dist-server/design.mjs).
import { main } from '../design.ts'

process.exitCode = await main(process.argv.slice(2))
