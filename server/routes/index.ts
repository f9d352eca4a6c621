import type { Router } from 'express'
import type { Config } from '../config.ts'
import { costBasisRoutes } from './cost-bases.ts'

/** Feature routes beyond identity: designs, cost bases, studies, runs, review... */
export function registerFeatureRoutes(router: Router, _cfg: Config): void {
  costBasisRoutes(router)
}
