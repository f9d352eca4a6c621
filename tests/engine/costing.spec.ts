import { describe, expect, it } from 'vitest'
import type { DesignSummary } from '../../server/engine/contract.ts'
import type { DesignSummary as PublicDesignSummary } from '../../shared/schemas/results.ts'
import { summaryToSI } from '../../shared/summaryUnits.ts'
import {
  bareModuleFactorTurton,
  capitalRecoveryFactor,
  costDesign,
  costFromCurve,
  escalateCost,
  platformsCost,
  pressureFactorVesselTurton,
  trayCountFactor,
} from '../../server/engine/costing/index.ts'
import { listPresets, loadPreset } from '../../server/engine/costing/presets.ts'
import { costBasisFieldMeta, costBasisSchema, type CostBasisData } from '../../shared/schemas/costBasis.ts'

/** Published check: value within a relative tolerance matching the digits printed in the source. */
function near(actual: number, expected: number, relTol: number): void {
  expect(Math.abs(actual - expected) / Math.abs(expected)).toBeLessThanOrEqual(relTol)
}

const FT = 0.3048
const IN = 0.0254
const LB = 0.45359237

const seider = loadPreset('seider-3rd-ce500')
const turton = loadPreset('turton-3rd-cepci397')

describe('capital recovery factor — compound-interest tables (A/P)', () => {
  // source: standard compound-interest tables, A/P column; values derived from the formula [D]
  const cases: [number, number, number][] = [
    [0.1, 10, 0.162745],
    [0.08, 20, 0.101852],
    [0.15, 10, 0.199252],
    [0.12, 15, 0.146824],
  ]
  for (const [i, n, expected] of cases) {
    it(`i = ${i}, n = ${n} -> ${expected} (A/P tables)`, () => {
      near(capitalRecoveryFactor(i, n), expected, 5e-6)
    })
  }
  it('limit i -> 0 is 1/n (definition of a uniform series without interest)', () => {
    expect(capitalRecoveryFactor(0, 8)).toBeCloseTo(0.125, 12)
    near(capitalRecoveryFactor(1e-9, 8), 0.125, 1e-6)
  })
})

describe('cost-index escalation — CEPCI annual averages', () => {
  it('Turton Example 7.13: tray C_p $4,569.4 at CEPCI 397 -> $5,756 at CEPCI 500 (book prints $5,756)', () => {
    // source: Turton et al. 3rd ed., Example 7.13 (page with "Update the cost from 2001 (CEPCI - 397)")
    near(escalateCost(4569.4, 397, 500), 5756, 5e-4)
  })
  it('CEPCI 2001 -> 2023 annual averages 394.3 -> 797.9 doubles the cost ×2.0236 (CEPCI table)', () => {
    // source: CEPCI annual averages (Chemical Engineering magazine), 2001 = 394.3, 2023 = 797.9
    near(escalateCost(1000, 394.3, 797.9), 2023.6, 5e-5)
  })
})

describe('Seider et al. 3rd ed. correlations (coefficients from memory; check values computed from them [D from M])', () => {
  it('tower shell C_V(W = 10,897 lb) = $57,394 at CE 500 [from memory]', () => {
    near(costFromCurve(10897 * LB, seider.correlations.shell.curve), 57394, 5e-5)
  })
  it('platforms and ladders C_PL(D = 5 ft, L = 50 ft) = $19,182 at CE 500 [from memory]', () => {
    const p = seider.correlations.platforms
    near(platformsCost(5 * FT, 50 * FT, p.multiplier, p.diameterExponent, p.heightExponent, p.lengthFactor), 19182, 5e-5)
  })
  it('tray base cost C_BT(D_i = 5 ft) = $1,116.5 at CE 500 [from memory]', () => {
    near(costFromCurve(5 * FT, seider.correlations.trays.curve), 1116.5, 5e-5)
  })
  it('tray count factor F_NT(5) = 1.8369, F_NT(10) = 1.4997, 1 at N >= 20 [from memory]', () => {
    const t = seider.correlations.trays
    near(trayCountFactor(5, t.countFactorForm, t.countFactorCoefficients, t.countFactorBelow), 1.8369, 5e-5)
    near(trayCountFactor(10, t.countFactorForm, t.countFactorCoefficients, t.countFactorBelow), 1.4997, 5e-5)
    expect(trayCountFactor(25, t.countFactorForm, t.countFactorCoefficients, t.countFactorBelow)).toBe(1)
  })
})

