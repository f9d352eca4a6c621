import { describe, it, expect, beforeAll, afterAll } from 'vitest'
import { readFileSync } from 'node:fs'
import path from 'node:path'
import ExcelJS from 'exceljs'
import { getDocument, OPS } from 'pdfjs-dist/legacy/build/pdf.mjs'
import type { Response } from 'superagent'
import { api, tokenFor, siteIds, type Person } from './helpers.ts'
import { ReviewEvent, User } from '../../server/db/models/index.ts'
import { PEOPLE } from './helpers.ts'
import { VESSEL_CAUTION } from '../../server/engine/vessel/shell.ts'
import { fmt } from '../../server/services/reports/format.ts'
import type { ReportModel } from '../../server/services/reports/model.ts'

const demo = JSON.parse(readFileSync('data/demo-studies.json', 'utf8')) as { studies: { inputs: Record<string, unknown> }[] }
const ethanolCase = demo.studies[0]!.inputs

const auth = async (who: Person) => ({ Authorization: `Bearer ${await tokenFor(who)}` })

/** Collect a binary response body as a Buffer. */
function binary(res: Response, cb: (err: Error | null, body: Buffer) => void): void {
  const chunks: Buffer[] = []
  res.on('data', (c: Buffer) => chunks.push(c))
  res.on('end', () => cb(null, Buffer.concat(chunks)))
}

interface PdfPage {
  text: string
  /** distinct text lines (by baseline) on the page */
  lines: number
  /** path-drawing and image-painting operations (vector figures are paths, never images) */
  paths: number
  images: number
}

/** Each page of a PDF read back with an independent PDF parser (pdf.js): its text (whitespace collapsed), lines and drawing operations. */
async function pdfPages(buf: Buffer): Promise<PdfPage[]> {
  const doc = await getDocument({
    data: new Uint8Array(buf),
    standardFontDataUrl: `${path.resolve('node_modules/pdfjs-dist/standard_fonts')}/`,
    isEvalSupported: false,
    verbosity: 0,
  }).promise
  const pages: PdfPage[] = []
  for (let i = 1; i <= doc.numPages; i++) {
    const page = await doc.getPage(i)
    const tc = await page.getTextContent()
    const parts: string[] = []
    const baselines = new Set<number>()
    for (const item of tc.items) {
      if (!('str' in item)) continue
      parts.push(item.str, item.hasEOL ? '\n' : ' ')
      if (item.str.trim()) baselines.add(Math.round(item.transform[5] as number))
    }
    const ops = await page.getOperatorList()
    pages.push({
      text: parts.join('').replace(/\s+/g, ' '),
      lines: baselines.size,
      paths: ops.fnArray.filter((f) => f === OPS.constructPath).length,
      images: ops.fnArray.filter((f) => f === OPS.paintImageXObject || f === OPS.paintInlineImageXObject).length,
    })
  }
  await doc.destroy()
  return pages
}

/** All text of a PDF, read back with an independent PDF parser (pdf.js), whitespace collapsed. */
async function pdfText(buf: Buffer): Promise<string> {
  const doc = await getDocument({
    data: new Uint8Array(buf),
    standardFontDataUrl: `${path.resolve('node_modules/pdfjs-dist/standard_fonts')}/`,
    isEvalSupported: false,
    verbosity: 0,
  }).promise
  const parts: string[] = []
  for (let i = 1; i <= doc.numPages; i++) {
    const page = await doc.getPage(i)
    const tc = await page.getTextContent()
    for (const item of tc.items) if ('str' in item) parts.push(item.str, item.hasEOL ? '\n' : ' ')
  }
  await doc.destroy()
  return parts.join('').replace(/\s+/g, ' ')
}

const money = (v: number, cur: string) => `${cur} ${Math.round(v).toLocaleString('en-US')}`

let cobalt = 0
let studyId = 0
let design: { id: number; result: { totalAnnualCost: number; costBreakdown: { currency: string; totalAnnualCost: number }; summary: Record<string, number>; checks: { key: string; value: number; status: string }[]; cautions: string[] } }
let trackedId = 0
let tracked: { id: number; result: { summary: Record<string, number> } }
let optimum: { id: number; result: { optimum: { totalAnnualCost: number; design: { summary: { actualTrays: number } } }; curves: { recovery: { feasible: boolean }[]; solventFactor: { feasible: boolean }[] } } }

