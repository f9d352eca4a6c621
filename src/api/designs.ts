import type { CostBasisInput } from '@shared/schemas/costBasis.ts'
import { pricedDesignSchema, optimisationResultSchema } from '@shared/schemas/results.ts'
import { http } from './http.ts'
import type { CaseInput, ComponentEntry, DesignResult, OptimizeResult } from './types.ts'

/** Stateless designs and optimisations; the answers are parsed with the shared answer schemas. */
export const designsApi = {
  evaluate: (c: CaseInput, costBasis?: CostBasisInput): Promise<DesignResult> =>
    http.post('/designs/evaluate', costBasis ? { case: c, costBasis } : c, { schema: pricedDesignSchema }),
  optimize: (c: CaseInput, costBasis?: CostBasisInput, search?: Record<string, unknown>): Promise<OptimizeResult> =>
    http.post('/designs/optimize', { case: c, costBasis, search }, { schema: optimisationResultSchema }),
  components: (): Promise<ComponentEntry[] | { items: ComponentEntry[] }> => http.get('/components'),
}
