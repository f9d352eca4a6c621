import { sequelize } from '../../db/sequelize.ts'
import { SiteComponent } from '../../db/models/index.ts'
import { audit } from '../audit.ts'
import { userNames } from '../people.ts'
import { decodeText, readCsv, parseNumber, columnIndex, quote, sortIssues, fileErrors, safeFileName, type CsvRow, type UploadedFile } from '../csv/reader.ts'
import { MIN_EQUILIBRIUM_POINTS, type CsvIssue, type EquilibriumPreview, type EquilibriumTableView } from '../../../shared/schemas/uploads.ts'
import type { AuthUser } from '../../types.d.ts'

/** Site equilibrium tables (x-y mole fractions) from CSV uploads: preview, save, list. */

export interface EquilibriumFields {
  name?: string
  solute?: string
  temperature?: number
}

/** Parse and check an x-y equilibrium table (mole fractions): header x,y[,temperature]. */
export function parseEquilibriumCsv(text: string): { points: [number, number][]; temperature: number | null; errors: CsvIssue[]; warnings: CsvIssue[] } {
  const { header, rows, errors } = readCsv(text)
  const warnings: CsvIssue[] = []
  const points: [number, number][] = []
  if (!header) {
    errors.push({ line: null, column: null, message: 'The file is empty: it needs a header line x,y[,temperature] and at least 3 points.' })
    return { points, temperature: null, errors, warnings }
  }
  const h = (header as CsvRow).fields
  const ix = columnIndex(h, ['x'])
  const iy = columnIndex(h, ['y'])
  const it = columnIndex(h, ['temperature', 't'])
  if (ix < 0 || iy < 0) {
    const looksNumeric = h.some((f) => parseNumber(f) !== null)
    errors.push({
      line: (header as CsvRow).line,
      column: null,
      message: looksNumeric
        ? 'The header line is missing: the first line must name the columns x,y[,temperature].'
        : `The header must name the columns x and y (and optionally temperature); found ${h.map(quote).join(', ')}.`,
    })
    return { points, temperature: null, errors, warnings }
  }
  const extra = h.filter((_, i) => i !== ix && i !== iy && i !== it)
  if (extra.length) warnings.push({ line: (header as CsvRow).line, column: null, message: `Extra columns ignored: ${extra.map(quote).join(', ')}.` })

  const temps: number[] = []
  let prev: { x: number; y: number; line: number } | null = null
  for (const r of rows) {
    const xs = r.fields[ix]
    const ys = r.fields[iy]
    const x = parseNumber(xs)
    const y = parseNumber(ys)
    let ok = true
    if (xs === undefined || xs === '') { errors.push({ line: r.line, column: 'x', message: 'is missing' }); ok = false }
    else if (x === null) { errors.push({ line: r.line, column: 'x', message: `${quote(xs)} is not a number` }); ok = false }
    else if (x < 0 || x >= 1) { errors.push({ line: r.line, column: 'x', message: `${x} is outside [0, 1): x is a mole fraction` }); ok = false }
    if (ys === undefined || ys === '') { errors.push({ line: r.line, column: 'y', message: 'is missing' }); ok = false }
    else if (y === null) { errors.push({ line: r.line, column: 'y', message: `${quote(ys)} is not a number` }); ok = false }
    else if (y < 0 || y >= 1) { errors.push({ line: r.line, column: 'y', message: `${y} is outside [0, 1): y is a mole fraction` }); ok = false }
    if (it >= 0) {
      const ts = r.fields[it]
      if (ts !== undefined && ts !== '') {
        const t = parseNumber(ts)
        if (t === null || t <= -273.15) errors.push({ line: r.line, column: 'temperature', message: `${quote(ts)} is not a temperature in degC` })
        else temps.push(t)
      }
    }
    if (!ok || x === null || y === null) continue
    if (prev) {
      if (x === prev.x && y === prev.y) {
        errors.push({ line: r.line, column: 'x', message: `duplicates the point on line ${prev.line} (${x}, ${y})` })
        continue
      }
      if (x === prev.x) {
        errors.push({ line: r.line, column: 'x', message: `x = ${x} repeats line ${prev.line} with a different y` })
        continue
      }
      if (x < prev.x) {
        errors.push({ line: r.line, column: 'x', message: `x = ${x} is below x = ${prev.x} on line ${prev.line}: x must increase strictly down the file` })
        continue
      }
      if (y <= prev.y) {
        errors.push({ line: r.line, column: 'y', message: `y = ${y} does not rise above y = ${prev.y} on line ${prev.line}: y must increase strictly with x` })
        continue
      }
    }
    points.push([x, y])
    prev = { x, y, line: r.line }
  }
  const dataRows = rows.length
  if (dataRows < MIN_EQUILIBRIUM_POINTS) {
    errors.push({ line: null, column: null, message: `An equilibrium table needs at least ${MIN_EQUILIBRIUM_POINTS} points; the file has ${dataRows}.` })
  }
  const first = points[0]
  if (first && first[0] > 0) warnings.push({ line: null, column: null, message: 'The table does not start at x = 0; the design adds the origin (0, 0).' })
  let temperature: number | null = temps[0] ?? null
  if (temps.length && temps.some((t) => Math.abs(t - temps[0]!) > 1e-9)) {
    warnings.push({ line: null, column: 'temperature', message: `The points are at different temperatures (${Math.min(...temps)} to ${Math.max(...temps)} degC); one table should hold one temperature.` })
    temperature = null
  }
  return { points, temperature, errors: sortIssues(errors), warnings: sortIssues(warnings) }
}

