import PDFDocument from 'pdfkit'
import type { ReportModel, CurveSeries } from './model.ts'
import { fmt, money } from './format.ts'
import { confidencePdf } from './confidence.ts'

/**
 * The printable study report (A4, built-in Helvetica: nothing is loaded from outside).
 * Sections: title block, inputs, design summary, tray checks, cost breakdown, cost curves,
 * options, sign-off history, cautions.
 */

type Doc = PDFKit.PDFDocument

const MARGIN = 50
const INK = '#1f2a33'
const MUTED = '#5b6770'
const RULE = '#c9d1d6'
const ACCENT = '#1d6f8c'
const STATUS_INK: Record<string, string> = { pass: '#2e7d32', warn: '#b26a00', fail: '#c62828' }

/** The standard fonts encode WinAnsi only: replace what they cannot show. */
export function pdfText(s: string): string {
  return s
    .replace(/[\u2212\u2010\u2011]/g, '-')
    .replace(/\u2264/g, '<=')
    .replace(/\u2265/g, '>=')
    .replace(/\u00d7/g, 'x')
    .replace(/\u03bc/g, 'u')
    .replace(/[\u2070-\u209f]/g, '')
    .replace(/[^\x09\x0a\x0d\x20-\x7e\u00a0-\u00ff\u2013\u2014\u2018\u2019\u201c\u201d\u2022\u2026\u20ac]/g, '?')
}

function bottom(doc: Doc): number {
  return doc.page.height - MARGIN
}

function ensure(doc: Doc, height: number): void {
  if (doc.y + height > bottom(doc)) doc.addPage()
}

function heading(doc: Doc, text: string): void {
  ensure(doc, 60)
  doc.moveDown(0.8)
  doc.font('Helvetica-Bold').fontSize(13).fillColor(ACCENT).text(pdfText(text), MARGIN, doc.y)
  const y = doc.y + 2
  doc.moveTo(MARGIN, y).lineTo(doc.page.width - MARGIN, y).lineWidth(0.5).strokeColor(RULE).stroke()
  doc.moveDown(0.5)
  doc.font('Helvetica').fontSize(9).fillColor(INK)
}

function note(doc: Doc, text: string): void {
  ensure(doc, 20)
  doc.font('Helvetica-Oblique').fontSize(9).fillColor(MUTED).text(pdfText(text), MARGIN, doc.y, { width: doc.page.width - 2 * MARGIN })
  doc.font('Helvetica').fillColor(INK)
}

interface Column {
  title: string
  width: number
  align?: 'left' | 'right' | 'center'
}

/** A simple table: header row, then rows; breaks pages and repeats the header. */
function table(doc: Doc, columns: Column[], rows: string[][], colour?: (row: number, col: number) => string | undefined): void {
  const rowH = 13
  const drawHeader = () => {
    let x = MARGIN
    doc.font('Helvetica-Bold').fontSize(8).fillColor(MUTED)
    const y = doc.y
    for (const c of columns) {
      doc.text(pdfText(c.title), x + 2, y, { width: c.width - 4, align: c.align ?? 'left', lineBreak: false, ellipsis: true })
      x += c.width
    }
    doc.y = y + rowH
    doc.moveTo(MARGIN, doc.y - 2).lineTo(MARGIN + columns.reduce((s, c) => s + c.width, 0), doc.y - 2).lineWidth(0.5).strokeColor(RULE).stroke()
    doc.font('Helvetica').fontSize(8.5).fillColor(INK)
  }
  ensure(doc, rowH * 3)
  drawHeader()
  rows.forEach((r, i) => {
    if (doc.y + rowH > bottom(doc)) {
      doc.addPage()
      drawHeader()
    }
    let x = MARGIN
    const y = doc.y
    columns.forEach((c, j) => {
      doc.fillColor(colour?.(i, j) ?? INK)
      doc.text(pdfText(r[j] ?? ''), x + 2, y, { width: c.width - 4, align: c.align ?? 'left', lineBreak: false, ellipsis: true })
      x += c.width
    })
    doc.y = y + rowH
  })
  doc.fillColor(INK)
  doc.x = MARGIN
}

function keyValues(doc: Doc, pairs: [string, string][]): void {
  table(doc, [{ title: 'Item', width: 150 }, { title: 'Value', width: 345 }], pairs.map(([k, v]) => [k, v]))
}

