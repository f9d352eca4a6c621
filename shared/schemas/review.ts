import { z } from 'zod'

export const submitBody = z.object({
  recommendedOptionId: z.number().int().positive(),
  comment: z.string().max(5000).default(''),
})
export const approveBody = z.object({ comment: z.string().max(5000).default('') })
export const returnBody = z.object({ comment: z.string().trim().min(1, 'say what needs to change').max(5000) })
export const commentBody = z.object({ body: z.string().trim().min(1, 'is required').max(5000) })

export type ReviewKind = 'comment' | 'submit' | 'approve' | 'return' | 'reopen'
export interface ReviewEventView {
  id: number
  kind: ReviewKind
  body: string
  userId: number
  userName: string
  createdAt: string
}

/** The only state changes a study can make, by action. */
export const TRANSITIONS = {
  submit: { from: ['draft', 'returned'], to: 'in_review' },
  approve: { from: ['in_review'], to: 'approved' },
  return: { from: ['in_review'], to: 'returned' },
} as const