export function previewEquilibrium(file: UploadedFile, fields: EquilibriumFields): EquilibriumPreview {
  const p = parseEquilibriumCsv(decodeText(file.buffer))
  const temperature = fields.temperature ?? p.temperature
  const warnings = [...p.warnings]
  if (fields.temperature !== undefined && p.temperature !== null && Math.abs(fields.temperature - p.temperature) > 1e-9) {
    warnings.push({ line: null, column: 'temperature', message: `The form says ${fields.temperature} degC, the file ${p.temperature} degC; the form's value is kept.` })
  }
  return { fileName: safeFileName(file.originalname), points: p.points, temperature, errors: p.errors, warnings }
}

function tableView(c: SiteComponent, who: Map<number, string>): EquilibriumTableView {
  const d = c.data as { solute?: string | null; temperature?: number | null; points?: [number, number][] }
  const points = d.points ?? []
  return {
    id: c.id,
    siteId: c.siteId as number,
    name: c.name,
    solute: d.solute ?? null,
    temperature: d.temperature ?? null,
    points,
    equilibrium: { model: 'table', points },
    source: c.source,
    createdByName: c.createdBy ? (who.get(c.createdBy) ?? null) : null,
    createdAt: c.createdAt.toISOString(),
  }
}

export async function saveEquilibrium(siteId: number, file: UploadedFile, fields: EquilibriumFields, actor: AuthUser, requestId: string): Promise<EquilibriumTableView> {
  const p = previewEquilibrium(file, fields)
  if (p.errors.length) throw fileErrors(p.errors)
  const name = (fields.name ?? p.fileName.replace(/\.[^.]*$/, '')).slice(0, 160) || 'Equilibrium table'
  const id = await sequelize.transaction(async (transaction) => {
    const c = await SiteComponent.create(
      {
        siteId, kind: 'equilibriumTable', name,
        data: { solute: fields.solute ?? null, temperature: p.temperature, points: p.points },
        source: `${p.fileName}, uploaded by ${actor.name}`,
        createdBy: actor.id,
      },
      { transaction },
    )
    await audit({ userId: actor.id, siteId, action: 'upload_equilibrium', entity: 'site_component', entityId: c.id, after: { name, fileName: p.fileName, points: p.points.length }, requestId }, transaction)
    return c.id
  })
  const c = await SiteComponent.findByPk(id)
  return tableView(c!, new Map([[actor.id, actor.name]]))
}

export async function listEquilibriumTables(siteId: number): Promise<EquilibriumTableView[]> {
  const rows = await SiteComponent.findAll({ where: { siteId, kind: 'equilibriumTable' }, order: [['id', 'DESC']] })
  const who = await userNames(rows.map((r) => r.createdBy))
  return rows.map((r) => tableView(r, who))
}