/** Round axis bounds and a tick step (1, 2 or 5 times a power of ten). */
function niceScale(lo: number, hi: number, ticks = 5): { lo: number; hi: number; step: number } {
  if (hi <= lo) {
    const pad = Math.abs(lo) * 0.05 || 1
    lo -= pad
    hi += pad
  }
  const raw = (hi - lo) / ticks
  const mag = Math.pow(10, Math.floor(Math.log10(raw)))
  const step = [1, 2, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? 10 * mag
  return { lo: Math.floor(lo / step) * step, hi: Math.ceil(hi / step) * step, step }
}

/** A vector line chart: TAC (solid), annualised capital (dashed) and operating cost (dotted) vs x, optimum marked. */
function lineChart(doc: Doc, s: CurveSeries, currency: string, x0: number, y0: number, w: number, h: number): void {
  const plot = { x: x0 + 48, y: y0 + 18, w: w - 58, h: h - 48 }
  doc.font('Helvetica-Bold').fontSize(9).fillColor(INK).text(pdfText(s.title), x0, y0, { width: w, lineBreak: false })
  if (s.points.length < 2) {
    doc.font('Helvetica-Oblique').fontSize(8).fillColor(MUTED).text('Too few feasible points to draw this curve.', plot.x, plot.y + 20, { width: plot.w })
    return
  }
  const xs = s.points.map((p) => p.x)
  const ys = s.points.flatMap((p) => [p.tac, p.capital, p.operating])
  const sx = niceScale(Math.min(...xs), Math.max(...xs))
  const sy = niceScale(0, Math.max(...ys))
  const px = (v: number) => plot.x + ((v - sx.lo) / (sx.hi - sx.lo)) * plot.w
  const py = (v: number) => plot.y + plot.h - ((v - sy.lo) / (sy.hi - sy.lo)) * plot.h

  doc.lineWidth(0.4).strokeColor(RULE)
  doc.font('Helvetica').fontSize(6.5).fillColor(MUTED)
  for (let v = sy.lo; v <= sy.hi + sy.step / 2; v += sy.step) {
    doc.moveTo(plot.x, py(v)).lineTo(plot.x + plot.w, py(v)).stroke()
    doc.text(fmt(v / 1000, 3), x0, py(v) - 3, { width: 44, align: 'right', lineBreak: false })
  }
  for (let v = sx.lo; v <= sx.hi + sx.step / 2; v += sx.step) {
    doc.moveTo(px(v), plot.y + plot.h).lineTo(px(v), plot.y + plot.h + 3).stroke()
    doc.text(fmt(v, 4), px(v) - 20, plot.y + plot.h + 5, { width: 40, align: 'center', lineBreak: false })
  }
  doc.lineWidth(0.8).strokeColor(INK).rect(plot.x, plot.y, plot.w, plot.h).stroke()
  doc.text(pdfText(`${s.xLabel} [${s.xUnit}]`), plot.x, plot.y + plot.h + 14, { width: plot.w, align: 'center', lineBreak: false })
  doc.save().rotate(-90, { origin: [x0 + 6, plot.y + plot.h / 2] })
  doc.text(pdfText(`Cost [1000 ${currency}/yr]`), x0 + 6 - plot.h / 2, plot.y + plot.h / 2 - 4, { width: plot.h, align: 'center', lineBreak: false })
  doc.restore()

  const line = (key: 'tac' | 'capital' | 'operating', colour: string, dash?: [number, number]) => {
    doc.save()
    doc.lineWidth(key === 'tac' ? 1.6 : 1).strokeColor(colour)
    if (dash) doc.dash(dash[0], { space: dash[1] })
    s.points.forEach((p, i) => (i === 0 ? doc.moveTo(px(p.x), py(p[key])) : doc.lineTo(px(p.x), py(p[key]))))
    doc.stroke()
    doc.undash()
    doc.restore()
  }
  line('capital', '#7b8f9c', [4, 2])
  line('operating', '#b26a00', [1, 2])
  line('tac', ACCENT)
  doc.circle(px(s.optimumX), py(s.optimumTac), 3).fillColor('#c62828').fill()

  // Legend
  const ly = plot.y + 4
  const items: [string, string][] = [['TAC', ACCENT], ['Capital (annualised)', '#7b8f9c'], ['Operating', '#b26a00'], ['Optimum', '#c62828']]
  let lx = plot.x + 6
  doc.fontSize(6.5)
  for (const [label, colour] of items) {
    doc.rect(lx, ly + 1, 8, 4).fillColor(colour).fill()
    doc.fillColor(INK).text(label, lx + 11, ly, { lineBreak: false })
    lx += 16 + doc.widthOfString(label)
  }
  if (s.infeasible) {
    doc.fillColor(MUTED).text(`${s.infeasible} infeasible point(s) not drawn`, plot.x + 6, plot.y + plot.h - 10, { lineBreak: false })
  }
  doc.fillColor(INK)
}

function dateTime(d: Date): string {
  return `${d.toISOString().slice(0, 16).replace('T', ' ')} UTC`
}

export function renderPdf(m: ReportModel): Promise<Buffer> {
  const doc = new PDFDocument({
    size: 'A4',
    margins: { top: MARGIN, bottom: MARGIN, left: MARGIN, right: MARGIN },
    info: { Title: pdfText(`${m.study.name}: study report`), Author: pdfText(m.generatedBy), Subject: pdfText(m.site.name), Creator: 'Scrubwright' },
    bufferPages: true,
  })
  const chunks: Buffer[] = []
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('data', (c: Buffer) => chunks.push(c))
    doc.on('end', () => resolve(Buffer.concat(chunks)))
    doc.on('error', reject)
  })
  const width = doc.page.width - 2 * MARGIN

  // ---- title block
  doc.font('Helvetica').fontSize(9).fillColor(MUTED).text(pdfText(`Scrubwright study report  |  ${m.site.name}`), MARGIN, MARGIN)
  doc.moveDown(0.3)
  doc.font('Helvetica-Bold').fontSize(18).fillColor(INK).text(pdfText(m.study.name), { width })
  if (m.study.description) doc.font('Helvetica').fontSize(9.5).fillColor(MUTED).text(pdfText(m.study.description), { width })
  doc.moveDown(0.5)
  const runLine = (r: { id: number; createdAt: Date; createdByName: string | null } | undefined) =>
    r ? `#${r.id}, ${dateTime(r.createdAt)}${r.createdByName ? `, ${r.createdByName}` : ''}` : 'none'
  const designRun = m.design?.run.kind === 'design' ? m.design.run : undefined
  const versions = (pick: (r: { costBasisVersion: number | null; engineVersion: string }) => string) =>
    [designRun ? `${pick(designRun)} (design)` : '', m.optimise ? `${pick(m.optimise.run)} (optimisation)` : ''].filter(Boolean).join('; ') || 'none'
  keyValues(doc, [
    ['Site', m.site.name],
    ['Study', `${m.study.name} (id ${m.study.id})`],
    ['Status', m.study.status.replace('_', ' ')],
    ['Revision', String(m.study.revision)],
    ['Owner', m.study.ownerName],
    ['Report date', `${dateTime(m.generatedAt)}, by ${m.generatedBy}`],
    ['Design run', runLine(designRun)],
    ['Optimisation run', runLine(m.optimise?.run)],
    ['Cost basis version', versions((r) => (r.costBasisVersion === null ? 'none' : `version ${r.costBasisVersion}`))],
    ['Cost basis in force', m.costBasisInForce ? `version ${m.costBasisInForce.version}, effective ${m.costBasisInForce.effectiveDate ?? ''}` : 'none'],
    ['Engine version', versions((r) => r.engineVersion)],
  ])
  if (!m.design && !m.optimise) {
    doc.moveDown(0.5)
    note(doc, 'No design or optimisation has been run for this study yet: the report shows the inputs, options and sign-off history only.')
  }

  // ---- inputs
  heading(doc, 'Inputs')
  if (m.inputsNote) note(doc, m.inputsNote)
  table(doc, [{ title: 'Field', width: 220 }, { title: 'Value', width: 170, align: 'right' }, { title: 'Unit', width: 105 }],
    m.inputs.map((r) => [r.label, typeof r.value === 'number' ? fmt(r.value, 6) : r.value, r.unit]))

  // ---- design
  heading(doc, 'Design summary')
  if (!m.design) note(doc, 'No design run exists for this study.')
  else {
    note(doc, `From ${m.design.source}.`)
    table(doc, [{ title: 'Quantity', width: 250 }, { title: 'Value', width: 140, align: 'right' }, { title: 'Unit', width: 105 }],
      m.design.summary.map((r) => [r.label, typeof r.value === 'number' ? fmt(r.value, 4) : r.value, r.unit]))
    if (m.design.warnings.length) {
      doc.moveDown(0.4)
      for (const w of m.design.warnings) note(doc, `Warning: ${w}`)
    }
  }

  heading(doc, 'Tray checks')
  if (!m.design) note(doc, 'No design run exists for this study.')
  else {
    table(doc,
      [{ title: 'Check', width: 170 }, { title: 'Value', width: 80, align: 'right' }, { title: 'Limit', width: 80, align: 'right' }, { title: 'Unit', width: 60 }, { title: 'Result', width: 105 }],
      m.design.checks.map((c) => [c.label, fmt(c.value, 4), fmt(c.limit, 4), c.unit, c.status.toUpperCase()]),
      (i, j) => (j === 4 ? STATUS_INK[m.design!.checks[i]!.status] : undefined))
    const advice = m.design.checks.filter((c) => c.status !== 'pass' && c.advice)
    for (const c of advice) note(doc, `${c.label}: ${c.advice}`)
  }

  // ---- costs
  heading(doc, 'Cost breakdown')
  if (!m.costs) note(doc, m.design ? 'The design run was not priced (no published cost basis at the time).' : 'No design run exists for this study.')
  else {
    const c = m.costs
    note(doc, `${c.currency} at cost index ${fmt(c.costIndex, 5)}; capital annualised with a capital recovery factor of ${fmt(c.capitalRecoveryFactor, 4)} per year.`)
    table(doc,
      [{ title: 'Item', width: 130 }, { title: 'Size / quantity', width: 115 }, { title: `Purchased [${c.currency}]`, width: 80, align: 'right' }, { title: `Installed [${c.currency}]`, width: 80, align: 'right' }, { title: `Annual [${c.currency}/yr]`, width: 90, align: 'right' }],
      [
        ...c.rows.map((r) => [r.label, r.size, r.purchased === null ? '' : fmt(r.purchased, 5), r.installed === null ? '' : fmt(r.installed, 5), fmt(r.annual, 5)]),
        ['Annualised capital', '', '', fmt(c.installedCapital, 5), fmt(c.annualisedCapital, 5)],
        ['Operating cost', '', '', '', fmt(c.operatingCost, 5)],
      ])
    doc.moveDown(0.4)
    keyValues(doc, [
      ['Total annualised cost (TAC)', `${money(c.totalAnnualCost, c.currency)} /yr`],
      ['Solute recovered', `${fmt(c.soluteRecoveredPerYear, 4)} kg/yr`],
      ['Cost per kg recovered', `${c.currency} ${fmt(c.costPerKgRecovered, 4)} /kg`],
    ])
  }

  // ---- curves
  heading(doc, 'Cost curves')
  if (!m.optimise) note(doc, 'No optimisation run exists for this study; run one to see the cost curves.')
  else {
    const o = m.optimise
    note(doc, `Optimum of run #${o.run.id}: recovery ${fmt(o.recovery * 100, 4)} %, solvent factor ${fmt(o.solventFactor, 4)}, tray spacing ${fmt(o.traySpacing, 3)} m, ${fmt(o.floodFraction * 100, 3)} % of flood, ${o.actualTrays} trays, diameter ${fmt(o.selectedDiameter, 3)} m, TAC ${money(o.totalAnnualCost, m.currency)} /yr (${o.evaluations} evaluations).`)
    doc.moveDown(0.4)
    for (const s of m.curves) {
      ensure(doc, 215)
      const y = doc.y
      lineChart(doc, s, m.currency, MARGIN, y, width, 205)
      doc.y = y + 215
      doc.x = MARGIN
    }
  }

  // ---- options
  heading(doc, 'Options')
  if (!m.options.length) note(doc, 'No options are pinned.')
  else {
    table(doc,
      [{ title: 'Option', width: 140 }, { title: 'Run', width: 70 }, { title: 'Trays', width: 40, align: 'right' }, { title: 'Diameter [m]', width: 65, align: 'right' }, { title: `TAC [${m.currency || 'currency'}/yr]`, width: 80, align: 'right' }, { title: 'Notes', width: 100 }],
      m.options.map((o) => [
        `${o.name}${o.id === m.recommendedOptionId ? ' (recommended)' : ''}`,
        `#${o.runId} ${o.run.kind}`,
        o.summary?.actualTrays !== undefined ? String(o.summary.actualTrays) : '',
        o.summary?.selectedDiameter !== undefined ? fmt(o.summary.selectedDiameter, 3) : '',
        o.tac === null ? '' : fmt(o.tac, 6),
        o.notes,
      ]))
  }

  // ---- sign-off
  heading(doc, 'Sign-off history')
  if (!m.review.length) note(doc, 'No review events yet.')
  else {
    table(doc, [{ title: 'When', width: 110 }, { title: 'Event', width: 70 }, { title: 'Who', width: 110 }, { title: 'Comment', width: 205 }],
      m.review.map((e) => [dateTime(e.at), e.kind, e.who, e.body.replace(/\s+/g, ' ')]))
  }

  if (m.confidence) confidencePdf(doc, m.confidence, pdfText)

  // ---- cautions
  heading(doc, 'Cautions')
  doc.font('Helvetica').fontSize(9).fillColor(INK)
  for (const c of m.cautions) {
    ensure(doc, 30)
    doc.text(pdfText(`- ${c}`), MARGIN, doc.y, { width })
    doc.moveDown(0.3)
  }

  // ---- page footers
  const range = doc.bufferedPageRange()
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i)
    const saved = doc.page.margins.bottom
    doc.page.margins.bottom = 0
    doc.font('Helvetica').fontSize(7).fillColor(MUTED)
      .text(pdfText(`${m.study.name}, revision ${m.study.revision}  |  page ${i + 1} of ${range.count}`), MARGIN, doc.page.height - MARGIN + 18, { width, align: 'center', lineBreak: false })
    doc.page.margins.bottom = saved
  }
  doc.end()
  return done
}
