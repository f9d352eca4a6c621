/**
 * The cost model's item keys and names, on their own (no schema) so the engine's cost model can
 * use them without loading the cost-basis schema (shared/schemas/costBasis.ts re-exports them).
 */
/** The cost model's items, in display order (capital items annualised, then operating items). */
export const capitalItemKeys = ['shell', 'platforms', 'trays', 'pump', 'motor', 'blower'] as const
export const operatingItemKeys = ['solvent', 'pumpElectricity', 'blowerElectricity', 'lostProduct', 'emissionCharge'] as const
export type CapitalItemKey = (typeof capitalItemKeys)[number]
export type OperatingItemKey = (typeof operatingItemKeys)[number]
export type CostItemKey = CapitalItemKey | OperatingItemKey

export const costItemLabels: Record<CostItemKey, string> = {
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
