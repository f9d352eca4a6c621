import Papa from 'papaparse'
import { randomUUID } from 'node:crypto'
import { sequelize } from '../db/sequelize.ts'
import { CostBasis, SiteComponent, VendorQuote } from '../db/models/index.ts'
import { AppError, ConflictError, NotFoundError, ValidationError, type ErrorDetail, zodDetails } from '../errors.ts'
import { audit } from './audit.ts'
import { basisInForce, getVersion } from './cost-bases.ts'
import { userNames } from './people.ts'
import { costFromCurve, loadPreset, DEFAULT_PRESET } from '../engine/costing/index.ts'
import { fitCostCurve, FitError, logSpacedSizes, costFromFit, type FitForm } from '../engine/fitting/index.ts'
import { costBasisSchema, type CostBasisData, type CostCurveData } from '../../shared/schemas/costBasis.ts'
import {
  EQUIPMENT_TYPES, MAX_CSV_ROWS, MIN_EQUILIBRIUM_POINTS,
  type CsvIssue, type EquilibriumPreview, type EquilibriumTableView, type EquipmentType, type FittableType,
  type QuoteRowInput, type QuotesPreview, type QuoteView,
} from '../../shared/schemas/uploads.ts'
import type { AuthUser } from '../types.d.ts'

/**
 * CSV uploads of equilibrium tables and vendor quotes, and cost-curve fits to the quotes.
 * Parsing is all-or-nothing: a preview lists every problem with its line in the file (the header
 * is line 1); saving refuses a file with any error and stores nothing.
 */

/** An uploaded file as the route hands it over (multer memory storage). */
export interface UploadedFile {
  originalname: string
  buffer: Buffer
}

// ---------------------------------------------------------------- CSV reading

interface CsvRow {
  line: number
  fields: string[]
}

