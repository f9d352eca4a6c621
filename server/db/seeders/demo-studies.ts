import type { Transaction } from 'sequelize'
import { CostBasis, Study, Run, User, type Site } from '../models/index.ts'
import { loadPreset } from '../../engine/costing/index.ts'
import { libraryWith, caseFromRequest, parseSearch, runDesign, runOptimise } from '../../services/engine-gateway.ts'
import { ENGINE_VERSION } from '../../engine/version.ts'
import type { CostBasisData } from '../../../shared/schemas/costBasis.ts'
import demo from '../../../data/demo-studies.json' with { type: 'json' }

const PRESET_OF_SITE: Record<string, string> = {
  'cobalt-ridge': 'halvard-cobalt-ridge',
  'marrow-bay': 'halvard-marrow-bay',
}

/** Demo cost bases (one published version per site) and studies with runs. Returns rows created. */
export async function seedDemoStudies(sites: Map<string, Site>, transaction: Transaction): Promise<number> {
  let created = 0
  const bases = new Map<string, CostBasis>()
  for (const [code, site] of sites) {
    const preset = PRESET_OF_SITE[code]
    if (!preset) continue
    let basis = await CostBasis.findOne({ where: { siteId: site.id, status: 'published' }, order: [['version', 'ASC']], transaction })
    if (!basis) {
      const data = loadPreset(preset)
      basis = await CostBasis.create(
        {
          siteId: site.id, version: 1, status: 'published', name: data.name, notes: 'Demo cost basis for the invented scenario.',
          data, effectiveDate: '2026-01-01', publishedAt: new Date('2026-01-05T09:00:00Z'), publishedBy: null, createdBy: null, basedOnId: null,
        },
        { transaction },
      )
      created++
    }
    bases.set(code, basis)
  }

  for (const s of demo.studies) {
    const site = sites.get(s.site)
    const basis = bases.get(s.site)
    if (!site || !basis) continue
    if (await Study.count({ where: { siteId: site.id, name: s.name }, transaction })) continue
    const owner = await User.findOne({ where: { email: s.owner }, transaction })
    if (!owner) continue
    const study = await Study.create(
      {
        siteId: site.id, ownerId: owner.id, name: s.name, description: s.description, inputs: s.inputs, search: null,
        parentStudyId: null, recommendedOptionId: null, optimumTac: null, targetRecovery: s.inputs.recovery, lastRunAt: null,
      },
      { transaction },
    )
    created++
    const c = caseFromRequest(s.inputs, libraryWith(), 'inputs')
    const data = basis.data as CostBasisData
    for (const kind of s.runs) {
      const result = kind === 'design' ? runDesign(c, data, 'inputs') : runOptimise(c, data, parseSearch({}, 'search'), 'inputs')
      const tac = kind === 'design' ? (result as { totalAnnualCost?: number }).totalAnnualCost : (result as { optimum: { totalAnnualCost: number } }).optimum.totalAnnualCost
      await Run.create(
        {
          studyId: study.id, kind: kind as 'design' | 'optimize', inputs: s.inputs, search: null, costBasisId: basis.id,
          costBasisVersion: basis.version, engineVersion: ENGINE_VERSION, result, totalAnnualCost: tac ?? null, createdBy: owner.id,
        },
        { transaction },
      )
      created++
      await study.update({ lastRunAt: new Date(), ...(kind === 'optimize' ? { optimumTac: tac ?? null } : {}) }, { transaction })
    }
  }
  return created
}
