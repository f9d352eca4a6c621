import { z } from 'zod'

const month = z.string().regex(/^\d{4}-(0[1-9]|1[0-2])$/, 'must be a month as YYYY-MM')

/** One month of a running unit. Flows in kmol/h, power in kW, fractions 0..1. */
export const operatingEntryBody = z
  .object({
    month,
    gasFlow: z.number().positive('must be above zero').max(1e6),
    solventFlow: z.number().positive('must be above zero').max(1e7),
    /** Inlet gas solute mole fraction of the month; absent: the approved design's. */
    inletMoleFraction: z.number().gt(0).lt(1).nullable().optional(),
    outletMoleFraction: z.number().min(0).lt(1).nullable().optional(),
    recovery: z.number().gt(0).lt(1).nullable().optional(),
    powerKw: z.number().min(0).max(1e5).nullable().optional(),
    notes: z.string().max(2000).default(''),
  })
  .refine((e) => !(e.outletMoleFraction != null && e.recovery != null), {
    message: 'give the outlet mole fraction or the recovery, not both',
    path: ['recovery'],
  })

export const updateOperatingEntryBody = z.object({
  entry: operatingEntryBody,
  lockVersion: z.number().int().min(0),
})

export type OperatingEntryBody = z.infer<typeof operatingEntryBody>