beforeAll(async () => {
  cobalt = (await siteIds()).cobalt
  const eng = await auth('engineer')
  const s = await api().post(`/api/v1/sites/${cobalt}/studies`).set(eng).send({ name: 'Report check: vent scrubber "copy" / rev', description: 'Ethanol from fermenter CO2 into water.', inputs: ethanolCase })
  studyId = s.body.id
  design = (await api().post(`/api/v1/sites/${cobalt}/studies/${studyId}/runs`).set(eng).send({ kind: 'design' })).body
  optimum = (await api().post(`/api/v1/sites/${cobalt}/studies/${studyId}/runs`).set(eng).send({ kind: 'optimize' })).body
  await api().post(`/api/v1/sites/${cobalt}/studies/${studyId}/options`).set(eng).send({ runId: optimum.id, name: 'Lowest cost option' })
  const reviewer = await User.findOne({ where: { email: PEOPLE.reviewer } })
  await ReviewEvent.create({ studyId, userId: reviewer!.id, kind: 'comment', body: 'Please check the weir height.' })

  // An approved study with an operating log: its design run is the approved option, three months are logged.
  const t = await api().post(`/api/v1/sites/${cobalt}/studies`).set(eng).send({ name: 'Report check: tracked scrubber', inputs: ethanolCase })
  trackedId = t.body.id
  tracked = (await api().post(`/api/v1/sites/${cobalt}/studies/${trackedId}/runs`).set(eng).send({ kind: 'design' })).body
  const opt = await api().post(`/api/v1/sites/${cobalt}/studies/${trackedId}/options`).set(eng).send({ runId: tracked.id, name: 'As designed' })
  await api().post(`/api/v1/sites/${cobalt}/studies/${trackedId}/submit`).set(eng).send({ recommendedOptionId: opt.body.id })
  await api().post(`/api/v1/sites/${cobalt}/studies/${trackedId}/approve`).set(await auth('reviewer')).send({})
  const log = 'month,gasFlow,solventFlow,outletMoleFraction,powerKw\n2026-06,405,325,0.00026,13.8\n2026-07,455,330,0.00024,14.1\n2026-08,432,360,0.00041,14.6\n'
  const imp = await api().post(`/api/v1/sites/${cobalt}/studies/${trackedId}/operating-entries/import`).set(eng).attach('file', Buffer.from(log), 'log.csv')
  expect(imp.status).toBe(201)
})

afterAll(async () => {
  await api().patch('/api/v1/auth/me').set(await auth('economist')).send({ unitSystem: 'SI' })
})

