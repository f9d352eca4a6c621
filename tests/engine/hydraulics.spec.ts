import { describe, expect, it } from 'vitest'
import {
  capacityFactorFair,
  diameterFromFlooding,
  downcomerAreaFraction,
  floodingVelocity,
  flowParameter,
  holeAreaFactor,
  holeAreaFractionTriangular,
  spacingFromRule,
  surfaceTensionFactor,
  DEFAULT_SPACING_RULE,
} from '../../server/engine/hydraulics/flooding.ts'
import { orificeCoefficient, weirCrestFrancis, weirLengthRatio, residualHead, dryTrayHeadTreybal, liquidHeadTreybal } from '../../server/engine/hydraulics/tray.ts'
import { evaluateCase } from '../../server/engine/index.ts'
import { readFileSync } from 'node:fs'
import { densityIdealGas } from '../../server/engine/properties/gas.ts'
import type { EngineWarning } from '../../server/engine/contract.ts'
import { expectPublished } from './published.ts'

const FIT = 'Fair (1961) curve fit, Treybal Table 6.2 / Benitez eqs 4.29-4.32; check values derived from the fit (D)'

describe('Fair flooding correlation: capacity values', () => {
  it('t = 0.5 m: alpha 0.04893, beta 0.03020, C_F = 0.07913 m/s for F_LV <= 0.1', () => {
    expectPublished({ source: FIT, where: 't=0.5, F_LV=0.1', expected: 0.07913, tolerance: 5e-6 }, capacityFactorFair(0.5, 0.1))
    expectPublished({ source: FIT, where: 't=0.5, F_LV=0.05 (floored)', expected: 0.07913, tolerance: 5e-6 }, capacityFactorFair(0.5, 0.05))
  })
  const table: [number, number[]][] = [
    [0.3, [0.05817, 0.05817, 0.04192, 0.02412]],
    [0.45, [0.07389, 0.07389, 0.05232, 0.02868]],
    [0.61, [0.09066, 0.09066, 0.06341, 0.03354]],
  ]
  const flvs = [0.01, 0.1, 0.3, 1.0]
  for (const [t, vals] of table) {
    it(`t = ${t} m at F_LV = 0.01 / 0.1 / 0.3 / 1.0`, () => {
      vals.forEach((v, i) => expectPublished({ source: FIT, where: `t=${t}, F_LV=${flvs[i]}`, expected: v, tolerance: 5e-6 }, capacityFactorFair(t, flvs[i]!)))
    })
  }
  it('F_LV below 0.1 is floored as the source says, with a warning (never silently)', () => {
    const w: EngineWarning[] = []
    capacityFactorFair(0.6, 0.02, w)
    expect(w.map((x) => x.code)).toContain('flowParameterFloored')
  })
  it('surface-tension factor (sigma/20)^0.2', () => {
    expectPublished({ source: 'Fair / Treybal (sigma/0.020)^0.2 (D)', where: '40 dyn/cm', expected: 1.1487, tolerance: 5e-5 }, surfaceTensionFactor(0.04))
    expectPublished({ source: 'Fair / Treybal (sigma/0.020)^0.2 (D)', where: '20 dyn/cm', expected: 1, tolerance: 1e-12 }, surfaceTensionFactor(0.02))
    expectPublished({ source: 'Fair / Treybal (sigma/0.020)^0.2 (D)', where: '70 dyn/cm', expected: 1.28474, tolerance: 5e-6 }, surfaceTensionFactor(0.07))
  })
  it("hole-area factor agrees with Ludwig's table (0.10 -> 1.00, 0.08 -> 0.90, 0.06 -> 0.80)", () => {
    const src = 'Ludwig, Applied Process Design vol. II, p. 200 (C)'
    expectPublished({ source: src, where: '0.10', expected: 1.0, tolerance: 0.005 }, holeAreaFactor(0.1))
    expectPublished({ source: src, where: '0.08', expected: 0.9, tolerance: 0.005 }, holeAreaFactor(0.08))
    expectPublished({ source: src, where: '0.06', expected: 0.8, tolerance: 0.005 }, holeAreaFactor(0.06))
  })
  it('hole area for triangular pitch A_h/A_a = 0.907 (d_o/p)^2 (Treybal eq. 6.31)', () => {
    expect(holeAreaFractionTriangular(0.0045, 0.012)).toBeCloseTo(0.907 * 0.375 ** 2, 14)
  })
  it('downcomer area fraction: 0.10 at F_LV <= 0.1 (Benitez eq. 4.34), 0.2 at F_LV >= 1', () => {
    expect(downcomerAreaFraction(0.05)).toBe(0.1)
    expect(downcomerAreaFraction(1.5)).toBe(0.2)
    expect(downcomerAreaFraction(0.55)).toBeCloseTo(0.15, 12)
  })
})

