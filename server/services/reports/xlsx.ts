import ExcelJS from 'exceljs'
import { COST_GAP_PARTS, REVIEW_WORDS, type ReportModel, type Row, type RowGroup } from './model.ts'
import { MONEY_FMT, numFmt } from './format.ts'
import { confidenceSheet } from './confidence.ts'

/**
 * The study as a workbook, one sheet per part: Inputs, Design summary, Trays, Profile, Economics,
 * Curves, Options, Operating log, Sign-off, and any sections features add. Numbers stay numbers
 * at full precision with a display format; units are in the headers or in a unit column, in the
 * reader's unit system.
 */

interface Col {
  header: string
  key: string
  width: number
  /** display format of numbers in this column: a format, 'auto' (by the value's size) or 'money' */
  fmt?: string
}

function sheet(wb: ExcelJS.Workbook, name: string, columns: Col[]): ExcelJS.Worksheet {
  const ws = wb.addWorksheet(name, { views: [{ state: 'frozen', ySplit: 1 }] })
  ws.columns = columns.map((c) => ({ header: c.header, key: c.key, width: c.width }))
  ws.getRow(1).font = { bold: true }
  return ws
}

/** Add a row and give its number cells their display format. */
function add(ws: ExcelJS.Worksheet, columns: Col[], values: Record<string, unknown>, digits = 4): ExcelJS.Row {
  const row = ws.addRow(values)
  columns.forEach((c, i) => {
    const cell = row.getCell(i + 1)
    if (typeof cell.value !== 'number') return
    // counts and whole numbers without decimals; other numbers to their significant digits
    cell.numFmt = c.fmt === 'money' ? MONEY_FMT : c.fmt && c.fmt !== 'auto' ? c.fmt : Number.isInteger(cell.value) ? '#,##0' : numFmt(cell.value, digits)
  })
  return row
}

/**
 * Text that a spreadsheet would read as a formula (starting with =, +, -, @, tab or CR) gets a
 * leading apostrophe, so a study name like "=HYPERLINK(...)" shows as text and never runs.
 */
export function escapeCellText(text: string): string {
  return /^[=+\-@\t\r]/.test(text) ? `'${text}` : text
}

function neutraliseFormulas(wb: ExcelJS.Workbook): void {
  wb.eachSheet((ws) => {
    ws.eachRow({ includeEmpty: false }, (row) => {
      row.eachCell({ includeEmpty: false }, (cell) => {
        if (typeof cell.value === 'string') cell.value = escapeCellText(cell.value)
      })
    })
  })
}

const VALUE_COLS: Col[] = [
  { header: 'Group', key: 'group', width: 22 }, { header: 'Quantity', key: 'label', width: 44 }, { header: 'Value', key: 'value', width: 16, fmt: 'auto' },
  { header: 'Unit', key: 'unit', width: 12 }, { header: 'Key', key: 'key', width: 28 },
]

function valueSheet(wb: ExcelJS.Workbook, name: string, groups: RowGroup[], empty: string): ExcelJS.Worksheet {
  const ws = sheet(wb, name, VALUE_COLS)
  for (const g of groups) for (const r of g.rows) addValue(ws, g.title, r)
  if (!groups.length) ws.addRow({ label: empty })
  return ws
}

function addValue(ws: ExcelJS.Worksheet, group: string, r: Row): void {
  add(ws, VALUE_COLS, { group, label: r.label, value: r.value ?? undefined, unit: r.unit, key: r.key }, r.digits ?? 4)
}

