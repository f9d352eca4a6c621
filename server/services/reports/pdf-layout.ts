import type { Row, RowGroup } from './model.ts'
import { fmt } from './format.ts'

/** Layout primitives of the printable report (A4, built-in Helvetica). */

export type Doc = PDFKit.PDFDocument

export const MARGIN = 50
export const INK = '#1f2a33'
export const MUTED = '#5b6770'
export const RULE = '#c9d1d6'
export const ACCENT = '#1d6f8c'
export const STATUS_INK: Record<string, string> = { pass: '#2e7d32', warn: '#b26a00', fail: '#c62828' }

/** The standard fonts encode WinAnsi only: replace what they cannot show. */
export function pdfText(s: string): string {
  return s
    .replace(/[\u2212\u2010\u2011]/g, '-')
    .replace(/\u2264/g, '<=')
    .replace(/\u2265/g, '>=')
    .replace(/\u03b3/g, 'gamma ')
    .replace(/\u221e/g, 'inf')
    .replace(/\u03bc/g, 'u')
    .replace(/[\u2070-\u209f]/g, '')
    .replace(/[^\x09\x0a\x0d\x20-\x7e\u00a0-\u00ff\u2013\u2014\u2018\u2019\u201c\u201d\u2022\u2026\u20ac]/g, '?')
}

export function contentWidth(doc: Doc): number {
  return doc.page.width - 2 * MARGIN
}

export function bottom(doc: Doc): number {
  return doc.page.height - MARGIN
}

export function ensure(doc: Doc, height: number): void {
  if (doc.y + height > bottom(doc)) doc.addPage()
}

/** A section title; kept on the page with at least `keep` points of what follows. */
export function heading(doc: Doc, text: string, keep = 60): void {
  ensure(doc, keep + 30)
  if (doc.y > MARGIN + 1) doc.moveDown(0.8)
  doc.font('Helvetica-Bold').fontSize(13).fillColor(ACCENT).text(pdfText(text), MARGIN, doc.y)
  const y = doc.y + 2
  doc.moveTo(MARGIN, y).lineTo(doc.page.width - MARGIN, y).lineWidth(0.5).strokeColor(RULE).stroke()
  doc.moveDown(0.5)
  doc.font('Helvetica').fontSize(9).fillColor(INK)
}

export function note(doc: Doc, text: string): void {
  ensure(doc, 20)
  doc.font('Helvetica-Oblique').fontSize(9).fillColor(MUTED).text(pdfText(text), MARGIN, doc.y, { width: contentWidth(doc) })
  doc.font('Helvetica').fillColor(INK)
}

export interface Column {
  title: string
  width: number
  align?: 'left' | 'right' | 'center'
}

const ROW_H = 13

/** A table: header row, then rows; breaks pages and repeats the header. A row of one cell starting with '§' is a group title. */
export function table(doc: Doc, columns: Column[], rows: string[][], colour?: (row: number, col: number) => string | undefined): void {
  const total = columns.reduce((s, c) => s + c.width, 0)
  const drawHeader = () => {
    let x = MARGIN
    doc.font('Helvetica-Bold').fontSize(8).fillColor(MUTED)
    const y = doc.y
    // titles wrap onto a second line where a column is narrow
    const h = Math.max(ROW_H, ...columns.map((c) => doc.heightOfString(pdfText(c.title), { width: c.width - 4 }) + 3))
    for (const c of columns) {
      const th = doc.heightOfString(pdfText(c.title), { width: c.width - 4 })
      doc.text(pdfText(c.title), x + 2, y + h - 3 - th, { width: c.width - 4, align: c.align ?? 'left' })
      x += c.width
    }
    doc.y = y + h
    doc.moveTo(MARGIN, doc.y - 2).lineTo(MARGIN + total, doc.y - 2).lineWidth(0.5).strokeColor(RULE).stroke()
    doc.font('Helvetica').fontSize(8.5).fillColor(INK)
  }
  ensure(doc, ROW_H * 3)
  drawHeader()
  rows.forEach((r, i) => {
    const group = r.length === 1 && r[0]!.startsWith('§')
    if (doc.y + ROW_H * (group ? 2 : 1) > bottom(doc)) {
      doc.addPage()
      drawHeader()
    }
    const y = doc.y
    if (group) {
      doc.font('Helvetica-Bold').fontSize(8.5).fillColor(ACCENT).text(pdfText(r[0]!.slice(1)), MARGIN + 2, y + 2, { width: total - 4, lineBreak: false })
      doc.font('Helvetica').fillColor(INK)
      doc.y = y + ROW_H + 2
      return
    }
    // a cell too long for its column wraps; the row grows to the tallest cell
    const rh = Math.max(ROW_H, ...columns.map((c, j) => doc.heightOfString(pdfText(r[j] ?? ''), { width: c.width - 4 }) + 2))
    if (rh > ROW_H && y + rh > bottom(doc)) {
      doc.addPage()
      drawHeader()
    }
    const y0 = doc.y
    let x = MARGIN
    columns.forEach((c, j) => {
      doc.fillColor(colour?.(i, j) ?? INK)
      doc.text(pdfText(r[j] ?? ''), x + 2, y0, { width: c.width - 4, align: c.align ?? 'left' })
      x += c.width
    })
    doc.y = y0 + rh
  })
  doc.fillColor(INK)
  doc.x = MARGIN
}