describe('Treybal Illus. 6.3 (methanol-water, 95 degC): flooding and diameter', () => {
  const src = 'Treybal Illus. 6.3 worked example, values recomputed from its data (D; D = 1.25 m as printed, C)'
  const G = 0.1 * 20.52 // kg/s
  const rhoV = densityIdealGas(101325, 0.02052, 368.15)
  const Mliq = 1 / (0.15 / 32.04 + 0.85 / 18.02)
  const L = 0.25 * Mliq // kg/s
  const rhoL = 961
  it('F_LV = 0.0624 (book 0.0622)', () => {
    expectPublished({ source: src, where: 'F_LV', expected: 0.0624, tolerance: 0.0002 }, flowParameter(L, G, rhoV, rhoL))
  })
  const CF = capacityFactorFair(0.5, flowParameter(L, G, rhoV, rhoL)) * surfaceTensionFactor(0.04)
  it('C_F with sigma = 0.040 N/m = 0.090897 m/s; V_F = 3.4177 m/s', () => {
    expectPublished({ source: src, where: 'C_F', expected: 0.090897, tolerance: 5e-7 }, CF)
    expectPublished({ source: src, where: 'V_F', expected: 3.4177, tolerance: 0.0005 }, floodingVelocity(CF, rhoL, rhoV))
  })
  it('D_calc = 1.242 m at 80 % of flood and A_d/A_t = 0.088 -> D = 1.25 m', () => {
    const Q = G / rhoV
    expectPublished({ source: src, where: 'Q', expected: 3.0208, tolerance: 0.0005 }, Q)
    const Dc = diameterFromFlooding(Q, 0.8, floodingVelocity(CF, rhoL, rhoV), 0.088)
    expectPublished({ source: src, where: 'D_calc', expected: 1.242, tolerance: 0.0005 }, Dc)
    expect(Math.ceil(Dc / 0.05) * 0.05).toBeCloseTo(1.25, 12)
  })
})

describe('tray geometry and heads', () => {
  it('Francis weir: 10 kg/s, 1000 kg/m3, 0.8 m -> 40.40 mm (Sinnott; derived from the formula, D)', () => {
    expectPublished({ source: 'Sinnott sec. 11.13 Francis weir formula (D)', where: 'h_ow', expected: 40.4, tolerance: 0.005 }, 1000 * weirCrestFrancis(10 / 1000, 0.8))
  })
  it('segmental downcomer: A_d/A_t = 0.1 gives L_w/D = 0.7267 (Benitez ch. 4 geometry)', () => {
    const r = weirLengthRatio(0.1)
    // check by the forward formula rather than a printed number
    const th = 2 * Math.asin(r)
    expect((th - Math.sin(th)) / (2 * Math.PI)).toBeCloseTo(0.1, 10)
    expect(r).toBeGreaterThan(0.72)
    expect(r).toBeLessThan(0.73)
  })
  it('orifice coefficient (Benitez fit) at d_o/l = 1 and residual head 6 sigma/(g rho d_o)', () => {
    expect(orificeCoefficient(0.002, 0.002)).toBeCloseTo(0.85032 - 0.04231 + 0.0017954, 12)
    expect(residualHead(0.07, 995, 0.0045)).toBeCloseTo((6 * 0.07) / (9.80665 * 995 * 0.0045), 12)
  })
  it('spacing rule (Treybal Table 6.1 / Benitez Table 4.3): <= 1 m -> 0.5 m, 1.5 m -> 0.6 m', () => {
    expect(spacingFromRule(DEFAULT_SPACING_RULE, 0.8)).toBe(0.5)
    expect(spacingFromRule(DEFAULT_SPACING_RULE, 1.5)).toBe(0.6)
    expect(spacingFromRule(DEFAULT_SPACING_RULE, 3.5)).toBe(0.75)
    expect(spacingFromRule(DEFAULT_SPACING_RULE, 9)).toBe(0.9)
  })
})

describe('second method: the Treybal set against the Benitez set on the demo tray', () => {
  const r = evaluateCase(JSON.parse(readFileSync('data/examples/design.json', 'utf8')))
  type End = { streams: { rhoV: number; qL: number }; tray: { vo: number; va: number; hd: number; hL: number; hSigma: number; ht: number } }
  const h = r.detail.hydraulics as { bottom: End; holeArea: number; netArea: number; weirLength: number; weepHoleVelocityTreybal: number; turndown: { tray: { vo: number } } }
  const b = h.bottom
  const D = r.summary.selectedDiameter
  it('dry-tray heads agree within 5 % (Liebson/Benitez orifice fit vs Treybal eq. 6.36)', () => {
    const hdT = dryTrayHeadTreybal(b.tray.vo, 0.0045, 0.002, h.holeArea / h.netArea, b.streams.rhoV, 995)
    expect(Math.abs(hdT / b.tray.hd - 1)).toBeLessThan(0.05)
  })
  it('total gas-pressure-drop heads agree within 15 % (clear-liquid heads differ more, as correlations do)', () => {
    const hLT = liquidHeadTreybal(0.05, b.tray.va, b.streams.rhoV, b.streams.qL, (D + h.weirLength) / 2)
    const hdT = dryTrayHeadTreybal(b.tray.vo, 0.0045, 0.002, h.holeArea / h.netArea, b.streams.rhoV, 995)
    const totalT = hdT + hLT + b.tray.hSigma
    expect(Math.abs(totalT / b.tray.ht - 1)).toBeLessThan(0.15)
    expect(hLT).toBeGreaterThan(0)
  })
  it('weeping: both criteria agree the demo tray does not weep at design or at 50 % turndown', () => {
    expect(h.weepHoleVelocityTreybal).toBeGreaterThan(1)
    expect(b.tray.vo).toBeGreaterThan(h.weepHoleVelocityTreybal)
    expect(h.turndown.tray.vo).toBeGreaterThan(h.weepHoleVelocityTreybal)
    expect(r.checks.find((c) => c.key === 'weeping')!.status).toBe('pass')
    expect(r.checks.find((c) => c.key === 'turndown')!.status).toBe('pass')
  })
})
