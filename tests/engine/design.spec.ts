import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { toSI } from '../../shared/units.ts'
import { caseToSI, evaluateBatch, evaluateCase, ENGINE_VERSION, InfeasibleDesignError, InvalidInputError } from '../../server/engine/index.ts'
import { designSI } from '../../server/engine/design.ts'

const demo = JSON.parse(readFileSync('data/examples/design.json', 'utf8')) as Record<string, unknown>
const demoGas = demo.gas as Record<string, unknown>

/** The demo ethanol case written out in full (no library names). */
const demoCase = {
  gas: { flow: 420, temperature: 32, pressure: 115, soluteMoleFraction: 0.015, carrierMolarMass: 44.01 },
  solute: { molarMass: 46.07 },
  solvent: { temperature: 30, soluteMoleFraction: 0, molarMass: 18.015, density: 995, viscosity: 0.8, surfaceTension: 70 },
  equilibrium: { model: 'constantK', K: 0.62 },
  recovery: 0.985,
  solventFactor: 1.35,
  tray: { holeDiameter: 4.5, holePitch: 12, thickness: 2, spacing: 0.6, floodFraction: 0.78, foamingFactor: 0.9, weirHeight: 50 },
  efficiency: { model: 'oconnell' },
}

function errorOf(f: () => unknown): unknown {
  try {
    f()
  } catch (e) {
    return e
  }
  return null
}

describe('the demo case, looked at as an engineer would', () => {
  const r = evaluateCase(demoCase)
  const s = r.summary
  it('a ~1-1.5 m column with 10-25 trays (O\'Connell about 50 %)', () => {
    expect(s.selectedDiameter).toBeGreaterThanOrEqual(1)
    expect(s.selectedDiameter).toBeLessThanOrEqual(1.6)
    expect(s.actualTrays).toBeGreaterThanOrEqual(10)
    expect(s.actualTrays).toBeLessThanOrEqual(25)
    expect(s.overallEfficiency).toBeGreaterThan(0.4)
    expect(s.overallEfficiency).toBeLessThan(0.6)
  })
  it('common practice: flooding velocity of a few m/s for an atmospheric absorber (double digits = an error)', () => {
    expect(s.floodingVelocity).toBeGreaterThan(1)
    expect(s.floodingVelocity).toBeLessThan(5)
  })
  it('material balance closes: absorbed + lost = in; minimum solvent ~ K r V (dilute)', () => {
    expect(s.soluteAbsorbed + s.soluteLost).toBeCloseTo(s.soluteInGas, 9)
    expect(s.soluteAbsorbed / s.soluteInGas).toBeCloseTo(0.985, 12)
    // the summary is SI (mol/s): the demo's 420 kmol/h of gas through the units library
    const V = toSI('molarFlow', 420)
    expect(s.minimumSolventFlow / (0.62 * 0.985 * V)).toBeGreaterThan(0.95)
    expect(s.minimumSolventFlow / (0.62 * 0.985 * V)).toBeLessThan(1.01)
    expect(s.solventFlow / s.minimumSolventFlow).toBeCloseTo(1.35, 12)
  })
  it('selected diameter is the calculated one rounded up to 0.05 m; tray pressure drop a few hundred Pa', () => {
    expect(s.selectedDiameter).toBeGreaterThanOrEqual(s.diameter)
    expect(s.selectedDiameter - s.diameter).toBeLessThan(0.05 + 1e-9)
    expect(s.pressureDropPerTray).toBeGreaterThan(200)
    expect(s.pressureDropPerTray).toBeLessThan(1200)
    expect(s.columnHeight).toBeCloseTo(s.actualTrays * 0.6 + 1 + 3, 9)
  })
  it('carries the vessel caution and all seven checks', () => {
    expect(r.cautions[0]).toMatch(/Preliminary estimate only/)
    expect(r.checks.map((c) => c.key).sort()).toEqual(['downcomerBackup', 'downcomerResidence', 'entrainment', 'flooding', 'pressureDropPerTray', 'turndown', 'weeping'])
    for (const c of r.checks) expect(['pass', 'warn', 'fail']).toContain(c.status)
  })
  it('hazard cautions from the library: flammable ethanol, asphyxiant CO2', () => {
    const d = evaluateCase(demo)
    expect(d.cautions.some((c) => /Ethanol is flammable/.test(c))).toBe(true)
    expect(d.cautions.some((c) => /asphyxiant/.test(c))).toBe(true)
    const a = evaluateCase({ ...demoCase, solute: 'ammonia', equilibrium: { model: 'henry' } })
    expect(a.cautions.some((c) => /toxic/.test(c))).toBe(true)
  })
  it('common practice: foaming factor about 0.9 for alcohol absorbers (Kister 1992, from memory) widens the column by 1/sqrt(0.9)', () => {
    expect((demo.tray as { foamingFactor: number }).foamingFactor).toBe(0.9)
    const d09 = evaluateCase(demoCase).summary.diameter
    const d10 = evaluateCase({ ...demoCase, tray: { ...demoCase.tray, foamingFactor: 1 } }).summary.diameter
    expect(d09 / d10).toBeCloseTo(1 / Math.sqrt(0.9), 9)
  })
  it('version constant', () => expect(ENGINE_VERSION).toMatch(/^\d+\.\d+\.\d+$/))
})

