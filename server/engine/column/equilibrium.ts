/**
 * Equilibrium at column conditions: the case's model evaluated at the column temperature and
 * the gas pressure, as a curve y*(x) in mole fractions.
 */
import type { CaseSI } from '../case.ts'
import type { EngineWarning } from '../contract.ts'
import { vapourPressureAntoine } from '../properties/vapourPressure.ts'
import { LinearEquilibrium, MargulesRaoultEquilibrium, TableEquilibrium, henryAtT, kFromHenry, type EquilibriumCurve } from '../equilibrium/models.ts'

const tableCache = new WeakMap<object, TableEquilibrium>()

export interface ColumnEquilibrium {
  curve: EquilibriumCurve
  /** dilute K (slope at x = 0) [-] */
  K0: number
  /** model parameters at column conditions, for the result detail (null when warnings are not collected) */
  info: Record<string, number | string> | null
}

/** Build the equilibrium curve of a case at its column temperature and pressure. */
export function equilibriumCurveOf(c: CaseSI, warnings?: EngineWarning[]): ColumnEquilibrium {
  const e = c.equilibrium
  const T = c.columnTemperature
  const P = c.gas.pressure
  switch (e.model) {
    case 'constantK':
      return { curve: new LinearEquilibrium(e.K), K0: e.K, info: null }
    case 'henry': {
      const H = henryAtT(e.Hcp, e.B, T, warnings, 'column.temperature')
      const cw = c.solvent.density / c.solvent.molarMass
      const K = kFromHenry(H, cw, P)
      return { curve: new LinearEquilibrium(K), K0: K, info: warnings ? { HcpAtT: H, solventMolarDensity: cw, K } : null }
    }
    case 'modifiedRaoult': {
      const Psat = e.vapourPressure ?? vapourPressureAntoine(e.antoine!, T, warnings, 'equilibrium.antoine')
      const k = Psat / P
      const K0 = e.gammaInf * k
      const curve = e.activityModel === 'margules' ? new MargulesRaoultEquilibrium(e.gammaInf, k) : new LinearEquilibrium(K0)
      return { curve, K0, info: warnings ? { vapourPressure: Psat, gammaInf: e.gammaInf, K0 } : null }
    }
    case 'table': {
      let t = tableCache.get(e)
      if (!t) {
        t = new TableEquilibrium(e.x, e.y)
        tableCache.set(e, t)
      }
      return { curve: t, K0: t.K0, info: null }
    }
  }
}
