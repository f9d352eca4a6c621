import { UniqueConstraintError } from 'sequelize'
import { decodeText, readCsv, parseNumber, columnIndex, quote, sortIssues, fileErrors } from './csv/reader.ts'
import type { CsvIssue } from '../../shared/schemas/uploads.ts'
import { sequelize } from '../db/sequelize.ts'
import { OperatingEntry, Study, Run } from '../db/models/index.ts'
import { AppError, ConflictError, NotFoundError, ValidationError, InfeasibleError, zodDetails } from '../errors.ts'
import { audit } from './audit.ts'
import { basisInForce } from './cost-bases.ts'
import { siteLibrary } from './runs.ts'
import { recommendedRun, designSummaryOf } from './studies.ts'
import { caseFromRequest } from './engine-gateway.ts'
import { costDesign, type CostBreakdown } from '../engine/costing/index.ts'
import { priceMonth, type MonthResult } from '../engine/tracking/operating.ts'
import { operatingEntryBody, type OperatingEntryBody } from '../../shared/schemas/operating.ts'
import type { DesignSummary } from '../../shared/schemas/results.ts'
import { summaryToSI } from '../../shared/summaryUnits.ts'
import { toSI } from '../../shared/units.ts'
import type { CostBasisData } from '../../shared/schemas/costBasis.ts'
import type { AuthUser } from '../types.d.ts'
import { monitoringOf, type MonitoringView } from './monitoring.ts'

function entryView(e: OperatingEntry) {
  return {
    id: e.id,
    month: e.month.slice(0, 7),
    gasFlow: e.gasFlow,
    solventFlow: e.solventFlow,
    inletMoleFraction: e.inletMoleFraction ?? null,
    outletMoleFraction: e.outletMoleFraction,
    recovery: e.recovery,
    powerKw: e.powerKw,
    notes: e.notes,
    lockVersion: e.lockVersion,
  }
}

export async function approvedStudy(siteId: number, studyId: number): Promise<Study> {
  const s = await Study.findOne({ where: { id: studyId, siteId } })
  if (!s) throw new NotFoundError('Study')
  return s
}

/** The approved design of a study: its recommended option's run (design or optimum). */
export async function approvedDesign(s: Study): Promise<{ summary: DesignSummary; run: Run }> {
  if (s.status !== 'approved' || !s.recommendedOptionId) {
    throw new InfeasibleError('Operating costs are tracked against an approved study.', [{ path: 'study.status', message: `is ${s.status}`, code: 'notApproved' }])
  }
  const run = await recommendedRun(s)
  if (!run) throw new NotFoundError('Recommended option')
  const summary = designSummaryOf(run.result)
  if (!summary) throw new NotFoundError('Design of the recommended option')
  return { summary, run }
}

export async function listEntries(siteId: number, studyId: number) {
  const s = await approvedStudy(siteId, studyId)
  const entries = await OperatingEntry.findAll({ where: { studyId }, order: [['month', 'ASC']] })
  let months: MonthResult[] = []
  let design: { summary: DesignSummary; runId: number; costBasisVersion: number | null } | null = null
  let monitoring: MonitoringView | null = null
  let monitoringIssue: string | null = null
  const pricedBases: CostBasisData[] = []
  if (s.status === 'approved' && entries.length) {
    const d = await approvedDesign(s)
    design = { summary: d.summary, runId: d.run.id, costBasisVersion: d.run.costBasisVersion }
    const library = await siteLibrary(siteId)
    const c = caseFromRequest(d.run.inputs, library, 'inputs')
    // The engine works in SI: the stored (public) summary and the logged kmol/h are converted here.
    const designSI = summaryToSI(d.summary)
    // Months under the same cost-basis version price the design the same way: cost it once per version.
    const designCosts = new Map<number, CostBreakdown>()
    months = []
    for (const e of entries) {
      const b = await basisInForce(siteId, e.month)
      if (!b) throw new InfeasibleError(`No cost-basis version is in force on ${e.month}.`, [{ path: 'costBasis', message: 'no published version is effective on or before that month', code: 'noCostBasis' }])
      const basis = b.data as CostBasisData
      let designCost = designCosts.get(b.id)
      if (!designCost) designCosts.set(b.id, (designCost = costDesign(designSI, basis)))
      const m = priceMonth(
        { month: e.month, gasFlow: toSI('molarFlow', e.gasFlow), solventFlow: toSI('molarFlow', e.solventFlow), outletMoleFraction: e.outletMoleFraction, recovery: e.recovery, powerKw: e.powerKw },
        {
          design: designSI,
          designCost,
          inletMoleFraction: e.inletMoleFraction ?? c.gas.soluteMoleFraction,
          soluteMolarMass: c.solute.molarMass,
          operatingHoursPerYear: basis.general.operatingHours,
          prices: { electricity: basis.utilities.electricityPrice, solvent: basis.utilities.solventCost, product: basis.utilities.productValue, emission: basis.utilities.emissionCharge },
        },
      )
      months.push({ ...m, month: m.month.slice(0, 7), costBasisVersion: b.version } as MonthResult & { costBasisVersion: number })
      pricedBases.push(basis)
    }
    // The rating of the months never stops the log from answering: a failure is reported beside it.
    try {
      monitoring = await monitoringOf(
        siteId,
        d.run,
        d.summary,
        library,
        entries.map((e) => ({ month: e.month.slice(0, 7), gasFlow: e.gasFlow, solventFlow: e.solventFlow, inletMoleFraction: e.inletMoleFraction ?? null })),
        months.map((m, i) => ({ ...m, basis: pricedBases[i]! })),
      )
    } catch (e) {
      if (!(e instanceof AppError)) throw e
      monitoringIssue = e.message + (e.details.length ? `: ${e.details.map((x) => x.message).join('; ')}` : '')
    }
  }
  const toDate = months.reduce((a, m) => ({ actual: a.actual + m.actual.total, design: a.design + m.design.total, gap: a.gap + m.gap }), { actual: 0, design: 0, gap: 0 })
  return { entries: entries.map(entryView), months, toDate, design, monitoring, monitoringIssue }
}