describe('Turton et al. 3rd ed., Appendix A and Example 7.13', () => {
  it('Example 7.13: 40 stainless sieve trays, 3 m -> C_BM = $421,300 at CEPCI 500 (F_BM 1.83, F_q = 1)', () => {
    // source: Turton et al. 3rd ed., Example 7.13 (printed $5,756 × 40 × 1.83 × 1.0 = $421,300)
    const t = turton.correlations.trays
    const A = (Math.PI / 4) * 3 ** 2
    const Fq = trayCountFactor(40, t.countFactorForm, t.countFactorCoefficients, t.countFactorBelow)
    expect(Fq).toBe(1)
    const cbm = escalateCost(costFromCurve(A, t.curve), 397, 500) * 40 * 1.83 * Fq
    near(cbm, 421300, 5e-4)
  })
  it('Example 7.13: tower 3 m × 30 m at 20 barg -> F_P = 6.4709 [D] and C_BM = $6,486,000 at CEPCI 500 (F_M 3.11)', () => {
    // source: Turton et al. 3rd ed., eq. 7.10 and Example 7.13 (tower $6,486,000 printed)
    const FP = pressureFactorVesselTurton(20, 3)
    near(FP, 6.4709, 2e-5)
    const V = (Math.PI / 4) * 3 ** 2 * 30
    const cp = escalateCost(costFromCurve(V, turton.correlations.shell.curve), 397, 500)
    near(cp * bareModuleFactorTurton(2.25, 1.82, 3.11, FP), 6486000, 5e-4)
  })
  it('F_q at N = 1 / 5 / 10 / 19 -> 3.000 / 2.328 / 1.640 / 1.043 [D from Appendix A]', () => {
    const t = turton.correlations.trays
    const fq = (n: number) => trayCountFactor(n, t.countFactorForm, t.countFactorCoefficients, t.countFactorBelow)
    near(fq(1), 3.0, 2e-4)
    near(fq(5), 2.328, 2e-4)
    near(fq(10), 1.64, 3e-4)
    near(fq(19), 1.043, 5e-4)
  })
  it('centrifugal pump C_p at 1 / 10 / 100 kW -> $2,450 / $3,950 / $12,930 (2001) [D from Appendix A]', () => {
    const c = turton.correlations.pump.curve
    near(costFromCurve(1000, c), 2450, 2e-4)
    near(costFromCurve(10000, c), 3950, 2e-4)
    near(costFromCurve(100000, c), 12930, 2e-4)
  })
  it('radial fan C_p at 1 / 10 / 100 m3/s -> $3,460 / $4,300 / $42,005 (2001) [D from Appendix A]', () => {
    const c = turton.correlations.blower.curve
    near(costFromCurve(1, c), 3460, 5e-4)
    near(costFromCurve(10, c), 4300, 5e-4)
    near(costFromCurve(100, c), 42005, 2e-4)
  })
  it('pressure factor floors at 1 and is 1.25 under vacuum below -0.5 barg (eq. 7.10 as published)', () => {
    expect(pressureFactorVesselTurton(0.5, 1)).toBe(1)
    expect(pressureFactorVesselTurton(-0.8, 1)).toBe(1.25)
  })
})

/**
 * A design summary typed by hand (not an engine output) for pricing checks, written in the public
 * units (kmol/h, kg/h, m3/h) and handed to the engine in SI through the edge's conversion.
 */
function summary(over: Partial<PublicDesignSummary> = {}): DesignSummary {
  return summaryToSI({
    minimumSolventFlow: 300,
    solventFlow: 450,
    absorptionFactor: 1.5,
    theoreticalStages: 6.2,
    actualTrays: 14,
    outletGasSoluteMoleFraction: 0.0003,
    richSolventSoluteMoleFraction: 0.02,
    gasDensity: 1.8,
    flowParameter: 0.08,
    capacityFactor: 0.08,
    floodingVelocity: 1.9,
    downcomerAreaFraction: 0.1,
    holeAreaFraction: 0.1,
    traySpacing: 0.6,
    diameter: 1.45,
    selectedDiameter: 5 * FT,
    pressureDropPerTray: 700,
    columnPressureDrop: 9800,
    columnHeight: 50 * FT,
    recovery: 0.98,
    solventFactor: 1.5,
    floodFraction: 0.75,
    gasFlow: 300,
    gasVolumetricFlow: 1.9,
    solventMassFlow: 8100,
    solventVolumetricFlow: 8.12,
    soluteInGas: 200,
    soluteAbsorbed: 196,
    soluteLost: 4,
    operatingPressure: 110000,
    designPressure: 150000,
    shellThickness: 0.3125 * IN,
    shellMass: 10897 * LB,
    percentFlood: 72,
    fractionOfFloodTarget: 0.75,
    ...over,
  })
}

