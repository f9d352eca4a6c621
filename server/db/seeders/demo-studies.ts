import type { Transaction } from 'sequelize'
import { CostBasis, type Site } from '../models/index.ts'
import { loadPreset } from '../../engine/costing/index.ts'

const PRESET_OF_SITE: Record<string, string> = {
  'cobalt-ridge': 'halvard-cobalt-ridge',
  'marrow-bay': 'halvard-marrow-bay',
}

/** Demo cost bases (one published version per site) and studies. Returns rows created. */
export async function seedDemoStudies(sites: Map<string, Site>, transaction: Transaction): Promise<number> {
  let created = 0
  for (const [code, site] of sites) {
    const preset = PRESET_OF_SITE[code]
    if (!preset) continue
    const has = await CostBasis.count({ where: { siteId: site.id }, transaction })
    if (has > 0) continue
    const data = loadPreset(preset)
    await CostBasis.create(
      {
        siteId: site.id, version: 1, status: 'published', name: data.name, notes: 'Demo cost basis for the invented scenario.',
        data, effectiveDate: '2026-01-01', publishedAt: new Date('2026-01-05T09:00:00Z'), publishedBy: null, createdBy: null, basedOnId: null,
      },
      { transaction },
    )
    created++
  }
  return created
}
