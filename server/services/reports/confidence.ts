/**
 * The "Confidence" section of the study report (PDF and workbook), self-contained: the chance the
 * study's design meets its target when K and tray efficiency scatter as the product's defaults say
 * (the distributions of the Confidence panel are not stored, so the report states the ones it
 * used), the spreads, what drives them, and a small histogram.
 *
 * Wiring (three lines elsewhere): reports.ts sets `confidence: await studyConfidence(...)` on the
 * model; pdf.ts calls confidencePdf before the cautions; xlsx.ts calls confidenceSheet.
 */
import type ExcelJS from 'exceljs'
import type { CostBasisData } from '../../../shared/schemas/costBasis.ts'
import { uncertaintySpecSchema, type Spread, type UncertaintyResult } from '../../../shared/schemas/uncertainty.ts'
import { propagate } from '../../engine/uncertainty/index.ts'
import { uncertaintyToPublic } from '../../../shared/summaryUnits.ts'
import { isEngineError } from '../../engine/errors.ts'
import { loadPreset, DEFAULT_PRESET } from '../../engine/costing/index.ts'
import { caseFromRequest } from '../engine-gateway.ts'
import { siteLibrary } from '../runs.ts'
import { AppError } from '../../errors.ts'
import { DisplayUnits } from './units.ts'
import type { QuantityKind } from '../../../shared/units.ts'

export interface ConfidenceSection {
  samples: number
  seed: number
  basisNote: string
  target: string
  probabilityMeetsTarget: number
  standardError: number
  low95: number
  high95: number
  probabilityFlooding: number
  recovery: Spread
  percentFlood: Spread
  totalAnnualCost: Spread
  currency: string
  column: string
  assumptions: string[]
  contributions: { label: string; rankCorrelation: number; share: number }[]
  histogram: { edges: number[]; counts: number[]; target: number }
  caution: string
}

const pc = (x: number, d = 1) => `${(100 * x).toFixed(d)} %`

/** The section from an uncertainty answer (pure). */
export function sectionOf(r: UncertaintyResult, basisNote: string, u: DisplayUnits = new DisplayUnits('SI')): ConfidenceSection {
  const q = (kind: QuantityKind, v: number, unit: string, digits: number) => `${Number(u.from(kind, v, unit).toFixed(digits))} ${u.unit(kind)}`
  return {
    samples: r.samples,
    seed: r.seed,
    basisNote,
    target: r.target.kind === 'emissionLimit' ? `release at or below ${q('massFlow', r.target.emissionLimit ?? 0, 'kg/h', 3)}` : `recovery at or above ${pc(r.target.recovery, 2)}`,
    probabilityMeetsTarget: r.probabilityMeetsTarget,
    standardError: r.samplingError.probabilityMeetsTarget.standardError,
    low95: r.samplingError.probabilityMeetsTarget.low95,
    high95: r.samplingError.probabilityMeetsTarget.high95,
    probabilityFlooding: r.probabilityFlooding,
    recovery: r.recovery,
    percentFlood: r.percentFlood,
    totalAnnualCost: r.totalAnnualCost,
    currency: r.currency,
    column: `${r.design.actualTrays} trays, ${q('length', r.design.selectedDiameter, 'm', 2)} diameter, ${q('length', r.design.traySpacing, 'm', 2)} spacing, solvent ${q('molarFlow', r.design.solventFlow, 'kmol/h', 1)} held; at nominal values ${pc(r.design.nominalRecovery, 2)} recovery at ${r.design.nominalPercentFlood.toFixed(0)} % of flood`,
    assumptions: r.assumptions.map((a) => {
      const d = a.distribution
      const what = d.distribution === 'lognormal' ? `lognormal multiplier, median ${d.median}, sigma of ln ${d.sigma}`
        : d.distribution === 'normal' ? `normal multiplier, mean ${d.mean}, standard deviation ${d.relativeSd} of nominal`
        : d.distribution === 'uniform' ? `uniform multiplier ${d.low}-${d.high}`
        : d.distribution === 'triangular' ? `triangular multiplier ${d.low} / ${d.mode} / ${d.high}`
        : 'held at nominal'
      return `${a.label}: ${what} (${a.origin === 'default' ? 'product default' : 'given'}; drawn ${a.range[0].toFixed(2)}-${a.range[1].toFixed(2)} x nominal${a.note ? `; ${a.note}` : ''})`
    }),
    contributions: r.contributions.map((c) => ({ label: c.label, rankCorrelation: c.rankCorrelation, share: c.share })),
    histogram: r.histogram,
    caution: r.cautions[0] ?? '',
  }
}