describe('costDesign — items, escalation, installation and annualisation', () => {
  it('shell, platforms and trays match the Seider check values escalated to the basis index', () => {
    const b: CostBasisData = structuredClone(seider)
    b.general.targetIndex = 797.9
    b.materials.shellMassSource = 'design'
    const r = costDesign(summary(), b)
    const esc = 797.9 / 500 // CEPCI 2023 annual average / CE 500
    const item = (k: string) => r.capital.find((c) => c.key === k)
    near(item('shell')?.purchased ?? 0, 57394 * esc, 5e-5) // Seider [from memory]
    near(item('platforms')?.purchased ?? 0, 19182 * esc, 5e-5) // Seider [from memory]
    // 14 trays: 14 × F_NT(14) × $1,116.5 (Seider [from memory]); F_NT = 2.25/1.0414^14
    near(item('trays')?.purchased ?? 0, 14 * (2.25 / 1.0414 ** 14) * 1116.5 * esc, 5e-5)
    near(item('shell')?.installed ?? 0, 57394 * esc * 4.16, 5e-5)
  })

  it('Turton basis: trays by area with F_q; 40 trays of 3 m -> 40 × $4,569.4 at CEPCI 397 (Example 7.13 reproduction [D])', () => {
    const r = costDesign(summary({ selectedDiameter: 3, columnHeight: 30, actualTrays: 40 }), turton)
    const trays = r.capital.find((c) => c.key === 'trays')
    near(trays?.purchased ?? 0, 40 * 4569.4, 5e-5)
    // shell by volume: V = π/4 · 3² · 30 = 212.06 m³ -> C_p° = $132,466 (2001) [D from Appendix A]
    near(r.capital.find((c) => c.key === 'shell')?.purchased ?? 0, 132466, 5e-5)
    // pump by shaft power: log10 C = 3.3892 + 0.0536 log10 W + 0.1538 (log10 W)², W in kW (Appendix A)
    const s = summary({ selectedDiameter: 3, columnHeight: 30 })
    const rho = s.solventMassFlow / s.solventVolumetricFlow
    const head = 30 + (s.operatingPressure - 101325) / (rho * 9.80665) + turton.drives.pumpHeadAllowance
    const W = (rho * 9.80665 * s.solventVolumetricFlow * head) / turton.drives.pumpEfficiency / 1000
    const lw = Math.log10(W)
    near(r.capital.find((c) => c.key === 'pump')?.purchased ?? 0, 10 ** (3.3892 + 0.0536 * lw + 0.1538 * lw * lw), 1e-9)
  })

  it('operating items follow their definitions (flow × hours × price; power = ρgQH/η)', () => {
    const b: CostBasisData = structuredClone(seider)
    b.utilities = { electricityPrice: 0.1, solventCost: 0.5, productValue: 0.6, emissionCharge: 0.3 }
    const s = summary()
    const r = costDesign(s, b)
    const h = b.general.operatingHours
    near(r.annual.solvent, 8.12 * h * 0.5, 1e-12)
    near(r.annual.lostProduct, 4 * h * 0.6, 1e-12)
    near(r.annual.emissionCharge, 4 * h * 0.3, 1e-12)
    const rho = 8100 / 8.12
    const head = s.columnHeight + (110000 - 101325) / (rho * 9.80665) + b.drives.pumpHeadAllowance
    const pumpW = (rho * 9.80665 * (8.12 / 3600) * head) / (b.drives.pumpEfficiency * b.drives.motorEfficiency)
    near(r.annual.pumpElectricity, (pumpW / 1000) * h * 0.1, 1e-12)
    const blowerW = (1.9 * (9800 + b.drives.blowerPressureAllowance)) / (b.drives.blowerEfficiency * b.drives.blowerMotorEfficiency)
    near(r.annual.blowerElectricity, (blowerW / 1000) * h * 0.1, 1e-12)
  })

  it('TAC = CRF × installed capital + operating, and equals the sum of the items', () => {
    const b = loadPreset('halvard-cobalt-ridge')
    const r = costDesign(summary(), b)
    const crf = capitalRecoveryFactor(b.capital.interestRate, b.capital.economicLife)
    near(r.totalAnnualCost, crf * r.installedCapital + r.operatingCost, 1e-12)
    const sum = Object.values(r.annual).reduce((a, v) => a + v, 0)
    near(r.totalAnnualCost, sum, 1e-12)
    near(r.costPerKgRecovered, r.totalAnnualCost / (196 * b.general.operatingHours), 1e-12)
    near(r.installedCapital, r.capital.reduce((a, c) => a + c.installed, 0) * b.capital.contingencyFactor, 1e-12)
  })

  it('cost index scales every capital item linearly (escalation C_B = C_A I_B/I_A)', () => {
    const a = loadPreset('seider-3rd-ce500')
    const b = structuredClone(a)
    b.general.targetIndex = 1000
    near(costDesign(summary(), b).purchasedCapital, 2 * costDesign(summary(), a).purchasedCapital, 1e-12)
  })

  it('outside a correlation range: a warning, and the cost is extrapolated, not clamped', () => {
    const small = summary({ selectedDiameter: 0.4, columnHeight: 4, shellMass: 250 })
    const r = costDesign(small, seider)
    expect(r.warnings.some((w) => w.code === 'costOutsideValidity' && w.path === 'correlations.shell')).toBe(true)
    // extrapolated: the tray cost follows the curve at 0.4 m (1.31 ft), below its 2 ft minimum
    const trays = r.capital.find((c) => c.key === 'trays')
    near(trays?.purchased ?? 0, 14 * (2.25 / 1.0414 ** 14) * 468 * Math.exp(0.1739 * 0.4 / FT), 1e-6)
  })
})

