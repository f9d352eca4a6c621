/**
 * One vessel model: the shell the design shows is the shell the cost model prices.
 * Rule checked: the costed shell mass equals the design's shown mass for every shipped cost basis,
 * and a cost basis that asks for its own material data runs the same model (vessel/shell.ts).
 */
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { evaluateCase } from '../../server/engine/index.ts'
import * as costing from '../../server/engine/costing/index.ts'
import { listPresets, loadPreset } from '../../server/engine/costing/presets.ts'
import { vesselShell } from '../../server/engine/vessel/shell.ts'

const demo = JSON.parse(readFileSync('data/examples/design.json', 'utf8')) as unknown

describe('one vessel model for design and costing', () => {
  const r = evaluateCase(demo)
  for (const p of listPresets()) {
    it(`${p.key}: costed shell mass and thickness = the design's shown values`, () => {
      const cb = costing.costDesign(r.summary, loadPreset(p.key))
      expect(cb.shell.mass).toBe(r.summary.shellMass)
      expect(cb.shell.thickness).toBe(r.summary.shellThickness)
      expect(cb.warnings.some((w) => w.code === 'shellMassFromCostBasis')).toBe(false)
    })
  }
  it("a basis with its own material data prices the same model's shell, and says it differs from the shown one", () => {
    const b = loadPreset('halvard-cobalt-ridge')
    b.materials.shellMassSource = 'costBasis'
    const cb = costing.costDesign(r.summary, b)
    const m = b.materials
    const v = vesselShell(
      {
        designPressure: Math.max(r.summary.designPressure, m.minimumDesignPressure),
        allowableStress: m.allowableStress,
        jointEfficiency: m.jointEfficiency,
        corrosionAllowance: m.corrosionAllowance,
        materialDensity: m.shellDensity,
        minimumThickness: m.minimumThickness,
      },
      r.summary.selectedDiameter,
      r.summary.columnHeight,
    )
    expect(cb.shell.mass).toBe(v.mass)
    if (Math.abs(v.mass - r.summary.shellMass) > 0.005 * r.summary.shellMass) {
      const w = cb.warnings.find((x) => x.code === 'shellMassFromCostBasis')
      expect(w?.message).toContain(String(Math.round(r.summary.shellMass)))
    }
  })
  it('the costing module has no shell thickness or mass function of its own', () => {
    const names = Object.keys(costing)
    expect(names.filter((n) => /shell|thickness/i.test(n))).toEqual([])
  })
})
