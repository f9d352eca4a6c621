import { COST_GAP_PARTS, type CurveSeries, type OperatingMonth, type ProfilePart } from './model.ts'
import { fmt } from './format.ts'
import { ACCENT, INK, MUTED, RULE, niceScale, pdfText, type Doc } from './pdf-layout.ts'

/** The report's figures, drawn as vector paths: cost curves, the operating diagram, the monthly cost-gap split. */

interface Plot {
  x: number
  y: number
  w: number
  h: number
}
type Scale = ReturnType<typeof niceScale>

/** Axes with grid, tick labels and titles; returns the maps from data to page. */
function axes(doc: Doc, plot: Plot, sx: Scale, sy: Scale, xTitle: string, yTitle: string, xTick: (v: number) => string, yTick: (v: number) => string) {
  const px = (v: number) => plot.x + ((v - sx.lo) / (sx.hi - sx.lo)) * plot.w
  const py = (v: number) => plot.y + plot.h - ((v - sy.lo) / (sy.hi - sy.lo)) * plot.h
  doc.lineWidth(0.4).strokeColor(RULE)
  doc.font('Helvetica').fontSize(6.5).fillColor(MUTED)
  for (let v = sy.lo; v <= sy.hi + sy.step / 2; v += sy.step) {
    doc.moveTo(plot.x, py(v)).lineTo(plot.x + plot.w, py(v)).stroke()
    doc.text(pdfText(yTick(v)), plot.x - 48, py(v) - 3, { width: 44, align: 'right', lineBreak: false })
  }
  for (let v = sx.lo; v <= sx.hi + sx.step / 2; v += sx.step) {
    doc.moveTo(px(v), plot.y + plot.h).lineTo(px(v), plot.y + plot.h + 3).stroke()
    doc.text(pdfText(xTick(v)), px(v) - 22, plot.y + plot.h + 5, { width: 44, align: 'center', lineBreak: false })
  }
  doc.lineWidth(0.8).strokeColor(INK).rect(plot.x, plot.y, plot.w, plot.h).stroke()
  doc.fontSize(7.5).fillColor(INK)
  doc.text(pdfText(xTitle), plot.x, plot.y + plot.h + 15, { width: plot.w, align: 'center', lineBreak: false })
  doc.save().rotate(-90, { origin: [plot.x - 50, plot.y + plot.h / 2] })
  doc.text(pdfText(yTitle), plot.x - 50 - plot.h / 2, plot.y + plot.h / 2 - 4, { width: plot.h, align: 'center', lineBreak: false })
  doc.restore()
  return { px, py }
}

function legend(doc: Doc, x: number, y: number, items: [string, string, 'line' | 'dash' | 'dot' | 'box' | 'dotMarker'][]): void {
  let lx = x
  doc.font('Helvetica').fontSize(7)
  for (const [label, colour, kind] of items) {
    doc.save()
    if (kind === 'box') doc.rect(lx, y + 1, 9, 6).fillColor(colour).fill()
    else if (kind === 'dotMarker') doc.circle(lx + 4.5, y + 4, 2.6).fillColor(colour).fill()
    else {
      doc.lineWidth(1.4).strokeColor(colour)
      if (kind === 'dash') doc.dash(3, { space: 2 })
      if (kind === 'dot') doc.dash(1, { space: 1.5 })
      doc.moveTo(lx, y + 4).lineTo(lx + 12, y + 4).stroke()
      doc.undash()
    }
    doc.restore()
    doc.fillColor(INK).text(pdfText(label), lx + 15, y, { lineBreak: false })
    lx += 24 + doc.widthOfString(pdfText(label))
  }
}

function polyline(doc: Doc, pts: [number, number][], colour: string, width: number, dash?: [number, number]): void {
  if (pts.length < 2) return
  doc.save()
  doc.lineWidth(width).strokeColor(colour)
  if (dash) doc.dash(dash[0], { space: dash[1] })
  pts.forEach(([x, y], i) => (i === 0 ? doc.moveTo(x, y) : doc.lineTo(x, y)))
  doc.stroke()
  doc.undash()
  doc.restore()
}

const CAPITAL = '#7b8f9c'
const OPERATING = '#b26a00'
const OPTIMUM = '#c62828'

