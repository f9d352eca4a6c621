import PDFDocument from 'pdfkit'
import { REVIEW_WORDS, type ReportModel, type ReportSection } from './model.ts'
import { fmt, money } from './format.ts'
import {
  INK, MARGIN, MUTED, RULE, STATUS_INK, bottom, contentWidth, dateTime, ensure, groupTable, heading, keyValues, note, pdfText, sheetBlock, table, type Doc,
} from './pdf-layout.ts'
import { confidencePdf } from './confidence.ts'
import { costCurveFigure, costGapFigure, operatingDiagram, GAP_PARTS } from './pdf-figures.ts'

export { pdfText } from './pdf-layout.ts'

/**
 * The printable study report (A4, built-in Helvetica: nothing is loaded from outside).
 * Page 1 is the data sheet (what a vendor enquiry needs); then the sections of SECTIONS in
 * order. Numbers are in the reader's unit system with the screens' labels.
 */

interface Section {
  key: string
  render(doc: Doc, m: ReportModel): void
}

const unitsName = (m: ReportModel) => (m.unitSystem === 'US' ? 'US customary units' : 'SI units')

function runLine(r: { id: number; createdAt: Date; createdByName: string | null } | undefined): string {
  return r ? `#${r.id}, ${dateTime(r.createdAt)}${r.createdByName ? `, ${r.createdByName}` : ''}` : 'none'
}

function basisLine(m: ReportModel): string {
  const parts: string[] = []
  const d = m.design?.run
  if (d) parts.push(`${d.costBasisVersion === null ? 'not priced' : `version ${d.costBasisVersion}`} (${d.kind === 'design' ? 'design' : 'optimum'} run #${d.id})`)
  if (m.optimise && m.optimise.run.id !== d?.id) parts.push(`${m.optimise.run.costBasisVersion === null ? 'not priced' : `version ${m.optimise.run.costBasisVersion}`} (optimisation run #${m.optimise.run.id})`)
  return parts.join('; ') || 'none'
}

/** Page 1: title block, the vendor data sheet in two columns, the cautions. */
function dataSheetPage(doc: Doc, m: ReportModel): void {
  const width = contentWidth(doc)
  doc.font('Helvetica').fontSize(9).fillColor(MUTED).text(pdfText(`Scrubwright study report  |  ${m.site.name}`), MARGIN, MARGIN)
  doc.moveDown(0.3)
  doc.font('Helvetica-Bold').fontSize(18).fillColor(INK).text(pdfText(m.study.name), { width })
  if (m.study.description) doc.font('Helvetica').fontSize(9.5).fillColor(MUTED).text(pdfText(m.study.description), { width })
  doc.moveDown(0.3)
  const last = m.review.filter((e) => e.kind === 'approve' || e.kind === 'submit').at(-1)
  doc.font('Helvetica').fontSize(8.5).fillColor(INK).text(pdfText(
    `Revision ${m.study.revision}, ${m.study.status.replace('_', ' ')}${last ? ` (${last.kind === 'approve' ? 'approved' : 'submitted'} by ${last.who}, ${last.at.toISOString().slice(0, 10)})` : ''}  |  ` +
    `design ${m.design ? runLine(m.design.run) : 'none'}  |  cost basis ${basisLine(m)}  |  ${unitsName(m)}  |  report ${dateTime(m.generatedAt)}`,
  ), { width })
  heading(doc, 'Data sheet', 100)
  if (!m.dataSheet.length) {
    note(doc, m.design
      ? 'The inputs of the design run no longer form a complete case, so the data sheet cannot be drawn up; the sections that follow show the run as stored.'
      : 'No design or optimisation has been run for this study yet: the report shows the inputs, options and sign-off history only.')
  } else {
    const top = doc.y
    const colW = (width - 24) / 2
    const half = Math.ceil(m.dataSheet.length / 2)
    let yl = top
    let yr = top
    m.dataSheet.forEach((g, i) => {
      if (i < half) yl = sheetBlock(doc, g, MARGIN, yl, colW)
      else yr = sheetBlock(doc, g, MARGIN + colW + 24, yr, colW)
    })
    doc.y = Math.max(yl, yr)
    doc.x = MARGIN
  }
  // the cautions, boxed, at the foot of the data sheet
  const text = m.cautions.map((c) => `- ${c}`).join('\n')
  doc.font('Helvetica').fontSize(7.5)
  const h = doc.heightOfString(pdfText(text), { width: width - 16 }) + 24
  // at the foot of a full data sheet; right below the note when there is none (the sections follow on the same page)
  const y = m.dataSheet.length ? Math.max(doc.y + 6, bottom(doc) - h) : doc.y + 8
  doc.rect(MARGIN, y, width, h).lineWidth(0.6).strokeColor(STATUS_INK.warn!).stroke()
  doc.font('Helvetica-Bold').fontSize(8.5).fillColor(STATUS_INK.warn!).text('Cautions', MARGIN + 8, y + 6)
  doc.font('Helvetica').fontSize(7.5).fillColor(INK).text(pdfText(text), MARGIN + 8, y + 18, { width: width - 16 })
  doc.y = y + h
  doc.x = MARGIN
}

