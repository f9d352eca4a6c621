/**
 * REGRESSION SNAPSHOTS, not published checks: the numbers below are the cost model's own output
 * for a fixed, hand-typed design summary, recorded when the model was written. They only catch
 * unintended changes; the published checks are in costing.spec.ts. Update them deliberately
 * when a preset or the model changes on purpose.
 */
import { describe, expect, it } from 'vitest'
import type { DesignSummary } from '../../server/engine/contract.ts'
import { summaryToSI } from '../../shared/summaryUnits.ts'
import { costDesign } from '../../server/engine/costing/costDesign.ts'
import { loadPreset } from '../../server/engine/costing/presets.ts'

// typed in the public units (kmol/h, kg/h, m3/h), handed to the engine in SI like a stored run
const s: DesignSummary = summaryToSI({
  minimumSolventFlow: 60, solventFlow: 90, absorptionFactor: 1.4, theoreticalStages: 5.2, actualTrays: 11,
  outletGasSoluteMoleFraction: 0.0002, richSolventSoluteMoleFraction: 0.06, gasDensity: 1.9, flowParameter: 0.01,
  capacityFactor: 0.1, floodingVelocity: 2.5, downcomerAreaFraction: 0.1, holeAreaFraction: 0.12, traySpacing: 0.6,
  diameter: 1.42, selectedDiameter: 1.45, pressureDropPerTray: 750, columnPressureDrop: 8250, columnHeight: 10.6,
  recovery: 0.985, solventFactor: 1.5, floodFraction: 0.78, gasFlow: 420, gasVolumetricFlow: 2.65, solventMassFlow: 1620,
  solventVolumetricFlow: 1.63, soluteInGas: 290, soluteAbsorbed: 285.65, soluteLost: 4.35, operatingPressure: 115000,
  designPressure: 180000, shellThickness: 0.0075, shellMass: 3200, percentFlood: 76, fractionOfFloodTarget: 0.75,
})

describe('regression snapshot (own output, not a reference): demo cost bases', () => {
  it('Cobalt Ridge demo basis', () => {
    const r = costDesign(s, loadPreset('halvard-cobalt-ridge'))
    // the shell is priced at the design's own mass (3,200 kg here): one vessel model
    expect(r.totalAnnualCost).toBeCloseTo(148205.055, 2)
    expect(r.installedCapital).toBeCloseTo(704986.164, 2)
    expect(r.annual.shell).toBeCloseTo(45544.594, 2)
    expect(r.annual.trays).toBeCloseTo(17462.399, 2)
    expect(r.annual.blowerElectricity).toBeCloseTo(29282.5, 2)
  })
  it('Marrow Bay demo basis', () => {
    const r = costDesign(s, loadPreset('halvard-marrow-bay'))
    expect(r.totalAnnualCost).toBeCloseTo(196818.563, 2)
    expect(r.annual.emissionCharge).toBeCloseTo(31320, 2)
    expect(r.annual.solvent).toBeCloseTo(17604, 2)
  })
})