describe('study report (PDF)', () => {
  it('serves a PDF attachment that reads back with the key sections and numbers', async () => {
    const r = await api().get(`/api/v1/sites/${cobalt}/studies/${studyId}/report.pdf`).set(await auth('reviewer')).buffer(true).parse(binary)
    expect(r.status).toBe(200)
    expect(r.headers['content-type']).toBe('application/pdf')
    expect(r.headers['content-disposition']).toMatch(/^attachment; filename="[\w.-]+\.pdf"$/)
    expect(r.headers['content-disposition']).toContain('Report-check-vent-scrubber-copy-rev-rev1.pdf')
    const body = r.body as Buffer
    expect(body.subarray(0, 5).toString('latin1')).toBe('%PDF-')
    const text = await pdfText(body)
    expect(text).toContain('Report check: vent scrubber "copy" / rev')
    expect(text).toContain('Cobalt Ridge fermentation plant')
    for (const section of ['Inputs', 'Design summary', 'Tray checks', 'Cost breakdown', 'Cost curves', 'Options', 'Sign-off history', 'Cautions']) {
      expect(text).toContain(section)
    }
    expect(text).toContain(VESSEL_CAUTION)
    // The hazard cautions of the result (ethanol is flammable, carbon dioxide an asphyxiant) are carried over.
    for (const c of design.result.cautions.filter((x) => /flammable|asphyxiant/i.test(x))) expect(text).toContain(c.slice(0, 40))
    const cur = design.result.costBreakdown.currency
    expect(text).toContain(`${money(design.result.totalAnnualCost, cur)} /yr`)
    expect(text).toContain(money(optimum.result.optimum.totalAnnualCost, cur))
    expect(text).toContain('Lowest cost option')
    expect(text).toContain('Please check the weir height.')
    expect(text).toContain('Total annualised cost vs recovery')
    expect(text).toContain('Total annualised cost vs solvent factor')
    expect(text).toMatch(/Actual trays \d+/)
    expect(text).toContain(`Actual trays ${design.result.summary.actualTrays}`)
  })

  it('says so when no run exists instead of failing', async () => {
    const eng = await auth('engineer')
    const s = await api().post(`/api/v1/sites/${cobalt}/studies`).set(eng).send({ name: 'Report check without runs', inputs: ethanolCase })
    const r = await api().get(`/api/v1/sites/${cobalt}/studies/${s.body.id}/report.pdf`).set(await auth('reviewer')).buffer(true).parse(binary)
    expect(r.status).toBe(200)
    const text = await pdfText(r.body as Buffer)
    expect(text).toContain('No design or optimisation has been run for this study yet')
    expect(text).toContain('No optimisation run exists for this study')
    expect(text).toContain(VESSEL_CAUTION)
    const x = await api().get(`/api/v1/sites/${cobalt}/studies/${s.body.id}/export.xlsx`).set(await auth('reviewer')).buffer(true).parse(binary)
    expect(x.status).toBe(200)
  })

  it('refuses non-members and answers 404 for an unknown study', async () => {
    const bay = await api().get(`/api/v1/sites/${cobalt}/studies/${studyId}/report.pdf`).set(await auth('bayEngineer'))
    expect(bay.status).toBe(403)
    expect(bay.body.error.code).toBe('forbidden')
    const xbay = await api().get(`/api/v1/sites/${cobalt}/studies/${studyId}/export.xlsx`).set(await auth('bayEngineer'))
    expect(xbay.status).toBe(403)
    const missing = await api().get(`/api/v1/sites/${cobalt}/studies/999999/report.pdf`).set(await auth('reviewer'))
    expect(missing.status).toBe(404)
    expect(missing.body.error.code).toBe('not_found')
  })
})

describe('study export (XLSX)', () => {
  it('serves a workbook whose economics, curves and options hold the run numbers', async () => {
    const r = await api().get(`/api/v1/sites/${cobalt}/studies/${studyId}/export.xlsx`).set(await auth('reviewer')).buffer(true).parse(binary)
    expect(r.status).toBe(200)
    expect(r.headers['content-type']).toBe('application/vnd.openxmlformats-officedocument.spreadsheetml.sheet')
    expect(r.headers['content-disposition']).toMatch(/^attachment; filename="[\w.-]+\.xlsx"$/)
    const wb = new ExcelJS.Workbook()
    const buf = r.body as Buffer
    await wb.xlsx.load(buf.buffer.slice(buf.byteOffset, buf.byteOffset + buf.byteLength) as ArrayBuffer)

    const rowsOf = (name: string) => {
      const ws = wb.getWorksheet(name)!
      const out: unknown[][] = []
      ws.eachRow((row) => out.push((row.values as unknown[]).slice(1)))
      return out
    }
    const firstCheck = design.result.checks[0]!
    expect(rowsOf('Trays').find((row) => row[7] === firstCheck.key)?.[1]).toBe(firstCheck.value)

    const cur = design.result.costBreakdown.currency
    const costs = rowsOf('Economics')
    expect(costs[0]).toContain(`Annual [${cur}/yr]`)
    expect(costs.find((row) => row[0] === 'Total annualised cost')?.[6]).toBe(design.result.totalAnnualCost)

    const curves = rowsOf('Curves')
    expect(curves[0]).toContain(`TAC [${cur}/yr]`)
    const feasible = optimum.result.curves.recovery.filter((p) => p.feasible).length + optimum.result.curves.solventFactor.filter((p) => p.feasible).length
    expect(curves.length - 1).toBe(feasible)
    expect(curves.some((row) => row[0] === 'recovery')).toBe(true)
    expect(curves.some((row) => row[0] === 'solventFactor')).toBe(true)

    const options = rowsOf('Options')
    expect(options[1]?.[0]).toBe('Lowest cost option')
    expect(options[1]?.[6]).toBe(optimum.result.optimum.totalAnnualCost)
  })
})