const details: Section = {
  key: 'details',
  render(doc, m) {
    heading(doc, 'Report details')
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
      ['Units', unitsName(m)],
      ['Design run', runLine(designRun)],
      ['Optimisation run', runLine(m.optimise?.run)],
      ['Cost basis version', versions((r) => (r.costBasisVersion === null ? 'none' : `version ${r.costBasisVersion}`))],
      ['Cost basis in force', m.costBasisInForce ? `version ${m.costBasisInForce.version}, effective ${m.costBasisInForce.effectiveDate ?? ''}` : 'none'],
      ['Engine version', versions((r) => r.engineVersion)],
    ])
  },
}

const inputs: Section = {
  key: 'inputs',
  render(doc, m) {
    heading(doc, 'Inputs')
    if (m.inputsNote) note(doc, m.inputsNote)
    if (m.inputs.length) groupTable(doc, m.inputs)
  },
}

const design: Section = {
  key: 'design',
  render(doc, m) {
    heading(doc, 'Design summary')
    if (!m.design) return note(doc, 'No design run exists for this study.')
    note(doc, `From ${m.design.source}.`)
    groupTable(doc, m.design.groups)
    for (const w of m.design.warnings) note(doc, `Note: ${w}`)
  },
}

const diagram: Section = {
  key: 'diagram',
  render(doc, m) {
    if (!m.profile || !m.profile.operating.length) return
    heading(doc, 'Operating diagram', 300)
    note(doc, `Equilibrium curve, operating line and theoretical stages, top of the column at the lower left. ${m.profile.methodNote}`)
    doc.moveDown(0.4)
    const y = doc.y
    operatingDiagram(doc, m.profile, MARGIN, y, contentWidth(doc), 300)
    doc.y = y + 306
    doc.x = MARGIN
  },
}

const checks: Section = {
  key: 'checks',
  render(doc, m) {
    heading(doc, 'Tray checks')
    if (!m.design) return note(doc, 'No design run exists for this study.')
    const limit = (c: (typeof m.design.checks)[number]) => `${c.direction === 'min' ? '>= ' : c.direction === 'max' ? '<= ' : ''}${fmt(c.limit, 4)}`
    table(doc,
      [{ title: 'Check', width: 190 }, { title: 'Value', width: 80, align: 'right' }, { title: 'Limit', width: 80, align: 'right' }, { title: '', width: 8 }, { title: 'Unit', width: 52 }, { title: 'Result', width: 85 }],
      m.design.checks.map((c) => [c.label, fmt(c.value, 4), limit(c), '', c.unit, c.status.toUpperCase()]),
      (i, j) => (j === 5 ? STATUS_INK[m.design!.checks[i]!.status] : undefined))
    for (const c of m.design.checks.filter((x) => x.status !== 'pass' && x.advice)) note(doc, `${c.label}: ${c.advice}`)
  },
}

const costs: Section = {
  key: 'costs',
  render(doc, m) {
    heading(doc, 'Cost breakdown')
    if (!m.costs) return note(doc, m.design ? 'The design run was not priced (no published cost basis at the time).' : 'No design run exists for this study.')
    const c = m.costs
    note(doc, `${c.currency} at cost index ${fmt(c.costIndex, 5)}; capital annualised with a capital recovery factor of ${fmt(c.capitalRecoveryFactor, 4)} per year; cost basis ${basisLine(m)}.`)
    table(doc,
      [{ title: 'Item', width: 130 }, { title: 'Size / quantity', width: 115 }, { title: `Purchased [${c.currency}]`, width: 80, align: 'right' }, { title: `Installed [${c.currency}]`, width: 80, align: 'right' }, { title: `Annual [${c.currency}/yr]`, width: 90, align: 'right' }],
      [
        ...c.rows.map((r) => [r.label, `${fmt(r.size, 4)} ${r.sizeUnit}`, r.purchased === null ? '' : fmt(r.purchased, 5), r.installed === null ? '' : fmt(r.installed, 5), fmt(r.annual, 5)]),
        ['Annualised capital', '', '', fmt(c.installedCapital, 5), fmt(c.annualisedCapital, 5)],
        ['Operating cost', '', '', '', fmt(c.operatingCost, 5)],
      ])
    doc.moveDown(0.4)
    keyValues(doc, [
      ['Total annualised cost (TAC)', `${money(c.totalAnnualCost, c.currency)} /yr`],
      ['Solute recovered', `${fmt(m.unitSystem === 'US' ? c.soluteRecoveredPerYear / 0.45359237 : c.soluteRecoveredPerYear, 4)} ${m.unitSystem === 'US' ? 'lb/yr' : 'kg/yr'}`],
      ['Cost per kg recovered', `${c.currency} ${fmt(c.costPerKgRecovered, 4)} /kg`],
    ])
  },
}