interface CsvRead {
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
 * lines are skipped. Stops after MAX_CSV_ROWS data rows with an error.
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

function columnIndex(header: string[], names: string[]): number {
  const want = names.map((n) => n.toLowerCase())
  return header.findIndex((h) => want.includes(h.toLowerCase()))
}

function safeFileName(name: string): string {
  const clean = name.replace(/[\u0000-\u001f\u007f]/g, '').trim().slice(0, 200)
  return clean || 'upload.csv'
}

function quote(s: string): string {
  return s.length > 40 ? `'${s.slice(0, 37)}...'` : `'${s}'`
}

function sortIssues(list: CsvIssue[]): CsvIssue[] {
  return [...list].sort((a, b) => (a.line ?? Number.MAX_SAFE_INTEGER) - (b.line ?? Number.MAX_SAFE_INTEGER))
}

/** The 400 a save answers with when the file has errors: one detail per problem, path 'file:line N'. */
function fileErrors(errors: CsvIssue[]): ValidationError {
  const details: ErrorDetail[] = errors.map((e) => ({
    path: e.line === null ? 'file' : `file:line ${e.line}`,
    message: e.column ? `${e.column}: ${e.message}` : e.message,
  }))
  const n = errors.length
  return new ValidationError(`The file has ${n} error${n === 1 ? '' : 's'}; nothing was saved.`, details)
}

// ---------------------------------------------------------------- equilibrium tables

export interface EquilibriumFields {
  name?: string
  solute?: string
  temperature?: number
}

/** Parse and check an x-y equilibrium table (mole fractions): header x,y[,temperature]. */
export function parseEquilibriumCsv(text: string): { points: [number, number][]; temperature: number | null; errors: CsvIssue[]; warnings: CsvIssue[] } {
  const { header, rows, errors } = readCsv(text)
  const warnings: CsvIssue[] = []
  const points: [number, number][] = []
  if (!header) {
    errors.push({ line: null, column: null, message: 'The file is empty: it needs a header line x,y[,temperature] and at least 3 points.' })
    return { points, temperature: null, errors, warnings }
  }
  const h = (header as CsvRow).fields
  const ix = columnIndex(h, ['x'])
  const iy = columnIndex(h, ['y'])
  const it = columnIndex(h, ['temperature', 't'])
  if (ix < 0 || iy < 0) {
    const looksNumeric = h.some((f) => parseNumber(f) !== null)
    errors.push({
      line: (header as CsvRow).line,
      column: null,
      message: looksNumeric
        ? 'The header line is missing: the first line must name the columns x,y[,temperature].'
        : `The header must name the columns x and y (and optionally temperature); found ${h.map(quote).join(', ')}.`,
    })
    return { points, temperature: null, errors, warnings }
  }
  const extra = h.filter((_, i) => i !== ix && i !== iy && i !== it)
  if (extra.length) warnings.push({ line: (header as CsvRow).line, column: null, message: `Extra columns ignored: ${extra.map(quote).join(', ')}.` })

  const temps: number[] = []
  let prev: { x: number; y: number; line: number } | null = null
  for (const r of rows) {
    const xs = r.fields[ix]
    const ys = r.fields[iy]
    const x = parseNumber(xs)
    const y = parseNumber(ys)
    let ok = true
    if (xs === undefined || xs === '') { errors.push({ line: r.line, column: 'x', message: 'is missing' }); ok = false }
    else if (x === null) { errors.push({ line: r.line, column: 'x', message: `${quote(xs)} is not a number` }); ok = false }
    else if (x < 0 || x >= 1) { errors.push({ line: r.line, column: 'x', message: `${x} is outside [0, 1): x is a mole fraction` }); ok = false }
    if (ys === undefined || ys === '') { errors.push({ line: r.line, column: 'y', message: 'is missing' }); ok = false }
    else if (y === null) { errors.push({ line: r.line, column: 'y', message: `${quote(ys)} is not a number` }); ok = false }
    else if (y < 0 || y >= 1) { errors.push({ line: r.line, column: 'y', message: `${y} is outside [0, 1): y is a mole fraction` }); ok = false }
    if (it >= 0) {
      const ts = r.fields[it]
      if (ts !== undefined && ts !== '') {
        const t = parseNumber(ts)
        if (t === null || t <= -273.15) errors.push({ line: r.line, column: 'temperature', message: `${quote(ts)} is not a temperature in degC` })
        else temps.push(t)
      }
    }
    if (r.fields.length > h.length) warnings.push({ line: r.line, column: null, message: `${r.fields.length - h.length} field(s) beyond the header ignored` })
    if (!ok || x === null || y === null) continue
    if (prev) {
      if (x === prev.x && y === prev.y) {
        errors.push({ line: r.line, column: 'x', message: `duplicates the point on line ${prev.line} (${x}, ${y})` })
        continue
      }
      if (x === prev.x) {
        errors.push({ line: r.line, column: 'x', message: `x = ${x} repeats line ${prev.line} with a different y` })
        continue
      }
      if (x < prev.x) {
        errors.push({ line: r.line, column: 'x', message: `x = ${x} is below x = ${prev.x} on line ${prev.line}: x must increase strictly down the file` })
        continue
      }
      if (y <= prev.y) {
        errors.push({ line: r.line, column: 'y', message: `y = ${y} does not rise above y = ${prev.y} on line ${prev.line}: y must increase strictly with x` })
        continue
      }
    }
    points.push([x, y])
    prev = { x, y, line: r.line }
  }
  const dataRows = rows.length
  if (dataRows < MIN_EQUILIBRIUM_POINTS) {
    errors.push({ line: null, column: null, message: `An equilibrium table needs at least ${MIN_EQUILIBRIUM_POINTS} points; the file has ${dataRows}.` })
  }
  const first = points[0]
  if (first && first[0] > 0) warnings.push({ line: null, column: null, message: 'The table does not start at x = 0; the design adds the origin (0, 0).' })
  let temperature: number | null = temps[0] ?? null
  if (temps.length && temps.some((t) => Math.abs(t - temps[0]!) > 1e-9)) {
    warnings.push({ line: null, column: 'temperature', message: `The points are at different temperatures (${Math.min(...temps)} to ${Math.max(...temps)} degC); one table should hold one temperature.` })
    temperature = null
  }
  return { points, temperature, errors: sortIssues(errors), warnings: sortIssues(warnings) }
}

export function previewEquilibrium(file: UploadedFile, fields: EquilibriumFields): EquilibriumPreview {
  const p = parseEquilibriumCsv(decodeText(file.buffer))
  const temperature = fields.temperature ?? p.temperature
  const warnings = [...p.warnings]
  if (fields.temperature !== undefined && p.temperature !== null && Math.abs(fields.temperature - p.temperature) > 1e-9) {
    warnings.push({ line: null, column: 'temperature', message: `The form says ${fields.temperature} degC, the file ${p.temperature} degC; the form's value is kept.` })
  }
  return { fileName: safeFileName(file.originalname), points: p.points, temperature, errors: p.errors, warnings }
}

function tableView(c: SiteComponent, who: Map<number, string>): EquilibriumTableView {
  const d = c.data as { solute?: string | null; temperature?: number | null; points?: [number, number][] }
  const points = d.points ?? []
  return {
    id: c.id,
    siteId: c.siteId as number,
    name: c.name,
    solute: d.solute ?? null,
    temperature: d.temperature ?? null,
    points,
    equilibrium: { model: 'table', points },
    source: c.source,
    createdByName: c.createdBy ? (who.get(c.createdBy) ?? null) : null,
    createdAt: c.createdAt.toISOString(),
  }
}

export async function saveEquilibrium(siteId: number, file: UploadedFile, fields: EquilibriumFields, actor: AuthUser, requestId: string): Promise<EquilibriumTableView> {
  const p = previewEquilibrium(file, fields)
  if (p.errors.length) throw fileErrors(p.errors)
  const name = (fields.name ?? p.fileName.replace(/\.[^.]*$/, '')).slice(0, 160) || 'Equilibrium table'
  const id = await sequelize.transaction(async (transaction) => {
    const c = await SiteComponent.create(
      {
        siteId, kind: 'equilibriumTable', name,
        data: { solute: fields.solute ?? null, temperature: p.temperature, points: p.points },
        source: `${p.fileName}, uploaded by ${actor.name}`,
        createdBy: actor.id,
      },
      { transaction },
    )
    await audit({ userId: actor.id, siteId, action: 'upload_equilibrium', entity: 'site_component', entityId: c.id, after: { name, fileName: p.fileName, points: p.points.length }, requestId }, transaction)
    return c.id
  })
  const c = await SiteComponent.findByPk(id)
  return tableView(c!, new Map([[actor.id, actor.name]]))
}

export async function listEquilibriumTables(siteId: number): Promise<EquilibriumTableView[]> {
  const rows = await SiteComponent.findAll({ where: { siteId, kind: 'equilibriumTable' }, order: [['id', 'DESC']] })
  const who = await userNames(rows.map((r) => r.createdBy))
  return rows.map((r) => tableView(r, who))
}

// ---------------------------------------------------------------- vendor quotes

const CURRENCY = /^[A-Z]{3}$/
const DATE = /^(\d{4})-(\d{2})-(\d{2})$/

function validDate(s: string): boolean {
  const m = DATE.exec(s)
  if (!m) return false
  const d = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])))
  return d.toISOString().slice(0, 10) === s
}

