/**
 * Role names and their labels, without zod: the app shell shows them on the first screen, and
 * the schema library is loaded only with the views that need it.
 */
export const ROLES = ['admin', 'economist', 'engineer', 'reviewer'] as const
export type Role = (typeof ROLES)[number]

export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Administrator',
  economist: 'Economist',
  engineer: 'Engineer',
  reviewer: 'Reviewer',
}