const curves: Section = {
  key: 'curves',
  render(doc, m) {
    heading(doc, 'Cost curves', 230)
    if (!m.optimise) return note(doc, 'No optimisation run exists for this study; run one to see the cost curves.')
    const o = m.optimise
    note(doc, `Optimum of run #${o.run.id}: ${o.rows.map((r) => `${r.label} ${typeof r.value === 'number' ? fmt(r.value, r.digits ?? 4) : r.value}${r.unit ? ` ${r.unit}` : ''}`).join('; ')}; TAC ${money(o.totalAnnualCost, m.currency)} /yr (${o.evaluations} evaluations).`)
    doc.moveDown(0.4)
    for (const s of m.curves) {
      ensure(doc, 225)
      const y = doc.y
      costCurveFigure(doc, s, m.currency, MARGIN, y, contentWidth(doc), 215)
      doc.y = y + 225
      doc.x = MARGIN
    }
  },
}

const options: Section = {
  key: 'options',
  render(doc, m) {
    heading(doc, 'Options')
    if (!m.options.length) return note(doc, 'No options are pinned.')
    const len = m.unitSystem === 'US' ? 'ft' : 'm'
    table(doc,
      [{ title: 'Option', width: 140 }, { title: 'Run', width: 70 }, { title: 'Trays', width: 40, align: 'right' }, { title: `Diameter [${len}]`, width: 65, align: 'right' }, { title: `TAC [${m.currency || 'currency'}/yr]`, width: 80, align: 'right' }, { title: 'Notes', width: 100 }],
      m.options.map((o) => [
        `${o.name}${o.id === m.recommendedOptionId ? ' (recommended)' : ''}`,
        `#${o.runId} ${o.run.kind}`,
        o.summary?.actualTrays !== undefined ? String(o.summary.actualTrays) : '',
        o.diameter === null ? '' : fmt(o.diameter, 3),
        o.tac === null ? '' : fmt(o.tac, 6),
        o.notes,
      ]))
  },
}

const operating: Section = {
  key: 'operating',
  render(doc, m) {
    const op = m.operating
    if (!op) return
    heading(doc, 'Operating log: cost gap against the approved optimum', 260)
    if (op.issue) note(doc, op.issue)
    if (!op.months.length) return
    note(doc, `Each logged month rated with the as-built column (approved design run #${op.designRunId}) and priced with the cost basis in force that month; the gap to the approved optimum's month cost (cost basis version ${op.costBasisVersion ?? 'none'}) is split into its causes, which add up to the gap.`)
    if (op.drift) note(doc, `Drift: ${op.drift}`)
    if (op.months.some((x) => x.gap !== null)) {
      doc.moveDown(0.3)
      const y = doc.y
      costGapFigure(doc, op.months, m.currency, MARGIN, y, contentWidth(doc), 220)
      doc.y = y + 226
      doc.x = MARGIN
    }
    const c = (v: number | null) => (v === null ? '' : fmt(v, 4))
    const cur = m.currency
    table(doc,
      [
        { title: 'Month', width: 48 }, { title: `Reference [${cur}]`, width: 56, align: 'right' }, { title: `Actual [${cur}]`, width: 56, align: 'right' },
        { title: `Gap [${cur}]`, width: 56, align: 'right' }, ...GAP_PARTS.map((p) => ({ title: `${p.label} [${cur}]`, width: 55.8, align: 'right' as const })),
      ],
      [
        ...op.months.map((x) => [x.month, c(x.reference), fmt(x.actual, 4), c(x.gap), ...GAP_PARTS.map((p) => c(x[p.key]))]),
        ['To date', fmt(op.toDate.reference, 4), fmt(op.toDate.actual, 4), fmt(op.toDate.gap, 4), ...GAP_PARTS.map((p) => fmt(op.months.reduce((a, x) => a + (x[p.key] ?? 0), 0), 4))],
      ])
    // the rating of the months (absent when it could not be made: the issue is noted above)
    if (!op.months.some((x) => x.designEfficiency > 0)) return
    doc.moveDown(0.6)
    table(doc,
      [
        { title: 'Month', width: 45 }, { title: `Gas [${op.flowUnit}]`, width: 58, align: 'right' }, { title: `Solvent [${op.flowUnit}]`, width: 58, align: 'right' },
        { title: `Solvent needed [${op.flowUnit}]`, width: 62, align: 'right' }, { title: 'Recovery expected [%]', width: 56, align: 'right' },
        { title: 'Recovery measured [%]', width: 56, align: 'right' }, { title: 'Efficiency achieved / design [%]', width: 72, align: 'right' },
        { title: 'Operating window', width: 86 },
      ],
      op.months.map((x) => [
        x.month, fmt(x.gasFlow, 4), fmt(x.solventFlow, 4), c(x.solventNeeded), fmt(x.expectedRecovery, 4), c(x.measuredRecovery),
        `${c(x.achievedEfficiency) || 'n/a'} / ${fmt(x.designEfficiency, 3)}`, x.insideWindow ? 'inside' : `outside: ${x.outside.join(', ')}`,
      ]))
    note(doc, 'Achieved efficiency: back-calculated from the measured recovery at the month\'s flows. Solvent needed: the solvent at which the as-built column at design efficiency reaches the design recovery with the month\'s gas.')
  },
}

