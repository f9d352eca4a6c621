// Entry of the compiled design command (dist-server/design.mjs). One plain case takes the quick
// path (../designOne.ts: no schemas loaded); everything else loads the full command (../design.ts).
import { readFileSync, statSync } from 'node:fs'
import { quickDesignText } from '../designOne.ts'

const argv = process.argv.slice(2)

function quick(): string | null {
  const args = argv.filter((a) => a !== '--')
  if (args.length !== 1 || args[0]!.startsWith('-')) return null
  try {
    if (statSync(args[0]!).size > 1 << 20) return null
    return quickDesignText(readFileSync(args[0]!, 'utf8'))
  } catch {
    return null
  }
}

const text = quick()
if (text !== null) process.stdout.write(text)
else {
  const { main } = await import('../design.ts')
  process.exitCode = main(argv)
}