describe('Kremser and stage-by-stage agree within 1 % on dilute linear cases', () => {
  // dilute in both phases: rich liquid x_N below about 0.03
  const grid: [number, number][] = [[0.001, 0.3], [0.005, 0.3], [0.001, 0.62], [0.01, 0.62], [0.03, 0.62], [0.001, 2], [0.01, 2], [0.03, 2]]
  for (const [y, K] of grid) {
    {
      it(`y_in = ${y}, K = ${K}`, () => {
        const base = { ...demoCase, gas: { ...demoCase.gas, soluteMoleFraction: y }, equilibrium: { model: 'constantK', K } }
        const a = evaluateCase({ ...base, method: 'kremser' }).summary
        const b = evaluateCase({ ...base, method: 'stageByStage' }).summary
        expect(Math.abs(b.theoreticalStages / a.theoreticalStages - 1)).toBeLessThan(0.01)
        expect(Math.abs(b.minimumSolventFlow / a.minimumSolventFlow - 1)).toBeLessThan(0.01)
      })
    }
  }
  it('auto picks stage-by-stage for tables, Margules curvature and y_in > 0.05 (common practice)', () => {
    expect(evaluateCase(demoCase).profile.method).toBe('kremser')
    expect(evaluateCase({ ...demoCase, gas: { ...demoCase.gas, soluteMoleFraction: 0.08 } }).profile.method).toBe('stageByStage')
    expect(evaluateCase(JSON.parse(readFileSync('data/examples/design-table.json', 'utf8'))).profile.method).toBe('stageByStage')
    expect(evaluateCase({ ...demo, equilibrium: { model: 'modifiedRaoult', activityModel: 'margules' } }).profile.method).toBe('stageByStage')
  })
})

