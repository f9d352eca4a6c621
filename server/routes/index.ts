import type { Router } from 'express'
import type { Config } from '../config.ts'
import { costBasisRoutes } from './cost-bases.ts'
import { designRoutes } from './designs.ts'
import { studyRoutes } from './studies.ts'
import { uploadRoutes } from './uploads.ts'
import { reportRoutes } from './reports.ts'
import { reviewRoutes } from './review.ts'
import { operatingRoutes } from './operating.ts'
import { allocationRoutes } from './allocation.ts'
import { standingRoutes } from './standing.ts'

/** Feature routes beyond identity: designs, cost bases, studies, runs, review... */
export function registerFeatureRoutes(router: Router, cfg: Config): void {
  designRoutes(router)
  costBasisRoutes(router)
  studyRoutes(router)
  uploadRoutes(router, cfg)
  reportRoutes(router)
  reviewRoutes(router, cfg)
  operatingRoutes(router, cfg)
  allocationRoutes(router)
  standingRoutes(router)
}