async function reportOf(id: number, who: Person = 'reviewer'): Promise<Buffer> {
  const r = await api().get(`/api/v1/sites/${cobalt}/studies/${id}/report.pdf`).set(await auth(who)).buffer(true).parse(binary)
  expect(r.status).toBe(200)
  return r.body as Buffer
}

async function workbookOf(id: number, who: Person = 'reviewer'): Promise<ExcelJS.Workbook> {
  const r = await api().get(`/api/v1/sites/${cobalt}/studies/${id}/export.xlsx`).set(await auth(who)).buffer(true).parse(binary)
  expect(r.status).toBe(200)
  const wb = new ExcelJS.Workbook()
  const buf = r.body as Buffer
  await wb.xlsx.load(buf.buffer.slice(buf.byteOffset, buf.byteOffset + buf.byteLength) as ArrayBuffer)
  return wb
}

function sheetRows(wb: ExcelJS.Workbook, name: string): ExcelJS.Row[] {
  const ws = wb.getWorksheet(name)
  expect(ws, `sheet ${name}`).toBeDefined()
  const out: ExcelJS.Row[] = []
  ws!.eachRow((row) => out.push(row))
  return out
}

const cells = (row: ExcelJS.Row | undefined) => ((row?.values ?? []) as unknown[]).slice(1)

