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

interface CurveMemo {
  T: number
  P: number
  rho: number
  M: number
  collect: boolean
  value: ColumnEquilibrium
  /** the warnings the model pushed when it was built, pushed again on every reuse */
  warns: EngineWarning[]
}

/**
 * The last curve built for each equilibrium model object, with the column conditions it was built
 * at: the design, the optimiser and a batch call this many times for the same case, and the curve
 * (a vapour pressure, a Henry constant, an exponential) is the same each time.
 */
const curveMemo = new WeakMap<object, CurveMemo>()

/** Build the equilibrium curve of a case at its column temperature and pressure. */
export function equilibriumCurveOf(c: CaseSI, warnings?: EngineWarning[]): ColumnEquilibrium {
  const e = c.equilibrium
  const T = c.columnTemperature
  const P = c.gas.pressure
  const rho = c.solvent.density
  const M = c.solvent.molarMass
  const collect = warnings !== undefined
  const m = curveMemo.get(e)
  if (m && m.T === T && m.P === P && m.rho === rho && m.M === M && m.collect === collect) {
    if (warnings) for (let i = 0; i < m.warns.length; i++) warnings.push({ ...m.warns[i]! })
    const v = m.value
    return { curve: v.curve, K0: v.K0, info: v.info ? { ...v.info } : null }
  }
  const n0 = warnings ? warnings.length : 0
  const value = buildCurve(c, e, T, P, warnings)
  const warns = warnings ? warnings.slice(n0).map((w) => ({ ...w })) : []
  curveMemo.set(e, { T, P, rho, M, collect, value: { curve: value.curve, K0: value.K0, info: value.info ? { ...value.info } : null }, warns })
  return value
}

function buildCurve(c: CaseSI, e: CaseSI['equilibrium'], T: number, P: number, warnings: EngineWarning[] | undefined): ColumnEquilibrium {
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
