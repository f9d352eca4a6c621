/**
 * The build trims Vuetify's stylesheet to the classes the client can use (scripts/css-trim.mjs).
 * Rules of the product's build (no outside reference): a class the client's templates name is
 * kept; a class nothing names goes; at-rules left empty go; keyframes stay.
 */
import { readFileSync } from 'node:fs'
import { execFileSync } from 'node:child_process'
import { describe, expect, it } from 'vitest'
import { trimCss, usedWords, wordsOf } from '../../scripts/css-trim.mjs'

const used = (src: string[], lib: string[] = []) => {
  const s = wordsOf(src)
  const l = wordsOf(lib)
  return { words: new Set([...s.words, ...l.words]), srcWords: s.words, prefixes: s.prefixes, propPrefixes: new Set(['text-', 'bg-', ...l.prefixes]) }
}

describe('css trim', () => {
  it('keeps what the sources name, drops the rest, and empty at-rules with it', () => {
    const css = `@layer a, b;
@layer u { .ma-2 { margin: 8px; } .ma-3 { margin: 12px; } }
@media (min-width: 600px) { .d-sm-flex { display: flex !important; } }
@keyframes v-shake { 59% { margin-left: 0; } }
.v-btn--block { width: 100%; }
.text-grey { color: #9e9e9e; } .text-red { color: red; }
.flag-warn, .flag-none { color: orange; }
.align-center { align-items: center; } .align-end { align-items: flex-end; }`
    const out = trimCss(css, used(['<div class="ma-2"><v-chip color="grey" :class="`flag-${code}`" align="center" /></div>'], ['`align-${props.align}`']))
    expect(out).toContain('.ma-2{')
    expect(out).not.toContain('.ma-3')
    expect(out).not.toContain('@media') // its only rule went
    expect(out).toContain('@keyframes v-shake')
    expect(out).toContain('@layer a, b;')
    expect(out).toContain('.v-btn--block') // Vuetify's own classes stay
    expect(out).toContain('.text-grey') // color="grey" becomes text-grey
    expect(out).not.toContain('.text-red')
    expect(out).toContain('.flag-warn,.flag-none') // a family the template builds
    expect(out).toContain('.align-center') // align="center" through Vuetify's align-${...}
    expect(out).not.toContain('.align-end')
  })

  it("keeps every Vuetify utility class the client's templates write in a class attribute", () => {
    const root = process.cwd()
    const css = readFileSync(`${root}/node_modules/vuetify/lib/styles/main.css`, 'utf8')
    const out = trimCss(css, usedWords(root))
    const classesIn = (text: string) => new Set([...text.matchAll(/\.((?:\\.|[A-Za-z0-9_-])+)/g)].map((m) => m[1]!))
    const before = classesIn(css)
    const after = classesIn(out)
    const files = execFileSync('find', ['src', '-name', '*.vue'], { encoding: 'utf8' }).trim().split('\n')
    const named = files.flatMap((f) => [...readFileSync(f, 'utf8').matchAll(/\bclass="([^"]+)"/g)].flatMap((m) => m[1]!.split(/\s+/)))
    const utilities = [...new Set(named)].filter((c) => before.has(c))
    expect(utilities.length).toBeGreaterThan(20)
    expect(utilities.filter((c) => !after.has(c))).toEqual([])
    expect(out.length).toBeLessThan(css.length / 3)
  })
})