export async function renderXlsx(m: ReportModel): Promise<Buffer> {
  const wb = new ExcelJS.Workbook()
  wb.creator = 'Scrubwright'
  wb.created = m.generatedAt
  wb.title = `${m.study.name}: study export`
  const cur = m.costs?.currency ?? m.currency

  // ---- Inputs, with the report's identity below
  const inputs = valueSheet(wb, 'Inputs', m.inputs, m.inputsNote ?? 'No inputs.')
  inputs.addRow({})
  const about: [string, string | number][] = [
    ['Site', m.site.name], ['Study', m.study.name], ['Status', m.study.status], ['Revision', m.study.revision], ['Owner', m.study.ownerName],
    ['Units', m.unitSystem === 'US' ? 'US customary' : 'SI'], ['Exported', m.generatedAt.toISOString()], ['Exported by', m.generatedBy],
    ['Design run', m.design ? `#${m.design.run.id} (${m.design.source})` : 'none'],
    ['Cost basis version of the design', m.design?.run.costBasisVersion ?? 'none'],
    ['Cost basis version of the optimisation', m.optimise?.run.costBasisVersion ?? 'none'],
    ['Cost basis in force', m.costBasisInForce ? m.costBasisInForce.version : 'none'],
    ['Engine version', m.design?.run.engineVersion ?? m.optimise?.run.engineVersion ?? ''],
  ]
  for (const [label, value] of about) add(inputs, VALUE_COLS, { group: 'Report', label, value })
  if (m.inputsNote && m.inputs.length) inputs.addRow({ group: 'Report', label: m.inputsNote })

  // ---- Design summary: the data sheet and the column screen
  const design = valueSheet(wb, 'Design summary', [...(m.design?.groups ?? []), ...m.dataSheet.map((g) => ({ ...g, title: `Data sheet: ${g.title}` }))], 'No design run exists for this study.')
  for (const w of m.design?.warnings ?? []) design.addRow({ group: 'Note', label: w })

  // ---- Trays: checks with limits
  const trayCols: Col[] = [
    { header: 'Check', key: 'label', width: 40 }, { header: 'Value', key: 'value', width: 14, fmt: 'auto' }, { header: 'Limit', key: 'limit', width: 12, fmt: 'auto' },
    { header: 'Limit is a', key: 'direction', width: 10 }, { header: 'Unit', key: 'unit', width: 8 }, { header: 'Result', key: 'status', width: 8 },
    { header: 'Advice', key: 'advice', width: 60 }, { header: 'Key', key: 'key', width: 20 },
  ]
  const trays = sheet(wb, 'Trays', trayCols)
  for (const c of m.design?.checks ?? []) {
    add(trays, trayCols, { label: c.label, key: c.key, value: c.value, limit: c.limit, direction: c.direction ?? '', unit: c.unit, status: c.status, advice: c.advice ?? '' })
  }

  // ---- Profile: the stages and the two lines (mole fractions)
  const profCols: Col[] = [
    { header: 'Series', key: 'series', width: 18 }, { header: 'Stage (1 = top)', key: 'stage', width: 14, fmt: '0' },
    { header: 'x, liquid [mol/mol]', key: 'x', width: 20, fmt: '0.000000' }, { header: 'y, gas [mol/mol]', key: 'y', width: 20, fmt: '0.000000' },
  ]
  const profile = sheet(wb, 'Profile', profCols)
  if (m.profile) {
    for (const p of m.profile.stages) add(profile, profCols, { series: 'stage', stage: p.stage, x: p.x, y: p.y })
    for (const p of m.profile.operating) add(profile, profCols, { series: 'operating line', x: p.x, y: p.y })
    for (const p of m.profile.equilibrium) add(profile, profCols, { series: 'equilibrium curve', x: p.x, y: p.y })
  }

  // ---- Economics
  const ecoCols: Col[] = [
    { header: 'Item', key: 'label', width: 30 }, { header: 'Kind', key: 'kind', width: 10 }, { header: 'Size / quantity', key: 'size', width: 16, fmt: 'auto' },
    { header: 'Size unit', key: 'sizeUnit', width: 14 }, { header: `Purchased [${cur}]`, key: 'purchased', width: 16, fmt: 'money' },
    { header: `Installed [${cur}]`, key: 'installed', width: 16, fmt: 'money' }, { header: `Annual [${cur}/yr]`, key: 'annual', width: 16, fmt: 'money' },
  ]
  const eco = sheet(wb, 'Economics', ecoCols)
  if (m.costs) {
    const c = m.costs
    for (const r of c.rows) add(eco, ecoCols, { label: r.label, kind: r.kind, size: r.size, sizeUnit: r.sizeUnit, purchased: r.purchased ?? undefined, installed: r.installed ?? undefined, annual: r.annual })
    eco.addRow({})
    add(eco, ecoCols, { label: 'Annualised capital', kind: 'total', installed: c.installedCapital, annual: c.annualisedCapital })
    add(eco, ecoCols, { label: 'Operating cost', kind: 'total', annual: c.operatingCost })
    add(eco, ecoCols, { label: 'Total annualised cost', kind: 'total', annual: c.totalAnnualCost })
    const basis = (label: string, value: number, fmt: string) => {
      const row = eco.addRow({ label, kind: 'basis', annual: value })
      row.getCell(7).numFmt = fmt
    }
    basis(`Cost per kg recovered [${cur}/kg]`, c.costPerKgRecovered, '#,##0.0000')
    basis('Solute recovered [kg/yr]', c.soluteRecoveredPerYear, '#,##0')
    basis('Capital recovery factor [1/yr]', c.capitalRecoveryFactor, '0.00000')
    basis('Cost index', c.costIndex, '#,##0.0')
  }

  // ---- Curves
  const curveCols: Col[] = [
    { header: 'Curve', key: 'curve', width: 16 }, { header: 'x', key: 'x', width: 12, fmt: 'auto' }, { header: 'x unit', key: 'xUnit', width: 8 },
    { header: `TAC [${cur}/yr]`, key: 'tac', width: 16, fmt: 'money' }, { header: `Capital, annualised [${cur}/yr]`, key: 'capital', width: 24, fmt: 'money' },
    { header: `Operating [${cur}/yr]`, key: 'operating', width: 18, fmt: 'money' }, { header: 'Actual trays', key: 'trays', width: 12, fmt: '0' },
    { header: 'Optimum', key: 'optimum', width: 10 },
  ]
  const curves = sheet(wb, 'Curves', curveCols)
  for (const s of m.curves) {
    for (const p of s.points) add(curves, curveCols, { curve: s.key, x: p.x, xUnit: s.xUnit, tac: p.tac, capital: p.capital, operating: p.operating, trays: p.actualTrays ?? undefined, optimum: p.x === s.optimumX ? 'yes' : '' })
  }

  // ---- Options
  const lenUnit = m.unitSystem === 'US' ? 'ft' : 'm'
  const optCols: Col[] = [
    { header: 'Option', key: 'name', width: 28 }, { header: 'Run', key: 'runId', width: 8, fmt: '0' }, { header: 'Kind', key: 'kind', width: 10 },
    { header: 'Recommended', key: 'recommended', width: 12 }, { header: 'Actual trays', key: 'trays', width: 12, fmt: '0' }, { header: `Diameter [${lenUnit}]`, key: 'diameter', width: 12, fmt: '#,##0.000' },
    { header: `TAC [${cur}/yr]`, key: 'tac', width: 16, fmt: 'money' }, { header: 'Notes', key: 'notes', width: 40 },
  ]
  const options = sheet(wb, 'Options', optCols)
  for (const o of m.options) {
    add(options, optCols, {
      name: o.name, runId: o.runId, kind: o.run.kind, recommended: o.id === m.recommendedOptionId ? 'yes' : '',
      trays: o.summary?.actualTrays, diameter: o.diameter ?? undefined, tac: o.tac ?? undefined, notes: o.notes,
    })
  }

  // ---- Operating log with the cost-gap split
  const op = m.operating
  const fu = op?.flowUnit ?? (m.unitSystem === 'US' ? 'lbmol/h' : 'kmol/h')
  const opCols: Col[] = [
    { header: 'Month', key: 'month', width: 10 },
    { header: `Gas flow [${fu}]`, key: 'gasFlow', width: 14, fmt: '#,##0.0' }, { header: `Solvent flow [${fu}]`, key: 'solventFlow', width: 16, fmt: '#,##0.0' },
    { header: `Solvent needed [${fu}]`, key: 'solventNeeded', width: 18, fmt: '#,##0.0' },
    { header: 'Expected recovery [%]', key: 'expectedRecovery', width: 14, fmt: '0.00' }, { header: 'Measured recovery [%]', key: 'measuredRecovery', width: 14, fmt: '0.00' },
    { header: 'Achieved efficiency [%]', key: 'achievedEfficiency', width: 14, fmt: '0.0' }, { header: 'Design efficiency [%]', key: 'designEfficiency', width: 14, fmt: '0.0' },
    { header: 'Percent of flood [%]', key: 'percentFlood', width: 12, fmt: '0.0' }, { header: 'Operating window', key: 'window', width: 22 },
    { header: `Reference month cost [${cur}]`, key: 'reference', width: 18, fmt: 'money' }, { header: `Actual month cost [${cur}]`, key: 'actual', width: 18, fmt: 'money' },
    { header: `Cost gap [${cur}]`, key: 'gap', width: 14, fmt: 'money' },
    ...COST_GAP_PARTS.map((p) => ({ header: `${p.label} [${cur}]`, key: p.key, width: 16, fmt: 'money' })),
  ]
  const ops = sheet(wb, 'Operating log', opCols)
  if (op) {
    for (const x of op.months) {
      add(ops, opCols, {
        ...x, solventNeeded: x.solventNeeded ?? undefined, measuredRecovery: x.measuredRecovery ?? undefined, achievedEfficiency: x.achievedEfficiency ?? undefined,
        window: x.insideWindow ? 'inside' : `outside: ${x.outside.join(', ')}`, reference: x.reference ?? undefined, gap: x.gap ?? undefined,
        prices: x.prices ?? undefined, throughput: x.throughput ?? undefined, excessSolvent: x.excessSolvent ?? undefined, efficiencyLoss: x.efficiencyLoss ?? undefined, other: x.other ?? undefined,
      })
    }
    if (op.drift) ops.addRow({ month: 'Drift', window: op.drift })
    if (op.issue) ops.addRow({ month: 'Note', window: op.issue })
  } else ops.addRow({ month: m.study.status === 'approved' ? 'No months logged.' : 'The operating log belongs to an approved study.' })

  // ---- Sections added by features
  for (const s of m.sections) {
    const cols: Col[] = s.columns.map((c, i) => ({ header: c.unit ? `${c.title} [${c.unit}]` : c.title, key: `c${i}`, width: Math.max(12, c.title.length + 4), fmt: 'auto' }))
    const ws = sheet(wb, s.title.slice(0, 31), cols.length ? cols : [{ header: s.title, key: 'c0', width: 60 }])
    for (const r of s.rows) add(ws, cols, Object.fromEntries(r.map((v, i) => [`c${i}`, v ?? undefined])))
    for (const n of s.notes) ws.addRow({ c0: n })
  }

  if (m.confidence) confidenceSheet(wb, m.confidence)

  // ---- Sign-off history
  const revCols: Col[] = [{ header: 'When (UTC)', key: 'at', width: 20 }, { header: 'Event', key: 'kind', width: 20 }, { header: 'Who', key: 'who', width: 24 }, { header: 'Comment', key: 'body', width: 70 }]
  const rev = sheet(wb, 'Sign-off', revCols)
  for (const e of m.review) {
    const row = rev.addRow({ at: e.at, kind: REVIEW_WORDS[e.kind] ?? e.kind, who: e.who, body: e.body })
    row.getCell(1).numFmt = 'yyyy-mm-dd hh:mm'
  }

  neutraliseFormulas(wb)
  const out = await wb.xlsx.writeBuffer()
  return Buffer.from(out as ArrayBuffer)
}
