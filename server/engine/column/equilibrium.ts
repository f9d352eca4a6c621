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

/**
 * The last curve built, with what it was built from: the design, the optimiser and a batch call
 * this many times for the same equilibrium at the same conditions, and the curve (a vapour
 * pressure, a Henry constant, an exponential) is the same each time. Compared by value, so a
 * batch of cases with the same equilibrium shares it too; one entry, nothing to evict (a map
 * keyed by the case objects would cost the garbage collector more than it saves).
 */
let memo: {
  e: CaseSI['equilibrium']
  key: string
  a: number
  b: number
  T: number
  P: number
  rho: number
  M: number
  collect: boolean
  value: ColumnEquilibrium
  /** the warnings the model pushed when it was built, pushed again on every reuse */
  warns: EngineWarning[]
} | null = null

/** The model's parameters as two numbers and a key (null: compared by object, a table). */
function params(e: CaseSI['equilibrium']): { key: string; a: number; b: number } | null {
  switch (e.model) {
    case 'constantK':
      return { key: 'K', a: e.K, b: 0 }
    case 'henry':
      return { key: 'H', a: e.Hcp, b: e.B }
    case 'modifiedRaoult':
      if (e.antoine) return null
      return { key: `R${e.activityModel}`, a: e.gammaInf, b: e.vapourPressure ?? NaN }
    case 'table':
      return null
  }
}

/** Build the equilibrium curve of a case at its column temperature and pressure. */
export function equilibriumCurveOf(c: CaseSI, warnings?: EngineWarning[]): ColumnEquilibrium {
  const e = c.equilibrium
  const T = c.columnTemperature
  const P = c.gas.pressure
  const rho = c.solvent.density
  const M = c.solvent.molarMass
  const collect = warnings !== undefined
  const p = params(e)
  const m = memo
  if (m && m.T === T && m.P === P && m.rho === rho && m.M === M && m.collect === collect && (p ? m.key === p.key && m.a === p.a && m.b === p.b : m.e === e)) {
    if (warnings) for (let i = 0; i < m.warns.length; i++) warnings.push({ ...m.warns[i]! })
    const v = m.value
    return { curve: v.curve, K0: v.K0, info: v.info ? { ...v.info } : null }
  }
  const n0 = warnings ? warnings.length : 0
  const value = buildCurve(c, e, T, P, warnings)
  const warns = warnings ? warnings.slice(n0).map((w) => ({ ...w })) : []
  memo = { e, key: p?.key ?? '', a: p?.a ?? NaN, b: p?.b ?? NaN, T, P, rho, M, collect, value: { curve: value.curve, K0: value.K0, info: value.info ? { ...value.info } : null }, warns }
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