describe('optimiser variables and options', () => {
  const c = caseToSI(demoCase)
  it('vars override recovery, solvent factor, spacing and flood fraction', () => {
    const r = designSI(c, { recovery: 0.95, solventFactor: 2, traySpacing: 0.45, floodFraction: 0.7 })
    expect(r.summary.recovery).toBe(0.95)
    expect(r.summary.solventFactor).toBe(2)
    expect(r.summary.traySpacing).toBe(0.45)
    expect(r.summary.floodFraction).toBe(0.7)
  })
  it('extra trays raise the achievable recovery; too few trays is infeasible', () => {
    const base = designSI(c)
    const more = designSI(c, { actualTrays: base.summary.actualTrays + 5 })
    expect(more.summary.actualTrays).toBe(base.summary.actualTrays + 5)
    expect(more.summary.achievedRecovery!).toBeGreaterThan(0.985)
    const e = errorOf(() => designSI(c, { actualTrays: 2 }))
    expect(e).toBeInstanceOf(InfeasibleDesignError)
    expect((e as InfeasibleDesignError).issues[0]!.code).toBe('tooFewTrays')
    const sbs = caseToSI({ ...demoCase, method: 'stageByStage' })
    const m2 = designSI(sbs, { actualTrays: designSI(sbs).summary.actualTrays + 5 })
    expect(m2.summary.achievedRecovery!).toBeGreaterThan(0.985)
  })
  it('lean result without profile and detail gives the same summary', () => {
    const a = designSI(c)
    const b = designSI(c, undefined, { profile: false, detail: false })
    expect(b.summary).toEqual(a.summary)
    expect(b.profile.stages).toHaveLength(0)
  })
  it('spacing "auto" converges to the rule and records the iterations', () => {
    const r = evaluateCase({ ...demoCase, tray: { ...demoCase.tray, spacing: 'auto' } })
    expect(r.summary.traySpacing).toBe(0.6) // 1.45 m -> 0.6 m
    const small = evaluateCase({ ...demoCase, gas: { ...demoCase.gas, flow: 60 }, tray: { ...demoCase.tray, spacing: 'auto' } })
    expect(small.summary.selectedDiameter).toBeLessThanOrEqual(1)
    expect(small.summary.traySpacing).toBe(0.5)
  })
  it('an oscillating custom spacing rule settles on the larger spacing with a warning', () => {
    // a rule where 0.3 m spacing needs > 1 m but 0.9 m spacing allows < 1 m
    const r = evaluateCase({
      ...demoCase,
      gas: { ...demoCase.gas, flow: 190 },
      tray: { ...demoCase.tray, spacing: 'auto', spacingRule: [{ maxDiameter: 1, spacing: 0.3 }, { maxDiameter: 10, spacing: 0.9 }] },
    })
    expect(r.warnings.some((w) => w.code === 'spacingOscillation')).toBe(true)
    expect(r.summary.traySpacing).toBe(0.9)
  })
})

describe('infeasible designs come back as structured reasons', () => {
  const c = caseToSI(demoCase)
  const cases: [string, () => unknown, string][] = [
    ['solvent factor <= 1', () => designSI(c, { solventFactor: 1 }), 'belowMinimumSolvent'],
    ['recovery outside (0, 1)', () => designSI(c, { recovery: 1 }), 'recoveryOutOfRange'],
    ['lean solvent loaded beyond the target (y_out <= K x0)', () => evaluateCase({ ...demoCase, solvent: { ...demoCase.solvent, soluteMoleFraction: 0.001 } }), 'leanSolventLoaded'],
    ['flooding impossible (capacity factor <= 0 at a huge liquid load)', () => evaluateCase({ ...demoCase, equilibrium: { model: 'constantK', K: 200 }, solventFactor: 3, tray: { ...demoCase.tray, spacing: 0.15 } }), 'flooding'],
    ['equilibrium outside the model (x* >= 1)', () => evaluateCase({ ...demoCase, equilibrium: { model: 'constantK', K: 0.01 } }), 'equilibriumOutOfRange'],
    [
      'gas above its dew point (Margules, cold column)',
      () => evaluateCase({ ...demo, gas: { ...demoGas, soluteMoleFraction: 0.143, temperature: 5 }, solvent: { name: 'water', temperature: 5 }, equilibrium: { model: 'modifiedRaoult', activityModel: 'margules' } }),
      'equilibriumOutOfRange',
    ],
  ]
  for (const [what, f, code] of cases) {
    it(what, () => {
      const e = errorOf(f)
      expect(e).toBeInstanceOf(InfeasibleDesignError)
      expect((e as InfeasibleDesignError).issues.map((i) => i.code)).toContain(code)
      expect((e as InfeasibleDesignError).issues[0]!.message.length).toBeGreaterThan(10)
    })
  }
})

