/**
 * The convention of the client (DEVELOPERS.md, Client): a view or component that calls the API
 * keeps status, error and retry in useAsync, never in a hand-rolled try/catch with its own
 * loading and error refs.
 */
import { describe, expect, it } from 'vitest'
import { execFileSync } from 'node:child_process'
import { readFileSync } from 'node:fs'

const files = execFileSync('find', ['src/views', 'src/components', '-name', '*.vue'], { encoding: 'utf8' }).trim().split('\n')
const sources = files.map((f) => ({ f, text: readFileSync(f, 'utf8') }))
/** The API objects a file imports as values (peopleApi, studiesApi, ...). */
const apiImports = (text: string) =>
  [...text.matchAll(/^import \{([^}]*)\} from '@\/api\/[A-Za-z]+\.ts'/gm)].flatMap((m) => m[1]!.split(',').map((n) => n.trim()).filter((n) => /^\w+Api$/.test(n)))

describe('calls to the API from the screens', () => {
  it('every view or component that imports an API object calls it through useAsync (or hands it to AppFormDialog, which does)', () => {
    const calling = sources.filter((s) => apiImports(s.text).length > 0)
    expect(calling.length).toBeGreaterThan(10)
    expect(calling.filter((s) => !s.text.includes('useAsync(') && !s.text.includes('<AppFormDialog')).map((s) => s.f)).toEqual([])
  })

  it('no view or component awaits the API inside a try block of its own', () => {
    const offenders = sources.filter((s) => [...s.text.matchAll(/try \{([\s\S]*?)\n\s*\} catch/g)].some((m) => /await [^\n]*(?:\w+Api\.|session\.|props\.(?:pin|remove))/.test(m[1]!))).map((s) => s.f)
    expect(offenders).toEqual([])
  })
})
