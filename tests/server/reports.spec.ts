import { describe, it, expect, beforeAll } from 'vitest'
import { readFileSync } from 'node:fs'
import path from 'node:path'
import ExcelJS from 'exceljs'
import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs'
import type { Response } from 'superagent'
import { api, tokenFor, siteIds, type Person } from './helpers.ts'
import { ReviewEvent, User } from '../../server/db/models/index.ts'
import { PEOPLE } from './helpers.ts'
import { VESSEL_CAUTION } from '../../server/engine/vessel/shell.ts'

const demo = JSON.parse(readFileSync('data/demo-studies.json', 'utf8')) as { studies: { inputs: Record<string, unknown> }[] }
const ethanolCase = demo.studies[0]!.inputs

const auth = async (who: Person) => ({ Authorization: `Bearer ${await tokenFor(who)}` })

/** Collect a binary response body as a Buffer. */
function binary(res: Response, cb: (err: Error | null, body: Buffer) => void): void {
  const chunks: Buffer[] = []
  res.on('data', (c: Buffer) => chunks.push(c))
  res.on('end', () => cb(null, Buffer.concat(chunks)))
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
let optimum: { id: number; result: { optimum: { totalAnnualCost: number }; curves: { recovery: { feasible: boolean }[]; solventFactor: { feasible: boolean }[] } } }

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
    // the Confidence section with its assumptions (server/services/reports/confidence.ts)
    expect(text).toMatch(/Chance of meeting the target \(recovery at or above [\d.]+ %\): [\d.]+ %/)
    expect(text).toContain('Equilibrium K: lognormal multiplier, median 1, sigma of ln 0.2 (product default')
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
  it('has the seven sheets with units in the headers and the run numbers in the cells', async () => {
    const r = await api().get(`/api/v1/sites/${cobalt}/studies/${studyId}/export.xlsx`).set(await auth('reviewer')).buffer(true).parse(binary)
    expect(r.status).toBe(200)
    expect(r.headers['content-type']).toBe('application/vnd.openxmlformats-officedocument.spreadsheetml.sheet')
    expect(r.headers['content-disposition']).toMatch(/^attachment; filename="[\w.-]+\.xlsx"$/)
    const wb = new ExcelJS.Workbook()
    const buf = r.body as Buffer
    await wb.xlsx.load(buf.buffer.slice(buf.byteOffset, buf.byteOffset + buf.byteLength) as ArrayBuffer)
    expect(wb.worksheets.map((w) => w.name)).toEqual(['Inputs', 'Design', 'Checks', 'Costs', 'Curves', 'Options', 'Confidence'])
    const chance = wb.getWorksheet('Confidence')!.getColumn(1).values.indexOf('Chance of meeting the target')
    const p = wb.getWorksheet('Confidence')!.getRow(chance).getCell(2).value as number
    expect(p).toBeGreaterThanOrEqual(0)
    expect(p).toBeLessThanOrEqual(1)

    const rowsOf = (name: string) => {
      const ws = wb.getWorksheet(name)!
      const out: unknown[][] = []
      ws.eachRow((row) => out.push((row.values as unknown[]).slice(1)))
      return out
    }
    const designRows = rowsOf('Design')
    expect(designRows[0]).toEqual(['Key', 'Quantity', 'Value', 'Unit'])
    const trays = designRows.find((row) => row[0] === 'actualTrays')
    expect(trays?.[2]).toBe(design.result.summary.actualTrays)
    const dia = designRows.find((row) => row[0] === 'selectedDiameter')
    expect(dia?.[2]).toBe(design.result.summary.selectedDiameter)
    expect(dia?.[3]).toBe('m')

    const checks = rowsOf('Checks')
    expect(checks.length - 1).toBe(design.result.checks.length)
    const firstCheck = design.result.checks[0]!
    expect(checks.find((row) => row[1] === firstCheck.key)?.[2]).toBe(firstCheck.value)

    const cur = design.result.costBreakdown.currency
    const costs = rowsOf('Costs')
    expect(costs[0]).toContain(`Annual [${cur}/yr]`)
    expect(costs.find((row) => row[0] === 'Total annualised cost')?.[5]).toBe(design.result.totalAnnualCost)

    const curves = rowsOf('Curves')
    expect(curves[0]).toContain(`TAC [${cur}/yr]`)
    const feasible = optimum.result.curves.recovery.filter((p) => p.feasible).length + optimum.result.curves.solventFactor.filter((p) => p.feasible).length
    expect(curves.length - 1).toBe(feasible)
    expect(curves.some((row) => row[0] === 'recovery')).toBe(true)
    expect(curves.some((row) => row[0] === 'solventFactor')).toBe(true)

    const options = rowsOf('Options')
    expect(options[1]?.[0]).toBe('Lowest cost option')
    expect(options[1]?.[6]).toBe(optimum.result.optimum.totalAnnualCost)

    const inputs = rowsOf('Inputs')
    expect(inputs.find((row) => row[0] === 'gas.flow')?.slice(1)).toEqual([420, 'kmol/h'])
  })
})
