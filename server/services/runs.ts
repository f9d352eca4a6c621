import { sequelize } from '../db/sequelize.ts'
import { Run, Study, SiteComponent } from '../db/models/index.ts'
import { ConflictError, NotFoundError, InfeasibleError } from '../errors.ts'
import { audit } from './audit.ts'
import { basisInForce } from './cost-bases.ts'
import { EDITABLE, runRow, headline } from './studies.ts'
import { userNames } from './people.ts'
import { libraryWith, caseFromRequest, parseSearch, runDesign, runOptimiseAsync, assertFinite } from './engine-gateway.ts'
import { ENGINE_VERSION } from '../engine/version.ts'
import type { ComponentLibrary, LibraryComponent } from '../engine/case.ts'
import type { CostBasisData } from '../../shared/schemas/costBasis.ts'
import type { AuthUser } from '../types.d.ts'

/** The component library of a site: the shipped library plus the site's own components. */
export async function siteLibrary(siteId: number): Promise<ComponentLibrary> {
  const rows = await SiteComponent.findAll({ where: { siteId, kind: 'component' } })
  if (!rows.length) return libraryWith()
  const components: Record<string, LibraryComponent> = {}
  for (const r of rows) components[r.name] = r.data as LibraryComponent
  return libraryWith({ components })
}

/** Compute a study's case (design or optimisation) against a given cost basis; nothing is stored. */
export async function compute(siteId: number, kind: 'design' | 'optimize', inputs: unknown, search: unknown, basis: CostBasisData | null) {
  const library = await siteLibrary(siteId)
  const c = caseFromRequest(inputs, library, 'inputs')
  if (kind === 'design') return runDesign(c, basis, 'inputs')
  if (!basis) throw new InfeasibleError('Optimisation needs a published cost basis for this site.', [{ path: 'costBasis', message: 'none is published', code: 'noCostBasis' }])
  return runOptimiseAsync(c, basis, parseSearch(search, 'search'), 'inputs')
}

function tacOf(kind: 'design' | 'optimize', result: unknown): number | null {
  const r = result as { totalAnnualCost?: number; optimum?: { totalAnnualCost?: number } }
  const v = kind === 'design' ? r.totalAnnualCost : r.optimum?.totalAnnualCost
  return typeof v === 'number' ? v : null
}

export async function createRun(siteId: number, studyId: number, kind: 'design' | 'optimize', actor: AuthUser, requestId: string) {
  const study = await Study.findOne({ where: { id: studyId, siteId } })
  if (!study) throw new NotFoundError('Study')
  if (!EDITABLE.includes(study.status)) throw new ConflictError('Runs can only be made while the study is a draft or returned.')
  const basisRow = await basisInForce(siteId)
  const basis = basisRow ? (basisRow.data as CostBasisData) : null
  const result = await compute(siteId, kind, study.inputs, study.search, basis)
  assertFinite(result)
  const tac = tacOf(kind, result)
  const id = await sequelize.transaction(async (transaction) => {
    const run = await Run.create(
      {
        studyId, kind, inputs: study.inputs, search: study.search, costBasisId: basisRow?.id ?? null,
        costBasisVersion: basisRow?.version ?? null, engineVersion: ENGINE_VERSION, result, totalAnnualCost: tac, createdBy: actor.id,
      },
      { transaction },
    )
    const patch: Partial<{ lastRunAt: Date; optimumTac: number | null }> = { lastRunAt: new Date() }
    if (kind === 'optimize') patch.optimumTac = tac
    await Study.update(patch, { where: { id: studyId }, transaction })
    await audit({ userId: actor.id, siteId, action: `run_${kind}`, entity: 'study', entityId: studyId, after: { runId: run.id, costBasisVersion: run.costBasisVersion, totalAnnualCost: tac }, requestId }, transaction)
    return run.id
  })
  return getRun(siteId, studyId, id)
}

export async function listRuns(siteId: number, studyId: number) {
  const s = await Study.findOne({ where: { id: studyId, siteId }, attributes: ['id'] })
  if (!s) throw new NotFoundError('Study')
  const runs = await Run.findAll({ where: { studyId }, order: [['id', 'DESC']], attributes: { exclude: ['result', 'inputs', 'search'] } })
  const who = await userNames(runs.map((r) => r.createdBy))
  return runs.map((r) => runRow(r, who))
}

export async function getRun(siteId: number, studyId: number, runId: number) {
  const s = await Study.findOne({ where: { id: studyId, siteId }, attributes: ['id'] })
  if (!s) throw new NotFoundError('Study')
  const r = await Run.findOne({ where: { id: runId, studyId } })
  if (!r) throw new NotFoundError('Run')
  const who = await userNames([r.createdBy])
  return { ...runRow(r, who), inputs: r.inputs, search: r.search, result: r.result }
}

/**
 * Recompute a stored run with its exact inputs against the cost basis in force now (not stored)
 * and list the headline numbers that moved.
 */
export async function compareWithCurrent(siteId: number, studyId: number, runId: number) {
  const stored = await getRun(siteId, studyId, runId)
  const basisRow = await basisInForce(siteId)
  if (!basisRow) throw new InfeasibleError('No published cost basis to compare with.', [{ path: 'costBasis', message: 'none is published', code: 'noCostBasis' }])
  const fresh = await compute(siteId, stored.kind, stored.inputs, stored.search, basisRow.data as CostBasisData)
  const before = headline(stored.result) ?? {}
  const after = headline(fresh) ?? {}
  const changes = Object.keys({ ...before, ...after })
    .filter((k) => before[k] !== after[k])
    .map((k) => ({ key: k, before: before[k] ?? null, after: after[k] ?? null }))
  return {
    run: { id: stored.id, costBasisVersion: stored.costBasisVersion, engineVersion: stored.engineVersion },
    current: { costBasisId: basisRow.id, costBasisVersion: basisRow.version, engineVersion: ENGINE_VERSION },
    changes,
    result: fresh,
  }
}