/** TAC (solid), annualised capital (dashed) and operating cost (dotted) against x, the optimum marked. */
export function costCurveFigure(doc: Doc, s: CurveSeries, currency: string, x0: number, y0: number, w: number, h: number): void {
  doc.font('Helvetica-Bold').fontSize(9).fillColor(INK).text(pdfText(s.title), x0, y0, { width: w, lineBreak: false })
  const plot = { x: x0 + 58, y: y0 + 30, w: w - 68, h: h - 62 }
  if (s.points.length < 2) {
    doc.font('Helvetica-Oblique').fontSize(8).fillColor(MUTED).text('Too few feasible points to draw this curve.', plot.x, plot.y + 20, { width: plot.w })
    return
  }
  const xs = s.points.map((p) => p.x)
  const sx = niceScale(Math.min(...xs), Math.max(...xs))
  const sy = niceScale(0, Math.max(...s.points.flatMap((p) => [p.tac, p.capital, p.operating])))
  const { px, py } = axes(doc, plot, sx, sy, `${s.xLabel} [${s.xUnit}]`, `Cost [${currency}/yr]`, (v) => fmt(v, 4), (v) => fmt(v, 4))
  const line = (key: 'tac' | 'capital' | 'operating') => s.points.map((p) => [px(p.x), py(p[key])] as [number, number])
  polyline(doc, line('capital'), CAPITAL, 1, [4, 2])
  polyline(doc, line('operating'), OPERATING, 1, [1, 2])
  polyline(doc, line('tac'), ACCENT, 1.6)
  doc.circle(px(s.optimumX), py(s.optimumTac), 3).fillColor(OPTIMUM).fill()
  legend(doc, x0 + 58, y0 + 14, [['Total annualised cost', ACCENT, 'line'], ['Capital, annualised', CAPITAL, 'dash'], ['Operating', OPERATING, 'dot'], [`Optimum (${fmt(s.optimumX, 4)} ${s.xUnit})`, OPTIMUM, 'dotMarker']])
  if (s.infeasible) {
    doc.font('Helvetica').fontSize(6.5).fillColor(MUTED).text(`${s.infeasible} infeasible point(s) not drawn`, plot.x + 6, plot.y + plot.h - 10, { lineBreak: false })
  }
  doc.fillColor(INK)
}

/** y on the operating line at x (linear between its points). */
function operatingY(op: { x: number; y: number }[], x: number): number {
  for (let i = 1; i < op.length; i++) {
    const a = op[i - 1]!
    const b = op[i]!
    if (x <= b.x || i === op.length - 1) return a.y + ((b.y - a.y) * (x - a.x)) / (b.x - a.x || 1)
  }
  return op[0]?.y ?? 0
}

/**
 * The stage steps from the top of the column: from the lean end on the operating line (x0, y1)
 * across to equilibrium (x1, y1), down to the operating line (x1, y2), and so on; the last step
 * drawn as far as it was counted (the counted fraction of its horizontal run).
 */
export function stageSteps(p: ProfilePart): [number, number][] {
  const op = [...p.operating].sort((a, b) => a.x - b.x)
  const stages = [...p.stages].sort((a, b) => a.stage - b.stage)
  const lean = op[0]
  if (!lean || !stages.length) return []
  const pts: [number, number][] = []
  let x = lean.x
  stages.forEach((st, i) => {
    const next = stages[i + 1]
    if (next) {
      pts.push([x, st.y], [st.x, st.y], [st.x, next.y])
      x = st.x
    } else {
      const xEnd = x + p.lastStageFraction * (st.x - x)
      pts.push([x, st.y], [xEnd, st.y], [xEnd, operatingY(op, xEnd)])
    }
  })
  return pts
}

const EQUILIBRIUM = '#2e7d32'
const STEPS = '#6a4c93'

