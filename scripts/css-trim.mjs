// Trims Vuetify's stylesheet (vuetify/styles: layers, core, material colours and about 240 kB of
// utility classes) to the utility and colour classes the client can use. A class is kept when
//  - it is one of Vuetify's own (v-...), or
//  - its name appears as a word in the client's sources or in Vuetify's components, or
//  - it starts with a prefix the client's templates build names from (`flag-${...}`), or
//  - it is a prefix Vuetify builds names from (colour, elevation, rounding, border, align...)
//    followed by a word of the client's sources: `color="grey"` becomes `text-grey`.
// A rule goes when none of its selectors is kept; an at-rule goes when it is left empty.
// Used by vite.config.ts at build time; the development server keeps the whole sheet.
import { readdirSync, readFileSync, statSync } from 'node:fs'
import { join } from 'node:path'

/** The prefixes Vuetify's props turn values into classes with. */
const PROP_PREFIXES = ['bg-', 'text-', 'elevation-', 'rounded-', 'border-', 'border-opacity-']

function files(dir, exts) {
  const out = []
  for (const f of readdirSync(dir)) {
    const p = join(dir, f)
    const st = statSync(p)
    if (st.isDirectory()) out.push(...files(p, exts))
    else if (exts.some((e) => f.endsWith(e))) out.push(p)
  }
  return out
}

/** Words (letters, digits, - and _) and template prefixes (`name-${`) of source texts. */
export function wordsOf(texts) {
  const words = new Set()
  const prefixes = new Set()
  for (const text of texts) {
    for (const m of text.matchAll(/[A-Za-z0-9_-]+/g)) words.add(m[0])
    for (const m of text.matchAll(/([a-z][a-z0-9-]*-)\$\{/g)) prefixes.add(m[1])
  }
  return { words, prefixes }
}

/**
 * What the client can use as class names: the words of its sources and of Vuetify's components and
 * composables; the prefixes the client's templates build names from (`name-${`), kept as whole
 * families; and the prefixes Vuetify builds names from (`align-${`, `elevation-${`), kept only with
 * a rest that is a word of the client's sources (a prop value: align="center", color="grey").
 */
export function usedWords(root) {
  const src = files(join(root, 'src'), ['.vue', '.ts', '.html']).map((f) => readFileSync(f, 'utf8'))
  src.push(readFileSync(join(root, 'index.html'), 'utf8'))
  const lib = [...files(join(root, 'node_modules/vuetify/lib/components'), ['.js']), ...files(join(root, 'node_modules/vuetify/lib/composables'), ['.js'])].map((f) => readFileSync(f, 'utf8'))
  const fromSrc = wordsOf(src)
  const fromLib = wordsOf(lib)
  const propPrefixes = new Set([...PROP_PREFIXES, ...fromLib.prefixes])
  return {
    words: new Set([...fromSrc.words, ...fromLib.words]),
    srcWords: fromSrc.words,
    prefixes: new Set([...fromSrc.prefixes].filter((p) => !propPrefixes.has(p))),
    propPrefixes,
  }
}

function classKept(name, used) {
  if (name.startsWith('v-') || used.words.has(name)) return true
  for (const p of used.prefixes) if (name.startsWith(p)) return true
  for (const p of used.propPrefixes) if (name.startsWith(p) && used.srcWords.has(name.slice(p.length))) return true
  return false
}

/** true when every class of the selector is kept (a selector without classes is kept). */
function selectorKept(selector, used) {
  for (const m of selector.matchAll(/\.((?:\\.|[A-Za-z0-9_-])+)/g)) {
    if (!classKept(m[1].replace(/\\(.)/g, '$1'), used)) return false
  }
  return true
}

/** Splits a selector list at top-level commas (not inside :is(...) or [..]). */
function splitSelectors(prelude) {
  const out = []
  let depth = 0
  let start = 0
  for (let i = 0; i < prelude.length; i++) {
    const ch = prelude[i]
    if (ch === '(' || ch === '[') depth++
    else if (ch === ')' || ch === ']') depth--
    else if (ch === ',' && depth === 0) {
      out.push(prelude.slice(start, i))
      start = i + 1
    }
  }
  out.push(prelude.slice(start))
  return out.map((s) => s.trim()).filter(Boolean)
}

/** Index of the brace that closes the block opened at `open` (strings and comments skipped). */
function closing(css, open) {
  let depth = 0
  for (let i = open; i < css.length; i++) {
    const ch = css[i]
    if (ch === '"' || ch === "'") {
      i = css.indexOf(ch, i + 1)
      if (i < 0) break
    } else if (ch === '/' && css[i + 1] === '*') {
      i = css.indexOf('*/', i + 2) + 1
      if (i <= 0) break
    } else if (ch === '{') depth++
    else if (ch === '}' && --depth === 0) return i
  }
  throw new Error('css-trim: unbalanced braces')
}

const GROUPING = /^@(media|supports|layer|container|scope|document)\b/

/** The stylesheet without the rules whose classes are not used. */
export function trimCss(css, used) {
  let out = ''
  let i = 0
  while (i < css.length) {
    const brace = css.indexOf('{', i)
    const semi = css.indexOf(';', i)
    if (brace < 0) {
      out += css.slice(i)
      break
    }
    if (semi >= 0 && semi < brace && css.slice(i, semi).trim().startsWith('@')) {
      out += css.slice(i, semi + 1) // a statement at-rule: @layer a, b; @import ...;
      i = semi + 1
      continue
    }
    const end = closing(css, brace)
    const prelude = css.slice(i, brace).replace(/\/\*[\s\S]*?\*\//g, '').trim()
    const body = css.slice(brace + 1, end)
    if (GROUPING.test(prelude)) {
      const inner = trimCss(body, used)
      if (inner.trim()) out += `${prelude}{${inner}}`
    } else if (prelude.startsWith('@')) {
      out += `${prelude}{${body}}` // @keyframes, @font-face, @property: kept whole
    } else {
      const kept = splitSelectors(prelude).filter((s) => selectorKept(s, used))
      if (kept.length) out += `${kept.join(',')}{${body}}`
    }
    i = end + 1
  }
  return out
}
