/**
 * The case field rules: defaults shown on the form are the engine's, messages name the value in
 * the person's units, and every rule with a typical range keeps its default inside its limits.
 */
import { describe, expect, it } from 'vitest'
import { CASE_FIELD_RULES, defaultText, helpText, ruleFor, ruleProblem, typicalText } from '../../shared/schemas/caseRules.ts'
import { caseSchema } from '../../shared/schemas/case.ts'
import { CASE_DEFAULTS } from '../../server/engine/case.ts'
import { toSI } from '../../shared/units.ts'
import demo from '../../data/demo-studies.json' with { type: 'json' }

/** The engine default of a path in SI, for the defaults that are numbers. */
const engineDefaults: Record<string, [number, 'smallLength' | 'length' | 'stress' | 'density' | null]> = {
  'tray.holeDiameter': [CASE_DEFAULTS.tray.holeDiameter, 'smallLength'],
  'tray.holePitch': [CASE_DEFAULTS.tray.holePitch, 'smallLength'],
  'tray.thickness': [CASE_DEFAULTS.tray.thickness, 'smallLength'],
  'tray.weirHeight': [CASE_DEFAULTS.tray.weirHeight, 'smallLength'],
  'tray.floodFraction': [CASE_DEFAULTS.tray.floodFraction, null],
  'tray.foamingFactor': [CASE_DEFAULTS.tray.foamingFactor, null],
  'tray.turndownFraction': [CASE_DEFAULTS.tray.turndownFraction, null],
  'column.diameterStep': [CASE_DEFAULTS.column.diameterStep, 'length'],
  'column.topAllowance': [CASE_DEFAULTS.column.topAllowance, 'length'],
  'column.bottomAllowance': [CASE_DEFAULTS.column.bottomAllowance, 'length'],
  'vessel.allowableStress': [CASE_DEFAULTS.vessel.allowableStress, 'stress'],
  'vessel.jointEfficiency': [CASE_DEFAULTS.vessel.jointEfficiency, null],
  'vessel.corrosionAllowance': [CASE_DEFAULTS.vessel.corrosionAllowance, 'smallLength'],
  'vessel.materialDensity': [CASE_DEFAULTS.vessel.materialDensity, 'density'],
}

describe('case field rules', () => {
  it('the default each blank field shows is the one the engine takes', () => {
    for (const [path, [si, kind]] of Object.entries(engineDefaults)) {
      const rule = ruleFor(path)!
      expect(typeof rule.default, path).toBe('number')
      const shown = kind ? toSI(kind, rule.default as number) : (rule.default as number)
      expect(shown, path).toBeCloseTo(si, 9)
    }
  })

  it('defaults and typical ranges keep the hard limits', () => {
    for (const [path, rule] of Object.entries(CASE_FIELD_RULES)) {
      const values = [...(rule.typical ?? []), ...(typeof rule.default === 'number' ? [rule.default] : [])]
      for (const v of values) expect(ruleProblem(rule, v, null), `${path} ${v}`).toBeNull()
      expect(rule.help.length, path).toBeGreaterThan(10)
    }
  })

  it('names the value in the person\'s unit system', () => {
    const flow = ruleFor('gas.flow')!
    expect(ruleProblem(flow, -300, 'SI')).toBe('-300 kmol/h: the gas flow must be positive')
    // 1 lb = 0.45359237 kg exactly (NIST SP 811 B.8): 300 kmol/h = 661.39 lbmol/h
    expect(ruleProblem(flow, -300, 'US')).toBe('-661.4 lbmol/h: the gas flow must be positive')
    expect(ruleProblem(flow, { value: -83.3333, unit: 'mol/s' }, 'SI')).toBe('-300 kmol/h: the gas flow must be positive')
    expect(ruleProblem(ruleFor('recovery')!, 1.2, 'US')).toBe('120 %: recovery must be below 100 %')
    expect(ruleProblem(ruleFor('solventFactor')!, 0.8, 'SI')).toBe('0.8: L/Lmin must be above 1')
    expect(ruleProblem(ruleFor('gas.temperature')!, -300, 'SI')).toBe('-300 °C: the gas temperature must be above absolute zero')
    expect(ruleProblem(ruleFor('column.topAllowance')!, -1, 'US')).toBe('-3.281 ft: the space above the top tray must not be negative')
    expect(ruleProblem(ruleFor('equilibrium.points.3.1')!, 1, null)).toBe('1: y must be below 1')
  })

  it('typical ranges and defaults in each unit system', () => {
    expect(typicalText(ruleFor('tray.holeDiameter')!, 'SI')).toBe('3–12 mm')
    // 25.4 mm = 1 in exactly
    expect(typicalText(ruleFor('tray.holeDiameter')!, 'US')).toBe('0.118–0.472 in')
    expect(defaultText(ruleFor('tray.holeDiameter')!, 'US')).toBe('0.1772 in')
    expect(defaultText(ruleFor('tray.holeDiameter')!, 'US', true)).toBe('0.1772')
    expect(typicalText(ruleFor('recovery')!, 'US')).toBe('90–99.5 %')
  })

  it('the schema lists every problem of a case at once, the demo study has none', () => {
    expect(caseSchema.safeParse(demo.studies[0]!.inputs).success).toBe(true)
    const inputs = demo.studies[0]!.inputs as { gas: object } & Record<string, unknown>
    const r = caseSchema.safeParse({ ...inputs, gas: { ...inputs.gas, flow: -300 }, recovery: 1.2, solventFactor: 0.8 })
    expect(r.success).toBe(false)
    expect(r.error!.issues.map((i) => i.path.join('.')).sort()).toEqual(['gas.flow', 'recovery', 'solventFactor'])
  })
})

describe('help and default words in the person\'s units', () => {
  it('puts the values of the words into the unit system', () => {
    // 101.325 kPa = 14.70 psi (1 psi = 6.894757 kPa, NIST SP 811 B.8)
    expect(helpText(ruleFor('gas.pressure')!, 'US')).toBe('Absolute pressure in the column; atmospheric is 14.7 psi.')
    expect(helpText(ruleFor('gas.pressure')!, 'SI')).toBe('Absolute pressure in the column; atmospheric is 101 kPa.')
    // 10 mm = 0.394 in (25.4 mm = 1 in exactly)
    expect(defaultText(ruleFor('tray.downcomerClearance')!, 'US')).toBe('the weir height less 0.394 in')
  })
})