/** Equilibrium curve, operating line and the theoretical stages (mole fractions). */
export function operatingDiagram(doc: Doc, p: ProfilePart, x0: number, y0: number, w: number, h: number): void {
  const plot = { x: x0 + 58, y: y0 + 18, w: w - 68, h: h - 50 }
  const steps = stageSteps(p)
  const xMax = Math.max(...p.operating.map((q) => q.x), ...steps.map((q) => q[0]))
  const yMax = Math.max(...p.operating.map((q) => q.y), ...steps.map((q) => q[1]))
  const sx = niceScale(0, xMax * 1.02)
  const sy = niceScale(0, yMax * 1.02)
  const { px, py } = axes(doc, plot, sx, sy, 'x, solute mole fraction in the liquid', 'y, solute mole fraction in the gas', (v) => fmt(v, 3), (v) => fmt(v, 3))
  doc.save().rect(plot.x, plot.y, plot.w, plot.h).clip()
  polyline(doc, p.equilibrium.filter((q) => q.x <= sx.hi * 1.05).map((q) => [px(q.x), py(q.y)]), EQUILIBRIUM, 1.6)
  polyline(doc, p.operating.map((q) => [px(q.x), py(q.y)]), ACCENT, 1.6)
  polyline(doc, steps.map(([x, y]) => [px(x), py(y)]), STEPS, 0.9, [3, 1.5])
  doc.restore()
  // stage numbers beside the equilibrium corners
  doc.font('Helvetica').fontSize(6).fillColor(STEPS)
  const stagesSorted = [...p.stages].sort((a, b) => a.stage - b.stage)
  const every = Math.max(1, Math.ceil(stagesSorted.length / 15))
  stagesSorted.forEach((st, i) => {
    if (i % every !== 0 && i !== stagesSorted.length - 1) return
    const c = steps[3 * i + 1]
    if (c) doc.text(String(st.stage), px(c[0]) + 2, py(c[1]) - 8, { lineBreak: false })
  })
  legend(doc, x0 + 58, y0 + 4, [['Equilibrium curve', EQUILIBRIUM, 'line'], ['Operating line', ACCENT, 'line'], [`Theoretical stages (${fmt(p.theoreticalStages, 3)})`, STEPS, 'dash']])
  doc.fillColor(INK)
}

const GAP_COLOURS: Record<(typeof COST_GAP_PARTS)[number]['key'], string> = {
  throughput: '#1d6f8c',
  excessSolvent: '#b26a00',
  efficiencyLoss: '#c62828',
  prices: '#6a4c93',
  other: '#9aa5ad',
}
export const GAP_PARTS = COST_GAP_PARTS.map((p) => ({ ...p, colour: GAP_COLOURS[p.key] }))

/** Each month's cost gap as stacked bars of its causes (above zero: costs more than the approved optimum), the net gap marked. */
export function costGapFigure(doc: Doc, months: OperatingMonth[], currency: string, x0: number, y0: number, w: number, h: number): void {
  const ms = months.filter((m) => m.gap !== null)
  const plot = { x: x0 + 58, y: y0 + 18, w: w - 68, h: h - 50 }
  if (!ms.length) return
  let lo = 0
  let hi = 0
  for (const m of ms) {
    let up = 0
    let down = 0
    for (const p of GAP_PARTS) {
      const v = m[p.key] ?? 0
      if (v >= 0) up += v
      else down += v
    }
    hi = Math.max(hi, up, m.gap ?? 0)
    lo = Math.min(lo, down, m.gap ?? 0)
  }
  const sy = niceScale(lo, hi)
  const n = ms.length
  const sx = { lo: 0, hi: n, step: n + 1 }
  const { py } = axes(doc, plot, sx, sy, 'Month', `Cost gap [${currency}/month]`, () => '', (v) => fmt(v, 4))
  const slot = plot.w / n
  const bw = Math.min(28, slot * 0.6)
  doc.lineWidth(0.8).strokeColor(INK).moveTo(plot.x, py(0)).lineTo(plot.x + plot.w, py(0)).stroke()
  ms.forEach((m, i) => {
    const cx = plot.x + slot * (i + 0.5)
    let up = 0
    let down = 0
    for (const p of GAP_PARTS) {
      const v = m[p.key] ?? 0
      if (v === 0) continue
      const from = v > 0 ? up : down
      const to = from + v
      if (v > 0) up = to
      else down = to
      doc.rect(cx - bw / 2, Math.min(py(from), py(to)), bw, Math.abs(py(to) - py(from))).fillColor(p.colour).fill()
    }
    const g = m.gap ?? 0
    doc.lineWidth(1.4).strokeColor(INK).moveTo(cx - bw / 2 - 3, py(g)).lineTo(cx + bw / 2 + 3, py(g)).stroke()
    const every = Math.max(1, Math.ceil(n / 12))
    if (i % every === 0) doc.font('Helvetica').fontSize(6.5).fillColor(MUTED).text(m.month, cx - 20, plot.y + plot.h + 5, { width: 40, align: 'center', lineBreak: false })
  })
  legend(doc, x0 + 58, y0 + 4, [...GAP_PARTS.map((p) => [p.label, p.colour, 'box'] as [string, string, 'box']), ['Net gap', INK, 'line']])
  doc.fillColor(INK)
}
