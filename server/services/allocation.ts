import { Study, Run, SolventAllocation } from '../db/models/index.ts'
import { NotFoundError, InfeasibleError, ValidationError } from '../errors.ts'
import { audit } from './audit.ts'
import { basisInForce } from './cost-bases.ts'
import { recommendedRun, designSummaryOf } from './studies.ts'
import { costDesign } from '../engine/costing/index.ts'
import { allocateSolvent, type AllocationUnit } from '../engine/allocation/solvent.ts'
import type { DesignSummary } from '../../shared/schemas/results.ts'
import { summaryToSI } from '../../shared/summaryUnits.ts'
import type { CostBasisData } from '../../shared/schemas/costBasis.ts'
import type { AllocationBody } from '../../shared/schemas/allocation.ts'
import type { AuthUser } from '../types.d.ts'

/** The design a study stands for: its recommended option, else its newest run. */
async function designOf(s: Study): Promise<DesignSummary | null> {
  const run = (await recommendedRun(s)) ?? (await Run.findOne({ where: { studyId: s.id }, order: [['id', 'DESC']] }))
  return run ? designSummaryOf(run.result) : null
}

export async function solve(siteId: number, body: AllocationBody, actor: AuthUser, requestId: string) {
  const basisRow = await basisInForce(siteId)
  if (!basisRow) throw new InfeasibleError('Allocation needs a published cost basis.', [{ path: 'costBasis', message: 'none is published', code: 'noCostBasis' }])
  const basis = basisRow.data as CostBasisData
  const units: AllocationUnit[] = []
  for (const [i, u] of body.units.entries()) {
    const s = await Study.findOne({ where: { id: u.studyId, siteId } })
    if (!s) throw new ValidationError('Unknown absorber.', [{ path: `body.units.${i}.studyId`, message: 'is not a study of this site' }])
    if (s.status === 'archived') throw new ValidationError('Archived study.', [{ path: `body.units.${i}.studyId`, message: 'is archived' }])
    const d = await designOf(s)
    if (!d) throw new ValidationError('The study has no design yet.', [{ path: `body.units.${i}.studyId`, message: 'has no run; run a design first' }])
    const c = costDesign(summaryToSI(d), basis)
    const designFlow = d.solventVolumetricFlow
    const minFlow = u.minFlow ?? 0.5 * designFlow
    const maxFlow = u.maxFlow ?? 2 * designFlow
    if (minFlow >= maxFlow) throw new ValidationError('Bounds are not valid.', [{ path: `body.units.${i}.minFlow`, message: 'must be below maxFlow' }])
    units.push({
      id: s.id,
      name: s.name,
      stages: d.actualTrays * (d.overallEfficiency ?? d.theoreticalStages / d.actualTrays),
      KV: d.solventFlow / d.absorptionFactor,
      m3PerKmol: d.solventVolumetricFlow / d.solventFlow,
      soluteIn: d.soluteInGas,
      hours: basis.general.operatingHours,
      solventCost: basis.utilities.solventCost,
      pumpElectricPerM3h: c.power.pumpElectric / 1000 / designFlow,
      electricityPrice: basis.utilities.electricityPrice,
      productValue: basis.utilities.productValue,
      emissionCharge: basis.utilities.emissionCharge,
      minFlow,
      maxFlow,
      designFlow,
    })
  }
  const result = { ...allocateSolvent(units, body.supplyLimit, body.objective), currency: basis.general.currency, costBasisVersion: basisRow.version }
  let id: number | null = null
  if (body.save && (result.feasible || body.saveInfeasible)) {
    const row = await SolventAllocation.create({ siteId, name: body.name || `Allocation ${new Date().toISOString().slice(0, 10)}`, inputs: body, result, createdBy: actor.id })
    id = row.id
    await audit({ userId: actor.id, siteId, action: 'save_allocation', entity: 'solvent_allocation', entityId: row.id, after: { supplyLimit: body.supplyLimit, units: body.units.length }, requestId })
  }
  return { id, saved: id !== null, ...result }
}

/** The absorbers of a site (studies not archived) with the design solvent flow each stands for, m³/h. */
export async function absorbers(siteId: number) {
  const studies = await Study.findAll({ where: { siteId }, order: [['name', 'ASC']] })
  const out = []
  for (const s of studies) {
    if (s.status === 'archived') continue
    const d = await designOf(s)
    out.push({ studyId: s.id, name: s.name, status: s.status, designFlow: d && Number.isFinite(d.solventVolumetricFlow) ? d.solventVolumetricFlow : null })
  }
  return out
}

export async function listSaved(siteId: number) {
  const rows = await SolventAllocation.findAll({ where: { siteId }, order: [['id', 'DESC']], limit: 100 })
  return rows.map((r) => ({ id: r.id, name: r.name, createdAt: r.createdAt.toISOString(), inputs: r.inputs, result: r.result }))
}

export async function getSaved(siteId: number, id: number) {
  const r = await SolventAllocation.findOne({ where: { id, siteId } })
  if (!r) throw new NotFoundError('Allocation')
  return { id: r.id, name: r.name, createdAt: r.createdAt.toISOString(), inputs: r.inputs, result: r.result }
}