describe('study report (PDF): what a practitioner reads', () => {
  it('opens with a one-page data sheet holding the numbers of a vendor enquiry', async () => {
    const pages = await pdfPages(await reportOf(studyId))
    const first = pages[0]!.text
    const s = design.result.summary
    expect(first).toContain('Data sheet')
    // duty, streams and their conditions, as typed in the case (420 kmol/h, 32 °C, 115 kPa, 1.5 mol %, water at 30 °C)
    expect(first).toContain('Ethanol absorbed from carbon dioxide into water')
    expect(first).toMatch(/Flow in 420 kmol\/h/)
    expect(first).toMatch(/Temperature in 32 °C/)
    expect(first).toMatch(/Pressure \(absolute\) 115 kPa/)
    expect(first).toMatch(/Solute in 1\.5 mol %/)
    expect(first).toMatch(/Temperature in 30 °C/)
    expect(first).toContain(`Flow ${fmt(s.solventFlow!, 4)} kmol/h`)
    // column, trays, hydraulics and the tray layout (hole 4.5 mm, pitch 12 mm, weir 50 mm as in the case)
    expect(first).toContain(`Sieve trays ${s.actualTrays}`)
    expect(first).toContain(`Inside diameter ${fmt(s.selectedDiameter!, 3)} m`)
    expect(first).toContain(`Tray spacing ${fmt(s.traySpacing!, 3)} m`)
    expect(first).toContain(`Percent of flood (worst end) ${fmt(s.percentFlood!, 3)} %`)
    expect(first).toContain(`Pressure drop per tray ${fmt(s.pressureDropPerTray!, 3)} Pa`)
    expect(first).toMatch(/Hole diameter 4\.5 mm/)
    expect(first).toMatch(/Hole pitch \(triangular\) 12 mm/)
    expect(first).toMatch(/Outlet weir height 50 mm/)
    for (const item of ['Weir length', 'Downcomer clearance', 'Active area', 'Materials of construction', 'Allowable stress', 'Corrosion allowance']) expect(first).toContain(item)
    // the cautions on the same page
    expect(first).toContain(VESSEL_CAUTION.slice(0, 60))
    expect(first).toMatch(/Ethanol is flammable/)
    expect(first).toMatch(/Carbon dioxide is an asphyxiant/)
    expect(first).toMatch(/local codes .* licensed engineers/)
    // one page: the next sections start on page 2
    expect(first).not.toContain('Report details')
    expect(pages[1]!.text).toMatch(/^Report details/)
  })

  it('labels and units as on screen: no field paths, engine names, degC or a bare "-" unit', async () => {
    const text = await pdfText(await reportOf(studyId))
    for (const internal of ['gas.soluteMoleFraction', 'gas.flow', 'tray.holeDiameter', 'constantK', 'oconnell', 'degC', 'm^3', 'mol/mol']) expect(text).not.toContain(internal)
    expect(text).not.toMatch(/\d -(\s|$)/)
    expect(text).toContain('Gas flow into the column 420 kmol/h')
    expect(text).toContain('Solute in the gas 1.5 mol %')
    expect(text).toContain('Gas temperature 32 °C')
    expect(text).toContain('Equilibrium model Constant K')
    expect(text).toContain('K = y / x 0.62')
    expect(text).toContain("Tray efficiency O'Connell correlation")
    expect(text).toContain('Recovery of the solute 98.5 %')
  })

  it('speaks the US customary units of a reader who chose them', async () => {
    const me = await api().patch('/api/v1/auth/me').set(await auth('economist')).send({ unitSystem: 'US' })
    expect(me.status).toBe(200)
    const text = await pdfText(await reportOf(studyId, 'economist'))
    // 420 kmol/h = 925.9 lbmol/h (1 lb = 0.45359237 kg exactly, NIST SP 811); 32 °C = 89.6 °F; 4.5 mm = 0.1772 in
    expect(text).toContain('Gas flow into the column 925.9 lbmol/h')
    expect(text).toContain('Gas temperature 89.6 °F')
    expect(text).toContain('Hole diameter 0.1772 in')
    expect(text).toContain('US customary units')
    for (const si of ['kmol/h', '°C', ' mm ', 'kPa']) expect(text).not.toContain(si)
  })

  it('draws the operating diagram and the cost curves as vector figures', async () => {
    const pages = await pdfPages(await reportOf(studyId))
    const diagram = pages.find((p) => p.text.includes('Operating diagram'))
    expect(diagram).toBeDefined()
    for (const t of ['Equilibrium curve', 'Operating line', 'Theoretical stages', 'x, solute mole fraction in the liquid', 'y, solute mole fraction in the gas']) expect(diagram!.text).toContain(t)
    // the stage steps alone are a path per stage; grid, axes and lines add more
    expect(diagram!.paths).toBeGreaterThan(20)
    const curves = pages.find((p) => p.text.includes('Total annualised cost vs recovery'))
    expect(curves!.paths).toBeGreaterThan(20)
    expect(pages.every((p) => p.images === 0)).toBe(true)
  })

  it('has no near-empty page: every page carries at least a section of text', async () => {
    for (const id of [studyId, trackedId]) {
      const pages = await pdfPages(await reportOf(id))
      // common practice, no source: a page with fewer than 8 lines besides its footer reads as a stray page
      for (const p of pages) expect(p.lines - 1, p.text.slice(0, 80)).toBeGreaterThanOrEqual(8)
    }
  })

  it('describes the recommended option once the study is submitted, not merely the newest run', async () => {
    const eng = await auth('engineer')
    const st = await api().post(`/api/v1/sites/${cobalt}/studies`).set(eng).send({ name: 'Report check: recommended optimum', inputs: ethanolCase })
    const id = st.body.id as number
    const optRun = (await api().post(`/api/v1/sites/${cobalt}/studies/${id}/runs`).set(eng).send({ kind: 'optimize' })).body as { id: number }
    const d = (await api().post(`/api/v1/sites/${cobalt}/studies/${id}/runs`).set(eng).send({ kind: 'design' })).body
    const opt = await api().post(`/api/v1/sites/${cobalt}/studies/${id}/options`).set(eng).send({ runId: optRun.id, name: 'Cheapest' })
    const sub = await api().post(`/api/v1/sites/${cobalt}/studies/${id}/submit`).set(eng).send({ recommendedOptionId: opt.body.id })
    expect(sub.status).toBe(200)
    const optimumTrays = optimum.result.optimum.design.summary.actualTrays
    // the same case optimised twice gives the same optimum; the design run at the case's own targets has more trays
    expect(d.result.summary.actualTrays).not.toBe(optimumTrays)
    const pages = await pdfPages(await reportOf(id))
    expect(pages[0]!.text).toContain(`Sieve trays ${optimumTrays}`)
    expect(pages.map((p) => p.text).join(' ')).toContain(`From the recommended option "Cheapest" (the optimum of optimisation run #${optRun.id})`)
  })

  it('carries the cost-basis version and the sign-off history', async () => {
    const text = await pdfText(await reportOf(trackedId))
    // another test file may publish a newer version of the site's basis meanwhile: the version the run was priced with is named
    expect(text).toMatch(/cost basis version \d+ \(design run #\d+\)/)
    expect(text).toContain('Sign-off history')
    expect(text).toMatch(/Submitted for review Nora Castellanos/)
    expect(text).toMatch(/Approved Ravi Brandt/)
  })

  it("splits each logged month's cost gap against the approved optimum into its causes", async () => {
    const log = await api().get(`/api/v1/sites/${cobalt}/studies/${trackedId}/operating-entries`).set(await auth('reviewer'))
    expect(log.status).toBe(200)
    const months = log.body.monitoring.months as { month: string; costGap: Record<string, number> }[]
    expect(months).toHaveLength(3)
    const text = await pdfText(await reportOf(trackedId))
    expect(text).toContain('Operating log: cost gap against the approved optimum')
    for (const part of ['Throughput [USD]', 'Solvent beyond need [USD]', 'Efficiency loss [USD]', 'Prices [USD]']) expect(text).toContain(part)
    for (const m of months) {
      const g = m.costGap
      const row = [m.month, g.reference!, g.actual!, g.gap!, g.throughput!, g.excessSolvent!, g.efficiencyLoss!, g.prices!, g.other!].map((v) => (typeof v === 'number' ? fmt(v, 4) : v)).join(' ')
      expect(text).toContain(row)
    }
  })
})

describe('study export (XLSX): one sheet per part, full precision', () => {
  it('stores numbers at full precision with display formats and units in the headers', async () => {
    const wb = await workbookOf(studyId)
    expect(wb.worksheets.map((w) => w.name)).toEqual(['Inputs', 'Design summary', 'Trays', 'Profile', 'Economics', 'Curves', 'Options', 'Operating log', 'Sensitivity of the optimum', 'Confidence', 'Sign-off'])
    // the sensitivity of the optimum: one row per item with the values actually used (the optimiser's answer)
    const sens = sheetRows(wb, 'Sensitivity of the optimum')
    const entries = (optimum as unknown as { result: { sensitivity: { label: string; lowValue: number; highValue: number; low: { tac: number } }[] } }).result.sensitivity
    expect(entries.length).toBeGreaterThan(0)
    expect(await pdfText(await reportOf(studyId))).toContain('Sensitivity of the optimum')
    for (const e of entries) {
      const row = sens.find((r) => r.getCell(1).value === e.label)
      expect(row, e.label).toBeDefined()
      expect(row!.getCell(4).value).toBe(e.lowValue)
      expect(row!.getCell(7).value).toBe(e.highValue)
      expect(row!.getCell(6).value).toBe(e.low.tac)
    }
    const summary = sheetRows(wb, 'Design summary')
    expect(cells(summary[0])).toEqual(['Group', 'Quantity', 'Value', 'Unit', 'Key'])
    const dia = summary.find((r) => r.getCell(5).value === 'selectedDiameter')!
    // the number as the engine computed it (e.g. 1.4500000000000002), shown through a format
    expect(dia.getCell(3).value).toBe(design.result.summary.selectedDiameter)
    expect(dia.getCell(3).numFmt).toBe('#,##0.00') // shown as 1.45, three significant digits as on screen
    expect(dia.getCell(4).value).toBe('m')
    // every number cell of every sheet has a display format
    for (const ws of wb.worksheets) {
      ws.eachRow((row, n) => {
        row.eachCell((cell) => {
          if (typeof cell.value === 'number') expect(cell.numFmt, `${ws.name}!${cell.address} (row ${n})`).toMatch(/0/)
        })
      })
    }
    const inputs = sheetRows(wb, 'Inputs')
    expect(cells(inputs.find((r) => r.getCell(2).value === 'Gas flow into the column')).slice(2, 4)).toEqual([420, 'kmol/h'])
    const profile = sheetRows(wb, 'Profile')
    expect(cells(profile[0])).toEqual(['Series', 'Stage (1 = top)', 'x, liquid [mol/mol]', 'y, gas [mol/mol]'])
    expect(profile.filter((r) => r.getCell(1).value === 'stage').length).toBe((design.result as unknown as { profile: { stages: unknown[] } }).profile.stages.length)
    const trays = sheetRows(wb, 'Trays')
    expect(trays.length - 1).toBe(design.result.checks.length)
  })

  it('gives the operating log with the cost-gap split in the reader\'s units', async () => {
    const log = await api().get(`/api/v1/sites/${cobalt}/studies/${trackedId}/operating-entries`).set(await auth('reviewer'))
    const months = log.body.monitoring.months as { month: string; costGap: Record<string, number> }[]
    const wb = await workbookOf(trackedId)
    const rows = sheetRows(wb, 'Operating log')
    const header = cells(rows[0]) as string[]
    for (const h of ['Gas flow [kmol/h]', 'Cost gap [USD]', 'Throughput [USD]', 'Solvent beyond need [USD]', 'Efficiency loss [USD]', 'Prices [USD]', 'Other [USD]']) expect(header).toContain(h)
    const col = (h: string) => header.indexOf(h) + 1
    for (const m of months) {
      const row = rows.find((r) => r.getCell(1).value === m.month)!
      expect(row.getCell(col('Cost gap [USD]')).value).toBe(m.costGap.gap)
      expect(row.getCell(col('Throughput [USD]')).value).toBe(m.costGap.throughput)
      expect(row.getCell(col('Solvent beyond need [USD]')).value).toBe(m.costGap.excessSolvent)
      expect(row.getCell(col('Efficiency loss [USD]')).value).toBe(m.costGap.efficiencyLoss)
      expect(row.getCell(col('Prices [USD]')).value).toBe(m.costGap.prices)
    }
    await api().patch('/api/v1/auth/me').set(await auth('economist')).send({ unitSystem: 'US' })
    const us = await workbookOf(studyId, 'economist')
    const gas = sheetRows(us, 'Inputs').find((r) => r.getCell(2).value === 'Gas flow into the column')!
    // 1 lbmol = 0.45359237 kmol exactly (NIST SP 811)
    expect(gas.getCell(3).value as number).toBeCloseTo(420 / 0.45359237, 9)
    expect(gas.getCell(4).value).toBe('lbmol/h')
    await api().patch('/api/v1/auth/me').set(await auth('economist')).send({ unitSystem: 'SI' })
  })
})

describe("a feature's own report section", () => {
  it('prints after the operating log in the PDF and gets a sheet of its own in the workbook', async () => {
    const { renderPdf } = await import('../../server/services/reports/pdf.ts')
    const { renderXlsx } = await import('../../server/services/reports/xlsx.ts')
    const model: ReportModel = {
      generatedAt: new Date('2026-12-01T10:00:00Z'), generatedBy: 'Test reader', unitSystem: 'SI', costBasisInForce: null,
      site: { id: 1, name: 'Test site' },
      study: { id: 1, name: 'Section check', description: '', status: 'draft', revision: 1, ownerName: 'Owner', updatedAt: new Date('2026-12-01T10:00:00Z') },
      dataSheet: [], inputs: [], inputsNote: null, design: null, profile: null, costs: null, optimise: null, curves: [], currency: 'USD',
      options: [], recommendedOptionId: null, operating: null, review: [], cautions: [VESSEL_CAUTION],
      sections: [{ key: 'confidence', title: 'Confidence of the result', notes: ['Spread from the stated input ranges.'], columns: [{ title: 'Quantity' }, { title: 'Low', unit: '%' }, { title: 'High', unit: '%' }], rows: [['Recovery', 97.1234, 98.9876]] }],
    }
    const text = (await pdfPages(await renderPdf(model))).map((p) => p.text).join(' ')
    expect(text).toContain('Confidence of the result')
    expect(text).toContain('Spread from the stated input ranges.')
    expect(text).toContain('Recovery 97.12 98.99')
    expect(text.indexOf('Confidence of the result')).toBeLessThan(text.indexOf('Sign-off history'))
    const wb = new ExcelJS.Workbook()
    const buf = await renderXlsx(model)
    await wb.xlsx.load(buf.buffer.slice(buf.byteOffset, buf.byteOffset + buf.byteLength) as ArrayBuffer)
    const ws = wb.getWorksheet('Confidence of the result')!
    expect(cells(ws.getRow(1))).toEqual(['Quantity', 'Low [%]', 'High [%]'])
    expect(ws.getRow(2).getCell(2).value).toBe(97.1234)
    expect(ws.getRow(2).getCell(2).numFmt).toBe('#,##0.00')
  })
})
