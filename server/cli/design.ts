/**
 * Command line: `npm run --silent design -- FILE [--ndjson] [--summary]`
 *
 * FILE holds one case (output: its design, pretty-printed), or a batch: { "cases": [...] }, a bare
 * array of cases, or NDJSON (one case per line). A batch is answered case by case: each case gets
 * its own slot, the design or { "error": { "code", "message", "issues": [{ "path", "message" }] } },
 * and a refused case never stops the others. Output: a JSON array written as it goes (one slot a
 * line), or NDJSON for NDJSON input or with --ndjson; --summary keeps only each design's summary.
 * Large files (over 64 MB, SCRUBWRIGHT_STREAM_BYTES) are read as a stream, in constant memory.
 * An optional "costBasis" beside the case (or the cases) — a full cost basis or
 * { "preset": "name" } — prices each design: its summary gains totalAnnualCost and costBreakdown.
 * The engine answers in SI; the summary's flows are printed in kmol/h, kg/h and m3/h, as the API does.
 * Exit codes: 0 every case designed; 2 bad or infeasible input, or any case of a batch refused
 * (stderr says how many and which); 1 other.
 */
import { readFileSync, statSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { reportCliError } from './errors.ts'
import { evaluateBatch, evaluateCase, InvalidInputError, ENGINE_VERSION } from '../engine/index.ts'
import type { DesignResult } from '../engine/contract.ts'
import type { DesignResult as PublicDesign } from '../../shared/schemas/results.ts'
import { summaryToPublic } from '../../shared/summaryUnits.ts'
import { designText, publicDesign, wordedInSI } from './designOne.ts'
import { priceDesign } from '../engine/costing/index.ts'
import { costBasisFrom } from './input.ts'
import { caseSlot, invalidJsonSlot, slotContext, type SlotContext } from '../engine/batch/slots.ts'
import { forEachLine, readHead, scanJson } from './json-stream.ts'
import type { CostBasisData } from '../../shared/schemas/costBasis.ts'

/** What the command prints: designs in the public units (kmol/h, kg/h, m3/h in the summary), or refused cases. */
export type DesignOutput = PublicDesign | (PublicDesign | { error: { code: string; message: string; issues: unknown[] } })[]

/** A design slot (or a summary-only one) in the public units: the engine's SI summary converted at this edge. */
function publicSlot(d: DesignResult | { summary: DesignResult['summary'] }): PublicDesign | { summary: PublicDesign['summary'] } {
  const out = { ...d, summary: summaryToPublic(d.summary) }
  if ('warnings' in out) out.warnings = wordedInSI(out.warnings)
  return out
}

/** True when the parsed JSON is a batch ({ cases: [...] } or an array). */
export function isBatch(raw: unknown): boolean {
  return Array.isArray(raw) || (typeof raw === 'object' && raw !== null && 'cases' in raw)
}

/** Design output for parsed JSON (one case -> result; batch -> array of results). */
export function designOutput(raw: unknown): DesignOutput {
  const hasBasis = typeof raw === 'object' && raw !== null && !Array.isArray(raw) && 'costBasis' in raw
  const basis = hasBasis ? costBasisFrom((raw as { costBasis: unknown }).costBasis) : null
  const one = (r: DesignResult): PublicDesign => publicDesign(r, basis)
  if (!isBatch(raw)) return one(evaluateCase(raw))
  return evaluateBatch(raw).map((r) => ('summary' in r ? one(r) : r))
}

/**
 * JSON text of the output: one case pretty-printed; a batch as an array with one compact
 * result per line (valid JSON, and far smaller for large batches).
 */
export function formatOutput(result: DesignOutput): string {
  if (!Array.isArray(result)) return designText(result)
  if (result.length === 0) return '[]\n'
  return '[\n' + result.map((r) => JSON.stringify(r)).join(',\n') + '\n]\n'
}

export interface BatchOptions {
  ndjson: boolean
  summary: boolean
}

/** Writes slots as they come, in 64 kB pieces; counts the refused ones (their first indexes kept). */
class SlotWriter {
  private buf = ''
  private n = 0
  refused = 0
  private refusedIndexes: number[] = []
  private firstIssues: string[] = []
  constructor(
    private readonly out: (s: string) => void,
    private readonly ndjson: boolean,
  ) {}
  slot(index: number, ok: boolean, value: unknown): void {
    const text = JSON.stringify(value)
    if (this.ndjson) this.buf += text + '\n'
    else this.buf += (this.n === 0 ? '[\n' : ',\n') + text
    this.n++
    if (!ok) {
      this.refused++
      if (this.refusedIndexes.length < 50) this.refusedIndexes.push(index)
      if (this.firstIssues.length < 10) {
        const e = (value as { error: { issues: { path: string; message: string }[]; message: string } }).error
        const first = e.issues[0]
        this.firstIssues.push(first ? `  ${first.path}: ${first.message}` : `  cases.${index}: ${e.message}`)
      }
    }
    if (this.buf.length >= 65536) this.flush()
  }
  flush(): void {
    if (this.buf) this.out(this.buf)
    this.buf = ''
  }
  /** Closes the output; returns the exit code (2 when any case was refused). */
  finish(err: (s: string) => void): number {
    if (!this.ndjson) this.buf += this.n === 0 ? '[]\n' : '\n]\n'
    this.flush()
    if (this.refused === 0) return 0
    const more = this.refused > this.refusedIndexes.length ? ', ...' : ''
    err(`${this.refused} of ${this.n} cases refused: cases ${this.refusedIndexes.join(', ')}${more}\n`)
    for (const line of this.firstIssues) err(line + '\n')
    return 2
  }
}

/** The pricing step of a batch with a cost basis. */
function pricer(basis: CostBasisData | null): SlotContext['price'] {
  if (!basis) return undefined
  return (d) => {
    const priced = priceDesign(d, basis)
    Object.assign(d.summary, { totalAnnualCost: priced.totalAnnualCost, costBreakdown: priced.costBreakdown })
  }
}

function runSlots(cases: Iterable<unknown> | ((each: (raw: unknown, i: number) => void) => void), w: SlotWriter, ctx: SlotContext): void {
  const each = (raw: unknown, i: number) => {
    const prefix = `cases.${i}.`
    if (raw instanceof BadLine) return w.slot(i, false, invalidJsonSlot(raw.message, `cases.${i}`))
    const s = caseSlot(raw, prefix, ctx)
    w.slot(i, s.ok, s.ok ? publicSlot(s.value) : s.value)
  }
  if (typeof cases === 'function') cases(each)
  else {
    let i = 0
    for (const raw of cases) each(raw, i++)
  }
}

/** A line or element that is not JSON (its own refused slot). */
class BadLine {
  constructor(readonly message: string) {}
}
function parseOrBad(text: string): unknown {
  try {
    return JSON.parse(text) as unknown
  } catch (e) {
    return new BadLine((e as Error).message)
  }
}

function ndjsonLines(lines: (each: (line: string, i: number) => void) => void) {
  return (each: (raw: unknown, i: number) => void) => {
    let i = 0
    lines((line) => {
      if (line.trim() === '') return
      each(parseOrBad(line), i)
      i++
    })
  }
}

/** True when text is NDJSON: several lines, the first of them a JSON value of its own. */
function looksLikeNdjson(text: string): boolean {
  const lines = text.split('\n').filter((l) => l.trim() !== '')
  if (lines.length < 2) return false
  try {
    const first = JSON.parse(lines[0]!) as unknown
    return typeof first === 'object' && first !== null && !Array.isArray(first) && !('cases' in first)
  } catch {
    return false
  }
}

function basisOf(raw: unknown): CostBasisData | null {
  const has = typeof raw === 'object' && raw !== null && !Array.isArray(raw) && 'costBasis' in raw
  return has ? costBasisFrom((raw as { costBasis: unknown }).costBasis) : null
}

/** A file of at most the stream size: read whole. Returns the exit code. */
function runWhole(file: string, opts: BatchOptions, out: (s: string) => void, err: (s: string) => void): number {
  const text = readText(file)
  let raw: unknown
  try {
    raw = JSON.parse(text) as unknown
  } catch (e) {
    if (!looksLikeNdjson(text)) throw new InvalidInputError('', `${file} is not valid JSON: ${(e as Error).message}`)
    const w = new SlotWriter(out, true)
    const ctx = slotContext({ summaryOnly: opts.summary })
    runSlots(ndjsonLines((each) => text.split('\n').forEach(each)), w, ctx)
    return w.finish(err)
  }
  if (!isBatch(raw)) {
    out(formatOutput(designOutput(raw)))
    return 0
  }
  const list = Array.isArray(raw) ? raw : (raw as { cases: unknown }).cases
  if (!Array.isArray(list)) throw new InvalidInputError('cases', 'must be an array of cases')
  const ctx = slotContext({ summaryOnly: opts.summary, price: pricer(basisOf(raw)) })
  const w = new SlotWriter(out, opts.ndjson)
  runSlots(list, w, ctx)
  return w.finish(err)
}

/** A large file: read as a stream. Returns the exit code. */
function runStream(file: string, opts: BatchOptions, out: (s: string) => void, err: (s: string) => void): number {
  const head = readHead(file).toString('utf8')
  const first = head.trimStart()[0]
  const firstLine = head.trimStart().split('\n')[0] ?? ''
  let nd = false
  if (first === '{') {
    try {
      const v = JSON.parse(firstLine) as object
      nd = !('cases' in v)
    } catch {
      nd = false
    }
  }
  if (nd) {
    const w = new SlotWriter(out, true)
    runSlots(ndjsonLines((each) => forEachLine(file, each)), w, slotContext({ summaryOnly: opts.summary }))
    return w.finish(err)
  }
  if (first !== '{' && first !== '[') throw new InvalidInputError('', `${file} is not a JSON batch: it starts with "${first ?? ''}"`)
  // first pass: the members beside "cases" (a cost basis may follow the cases)
  const members: Record<string, unknown> = {}
  let casesFound = first === '['
  if (first === '{') {
    scanJson(file, {
      want: (depth, parent, key, byte) => {
        if (depth !== 1 || parent !== '{') return false
        if (key === 'cases') {
          casesFound = true
          if (byte !== 0x5b) throw new InvalidInputError('cases', 'must be an array of cases')
          return false
        }
        return true
      },
      value: (text, _d, _p, key) => {
        if (key !== null) members[key] = parseOrBad(text)
      },
    })
    if (!casesFound) throw new InvalidInputError('cases', `${file} is too large for one case; a batch needs "cases": [...]`)
  }
  const ctx = slotContext({ summaryOnly: opts.summary, price: pricer(basisOf(members)) })
  const w = new SlotWriter(out, opts.ndjson)
  runSlots(
    (each) => {
      let i = 0
      scanJson(file, {
        want: (depth, parent, key) => (first === '[' ? depth === 1 : depth === 2 && key === 'cases' && parent === '['),
        value: (text) => each(parseOrBad(text), i++),
      })
    },
    w,
    ctx,
  )
  return w.finish(err)
}

function readText(file: string): string {
  try {
    return readFileSync(file, 'utf8')
  } catch (e) {
    throw new InvalidInputError('', `cannot read ${file}: ${(e as Error).message}`)
  }
}

/** Run the command; returns the exit code. */
export function main(argv: string[], out: (s: string) => void = (s) => process.stdout.write(s), err: (s: string) => void = (s) => process.stderr.write(s)): number {
  const flags = argv.filter((a) => a.startsWith('--') && a !== '--')
  const args = argv.filter((a) => !a.startsWith('--') && a !== '--')
  const unknown = flags.filter((f) => !['--ndjson', '--summary', '--help'].includes(f))
  if (args.length !== 1 || args[0] === '-h' || flags.includes('--help') || unknown.length > 0) {
    if (unknown.length) err(`unknown option ${unknown.join(', ')}\n`)
    err(`usage: npm run --silent design -- FILE [--ndjson] [--summary]   (Scrubwright design engine ${ENGINE_VERSION})\n`)
    return args.length === 1 && unknown.length === 0 ? 0 : 2
  }
  const opts: BatchOptions = { ndjson: flags.includes('--ndjson'), summary: flags.includes('--summary') }
  const file = args[0]!
  try {
    let size: number
    try {
      size = statSync(file).size
    } catch (e) {
      throw new InvalidInputError('', `cannot read ${file}: ${(e as Error).message}`)
    }
    const limit = Number(process.env.SCRUBWRIGHT_STREAM_BYTES ?? 64 * 2 ** 20)
    return size > limit ? runStream(file, opts, out, err) : runWhole(file, opts, out, err)
  } catch (e) {
    return reportCliError(e, err)
  }
}

// Run directly from source (tsx); the compiled command runs through bin/, where this module is bundled into the entry.
if (process.argv[1]?.endsWith('.ts') && fileURLToPath(import.meta.url) === process.argv[1]) {
  process.exitCode = main(process.argv.slice(2))
}