function toRow(studyId: number, e: OperatingEntryBody, actor: AuthUser) {
  return {
    studyId,
    month: `${e.month}-01`,
    gasFlow: e.gasFlow,
    solventFlow: e.solventFlow,
    inletMoleFraction: e.inletMoleFraction ?? null,
    outletMoleFraction: e.outletMoleFraction ?? null,
    recovery: e.recovery ?? null,
    powerKw: e.powerKw ?? null,
    notes: e.notes,
    createdBy: actor.id,
  }
}

async function requireApproved(siteId: number, studyId: number, transaction: import('sequelize').Transaction) {
  const s = await Study.findOne({ where: { id: studyId, siteId }, transaction })
  if (!s) throw new NotFoundError('Study')
  if (s.status !== 'approved') throw new ConflictError('The operating log belongs to an approved study.', [{ path: 'study.status', message: `is ${s.status}` }])
}

/** The months of the list that the study has logged already (409 naming them). */
function loggedAlready(months: string[], path: string): ConflictError {
  const list = [...new Set(months)].sort()
  const named = list.length === 1 ? `${list[0]} is logged already` : `${list.slice(0, -1).join(', ')} and ${list.at(-1)} are logged already`
  return new ConflictError(`${named}; edit ${list.length === 1 ? 'that month' : 'those months'} instead.`, list.map((m) => ({ path, message: `${m} is logged already` })))
}

export async function createEntries(siteId: number, studyId: number, list: OperatingEntryBody[], actor: AuthUser, requestId: string) {
  const months = list.map((e) => e.month)
  try {
    await sequelize.transaction(async (transaction) => {
      await requireApproved(siteId, studyId, transaction)
      const taken = await OperatingEntry.findAll({ where: { studyId, month: months.map((m) => `${m}-01`) }, attributes: ['month'], transaction })
      if (taken.length) throw loggedAlready(taken.map((t) => t.month.slice(0, 7)), 'body.month')
      const rows = await OperatingEntry.bulkCreate(list.map((e) => toRow(studyId, e, actor)), { transaction })
      await audit({ userId: actor.id, siteId, action: 'log_operation', entity: 'study', entityId: studyId, after: { months: list.map((e) => e.month), ids: rows.map((r) => r.id) }, requestId }, transaction)
    })
  } catch (e) {
    // two writers at once: the unique index answers; name the months asked for
    if (e instanceof UniqueConstraintError) throw loggedAlready(months, 'body.month')
    throw e
  }
  return listEntries(siteId, studyId)
}

export async function updateEntry(siteId: number, studyId: number, entryId: number, body: { entry: OperatingEntryBody; lockVersion: number }, actor: AuthUser, requestId: string) {
  try {
    await sequelize.transaction(async (transaction) => {
      await requireApproved(siteId, studyId, transaction)
      const e = await OperatingEntry.findOne({ where: { id: entryId, studyId }, transaction, lock: transaction.LOCK.UPDATE })
      if (!e) throw new NotFoundError('Operating entry')
      if (e.lockVersion !== body.lockVersion) throw new ConflictError('Someone else changed this entry; reload to see it.', [{ path: 'body.lockVersion', message: `is ${body.lockVersion}, current is ${e.lockVersion}` }])
      const before = entryView(e)
      await e.update({ ...toRow(studyId, body.entry, actor), createdBy: e.createdBy, lockVersion: e.lockVersion + 1 }, { transaction })
      await audit({ userId: actor.id, siteId, action: 'update_operation', entity: 'operating_entry', entityId: e.id, before, after: entryView(e), requestId }, transaction)
    })
  } catch (e) {
    if (e instanceof UniqueConstraintError) throw loggedAlready([body.entry.month], 'body.entry.month')
    throw e
  }
  return listEntries(siteId, studyId)
}