export function keyValues(doc: Doc, pairs: [string, string][]): void {
  table(doc, [{ title: 'Item', width: 150 }, { title: 'Value', width: contentWidth(doc) - 150 }], pairs.map(([k, v]) => [k, v]))
}

/** A row's value as printed: numbers to their significant digits with separators. */
export function shown(r: Row): string {
  if (r.value === null) return ''
  return typeof r.value === 'number' ? fmt(r.value, r.digits ?? 4) : r.value
}

/** Grouped rows as one table (Quantity, Value, Unit) with the group titles between. */
export function groupTable(doc: Doc, groups: RowGroup[], widths: [number, number, number] = [265, 130, 100]): void {
  const rows: string[][] = []
  for (const g of groups) {
    rows.push([`§${g.title}`])
    for (const r of g.rows) rows.push([r.label, shown(r), r.unit])
  }
  table(doc, [{ title: 'Quantity', width: widths[0] }, { title: 'Value', width: widths[1], align: 'right' }, { title: 'Unit', width: widths[2] }], rows)
}

/** A compact block of grouped rows at (x, y) in a column `w` wide (the data sheet); returns the y below it. */
export function sheetBlock(doc: Doc, g: RowGroup, x: number, y: number, w: number): number {
  const lh = 11
  doc.font('Helvetica-Bold').fontSize(9).fillColor(ACCENT).text(pdfText(g.title), x, y, { width: w, lineBreak: false })
  y += 12
  doc.moveTo(x, y - 1).lineTo(x + w, y - 1).lineWidth(0.4).strokeColor(RULE).stroke()
  doc.font('Helvetica').fontSize(8).fillColor(INK)
  const labelW = w * 0.5
  const valueW = w * 0.27
  for (const r of g.rows) {
    const text = shown(r)
    if (typeof r.value === 'string' && text.length > 18) {
      // words: label above, text across the column
      doc.fillColor(MUTED).text(pdfText(r.label), x, y + 1, { width: w, lineBreak: false, ellipsis: true })
      y += lh
      doc.fillColor(INK).text(pdfText(text), x + 8, y + 1, { width: w - 8 })
      y = doc.y + 1
      continue
    }
    doc.fillColor(MUTED).text(pdfText(r.label), x, y + 1, { width: labelW - 4, lineBreak: false, ellipsis: true })
    doc.fillColor(INK).font('Helvetica-Bold').text(pdfText(text), x + labelW, y + 1, { width: valueW - 4, align: 'right', lineBreak: false })
    doc.font('Helvetica').text(pdfText(r.unit), x + labelW + valueW, y + 1, { width: w - labelW - valueW, lineBreak: false, ellipsis: true })
    y += lh
  }
  return y + 8
}

/** Round axis bounds and a tick step (1, 2 or 5 times a power of ten). */
export function niceScale(lo: number, hi: number, ticks = 5): { lo: number; hi: number; step: number } {
  if (hi <= lo) {
    const pad = Math.abs(lo) * 0.05 || 1
    lo -= pad
    hi += pad
  }
  const raw = (hi - lo) / ticks
  const mag = Math.pow(10, Math.floor(Math.log10(raw)))
  const step = [1, 2, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? 10 * mag
  return { lo: Math.floor(lo / step + 1e-9) * step, hi: Math.ceil(hi / step - 1e-9) * step, step }
}

export function dateTime(d: Date): string {
  return `${d.toISOString().slice(0, 16).replace('T', ' ')} UTC`
}
