import { UniqueConstraintError } from 'sequelize'
import Papa from 'papaparse'
import { sequelize } from '../db/sequelize.ts'
import { OperatingEntry, Study, Run } from '../db/models/index.ts'
import { ConflictError, NotFoundError, ValidationError, InfeasibleError, type ErrorDetail } from '../errors.ts'
import { audit } from './audit.ts'
import { basisInForce } from './cost-bases.ts'
import { siteLibrary } from './runs.ts'
import { recommendedRun, designSummaryOf } from './studies.ts'
import { parseCase } from './engine-gateway.ts'
import { costDesign, type CostBreakdown } from '../engine/costing/index.ts'
import { priceMonth, type MonthResult } from '../engine/tracking/operating.ts'
import { operatingEntryBody, type OperatingEntryBody } from '../../shared/schemas/operating.ts'
import type { DesignSummary } from '../engine/contract.ts'
import type { CostBasisData } from '../../shared/schemas/costBasis.ts'
import type { AuthUser } from '../types.d.ts'
import { zodDetails } from '../middleware/error-handler.ts'

function entryView(e: OperatingEntry) {
  return {
    id: e.id,
    month: e.month.slice(0, 7),
    gasFlow: e.gasFlow,
    solventFlow: e.solventFlow,
    outletMoleFraction: e.outletMoleFraction,
    recovery: e.recovery,
    powerKw: e.powerKw,
    notes: e.notes,
    lockVersion: e.lockVersion,
  }
}

async function approvedStudy(siteId: number, studyId: number): Promise<Study> {
  const s = await Study.findOne({ where: { id: studyId, siteId } })
  if (!s) throw new NotFoundError('Study')
  return s
}

/** The approved design of a study: its recommended option's run (design or optimum). */
async function approvedDesign(s: Study): Promise<{ summary: DesignSummary; run: Run }> {
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
  if (s.status === 'approved' && entries.length) {
    const d = await approvedDesign(s)
    design = { summary: d.summary, runId: d.run.id, costBasisVersion: d.run.costBasisVersion }
    const c = parseCase(d.run.inputs, await siteLibrary(siteId), 'inputs')
    // Months under the same cost-basis version price the design the same way: cost it once per version.
    const designCosts = new Map<number, CostBreakdown>()
    months = []
    for (const e of entries) {
      const b = await basisInForce(siteId, e.month)
      if (!b) throw new InfeasibleError('No published cost basis to price the month with.', [{ path: 'costBasis', message: 'none is published', code: 'noCostBasis' }])
      const basis = b.data as CostBasisData
      let designCost = designCosts.get(b.id)
      if (!designCost) designCosts.set(b.id, (designCost = costDesign(d.summary, basis)))
      const m = priceMonth(
        { month: e.month, gasFlow: e.gasFlow, solventFlow: e.solventFlow, outletMoleFraction: e.outletMoleFraction, recovery: e.recovery, powerKw: e.powerKw },
        {
          design: d.summary,
          designCost,
          inletMoleFraction: c.gas.soluteMoleFraction,
          soluteMolarMass: c.solute.molarMass * 1000,
          operatingHoursPerYear: basis.general.operatingHours,
          prices: { electricity: basis.utilities.electricityPrice, solvent: basis.utilities.solventCost, product: basis.utilities.productValue, emission: basis.utilities.emissionCharge },
        },
      )
      months.push({ ...m, month: m.month.slice(0, 7), costBasisVersion: b.version } as MonthResult & { costBasisVersion: number })
    }
  }
  const toDate = months.reduce((a, m) => ({ actual: a.actual + m.actual.total, design: a.design + m.design.total, gap: a.gap + m.gap }), { actual: 0, design: 0, gap: 0 })
  return { entries: entries.map(entryView), months, toDate, design }
}

