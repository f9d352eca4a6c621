import { describe, expect, it } from 'vitest'
import { fromSI } from '../../shared/units.ts'
import { COMPONENT_LIBRARY, evaluateCase } from '../../server/engine/index.ts'
import { findComponent, mergeLibraries } from '../../server/engine/case.ts'

describe('component library (data/components.json)', () => {
  const names = ['water', 'carbon dioxide', 'nitrogen', 'air', 'ethanol', 'methanol', 'acetone', 'ammonia', 'isopropanol']
  it('holds the required components, found by name or alias', () => {
    for (const n of names) expect(findComponent(COMPONENT_LIBRARY, n)).not.toBeNull()
    expect(findComponent(COMPONENT_LIBRARY, 'CO2')?.[0]).toBe('carbon dioxide')
    expect(findComponent(COMPONENT_LIBRARY, 'ipa')?.[0]).toBe('isopropanol')
    expect(findComponent(COMPONENT_LIBRARY, 'EtOH')?.[0]).toBe('ethanol')
  })
  it('every value carries a source string', () => {
    for (const [name, comp] of Object.entries(COMPONENT_LIBRARY.components)) {
      for (const [key, v] of Object.entries(comp)) {
        if (v && typeof v === 'object' && !Array.isArray(v)) {
          expect(typeof (v as { source?: unknown }).source, `${name}.${key}.source`).toBe('string')
          expect(((v as { source: string }).source).length, `${name}.${key}.source`).toBeGreaterThan(3)
        }
      }
      expect(comp.molarMass?.value, `${name} molar mass`).toBeGreaterThan(0)
    }
  })
  it('solutes have Henry constants and vapour pressures; carriers have gas viscosities', () => {
    for (const n of ['ethanol', 'methanol', 'acetone', 'ammonia', 'isopropanol']) {
      const c = COMPONENT_LIBRARY.components[n]!
      expect(c.henry!.Hcp).toBeGreaterThan(0)
      expect(c.antoine!.B).toBeGreaterThan(0)
    }
    for (const n of ['carbon dioxide', 'nitrogen', 'air']) expect(COMPONENT_LIBRARY.components[n]!.gasViscosity!.value).toBeGreaterThan(1e-6)
  })
  it('hazard flags: flammable alcohols and acetone, toxic ammonia, asphyxiant CO2 and N2', () => {
    const flags = (n: string) => COMPONENT_LIBRARY.components[n]!.hazards!.flags
    for (const n of ['ethanol', 'methanol', 'acetone', 'isopropanol']) expect(flags(n)).toContain('flammable')
    expect(flags('ammonia')).toContain('toxic')
    expect(flags('carbon dioxide')).toContain('asphyxiant')
    expect(flags('nitrogen')).toContain('asphyxiant')
  })
  it('user values override library values; site components extend the library', () => {
    const base = {
      gas: { flow: 100, temperature: 30, pressure: 110, soluteMoleFraction: 0.01, carrier: 'nitrogen' },
      solute: { name: 'ethanol', molarMass: 50 },
      solvent: { name: 'water', temperature: 30 },
      equilibrium: { model: 'constantK', K: 0.5 },
      recovery: 0.9,
      solventFactor: 1.4,
    }
    const r = evaluateCase(base)
    expect(fromSI('massFlow', r.summary.soluteInGas, 'kg/h')).toBeCloseTo(100 * 0.01 * 50, 9) // the summary is SI (kg/s)
    const site = { components: { 'site solvent x': { molarMass: { value: 77, unit: 'kg/kmol', source: 'site lab' }, hazards: { flags: ['toxic'], source: 'site SDS' } } } }
    const lib = mergeLibraries(COMPONENT_LIBRARY, site)
    const r2 = evaluateCase({ ...base, solute: 'site solvent x' }, { library: lib })
    expect(fromSI('massFlow', r2.summary.soluteInGas, 'kg/h')).toBeCloseTo(100 * 0.01 * 77, 9)
    expect(r2.cautions.some((c) => /toxic/.test(c))).toBe(true)
  })
})
