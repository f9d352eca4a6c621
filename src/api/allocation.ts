/** Site solvent allocation: split a limited solvent supply between absorbers (m³/h). */
import type { AllocationAbsorber, AllocationBody } from '@shared/schemas/allocation.ts'
import { http } from './http.ts'

export type AllocationObjective = 'minCost' | 'maxRecovered'

export type AllocationRequest = Omit<AllocationBody, 'name' | 'objective' | 'save' | 'saveInfeasible'> & { name?: string; objective?: AllocationObjective; save?: boolean; saveInfeasible?: boolean }
export type { AllocationAbsorber }

export interface AllocationUnitResult {
  id: number
  name: string
  flow: number
  recovery: number
  cost: number
  recovered: number
  minFlow: number
  maxFlow: number
  designFlow: number
}

export interface AllocationResult {
  id?: number | null
  /** Whether this answer was saved (an infeasible one is not, unless asked). */
  saved?: boolean
  feasible: boolean
  objective: AllocationObjective
  supplyLimit: number
  used: number
  units: AllocationUnitResult[]
  totalCost: number
  totalRecovered: number
  shadowPrice: number
  curves: { id: number; points: { flow: number; cost: number; recovery: number }[] }[]
  warnings: string[]
  currency?: string
  costBasisVersion?: number
}

export interface SavedAllocation {
  id: number
  name: string
  createdAt: string
  inputs: AllocationRequest
  result: AllocationResult
}

export const allocationApi = {
  solve: (siteId: number, body: AllocationRequest): Promise<AllocationResult> => http.post(`/sites/${siteId}/allocations/solve`, body),
  list: (siteId: number): Promise<SavedAllocation[]> => http.get(`/sites/${siteId}/allocations`),
  absorbers: (siteId: number): Promise<AllocationAbsorber[]> => http.get(`/sites/${siteId}/allocations/absorbers`),
}
