/** Site solvent allocation: split a limited solvent supply between absorbers (m³/h). */
import type { z } from 'zod'
import type { AllocationAbsorber, AllocationBody, AllocationObjective, AllocationResult, AllocationUnitResult, savedAllocationSchema } from '@shared/schemas/allocation.ts'
import { http } from './http.ts'

export type AllocationRequest = Omit<AllocationBody, 'name' | 'objective' | 'save' | 'saveInfeasible'> & { name?: string; objective?: AllocationObjective; save?: boolean; saveInfeasible?: boolean }
export type { AllocationAbsorber, AllocationObjective, AllocationResult, AllocationUnitResult }

export interface SavedAllocation extends Omit<z.infer<typeof savedAllocationSchema>, 'inputs'> {
  inputs: AllocationRequest
}

export const allocationApi = {
  solve: (siteId: number, body: AllocationRequest): Promise<AllocationResult> => http.post(`/sites/${siteId}/allocations/solve`, body),
  list: (siteId: number): Promise<SavedAllocation[]> => http.get(`/sites/${siteId}/allocations`),
  absorbers: (siteId: number): Promise<AllocationAbsorber[]> => http.get(`/sites/${siteId}/allocations/absorbers`),
}