/**
 * The section for a study's inputs, with the default distributions and the cost basis in force
 * (or the demo basis); null when the inputs do not give a design (the report says why elsewhere).
 */
export async function studyConfidence(siteId: number, inputs: unknown, basis: CostBasisData | null | undefined, u?: DisplayUnits): Promise<ConfidenceSection | null> {
  try {
    const c = caseFromRequest(inputs, await siteLibrary(siteId), 'inputs')
    const spec = uncertaintySpecSchema.parse({ samples: 10000, seed: 1 })
    const b = basis ?? loadPreset(DEFAULT_PRESET)
    const note = basis ? 'priced with the cost basis in force' : 'no published cost basis: priced with the demo cost basis'
    return sectionOf(uncertaintyToPublic(propagate({ c, basis: b, spec })), note, u)
  } catch (e) {
    if (isEngineError(e) || e instanceof AppError) return null
    throw e
  }
}

type Doc = PDFKit.PDFDocument

/** The section in the PDF (its own heading, lines, histogram and contributions). */
export function confidencePdf(doc: Doc, s: ConfidenceSection, text: (t: string) => string): void {
  const margin = doc.page.margins.left
  const width = doc.page.width - 2 * margin
  if (doc.y + 330 > doc.page.height - doc.page.margins.bottom) doc.addPage()
  doc.moveDown(0.8)
  doc.font('Helvetica-Bold').fontSize(13).fillColor('#1d6f8c').text('Confidence', margin, doc.y)
  const yr = doc.y + 2
  doc.moveTo(margin, yr).lineTo(margin + width, yr).lineWidth(0.5).strokeColor('#c9d1d6').stroke()
  doc.moveDown(0.5)
  doc.font('Helvetica').fontSize(9).fillColor('#1f2a33')
  doc.text(text(`The study's design is held (${s.column}) and rated in ${s.samples.toLocaleString('en')} Latin hypercube samples (seed ${s.seed}); ${s.basisNote}.`), margin, doc.y, { width })
  doc.moveDown(0.3)
  doc.font('Helvetica-Bold').fontSize(16).text(text(`Chance of meeting the target (${s.target}): ${pc(s.probabilityMeetsTarget)}`), { width })
  doc.font('Helvetica').fontSize(9)
  doc.text(text(`Sampling error ${pc(s.standardError, 2)} (95 % interval ${pc(s.low95)}-${pc(s.high95)}). Chance of flooding ${pc(s.probabilityFlooding, 2)}.`), { width })
  doc.text(text(`Recovery 5 / 50 / 95 %: ${pc(s.recovery.p05, 2)} / ${pc(s.recovery.p50, 2)} / ${pc(s.recovery.p95, 2)}. Percent flood 5 / 95 %: ${s.percentFlood.p05.toFixed(0)} / ${s.percentFlood.p95.toFixed(0)} %. TAC 5 % / mean / 95 %: ${Math.round(s.totalAnnualCost.p05).toLocaleString('en')} / ${Math.round(s.totalAnnualCost.mean).toLocaleString('en')} / ${Math.round(s.totalAnnualCost.p95).toLocaleString('en')} ${s.currency}/yr.`), { width })
  // histogram of recovery with the target
  const h = s.histogram
  const x0 = margin + 30, y0 = doc.y + 10, w = width - 40, hh = 110
  const max = Math.max(1, ...h.counts)
  const lo = h.edges[0]!, hi = h.edges[h.edges.length - 1]!
  const X = (v: number) => x0 + ((v - lo) / (hi - lo)) * w
  doc.lineWidth(0.5).strokeColor('#5b6770').moveTo(x0, y0 + hh).lineTo(x0 + w, y0 + hh).stroke()
  h.counts.forEach((k, i) => {
    const a = X(h.edges[i]!), b = X(h.edges[i + 1]!)
    const bh = (k / max) * hh
    if (bh > 0) doc.rect(a, y0 + hh - bh, Math.max(0.5, b - a - 0.5), bh).fill('#1D5C6B')
  })
  if (h.target >= lo && h.target <= hi) {
    doc.lineWidth(1).strokeColor('#c62828').dash(3, { space: 2 }).moveTo(X(h.target), y0).lineTo(X(h.target), y0 + hh).stroke().undash()
    doc.fontSize(7).fillColor('#c62828').text(text(`target ${pc(h.target, 2)}`), X(h.target) - 60, y0 - 2, { width: 58, align: 'right' })
  }
  doc.fontSize(7).fillColor('#5b6770')
  doc.text(pc(lo, 2), x0 - 10, y0 + hh + 3, { width: 60 })
  doc.text(pc(hi, 2), x0 + w - 50, y0 + hh + 3, { width: 60, align: 'right' })
  doc.text('Recovery over the samples', x0 + w / 2 - 60, y0 + hh + 3, { width: 120, align: 'center' })
  doc.y = y0 + hh + 18
  doc.x = margin
  doc.font('Helvetica-Bold').fontSize(9).fillColor('#1f2a33').text('What drives the spread of recovery (Spearman rank correlation; share of the spread)', margin, doc.y, { width })
  doc.font('Helvetica')
  for (const c of s.contributions) doc.text(text(`- ${c.label}: ${c.rankCorrelation.toFixed(2)}; ${pc(c.share, 0)}`), { width })
  doc.moveDown(0.3)
  doc.font('Helvetica-Bold').text('Assumptions', { width })
  doc.font('Helvetica')
  for (const a of s.assumptions) doc.text(text(`- ${a}`), { width })
  doc.text(text('- Every other input at its nominal value; each sample keeps the balance method of the nominal design.'), { width })
  doc.moveDown(0.3)
  doc.font('Helvetica-Oblique').fillColor('#5b6770').text(text(s.caution), { width })
  doc.font('Helvetica').fillColor('#1f2a33')
}

