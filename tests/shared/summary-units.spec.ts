/**
 * The design summary is SI inside the engine and in kmol/h, kg/h and m3/h in the public answer:
 * converted once, at the edge (shared/summaryUnits.ts). Factors: 1 h = 3600 s and
 * 1 kmol = 1000 mol (SI definitions; NIST SP 811, 2008).
 */
import { describe, expect, it } from 'vitest'
import { caseToSI, evaluateCase } from '../../server/engine/index.ts'
import { costDesign, loadPreset } from '../../server/engine/costing/index.ts'
import { publicDesign } from '../../server/services/engine-gateway.ts'
import { SUMMARY_PUBLIC_UNITS, summaryToPublic, summaryToSI } from '../../shared/summaryUnits.ts'
import type { DesignSummary } from '../../shared/schemas/results.ts'
import demo from '../../data/demo-studies.json' with { type: 'json' }

const demoCase = demo.studies[0]!.inputs // 420 kmol/h of gas, y_in = 0.015, ethanol 46.07 kg/kmol
const rel = (a: number, b: number) => Math.abs(a / b - 1)

describe('the design summary: SI in the engine, public units at the edge', () => {
  const c = caseToSI(demoCase)
  const engine = evaluateCase(demoCase)

  it('the engine summary is SI: the gas flow in mol/s and the solute in kg/s', () => {
    // 420 kmol/h = 420 x 1000 mol / 3600 s = 116.667 mol/s
    expect(rel(engine.summary.gasFlow, (420 * 1000) / 3600)).toBeLessThan(1e-14)
    // solute in = V y M in mol/s x kg/mol = kg/s
    expect(rel(engine.summary.soluteInGas, c.gas.flow * c.gas.soluteMoleFraction * c.solute.molarMass)).toBeLessThan(1e-14)
    // the solvent's density from its own mass and volume flows, both per second
    expect(engine.summary.solventMassFlow / engine.summary.solventVolumetricFlow).toBeCloseTo(c.solvent.density, 9)
  })

  it('the public answer carries kmol/h, kg/h and m3/h, with the same keys in the same order', () => {
    const pub = publicDesign(engine).summary
    expect(rel(pub.gasFlow, 420)).toBeLessThan(1e-14) // the case file's own number comes back
    expect(rel(pub.soluteInGas, engine.summary.soluteInGas * 3600)).toBeLessThan(1e-15)
    expect(rel(pub.solventVolumetricFlow, engine.summary.solventVolumetricFlow * 3600)).toBeLessThan(1e-15)
    expect(rel(pub.solventFlow, (engine.summary.solventFlow * 3600) / 1000)).toBeLessThan(1e-14)
    expect(Object.keys(pub)).toEqual(Object.keys(engine.summary))
    // every other field is SI in both and passes through untouched
    for (const k of Object.keys(pub) as (keyof DesignSummary & string)[]) {
      if (!(k in SUMMARY_PUBLIC_UNITS)) expect(pub[k]).toBe(engine.summary[k])
    }
  })

  it('converts into new objects: the engine result (which the optimiser may cache) is not changed', () => {
    const before = JSON.stringify(engine)
    publicDesign(engine, null)
    expect(JSON.stringify(engine)).toBe(before)
  })

  it('a stored (public) summary goes back to SI for the cost model, and prices as the engine summary does', () => {
    const basis = loadPreset('halvard-cobalt-ridge')
    const stored = JSON.parse(JSON.stringify(summaryToPublic(engine.summary))) as DesignSummary
    const back = summaryToSI(stored)
    for (const k of Object.keys(SUMMARY_PUBLIC_UNITS) as (keyof typeof SUMMARY_PUBLIC_UNITS)[]) expect(rel(back[k], engine.summary[k])).toBeLessThan(1e-15)
    expect(rel(costDesign(back, basis).totalAnnualCost, costDesign(engine.summary, basis).totalAnnualCost)).toBeLessThan(1e-12)
    // @ts-expect-error a public summary does not reach the engine's cost model without summaryToSI
    costDesign(stored, basis)
  })
})
