/** Cost items of the cost model, in display order, with their kind. */
export const CAPITAL_ITEMS = ['shell', 'platforms', 'trays', 'pump', 'motor', 'blower'] as const
export const OPERATING_ITEMS = ['solvent', 'pumpElectricity', 'blowerElectricity', 'lostProduct', 'emissionCharge'] as const

export const COST_ITEM_LABELS: Record<string, string> = {
  shell: 'Shell and heads',
  platforms: 'Platforms and ladders',
  trays: 'Trays',
  pump: 'Solvent pump',
  motor: 'Pump motor',
  blower: 'Blower',
  solvent: 'Solvent make-up / treatment',
  pumpElectricity: 'Pump electricity',
  blowerElectricity: 'Blower electricity',
  lostProduct: 'Lost product',
  emissionCharge: 'Emission charge',
}

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