/** The section as a worksheet "Confidence". */
export function confidenceSheet(wb: ExcelJS.Workbook, s: ConfidenceSection): void {
  const ws = wb.addWorksheet('Confidence')
  ws.columns = [{ header: 'Quantity', key: 'q', width: 48 }, { header: 'Value', key: 'v', width: 18 }, { header: 'Unit', key: 'u', width: 14 }]
  ws.getRow(1).font = { bold: true }
  const rows: [string, number | string, string][] = [
    ['Target', s.target, ''],
    ['Samples', s.samples, '-'],
    ['Seed', s.seed, '-'],
    ['Chance of meeting the target', s.probabilityMeetsTarget, '-'],
    ['Sampling error (standard)', s.standardError, '-'],
    ['95 % interval, low', s.low95, '-'],
    ['95 % interval, high', s.high95, '-'],
    ['Chance of flooding', s.probabilityFlooding, '-'],
    ...(['mean', 'p05', 'p50', 'p95'] as const).map((k): [string, number, string] => [`Recovery, ${k}`, s.recovery[k], '-']),
    ...(['mean', 'p05', 'p50', 'p95'] as const).map((k): [string, number, string] => [`Percent flood, ${k}`, s.percentFlood[k], '%']),
    ...(['mean', 'p05', 'p50', 'p95'] as const).map((k): [string, number, string] => [`TAC, ${k}`, s.totalAnnualCost[k], `${s.currency}/yr`]),
    ...s.contributions.map((c): [string, number, string] => [`Rank correlation with recovery: ${c.label}`, c.rankCorrelation, '-']),
    ...s.assumptions.map((a): [string, string, string] => ['Assumption', a, '']),
    ['Held column', s.column, ''],
    ['Cost basis', s.basisNote, ''],
    ['Caution', s.caution, ''],
  ]
  for (const [q, v, u] of rows) {
    const row = ws.addRow({ q, v, u })
    // full precision kept; shown with a display format like every number of the workbook
    if (typeof v === 'number') row.getCell(2).numFmt = Number.isInteger(v) ? '#,##0' : '#,##0.0000'
  }
}