function toRow(studyId: number, e: OperatingEntryBody, actor: AuthUser) {
  return {
    studyId,
    month: `${e.month}-01`,
    gasFlow: e.gasFlow,
    solventFlow: e.solventFlow,
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

export async function createEntries(siteId: number, studyId: number, list: OperatingEntryBody[], actor: AuthUser, requestId: string) {
  try {
    await sequelize.transaction(async (transaction) => {
      await requireApproved(siteId, studyId, transaction)
      const rows = await OperatingEntry.bulkCreate(list.map((e) => toRow(studyId, e, actor)), { transaction })
      await audit({ userId: actor.id, siteId, action: 'log_operation', entity: 'study', entityId: studyId, after: { months: list.map((e) => e.month), ids: rows.map((r) => r.id) }, requestId }, transaction)
    })
  } catch (e) {
    if (e instanceof UniqueConstraintError) throw new ConflictError('A month is logged already; edit that entry instead.', [{ path: 'body.month', message: 'is logged already' }])
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
    if (e instanceof UniqueConstraintError) throw new ConflictError('That month is logged already.', [{ path: 'body.entry.month', message: 'is logged already' }])
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

const CSV_COLUMNS = ['month', 'gasFlow', 'solventFlow', 'outletMoleFraction', 'recovery', 'powerKw', 'notes'] as const
const NUMERIC = new Set(['gasFlow', 'solventFlow', 'outletMoleFraction', 'recovery', 'powerKw'])

/** Parse an operating-log CSV (header: month,gasFlow,solventFlow[,outletMoleFraction|recovery][,powerKw][,notes]); line-numbered errors. */
export function parseOperatingCsv(text: string): { entries: OperatingEntryBody[]; errors: ErrorDetail[] } {
  const parsed = Papa.parse<Record<string, string>>(text.replace(/^\uFEFF/, ''), { header: true, skipEmptyLines: 'greedy', transformHeader: (h) => h.trim() })
  const errors: ErrorDetail[] = []
  const fields = parsed.meta.fields ?? []
  for (const need of ['month', 'gasFlow', 'solventFlow']) {
    if (!fields.includes(need)) errors.push({ path: 'file:line 1', message: `missing column "${need}" (expected ${CSV_COLUMNS.join(', ')})` })
  }
  if (errors.length) return { entries: [], errors }
  const entries: OperatingEntryBody[] = []
  const seen = new Set<string>()
  parsed.data.forEach((row, i) => {
    const line = i + 2
    const obj: Record<string, unknown> = {}
    if ('__parsed_extra' in row) {
      errors.push({ path: `file:line ${line}`, message: `has more values than the header has columns (${fields.length})` })
      return
    }
    for (const [k, raw] of Object.entries(row)) {
      const v = (raw ?? '').trim()
      if (!CSV_COLUMNS.includes(k as (typeof CSV_COLUMNS)[number]) || v === '') continue
      if (NUMERIC.has(k)) {
        const n = Number(v)
        if (!Number.isFinite(n)) {
          errors.push({ path: `file:line ${line}`, message: `${k} "${v}" is not a number` })
          return
        }
        obj[k] = n
      } else obj[k] = v
    }
    const r = operatingEntryBody.safeParse(obj)
    if (!r.success) {
      for (const d of zodDetails(r.error)) errors.push({ path: `file:line ${line}`, message: `${d.path} ${d.message}` })
      return
    }
    if (seen.has(r.data.month)) errors.push({ path: `file:line ${line}`, message: `month ${r.data.month} appears twice` })
    seen.add(r.data.month)
    entries.push(r.data)
  })
  for (const e of parsed.errors) if (e.code !== 'TooManyFields') errors.push({ path: `file:line ${(e.row ?? 0) + 2}`, message: e.message })
  return { entries, errors }
}

export async function importCsv(siteId: number, studyId: number, text: string, actor: AuthUser, requestId: string) {
  const { entries, errors } = parseOperatingCsv(text)
  if (errors.length) throw new ValidationError('The file has errors; nothing was saved.', errors)
  if (!entries.length) throw new ValidationError('The file has no rows.', [{ path: 'file', message: 'no data rows' }])
  return createEntries(siteId, studyId, entries, actor, requestId)
}

export { operatingEntryBody }
