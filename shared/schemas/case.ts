/**
 * Case-file schema (zod v4), shared by the engine, the API, the CLI and the client.
 * Imports only zod and ../units.ts.
 *
 * A quantity is a bare number in the case unit of its kind (see QUANTITY_KINDS in
 * ../units.ts and data/examples/README.md) or { "value": v, "unit": "..." }.
 * This schema checks shape, types and the range of each field with a rule in ./caseRules.ts
 * (messages in the person's units and words, e.g. '-300 kmol/h: the gas flow must be positive');
 * the engine checks again when it normalises the case (with the same field paths).
 */
import { z } from 'zod'
import { QUANTITY_KINDS, isUnitOf, type QuantityInput, type QuantityKind } from '../units.ts'
import { requiredText, ruleFor, ruleProblem } from './caseRules.ts'

/** Add the range check of the field rule at `path` (see caseRules.ts) to a schema. */
function ruled<T extends z.ZodType>(schema: T, path: string): T {
  const rule = ruleFor(path)
  if (!rule) throw new Error(`no field rule for ${path}`)
  return schema.superRefine((v, ctx) => {
    const problem = ruleProblem(rule, v as QuantityInput)
    if (problem) ctx.addIssue({ code: 'custom', message: problem, params: { rule: path } })
  }) as unknown as T
}

/** A plain number (fraction, factor) with the rule of its field. */
function num(path: string) {
  const rule = ruleFor(path)
  return ruled(z.number({ error: (iss) => (iss.input === undefined ? requiredText(rule) : `not a number: enter ${rule?.noun ?? 'a number'}`) }), path)
}

/** A quantity with the rule of its field. */
function q(kind: QuantityKind, path: string) {
  return ruled(quantity(kind, path), path)
}

/** A quantity of a given kind; the unit (when given) must be a unit of that kind. */
export function quantity(kind: QuantityKind, path?: string) {
  const info = QUANTITY_KINDS[kind]
  const rule = path ? ruleFor(path) : undefined
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
          ? requiredText(rule)
          : typeof iss.input === 'number'
            ? `not a number: enter ${rule?.noun ?? 'a number'}`
            : `expected a number (in ${info.caseUnit}) or { "value": number, "unit": "${info.caseUnit}" }`,
    },
  )
}

export const gasSchema = z
  .object({
    flow: q('molarFlow', 'gas.flow'),
    temperature: q('temperature', 'gas.temperature'),
    pressure: q('pressure', 'gas.pressure'),
    soluteMoleFraction: num('gas.soluteMoleFraction'),
    carrierMolarMass: q('molarMass', 'gas.carrierMolarMass').optional(),
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
      molarMass: q('molarMass', 'solute.molarMass').optional(),
    })
    .strict(),
], nameOrObject('solute'))

export const solventSchema = z.union([
  z.string().min(1),
  z
    .object({
      name: z.string().min(1).optional(),
      temperature: q('temperature', 'solvent.temperature').optional(),
      soluteMoleFraction: num('solvent.soluteMoleFraction').optional(),
      molarMass: q('molarMass', 'solvent.molarMass').optional(),
      density: q('density', 'solvent.density').optional(),
      viscosity: q('viscosity', 'solvent.viscosity').optional(),
      surfaceTension: q('surfaceTension', 'solvent.surfaceTension').optional(),
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
  z.object({ model: z.literal('constantK'), K: num('equilibrium.K') }).strict(),
  z
    .object({
      model: z.literal('henry'),
      Hcp: q('henrySolubility', 'equilibrium.Hcp').optional(),
      B: q('inverseTemperatureSlope', 'equilibrium.B').optional(),
    })
    .strict(),
  z
    .object({
      model: z.literal('modifiedRaoult'),
      gammaInf: num('equilibrium.gammaInf').optional(),
      activityModel: z.enum(['constant', 'margules']).optional(),
      antoine: antoineSchema.optional(),
      vapourPressure: q('pressure', 'equilibrium.vapourPressure').optional(),
    })
    .strict(),
  z
    .object({
      model: z.literal('table'),
      points: z.array(z.tuple([num('equilibrium.points.*.0'), num('equilibrium.points.*.1')])).min(2),
      /** Temperature the points were measured at (the engine warns when the column's differs). */
      temperature: q('temperature', 'equilibrium.temperature').optional(),
    })
    .strict(),
])

export const spacingRuleSchema = z
  .array(z.object({ maxDiameter: quantity('length'), spacing: quantity('length') }).strict())
  .min(1)

export const traySchema = z
  .object({
    holeDiameter: q('smallLength', 'tray.holeDiameter').optional(),
    holePitch: q('smallLength', 'tray.holePitch').optional(),
    thickness: q('smallLength', 'tray.thickness').optional(),
    spacing: z.union([z.literal('auto'), q('length', 'tray.spacing')]).optional(),
    floodFraction: num('tray.floodFraction').optional(),
    foamingFactor: num('tray.foamingFactor').optional(),
    weirHeight: q('smallLength', 'tray.weirHeight').optional(),
    downcomerClearance: q('smallLength', 'tray.downcomerClearance').optional(),
    turndownFraction: num('tray.turndownFraction').optional(),
    spacingRule: spacingRuleSchema.optional(),
  })
  .strict()

export const efficiencySchema = z.discriminatedUnion('model', [
  z.object({ model: z.literal('oconnell') }).strict(),
  z.object({ model: z.literal('fixed'), value: num('efficiency.value') }).strict(),
])

export const columnSchema = z
  .object({
    temperature: q('temperature', 'column.temperature').optional(),
    diameterStep: q('length', 'column.diameterStep').optional(),
    topAllowance: q('length', 'column.topAllowance').optional(),
    bottomAllowance: q('length', 'column.bottomAllowance').optional(),
  })
  .strict()

export const vesselSchema = z
  .object({
    designPressure: q('pressureGauge', 'vessel.designPressure').optional(),
    allowableStress: q('stress', 'vessel.allowableStress').optional(),
    jointEfficiency: num('vessel.jointEfficiency').optional(),
    corrosionAllowance: q('smallLength', 'vessel.corrosionAllowance').optional(),
    materialDensity: q('density', 'vessel.materialDensity').optional(),
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
  recovery: num('recovery'),
  solventFactor: num('solventFactor'),
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
