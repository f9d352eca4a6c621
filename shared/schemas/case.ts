/**
 * Case-file schema (zod v4), shared by the engine, the API, the CLI and the client.
 * Imports only zod and ../units.ts.
 *
 * A quantity is a bare number in the case unit of its kind (see QUANTITY_KINDS in
 * ../units.ts and data/examples/README.md) or { "value": v, "unit": "..." }.
 * This schema checks shape and types; units, signs and ranges are checked when the
 * engine normalises the case (with the same field paths).
 */
import { z } from 'zod'
import { QUANTITY_KINDS, isUnitOf, type QuantityKind } from '../units.ts'

/** A quantity of a given kind; the unit (when given) must be a unit of that kind. */
export function quantity(kind: QuantityKind) {
  const info = QUANTITY_KINDS[kind]
  return z.union(
    [
    z.number(),
    z
      .object({ value: z.number(), unit: z.string().min(1) })
      .strict()
      .refine((q) => isUnitOf(kind, q.unit), {
        message: `unknown unit or not a unit of ${QUANTITY_KINDS[kind].label.toLowerCase()} (e.g. ${QUANTITY_KINDS[kind].caseUnit})`,
        path: ['unit'],
      }),
    ],
    {
      error: (iss) =>
        iss.input === undefined
          ? 'required'
          : `expected a number (in ${info.caseUnit}) or { "value": number, "unit": "${info.caseUnit}" }`,
    },
  )
}

const fraction = z.number()

export const gasSchema = z
  .object({
    flow: quantity('molarFlow'),
    temperature: quantity('temperature'),
    pressure: quantity('pressure'),
    soluteMoleFraction: fraction,
    carrierMolarMass: quantity('molarMass').optional(),
    carrier: z.string().min(1).optional(),
    viscosity: quantity('gasViscosity').optional(),
  })
  .strict()

const nameOrObject = (what: string) => ({
  error: (iss: { input: unknown }) =>
    iss.input === undefined ? 'required' : `expected a library component name or an object with the ${what} properties`,
})

export const soluteSchema = z.union([
  z.string().min(1),
  z
    .object({
      name: z.string().min(1).optional(),
      molarMass: quantity('molarMass').optional(),
    })
    .strict(),
], nameOrObject('solute'))

export const solventSchema = z.union([
  z.string().min(1),
  z
    .object({
      name: z.string().min(1).optional(),
      temperature: quantity('temperature').optional(),
      soluteMoleFraction: fraction.optional(),
      molarMass: quantity('molarMass').optional(),
      density: quantity('density').optional(),
      viscosity: quantity('viscosity').optional(),
      surfaceTension: quantity('surfaceTension').optional(),
    })
    .strict(),
], nameOrObject('solvent'))

export const antoineSchema = z
  .object({
    A: z.number(),
    B: z.number(),
    C: z.number(),
    Tmin: z.number().optional(),
    Tmax: z.number().optional(),
  })
  .strict()

export const equilibriumSchema = z.discriminatedUnion('model', [
  z.object({ model: z.literal('constantK'), K: z.number() }).strict(),
  z
    .object({
      model: z.literal('henry'),
      Hcp: quantity('henrySolubility').optional(),
      B: quantity('inverseTemperatureSlope').optional(),
    })
    .strict(),
  z
    .object({
      model: z.literal('modifiedRaoult'),
      gammaInf: z.number().optional(),
      activityModel: z.enum(['constant', 'margules']).optional(),
      antoine: antoineSchema.optional(),
      vapourPressure: quantity('pressure').optional(),
    })
    .strict(),
  z
    .object({
      model: z.literal('table'),
      points: z.array(z.tuple([z.number(), z.number()])).min(2),
    })
    .strict(),
])

export const spacingRuleSchema = z
  .array(z.object({ maxDiameter: quantity('length'), spacing: quantity('length') }).strict())
  .min(1)

export const traySchema = z
  .object({
    holeDiameter: quantity('smallLength').optional(),
    holePitch: quantity('smallLength').optional(),
    thickness: quantity('smallLength').optional(),
    spacing: z.union([z.literal('auto'), quantity('length')]).optional(),
    floodFraction: fraction.optional(),
    foamingFactor: fraction.optional(),
    weirHeight: quantity('smallLength').optional(),
    downcomerClearance: quantity('smallLength').optional(),
    turndownFraction: fraction.optional(),
    spacingRule: spacingRuleSchema.optional(),
  })
  .strict()

export const efficiencySchema = z.discriminatedUnion('model', [
  z.object({ model: z.literal('oconnell') }).strict(),
  z.object({ model: z.literal('fixed'), value: z.number() }).strict(),
])

export const columnSchema = z
  .object({
    temperature: quantity('temperature').optional(),
    diameterStep: quantity('length').optional(),
    topAllowance: quantity('length').optional(),
    bottomAllowance: quantity('length').optional(),
  })
  .strict()

export const vesselSchema = z
  .object({
    designPressure: quantity('pressureGauge').optional(),
    allowableStress: quantity('stress').optional(),
    jointEfficiency: z.number().optional(),
    corrosionAllowance: quantity('smallLength').optional(),
    materialDensity: quantity('density').optional(),
    minimumThickness: z
      .array(z.object({ maxDiameter: quantity('length'), thickness: quantity('smallLength') }).strict())
      .min(1)
      .optional(),
  })
  .strict()

/**
 * One design case. Unknown top-level keys (e.g. "name", "id", "costBasis") are allowed
 * and ignored by the engine; unknown keys inside the sections are errors (typos).
 */
export const caseSchema = z.looseObject({
  name: z.string().optional(),
  description: z.string().optional(),
  gas: gasSchema,
  solute: soluteSchema,
  solvent: solventSchema,
  equilibrium: equilibriumSchema,
  recovery: fraction,
  solventFactor: fraction,
  tray: traySchema.optional(),
  efficiency: efficiencySchema.optional(),
  method: z.enum(['auto', 'kremser', 'stageByStage']).optional(),
  column: columnSchema.optional(),
  vessel: vesselSchema.optional(),
})

export const batchSchema = z.looseObject({
  cases: z.array(caseSchema).min(1),
})

export type CaseInput = z.infer<typeof caseSchema>
export type BatchInput = z.infer<typeof batchSchema>
export type EquilibriumInput = z.infer<typeof equilibriumSchema>
export type TrayInput = z.infer<typeof traySchema>
