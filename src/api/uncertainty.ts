import { optimisationResultSchema } from '@shared/schemas/results.ts'
import { uncertaintyResultSchema, type RobustSpecInput, type UncertaintyResult, type UncertaintySpecInput } from '@shared/schemas/uncertainty.ts'
import { http } from './http.ts'
import type { CaseInput, OptimizeResult } from './types.ts'

/** The chance of meeting the target, and the robust optimum; answers parsed with the shared schemas. */
export const uncertaintyApi = {
  run: (body: { case: CaseInput; siteId?: number; search?: Record<string, unknown>; uncertainty: UncertaintySpecInput }): Promise<UncertaintyResult> =>
    http.post('/designs/uncertainty', body, { schema: uncertaintyResultSchema }),
  robust: (body: { case: CaseInput; siteId?: number; search?: Record<string, unknown>; robust: RobustSpecInput }): Promise<OptimizeResult> =>
    http.post('/designs/optimize', body, { schema: optimisationResultSchema }),
}