describe('cost-basis schema and presets', () => {
  it('every preset parses and names its source and cost-index year', () => {
    const list = listPresets()
    expect(list.length).toBeGreaterThanOrEqual(4)
    for (const p of list) {
      const b = loadPreset(p.key)
      expect(costBasisSchema.safeParse(b).success).toBe(true)
      expect(b.sources.length).toBeGreaterThan(0)
      expect(b.general.targetYear.length).toBeGreaterThan(0)
      for (const k of ['shell', 'trays', 'pump', 'motor', 'blower'] as const) {
        expect(b.correlations[k].curve.source.length).toBeGreaterThan(10)
      }
    }
  })
  it('Seider-based presets say their coefficients are from memory', () => {
    for (const key of ['seider-3rd-ce500', 'halvard-cobalt-ridge', 'halvard-marrow-bay']) {
      const b = loadPreset(key)
      for (const k of ['shell', 'trays', 'pump', 'motor', 'blower'] as const) {
        expect(b.correlations[k].curve.source).toMatch(/from memory/)
      }
    }
  })
  it('demo bases use CEPCI 2023 annual average 797.9 (CEPCI table)', () => {
    expect(loadPreset('halvard-cobalt-ridge').general.targetIndex).toBe(797.9)
    expect(loadPreset('halvard-marrow-bay').utilities.emissionCharge).toBeGreaterThan(0)
  })
  it('every leaf field of the schema has a label and unit in the field metadata', () => {
    const b = loadPreset('seider-3rd-ce500')
    const missing: string[] = []
    const walk = (o: unknown, path: string) => {
      if (o !== null && typeof o === 'object' && !Array.isArray(o)) {
        for (const [k, v] of Object.entries(o)) walk(v, path ? `${path}.${k}` : k)
      } else if (!costBasisFieldMeta[path]) missing.push(path)
    }
    walk(b, '')
    expect(missing).toEqual([])
  })
  it('rejects a bad field with its path', () => {
    const bad = structuredClone(loadPreset('seider-3rd-ce500')) as unknown as { capital: { interestRate: number } }
    bad.capital.interestRate = -0.1
    const r = costBasisSchema.safeParse(bad)
    expect(r.success).toBe(false)
    if (!r.success) expect(r.error.issues[0]?.path.join('.')).toBe('capital.interestRate')
  })
  it('unknown preset names throw', () => {
    expect(() => loadPreset('nope')).toThrow(/Unknown cost preset/)
  })
})