const QUOTE_COLUMNS = {
  equipmentType: ['equipmentType', 'equipment_type', 'equipment'],
  size: ['size'],
  sizeUnit: ['sizeUnit', 'size_unit', 'unit'],
  cost: ['cost', 'price'],
  currency: ['currency'],
  date: ['date', 'quoteDate', 'quote_date'],
  costIndex: ['costIndex', 'cost_index', 'index'],
  vendor: ['vendor', 'supplier'],
} as const
type QuoteColumn = keyof typeof QUOTE_COLUMNS

/** Parse and check vendor quotes: equipmentType,size,sizeUnit,cost,currency, date and/or costIndex, vendor. */
export function parseQuotesCsv(text: string): { quotes: QuoteRowInput[]; errors: CsvIssue[]; warnings: CsvIssue[] } {
  const { header, rows, errors } = readCsv(text)
  const warnings: CsvIssue[] = []
  const quotes: QuoteRowInput[] = []
  if (!header) {
    errors.push({ line: null, column: null, message: 'The file is empty: it needs a header line and at least one quote.' })
    return { quotes, errors, warnings }
  }
  const h = (header as CsvRow).fields
  const hl = (header as CsvRow).line
  const col = {} as Record<QuoteColumn, number>
  for (const k of Object.keys(QUOTE_COLUMNS) as QuoteColumn[]) col[k] = columnIndex(h, [...QUOTE_COLUMNS[k]])
  const missing = (['equipmentType', 'size', 'sizeUnit', 'cost', 'currency'] as const).filter((k) => col[k] < 0)
  if (missing.length) {
    const looksNumeric = h.some((f) => parseNumber(f) !== null)
    errors.push({
      line: hl,
      column: null,
      message: looksNumeric
        ? 'The header line is missing: the first line must name the columns equipmentType,size,sizeUnit,cost,currency,date or costIndex[,vendor].'
        : `The header lacks the column${missing.length > 1 ? 's' : ''} ${missing.join(', ')}.`,
    })
    return { quotes, errors, warnings }
  }
  if (col.date < 0 && col.costIndex < 0) {
    errors.push({ line: hl, column: null, message: 'The header needs a date (YYYY-MM-DD) or a costIndex column, or both.' })
    return { quotes, errors, warnings }
  }
  const known = new Set(Object.values(col).filter((i) => i >= 0))
  const extra = h.filter((_, i) => !known.has(i))
  if (extra.length) warnings.push({ line: hl, column: null, message: `Extra columns ignored: ${extra.map(quote).join(', ')}.` })

  const types = new Map(EQUIPMENT_TYPES.map((t) => [t.toLowerCase(), t]))
  const field = (r: CsvRow, k: QuoteColumn) => (col[k] >= 0 ? (r.fields[col[k]] ?? '') : '')
  for (const r of rows) {
    const before = errors.length
    const bad = (column: string, message: string) => errors.push({ line: r.line, column, message })
    const typeRaw = field(r, 'equipmentType')
    const type = types.get(typeRaw.toLowerCase())
    if (!typeRaw) bad('equipmentType', 'is missing')
    else if (!type) bad('equipmentType', `${quote(typeRaw)} is not an equipment type of the cost basis (${EQUIPMENT_TYPES.join(', ')})`)
    const sizeRaw = field(r, 'size')
    const size = parseNumber(sizeRaw)
    if (size === null) bad('size', sizeRaw ? `${quote(sizeRaw)} is not a number` : 'is missing')
    else if (size <= 0) bad('size', `${size} must be positive`)
    const sizeUnit = field(r, 'sizeUnit')
    if (!sizeUnit) bad('sizeUnit', 'is missing')
    else if (sizeUnit.length > 20) bad('sizeUnit', 'must be at most 20 characters')
    const costRaw = field(r, 'cost')
    const cost = parseNumber(costRaw)
    if (cost === null) bad('cost', costRaw ? `${quote(costRaw)} is not a number (no currency signs or thousands separators)` : 'is missing')
    else if (cost <= 0) bad('cost', `${cost} must be positive`)
    const currency = field(r, 'currency').toUpperCase()
    if (!CURRENCY.test(currency)) bad('currency', `${quote(field(r, 'currency'))} is not a three-letter currency code (e.g. USD, EUR)`)
    const dateRaw = field(r, 'date')
    if (dateRaw && !validDate(dateRaw)) bad('date', `${quote(dateRaw)} is not a date in the form YYYY-MM-DD`)
    const indexRaw = field(r, 'costIndex')
    const costIndex = indexRaw ? parseNumber(indexRaw) : null
    if (indexRaw && (costIndex === null || costIndex <= 0)) bad('costIndex', `${quote(indexRaw)} is not a positive number`)
    if (!dateRaw && !indexRaw) bad(col.costIndex >= 0 ? 'costIndex' : 'date', 'give the quote date or its cost index')
    const vendor = field(r, 'vendor')
    if (vendor.length > 160) bad('vendor', 'must be at most 160 characters')
    if (errors.length > before || !type || size === null || cost === null) continue
    quotes.push({
      line: r.line, equipmentType: type, size, sizeUnit, cost, currency,
      quoteDate: dateRaw || null, costIndex: indexRaw ? costIndex : null, vendor,
    })
  }
  if (!rows.length) errors.push({ line: null, column: null, message: 'The file has no quotes below the header.' })
  const noIndex = quotes.filter((q) => q.costIndex === null).length
  if (noIndex) warnings.push({ line: null, column: 'costIndex', message: `${noIndex} quote(s) carry no cost index; a fit takes them at the cost index it escalates to.` })
  return { quotes, errors: sortIssues(errors), warnings: sortIssues(warnings) }
}