describe('bad input gives InvalidInputError with the field path', () => {
  const bad: [string, unknown, string][] = [
    ['negative gas flow', { ...demoCase, gas: { ...demoCase.gas, flow: -3 } }, 'gas.flow'],
    ['missing pressure', { ...demoCase, gas: { ...demoCase.gas, pressure: undefined } }, 'gas.pressure'],
    ['unknown unit', { ...demoCase, gas: { ...demoCase.gas, flow: { value: 3, unit: 'bushel/h' } } }, 'gas.flow.unit'],
    ['wrong-dimension unit', { ...demoCase, tray: { ...demoCase.tray, holeDiameter: { value: 3, unit: 'kg' } } }, 'tray.holeDiameter.unit'],
    ['unknown component', { ...demoCase, solute: 'unobtainium' }, 'solute'],
    ['unknown carrier', { ...demoCase, gas: { ...demoGas, carrier: 'argonite' } }, 'gas.carrier'],
    ['recovery of 1', { ...demoCase, recovery: 1 }, 'recovery'],
    ['mole fraction above 1', { ...demoCase, gas: { ...demoCase.gas, soluteMoleFraction: 1.2 } }, 'gas.soluteMoleFraction'],
    ['NaN-like string', { ...demoCase, solventFactor: 'lots' }, 'solventFactor'],
    ['unsorted table', { ...demoCase, equilibrium: { model: 'table', points: [[0, 0], [0.2, 0.1], [0.1, 0.2]] } }, 'equilibrium.points.2'],
    ['unknown equilibrium model', { ...demoCase, equilibrium: { model: 'magic' } }, 'equilibrium.model'],
    ['typo in a section', { ...demoCase, tray: { ...demoCase.tray, holeDiamter: 4 } }, 'tray'],
    ['temperature below absolute zero', { ...demoCase, gas: { ...demoCase.gas, temperature: { value: -5, unit: 'K' } } }, 'gas.temperature'],
    ['pitch smaller than holes', { ...demoCase, tray: { ...demoCase.tray, holePitch: 4 } }, 'tray.holePitch'],
    ['missing solvent properties without a library solvent', { ...demoCase, solvent: { temperature: 30 } }, 'solvent.molarMass'],
    ['not an object', 42, ''],
  ]
  for (const [what, raw, path] of bad) {
    it(what, () => {
      const e = errorOf(() => evaluateCase(raw))
      expect(e).toBeInstanceOf(InvalidInputError)
      const ie = e as InvalidInputError
      expect(ie.issues.map((i) => i.path).some((p) => p.startsWith(path))).toBe(true)
      expect(ie.reason.length).toBeGreaterThan(3)
    })
  }
  it('batch errors name the case index', () => {
    const e = errorOf(() => evaluateBatch({ cases: [demoCase, { ...demoCase, gas: { ...demoCase.gas, flow: -1 } }] }))
    expect(e).toBeInstanceOf(InvalidInputError)
    expect((e as InvalidInputError).path).toBe('cases.1.gas.flow')
  })
  it('a batch returns results in order', () => {
    const r = evaluateBatch({ cases: [demoCase, { ...demoCase, recovery: 0.9 }] })
    expect(r).toHaveLength(2)
    expect((r[1] as { summary: { recovery: number } }).summary.recovery).toBe(0.9)
  })
})

describe('units in case files', () => {
  it('US customary inputs give the same design as SI inputs', () => {
    const si = evaluateCase(demoCase).summary
    const us = evaluateCase({
      ...demoCase,
      gas: {
        ...demoCase.gas,
        flow: { value: 420 / 0.45359237, unit: 'lbmol/h' },
        temperature: { value: 32 * 1.8 + 32, unit: 'degF' },
        pressure: { value: 115000 / 6894.757293168, unit: 'psia' },
      },
      tray: { ...demoCase.tray, holeDiameter: { value: 4.5 / 25.4, unit: 'in' }, spacing: { value: 0.6 / 0.3048, unit: 'ft' } },
      solvent: { ...demoCase.solvent, viscosity: { value: 0.8, unit: 'cP' }, surfaceTension: { value: 70, unit: 'dyn/cm' } },
    }).summary
    expect(us.selectedDiameter).toBeCloseTo(si.selectedDiameter, 9)
    expect(us.theoreticalStages).toBeCloseTo(si.theoreticalStages, 9)
    expect(us.diameter).toBeCloseTo(si.diameter, 9)
  })
})
