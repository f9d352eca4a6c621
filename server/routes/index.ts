import type { Router } from 'express'
import type { Config } from '../config.ts'

/** Feature routes beyond identity: designs, cost bases, studies, runs, review... */
export function registerFeatureRoutes(_router: Router, _cfg: Config): void {}