/** Compare the quotes with the site's cost basis (units and currency) for warnings. */
async function basisWarnings(siteId: number, quotes: QuoteRowInput[]): Promise<CsvIssue[]> {
  const row = await basisInForce(siteId)
  const basis = row ? (row.data as CostBasisData) : loadPreset(DEFAULT_PRESET)
  const out: CsvIssue[] = []
  for (const q of quotes) {
    if (q.currency !== basis.general.currency) {
      out.push({ line: q.line, column: 'currency', message: `${q.currency} differs from the cost basis currency ${basis.general.currency}; a fit leaves this quote out` })
    }
    if (q.equipmentType === 'platforms') continue
    const curve = basis.correlations[q.equipmentType].curve
    if (q.sizeUnit !== curve.sizeUnit) {
      out.push({ line: q.line, column: 'sizeUnit', message: `${quote(q.sizeUnit)} differs from the cost curve's size unit ${quote(curve.sizeUnit)}; a fit leaves this quote out` })
    }
  }
  return out
}

export async function previewQuotes(siteId: number, file: UploadedFile): Promise<QuotesPreview> {
  const p = parseQuotesCsv(decodeText(file.buffer))
  const warnings = sortIssues([...p.warnings, ...(await basisWarnings(siteId, p.quotes))])
  return { fileName: safeFileName(file.originalname), quotes: p.quotes, errors: p.errors, warnings }
}

