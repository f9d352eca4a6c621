import type { CostBasisInput } from '@shared/schemas/costBasis.ts'
import { http } from './http.ts'
import type { CaseInput, ComponentEntry, DesignResult, OptimizeResult } from './types.ts'

export const designsApi = {
  evaluate: (c: CaseInput, costBasis?: CostBasisInput): Promise<DesignResult> =>
    http.post('/designs/evaluate', costBasis ? { case: c, costBasis } : c),
  optimize: (c: CaseInput, costBasis?: CostBasisInput, search?: Record<string, unknown>): Promise<OptimizeResult> =>
    http.post('/designs/optimize', { case: c, costBasis, search }),
  components: (): Promise<ComponentEntry[] | { items: ComponentEntry[] }> => http.get('/components'),
}
