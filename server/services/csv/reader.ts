import Papa from 'papaparse'
import { AppError, ValidationError, type ErrorDetail } from '../../errors.ts'
import { MAX_CSV_ROWS, type CsvIssue } from '../../../shared/schemas/uploads.ts'

/**
 * The one CSV reader of every upload (equilibrium tables, vendor quotes, the operating log):
 * UTF-8 text, a header line, rows with the line each starts on, one rule for numbers, and the
 * 400 answer with one 'file:line N' detail per problem. Parsing is all-or-nothing: a preview lists
 * every problem; saving refuses a file with any error and stores nothing.
 */

/** An uploaded file as the route hands it over (multer memory storage). */
export interface UploadedFile {
  originalname: string
  buffer: Buffer
}

export interface CsvRow {
  line: number
  fields: string[]
}

export interface CsvRead {
  header: CsvRow | null
  rows: CsvRow[]
  errors: CsvIssue[]
}

/** Decode an upload as UTF-8 text (a leading byte-order mark is dropped); 400 for binary files. */
export function decodeText(buf: Buffer): string {
  if (buf.includes(0)) throw new AppError(400, 'unsupported_file_type', 'The file is not a text (CSV) file.', [{ path: 'file', message: 'contains binary data' }])
  let text: string
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(buf)
  } catch {
    throw new AppError(400, 'unsupported_file_type', 'The file is not UTF-8 text; save the CSV as UTF-8.', [{ path: 'file', message: 'is not valid UTF-8' }])
  }
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text
}

/**
 * Split CSV text into rows with the line each starts on (quoted fields may span lines). Blank
 * lines are skipped. A row with more (non-blank) fields than the header is an error on its line:
 * a stray comma must not shift or drop a value silently. Stops after MAX_CSV_ROWS data rows.
 */
export function readCsv(text: string): CsvRead {
  const errors: CsvIssue[] = []
  const rows: CsvRow[] = []
  let header: CsvRow | null = null
  const nl = text.includes('\n') ? '\n' : '\r'
  let start = 0
  let line = 1
  let counted = 0
  let tooMany = false
  Papa.parse<string[]>(text, {
    header: false,
    delimiter: ',',
    skipEmptyLines: false,
    step: (r, parser) => {
      // The row starts where the previous one ended: count the line breaks up to here.
      for (let i = counted; i < start; i++) if (text[i] === nl) line++
      counted = start
      const rowLine = line
      start = r.meta.cursor
      for (const e of r.errors) errors.push({ line: rowLine, column: null, message: `CSV syntax: ${e.message.toLowerCase()}` })
      const fields = r.data.map((f) => f.trim())
      if (fields.every((f) => f === '')) return
      if (!header) {
        header = { line: rowLine, fields }
        return
      }
      if (rows.length >= MAX_CSV_ROWS) {
        tooMany = true
        parser.abort()
        return
      }
      const width = (header as CsvRow).fields.length
      const stray = fields.slice(width).filter((f) => f !== '')
      if (stray.length) {
        const n = stray.length
        errors.push({ line: rowLine, column: null, message: `${n} field${n === 1 ? '' : 's'} beyond the header (${stray.map(quote).join(', ')}); the header names ${width} column${width === 1 ? '' : 's'}` })
      }
      rows.push({ line: rowLine, fields })
    },
  })
  if (tooMany) errors.push({ line: null, column: null, message: `The file has more than ${MAX_CSV_ROWS} data rows; split it into smaller files.` })
  return { header, rows, errors }
}

const NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/

/** A strict decimal number (no thousands separators, no decimal commas), or null. */
export function parseNumber(s: string | undefined): number | null {
  if (s === undefined) return null
  const t = s.trim()
  if (!NUMBER.test(t)) return null
  const v = Number(t)
  return Number.isFinite(v) ? v : null
}

export function columnIndex(header: string[], names: string[]): number {
  const want = names.map((n) => n.toLowerCase())
  return header.findIndex((h) => want.includes(h.toLowerCase()))
}

export function safeFileName(name: string): string {
  const clean = name.replace(/[\u0000-\u001f\u007f]/g, '').trim().slice(0, 200)
  return clean || 'upload.csv'
}

export function quote(s: string): string {
  return s.length > 40 ? `'${s.slice(0, 37)}...'` : `'${s}'`
}

export function sortIssues(list: CsvIssue[]): CsvIssue[] {
  return [...list].sort((a, b) => (a.line ?? Number.MAX_SAFE_INTEGER) - (b.line ?? Number.MAX_SAFE_INTEGER))
}

/** The 400 a save answers with when the file has errors: one detail per problem, path 'file:line N'. */
export function fileErrors(errors: CsvIssue[]): ValidationError {
  const details: ErrorDetail[] = errors.map((e) => ({
    path: e.line === null ? 'file' : `file:line ${e.line}`,
    message: e.column ? `${e.column}: ${e.message}` : e.message,
  }))
  const n = errors.length
  return new ValidationError(`The file has ${n} error${n === 1 ? '' : 's'}; nothing was saved.`, details)
}
