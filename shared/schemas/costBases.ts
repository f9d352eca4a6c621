import { z } from 'zod'
import { shortText } from './common.ts'

/** Request bodies and views of the versioned site cost bases (the data itself: costBasis.ts). */
export const createCostBasisBody = z
  .object({
    name: shortText(160).optional(),
    basedOnId: z.number().int().positive().optional(),
    preset: z.string().max(80).optional(),
  })
  .refine((b) => !(b.basedOnId && b.preset), { message: 'give either basedOnId or preset, not both', path: ['preset'] })

export const updateCostBasisBody = z.object({
  name: shortText(160).optional(),
  notes: z.string().max(5000).optional(),
  data: z.unknown().optional(),
  lockVersion: z.number().int().min(0),
})

export const publishCostBasisBody = z.object({
  effectiveDate: z.iso.date('must be a date (YYYY-MM-DD)'),
  lockVersion: z.number().int().min(0),
  /** Needed when the date is before the effective date of the version in force today. */
  confirmEarlierDate: z.boolean().optional(),
})

export interface CostBasisVersionView {
  id: number
  siteId: number
  version: number
  status: 'draft' | 'published'
  name: string
  notes: string
  effectiveDate: string | null
  publishedAt: string | null
  publishedByName: string | null
  createdByName: string | null
  basedOnId: number | null
  lockVersion: number
  updatedAt: string
  /** This version is the one in force today (shared/costBasisInForce.ts). */
  inForce: boolean
}
