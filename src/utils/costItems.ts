import { capitalItemKeys, operatingItemKeys, costItemLabels } from '@shared/schemas/costBasis.ts'

/** Cost items of the cost model, in display order, with their kind (defined once, in the shared schema). */
export const CAPITAL_ITEMS = capitalItemKeys
export const OPERATING_ITEMS = operatingItemKeys
export const COST_ITEM_LABELS: Record<string, string> = costItemLabels

export function isCapitalItem(key: string): boolean {
  return (CAPITAL_ITEMS as readonly string[]).includes(key)
}

/** Sum of the capital (annualised) and operating parts of an item map. */
export function splitAnnual(annual: Record<string, number> | null | undefined): { capital: number; operating: number } {
  let capital = 0
  let operating = 0
  for (const [k, v] of Object.entries(annual ?? {})) {
    if (!Number.isFinite(v)) continue
    if (isCapitalItem(k)) capital += v
    else operating += v
  }
  return { capital, operating }
}