function quoteView(q: VendorQuote, who: Map<number, string>): QuoteView {
  return {
    id: q.id,
    siteId: q.siteId as number,
    equipmentType: q.equipmentType,
    size: q.size,
    sizeUnit: q.sizeUnit,
    cost: q.cost,
    currency: q.currency,
    quoteDate: q.quoteDate,
    costIndex: q.costIndex,
    vendor: q.vendor,
    uploadRef: q.uploadRef,
    createdByName: q.createdBy ? (who.get(q.createdBy) ?? null) : null,
    createdAt: q.createdAt.toISOString(),
  }
}

export async function saveQuotes(siteId: number, file: UploadedFile, actor: AuthUser, requestId: string): Promise<{ uploadRef: string; fileName: string; count: number; quotes: QuoteView[]; warnings: CsvIssue[] }> {
  const p = await previewQuotes(siteId, file)
  if (p.errors.length) throw fileErrors(p.errors)
  const uploadRef = randomUUID()
  await sequelize.transaction(async (transaction) => {
    await VendorQuote.bulkCreate(
      p.quotes.map((q) => ({
        siteId, equipmentType: q.equipmentType, size: q.size, sizeUnit: q.sizeUnit, cost: q.cost, currency: q.currency,
        quoteDate: q.quoteDate, costIndex: q.costIndex, vendor: q.vendor, uploadRef, createdBy: actor.id,
      })),
      { transaction },
    )
    await audit({ userId: actor.id, siteId, action: 'upload_quotes', entity: 'vendor_quote', entityId: uploadRef, after: { fileName: p.fileName, count: p.quotes.length }, requestId }, transaction)
  })
  const rows = await VendorQuote.findAll({ where: { siteId, uploadRef }, order: [['id', 'ASC']] })
  return { uploadRef, fileName: p.fileName, count: rows.length, quotes: rows.map((r) => quoteView(r, new Map([[actor.id, actor.name]]))), warnings: p.warnings }
}

export async function listQuotes(siteId: number, equipmentType?: EquipmentType): Promise<QuoteView[]> {
  const rows = await VendorQuote.findAll({ where: equipmentType ? { siteId, equipmentType } : { siteId }, order: [['equipmentType', 'ASC'], ['size', 'ASC'], ['id', 'ASC']] })
  const who = await userNames(rows.map((r) => r.createdBy))
  return rows.map((r) => quoteView(r, who))
}

export async function deleteQuote(siteId: number, id: number, actor: AuthUser, requestId: string): Promise<void> {
  await sequelize.transaction(async (transaction) => {
    const q = await VendorQuote.findOne({ where: { id, siteId }, transaction, lock: transaction.LOCK.UPDATE })
    if (!q) throw new NotFoundError('Quote')
    await q.destroy({ transaction })
    await audit({
      userId: actor.id, siteId, action: 'delete_quote', entity: 'vendor_quote', entityId: id,
      before: { equipmentType: q.equipmentType, size: q.size, sizeUnit: q.sizeUnit, cost: q.cost, currency: q.currency, uploadRef: q.uploadRef }, requestId,
    }, transaction)
  })
}