function extraSection(s: ReportSection): Section {
  return {
    key: s.key,
    render(doc) {
      heading(doc, s.title)
      for (const n of s.notes) note(doc, n)
      if (!s.columns.length) return
      const w = contentWidth(doc) / s.columns.length
      table(doc, s.columns.map((c, i) => ({ title: c.unit ? `${c.title} [${c.unit}]` : c.title, width: w, align: i === 0 ? 'left' : 'right' })),
        s.rows.map((r) => r.map((v) => (v === null ? '' : typeof v === 'number' ? fmt(v, 4) : v))))
    },
  }
}

/** Sign-off history and cautions close the report; kept together so the last page is never a stub. */
const closing: Section = {
  key: 'closing',
  render(doc, m) {
    const width = contentWidth(doc)
    doc.font('Helvetica').fontSize(9)
    const cautionsH = m.cautions.reduce((a, c) => a + doc.heightOfString(pdfText(`- ${c}`), { width }) + 4, 0)
    const needed = 70 + Math.max(1, m.review.length) * 13 + 50 + cautionsH
    if (doc.y + needed > bottom(doc) && needed < bottom(doc) - MARGIN) doc.addPage()
    heading(doc, 'Sign-off history')
    if (!m.review.length) note(doc, 'No review events yet.')
    else {
      table(doc, [{ title: 'When', width: 100 }, { title: 'Event', width: 100 }, { title: 'Who', width: 100 }, { title: 'Comment', width: 195 }],
        m.review.map((e) => [dateTime(e.at), REVIEW_WORDS[e.kind] ?? e.kind, e.who, e.body.replace(/\s+/g, ' ')]))
    }
    heading(doc, 'Cautions')
    doc.font('Helvetica').fontSize(9).fillColor(INK)
    for (const c of m.cautions) {
      ensure(doc, 30)
      doc.text(pdfText(`- ${c}`), MARGIN, doc.y, { width })
      doc.moveDown(0.3)
    }
  },
}

/** The sections after the data sheet, in order; features add theirs through the model's `sections`. */
/** The chance of meeting the target (./confidence.ts renders it). */
const confidence: Section = {
  key: 'confidence',
  render(doc, m) {
    if (m.confidence) confidencePdf(doc, m.confidence, pdfText)
  },
}

function sectionsOf(m: ReportModel): Section[] {
  return [details, inputs, design, diagram, checks, costs, curves, options, operating, ...m.sections.map(extraSection), confidence, closing]
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
  const width = contentWidth(doc)

  dataSheetPage(doc, m)
  if (m.dataSheet.length) doc.addPage()
  else doc.y += 4
  for (const s of sectionsOf(m)) s.render(doc, m)

  // ---- page footers
  const range = doc.bufferedPageRange()
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i)
    const saved = doc.page.margins.bottom
    doc.page.margins.bottom = 0
    doc.moveTo(MARGIN, doc.page.height - MARGIN + 12).lineTo(doc.page.width - MARGIN, doc.page.height - MARGIN + 12).lineWidth(0.4).strokeColor(RULE).stroke()
    doc.font('Helvetica').fontSize(7).fillColor(MUTED)
      .text(pdfText(`${m.study.name}, revision ${m.study.revision}  |  ${unitsName(m)}  |  page ${i + 1} of ${range.count}`), MARGIN, doc.page.height - MARGIN + 18, { width, align: 'center', lineBreak: false })
    doc.page.margins.bottom = saved
  }
  doc.end()
  return done
}