export async function deleteEntry(siteId: number, studyId: number, entryId: number, actor: AuthUser, requestId: string) {
  await sequelize.transaction(async (transaction) => {
    await requireApproved(siteId, studyId, transaction)
    const e = await OperatingEntry.findOne({ where: { id: entryId, studyId }, transaction })
    if (!e) throw new NotFoundError('Operating entry')
    await e.destroy({ transaction })
    await audit({ userId: actor.id, siteId, action: 'delete_operation', entity: 'operating_entry', entityId: entryId, before: entryView(e), after: null, requestId }, transaction)
  })
}

const CSV_COLUMNS = ['month', 'gasFlow', 'solventFlow', 'inletMoleFraction', 'outletMoleFraction', 'recovery', 'powerKw', 'notes'] as const
type CsvColumn = (typeof CSV_COLUMNS)[number]
const NUMERIC = new Set<CsvColumn>(['gasFlow', 'solventFlow', 'inletMoleFraction', 'outletMoleFraction', 'recovery', 'powerKw'])

/**
 * Parse an operating-log CSV (header: month,gasFlow,solventFlow[,inletMoleFraction][,outletMoleFraction|recovery][,powerKw][,notes])
 * with the uploads' one reader and number rule; line-numbered problems.
 */
export function parseOperatingCsv(text: string): { entries: OperatingEntryBody[]; errors: CsvIssue[] } {
  const { header, rows, errors } = readCsv(text)
  if (!header) return { entries: [], errors: [...errors, { line: null, column: null, message: `The file is empty: it needs a header line (${CSV_COLUMNS.join(', ')}) and at least one month.` }] }
  const col = new Map<CsvColumn, number>()
  for (const k of CSV_COLUMNS) {
    const i = columnIndex(header.fields, [k])
    if (i >= 0) col.set(k, i)
  }
  for (const need of ['month', 'gasFlow', 'solventFlow'] as const) {
    if (!col.has(need)) errors.push({ line: header.line, column: null, message: `missing column "${need}" (expected ${CSV_COLUMNS.join(', ')})` })
  }
  const extra = header.fields.filter((_, i) => ![...col.values()].includes(i))
  if (extra.length) errors.push({ line: header.line, column: null, message: `unknown column${extra.length > 1 ? 's' : ''} ${extra.map(quote).join(', ')} (expected ${CSV_COLUMNS.join(', ')})` })
  if (errors.some((e) => e.line === header.line)) return { entries: [], errors: sortIssues(errors) }
  const entries: OperatingEntryBody[] = []
  const seen = new Set<string>()
  const badLines = new Set(errors.map((e) => e.line))
  for (const r of rows) {
    if (badLines.has(r.line)) continue
    const obj: Record<string, unknown> = {}
    let ok = true
    for (const [k, i] of col) {
      const v = r.fields[i] ?? ''
      if (v === '') continue
      if (NUMERIC.has(k)) {
        const n = parseNumber(v)
        if (n === null) {
          errors.push({ line: r.line, column: k, message: `${quote(v)} is not a number` })
          ok = false
          continue
        }
        obj[k] = n
      } else obj[k] = v
    }
    if (!ok) continue
    const parsed = operatingEntryBody.safeParse(obj)
    if (!parsed.success) {
      for (const d of zodDetails(parsed.error)) errors.push({ line: r.line, column: d.path || null, message: d.message })
      continue
    }
    if (seen.has(parsed.data.month)) errors.push({ line: r.line, column: 'month', message: `${parsed.data.month} appears twice` })
    seen.add(parsed.data.month)
    entries.push(parsed.data)
  }
  return { entries, errors: sortIssues(errors) }
}

/** Log the months of a CSV file: all rows or none (400 with 'file:line N' details). */
export async function importCsv(siteId: number, studyId: number, file: Buffer, actor: AuthUser, requestId: string) {
  const { entries, errors } = parseOperatingCsv(decodeText(file))
  if (errors.length) throw fileErrors(errors)
  if (!entries.length) throw new ValidationError('The file has no rows.', [{ path: 'file', message: 'no data rows' }])
  return createEntries(siteId, studyId, entries, actor, requestId)
}

export { operatingEntryBody }