// ---------------------------------------------------------------- fits

async function comparisonBasis(siteId: number, costBasisId?: number): Promise<{ data: CostBasisData; id: number | null; version: number | null; preset: string | null }> {
  if (costBasisId !== undefined) {
    const b = await CostBasis.findOne({ where: { id: costBasisId, siteId } })
    if (!b) throw new ValidationError('Unknown cost basis.', [{ path: 'body.costBasisId', message: 'is not a version of this site' }])
    return { data: b.data as CostBasisData, id: b.id, version: b.version, preset: null }
  }
  const b = await basisInForce(siteId)
  if (b) return { data: b.data as CostBasisData, id: b.id, version: b.version, preset: null }
  return { data: loadPreset(DEFAULT_PRESET), id: null, version: null, preset: DEFAULT_PRESET }
}

function fitFailed(message: string, code: string, path = 'body.equipmentType'): AppError {
  return new AppError(422, 'fit_not_possible', message, [{ path, message, code }])
}

/** Default form: the form of the basis curve (three or more log terms and no linear term -> quadraticLog). */
function defaultForm(curve: CostCurveData): FitForm {
  return curve.coefficients.length >= 3 && curve.linearCoefficient === 0 ? 'quadraticLog' : 'power'
}

export async function fitQuotes(siteId: number, body: { equipmentType: FittableType; targetIndex?: number; form?: FitForm; costBasisId?: number }) {
  const basis = await comparisonBasis(siteId, body.costBasisId)
  const curve = basis.data.correlations[body.equipmentType].curve
  const targetIndex = body.targetIndex ?? basis.data.general.targetIndex
  const currency = basis.data.general.currency
  const form = body.form ?? defaultForm(curve)
  const rows = await VendorQuote.findAll({ where: { siteId, equipmentType: body.equipmentType }, order: [['size', 'ASC'], ['id', 'ASC']] })
  const warnings: string[] = []
  const otherUnit = rows.filter((q) => q.sizeUnit !== curve.sizeUnit)
  const otherCurrency = rows.filter((q) => q.sizeUnit === curve.sizeUnit && q.currency !== currency)
  if (otherUnit.length) warnings.push(`${otherUnit.length} quote(s) are left out: their size unit differs from the curve's '${curve.sizeUnit}'.`)
  if (otherCurrency.length) warnings.push(`${otherCurrency.length} quote(s) are left out: their currency differs from ${currency}.`)
  const used = rows.filter((q) => q.sizeUnit === curve.sizeUnit && q.currency === currency)
  const noIndex = used.filter((q) => q.costIndex === null).length
  if (noIndex) warnings.push(`${noIndex} quote(s) carry no cost index and are taken as at index ${targetIndex}.`)
  const points = used.map((q) => ({ size: q.size, cost: q.costIndex ? (q.cost * targetIndex) / q.costIndex : q.cost }))

  let fit
  try {
    fit = fitCostCurve(points, form, curve.logBase)
  } catch (e) {
    if (e instanceof FitError) throw fitFailed(`${e.message}${rows.length !== used.length ? ` (${rows.length - used.length} of ${rows.length} quotes were left out for unit or currency)` : ''}`, e.code)
    throw e
  }
  if (fit.dof === 0) warnings.push('There are as many quotes as coefficients: the curve passes through every quote and R² says nothing about the fit.')

  // The basis curve at the same sizes, escalated to the same index (purchased cost, before material or type factors).
  const basisCost = (S: number) => (costFromCurve(S / curve.sizeFactor, curve) * targetIndex) / curve.baseIndex
  const source = `Fit to ${fit.n} vendor quote${fit.n === 1 ? '' : 's'} of the site (${form}, R² = ${fit.r2.toFixed(4)})`
  const baseYear = targetIndex === basis.data.general.targetIndex ? basis.data.general.targetYear : `index ${targetIndex}`
  const adopt = {
    equipmentType: body.equipmentType,
    logBase: curve.logBase,
    coefficients: fit.coefficients,
    sizeMin: fit.sizeMin,
    sizeMax: fit.sizeMax,
    baseIndex: targetIndex,
    baseYear,
    source,
  }
  return {
    equipmentType: body.equipmentType,
    form,
    currency,
    targetIndex,
    sizeUnit: curve.sizeUnit,
    logBase: fit.logBase,
    coefficients: fit.coefficients,
    r2: fit.r2,
    rmsLogResidual: fit.rmsLogResidual,
    n: fit.n,
    dof: fit.dof,
    curve: adoptedCurve(curve, adopt),
    adopt,
    points: used.map((q, i) => {
      const r = fit.residuals[i]!
      return {
        quoteId: q.id, size: q.size, cost: q.cost, costIndex: q.costIndex, escalatedCost: r.cost,
        fitted: r.fitted, logResidual: r.logResidual, relativeError: r.relativeError, basisCost: basisCost(q.size),
      }
    }),
    line: logSpacedSizes(fit.sizeMin, fit.sizeMax, 41).map((S) => ({ size: S, fitted: costFromFit(S, fit.coefficients, fit.logBase), basis: basisCost(S) })),
    basis: { costBasisId: basis.id, version: basis.version, preset: basis.preset, curve },
    warnings,
  }
}

