import { randomUUID } from 'node:crypto'
import { sequelize } from '../../db/sequelize.ts'
import { VendorQuote } from '../../db/models/index.ts'
import { NotFoundError } from '../../errors.ts'
import { audit } from '../audit.ts'
import { basisInForce } from '../cost-bases.ts'
import { userNames } from '../people.ts'
import { loadPreset, DEFAULT_PRESET } from '../../engine/costing/index.ts'
import { decodeText, readCsv, parseNumber, columnIndex, quote, sortIssues, fileErrors, safeFileName, type CsvRow, type UploadedFile } from '../csv/reader.ts'
import type { CostBasisData } from '../../../shared/schemas/costBasis.ts'
import {
  EQUIPMENT_TYPES,
  type CsvIssue, type EquipmentType, type QuoteRowInput, type QuotesPreview, type QuoteView,
} from '../../../shared/schemas/uploads.ts'
import type { AuthUser } from '../../types.d.ts'

/** Vendor quotes from CSV uploads: preview (with warnings against the cost basis), save, list, delete. */

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
