import { z } from 'zod'
import { requiredText, ruleProblem, type CaseFieldRule } from './caseRules.ts'

const month = z.string({ error: (iss) => (iss.input === undefined ? 'required: enter the month' : 'must be a month as YYYY-MM') }).regex(/^\d{4}-(0[1-9]|1[0-2])$/, 'must be a month as YYYY-MM')

/**
 * The rules of the logged month's numbers, in the shape of the case-field rules
 * (./caseRules.ts): limits in the logged unit (kmol/h, kW, fractions), messages in the person's
 * units and words ('120 %: recovery must be below 100 %', '-661.4 lbmol/h: the gas flow must be
 * positive'), the form's live check and the server's answer alike.
 */
export const OPERATING_FIELD_RULES = {
  gasFlow: { label: 'Gas flow', noun: 'the gas flow', shown: { kind: 'molarFlow' }, min: { value: 0, open: true }, max: { value: 1e6, open: false }, required: true, help: 'Mean gas flow into the column over the month.' },
  solventFlow: { label: 'Solvent flow', noun: 'the solvent flow', shown: { kind: 'molarFlow' }, min: { value: 0, open: true }, max: { value: 1e7, open: false }, required: true, help: 'Mean lean-solvent flow over the month.' },
  inletMoleFraction: { label: 'Inlet solute', noun: 'the inlet solute', shown: { scale: 100, unit: 'mol %' }, min: { value: 0, open: true }, max: { value: 1, open: true }, help: 'Mean solute in the entering gas; blank takes the approved design’s.' },
  outletMoleFraction: { label: 'Outlet gas solute (mole fraction)', noun: 'the outlet mole fraction', shown: { scale: 1, unit: '' }, min: { value: 0, open: false }, max: { value: 1, open: true }, help: 'Mean solute mole fraction in the gas leaving the top.' },
  recovery: { label: 'Recovery', noun: 'recovery', shown: { scale: 100, unit: '%' }, min: { value: 0, open: true }, max: { value: 1, open: true }, help: 'Share of the entering solute washed out of the gas.' },
  powerKw: { label: 'Power', noun: 'the power', shown: { scale: 1, unit: 'kW' }, min: { value: 0, open: false }, max: { value: 1e5, open: false }, help: 'Mean electric power of the pumps and fans of the unit.' },
} satisfies Record<string, CaseFieldRule>

export type OperatingNumberField = keyof typeof OPERATING_FIELD_RULES

/** What is wrong with a logged number, in the person's units, or null (the form's live check). */
export function operatingFieldProblem(field: OperatingNumberField, v: number): string | null {
  return ruleProblem(OPERATING_FIELD_RULES[field], v)
}

/** A number of the logged month with its rule: type, presence and range in the person's words. */
function ruledNumber(field: OperatingNumberField) {
  const rule: CaseFieldRule = OPERATING_FIELD_RULES[field]
  return z
    .number({ error: (iss) => (iss.input === undefined ? requiredText(rule) : `not a number: enter ${rule.noun}`) })
    .superRefine((v, ctx) => {
      const problem = ruleProblem(rule, v)
      if (problem) ctx.addIssue({ code: 'custom', message: problem, params: { rule: field } })
    })
}

/** One month of a running unit. Flows in kmol/h, power in kW, fractions 0..1. */
export const operatingEntryBody = z
  .object({
    month,
    gasFlow: ruledNumber('gasFlow'),
    solventFlow: ruledNumber('solventFlow'),
    /** Inlet gas solute mole fraction of the month; absent: the approved design's. */
    inletMoleFraction: ruledNumber('inletMoleFraction').nullable().optional(),
    outletMoleFraction: ruledNumber('outletMoleFraction').nullable().optional(),
    recovery: ruledNumber('recovery').nullable().optional(),
    powerKw: ruledNumber('powerKw').nullable().optional(),
    notes: z.string().max(2000, 'must be at most 2,000 characters').default(''),
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