function adoptedCurve(old: CostCurveData, a: { logBase: 'e' | '10'; coefficients: number[]; sizeMin: number; sizeMax: number; baseIndex: number; baseYear: string; source: string }): CostCurveData {
  return {
    ...old,
    logBase: a.logBase,
    multiplier: 1,
    coefficients: [...a.coefficients],
    linearCoefficient: 0,
    sizeMin: a.sizeMin,
    sizeMax: a.sizeMax,
    baseIndex: a.baseIndex,
    baseYear: a.baseYear,
    source: a.source,
  }
}

export interface AdoptFitInput {
  equipmentType: FittableType
  coefficients: number[]
  logBase?: 'e' | '10'
  sizeMin?: number
  sizeMax?: number
  baseIndex?: number
  baseYear?: string
  source?: string
  lockVersion: number
}

/** Write fitted coefficients into a draft cost basis (409 when published or stale). */
export async function adoptFit(siteId: number, id: number, body: AdoptFitInput, actor: AuthUser, requestId: string) {
  await sequelize.transaction(async (transaction) => {
    const b = await CostBasis.findOne({ where: { id, siteId }, transaction, lock: transaction.LOCK.UPDATE })
    if (!b) throw new NotFoundError('Cost basis')
    if (b.status !== 'draft') throw new ConflictError(`Version ${b.version} is published and cannot change; create a new draft to adopt the fit.`)
    if (b.lockVersion !== body.lockVersion) {
      throw new ConflictError('Someone else changed this draft since you opened it; reload to see their changes.', [
        { path: 'body.lockVersion', message: `is ${body.lockVersion}, current is ${b.lockVersion}` },
      ])
    }
    const data = structuredClone(b.data) as CostBasisData
    const corr = data.correlations[body.equipmentType]
    const before = corr.curve
    corr.curve = adoptedCurve(before, {
      coefficients: body.coefficients,
      logBase: body.logBase ?? before.logBase,
      sizeMin: body.sizeMin ?? before.sizeMin,
      sizeMax: body.sizeMax ?? before.sizeMax,
      baseIndex: body.baseIndex ?? data.general.targetIndex,
      baseYear: body.baseYear ?? (body.baseIndex === undefined ? data.general.targetYear : `index ${body.baseIndex}`),
      source: body.source ?? 'Fit to vendor quotes of the site',
    })
    const checked = costBasisSchema.safeParse(data)
    if (!checked.success) throw new ValidationError('The fitted curve does not fit the cost basis.', zodDetails(checked.error, 'body'))
    b.data = checked.data
    b.lockVersion = b.lockVersion + 1
    await b.save({ transaction })
    await audit({ userId: actor.id, siteId, action: 'adopt_fit', entity: 'cost_basis', entityId: b.id, before: { equipmentType: body.equipmentType, curve: before }, after: { equipmentType: body.equipmentType, curve: corr.curve }, requestId }, transaction)
  })
  return getVersion(siteId, id)
}
