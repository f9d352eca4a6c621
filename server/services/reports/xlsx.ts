import ExcelJS from 'exceljs'
import type { ReportModel } from './model.ts'
import { confidenceSheet } from './confidence.ts'

/**
 * The study as a workbook: Inputs, Design, Checks, Costs, Curves, Options. Numbers stay numbers
 * (no formatting into text); units are in the headers or in a unit column.
 */

function sheet(wb: ExcelJS.Workbook, name: string, columns: { header: string; key: string; width: number }[]): ExcelJS.Worksheet {
  const ws = wb.addWorksheet(name, { views: [{ state: 'frozen', ySplit: 1 }] })
  ws.columns = columns
  ws.getRow(1).font = { bold: true }
  return ws
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

export async function renderXlsx(m: ReportModel): Promise<Buffer> {
  const wb = new ExcelJS.Workbook()
  wb.creator = 'Scrubwright'
  wb.created = m.generatedAt
  wb.title = `${m.study.name}: study export`
  const cur = m.costs?.currency ?? m.currency

  const inputs = sheet(wb, 'Inputs', [{ header: 'Field', key: 'field', width: 34 }, { header: 'Value', key: 'value', width: 18 }, { header: 'Unit', key: 'unit', width: 16 }])
  for (const r of m.inputs) inputs.addRow({ field: r.label, value: r.value, unit: r.unit })
  inputs.addRow({})
  inputs.addRow({ field: 'Site', value: m.site.name })
  inputs.addRow({ field: 'Study', value: m.study.name })
  inputs.addRow({ field: 'Status', value: m.study.status })
  inputs.addRow({ field: 'Revision', value: m.study.revision })
  inputs.addRow({ field: 'Owner', value: m.study.ownerName })
  inputs.addRow({ field: 'Exported', value: m.generatedAt.toISOString() })

  const design = sheet(wb, 'Design', [{ header: 'Key', key: 'key', width: 30 }, { header: 'Quantity', key: 'label', width: 36 }, { header: 'Value', key: 'value', width: 16 }, { header: 'Unit', key: 'unit', width: 12 }])
  if (m.design) {
    for (const r of m.design.summary) design.addRow(r)
    design.addRow({})
    design.addRow({ key: 'source', label: 'From', value: m.design.source })
    design.addRow({ key: 'costBasisVersion', label: 'Cost basis version', value: m.design.run.costBasisVersion ?? '' })
    design.addRow({ key: 'engineVersion', label: 'Engine version', value: m.design.run.engineVersion })
  } else design.addRow({ key: 'none', label: 'No design run exists for this study.' })

  const checks = sheet(wb, 'Checks', [
    { header: 'Check', key: 'label', width: 30 }, { header: 'Key', key: 'key', width: 22 }, { header: 'Value', key: 'value', width: 12 },
    { header: 'Limit', key: 'limit', width: 12 }, { header: 'Unit', key: 'unit', width: 8 }, { header: 'Result', key: 'status', width: 8 }, { header: 'Advice', key: 'advice', width: 50 },
  ])
  for (const c of m.design?.checks ?? []) checks.addRow({ label: c.label, key: c.key, value: c.value, limit: c.limit, unit: c.unit, status: c.status, advice: c.advice ?? '' })

  const costs = sheet(wb, 'Costs', [
    { header: 'Item', key: 'label', width: 28 }, { header: 'Kind', key: 'kind', width: 10 }, { header: 'Size / quantity', key: 'size', width: 24 },
    { header: `Purchased [${cur}]`, key: 'purchased', width: 16 }, { header: `Installed [${cur}]`, key: 'installed', width: 16 }, { header: `Annual [${cur}/yr]`, key: 'annual', width: 16 },
  ])
  if (m.costs) {
    for (const r of m.costs.rows) costs.addRow({ label: r.label, kind: r.kind, size: r.size, purchased: r.purchased ?? undefined, installed: r.installed ?? undefined, annual: r.annual })
    costs.addRow({})
    costs.addRow({ label: 'Annualised capital', kind: 'total', installed: m.costs.installedCapital, annual: m.costs.annualisedCapital })
    costs.addRow({ label: 'Operating cost', kind: 'total', annual: m.costs.operatingCost })
    costs.addRow({ label: 'Total annualised cost', kind: 'total', annual: m.costs.totalAnnualCost })
    costs.addRow({ label: `Cost per kg recovered [${cur}/kg]`, kind: 'total', annual: m.costs.costPerKgRecovered })
    costs.addRow({ label: 'Cost index', kind: 'basis', annual: m.costs.costIndex })
  }

  const curves = sheet(wb, 'Curves', [
    { header: 'Curve', key: 'curve', width: 16 }, { header: 'x', key: 'x', width: 12 }, { header: 'x unit', key: 'xUnit', width: 8 },
    { header: `TAC [${cur}/yr]`, key: 'tac', width: 16 }, { header: `Capital, annualised [${cur}/yr]`, key: 'capital', width: 24 },
    { header: `Operating [${cur}/yr]`, key: 'operating', width: 18 }, { header: 'Actual trays [-]', key: 'trays', width: 14 },
  ])
  for (const s of m.curves) {
    for (const p of s.points) curves.addRow({ curve: s.key, x: p.x, xUnit: s.xUnit, tac: p.tac, capital: p.capital, operating: p.operating, trays: p.actualTrays ?? undefined })
  }

  const options = sheet(wb, 'Options', [
    { header: 'Option', key: 'name', width: 28 }, { header: 'Run', key: 'runId', width: 8 }, { header: 'Kind', key: 'kind', width: 10 },
    { header: 'Recommended', key: 'recommended', width: 12 }, { header: 'Actual trays [-]', key: 'trays', width: 14 }, { header: 'Diameter [m]', key: 'diameter', width: 12 },
    { header: `TAC [${cur}/yr]`, key: 'tac', width: 16 }, { header: 'Notes', key: 'notes', width: 40 },
  ])
  for (const o of m.options) {
    options.addRow({
      name: o.name, runId: o.runId, kind: o.run.kind, recommended: o.id === m.recommendedOptionId ? 'yes' : '',
      trays: o.summary?.actualTrays, diameter: o.summary?.selectedDiameter, tac: o.tac ?? undefined, notes: o.notes,
    })
  }

  if (m.confidence) confidenceSheet(wb, m.confidence)
  neutraliseFormulas(wb)
  const out = await wb.xlsx.writeBuffer()
  return Buffer.from(out as ArrayBuffer)
}
