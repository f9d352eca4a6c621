import type { Transaction } from 'sequelize'
import type { Site } from '../models/index.ts'

/** Demo cost bases and studies; filled in once the cost model lands. Returns rows created. */
export async function seedDemoStudies(_sites: Map<string, Site>, _t: Transaction): Promise<number> {
  return 0
}
