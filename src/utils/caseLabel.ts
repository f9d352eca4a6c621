import type { CaseInput, RunView } from '@/api/types.ts'
import { fmtNumber } from './format.ts'

/** The equilibrium a case uses, in a few words: 'K 0.43', 'x–y table (5 points)'. */
export function equilibriumLabel(c: CaseInput): string {
  const e = c.equilibrium
  switch (e.model) {
    case 'constantK':
      return `K ${fmtNumber(e.K, 3)}`
    case 'henry':
      return e.Hcp === undefined ? 'Henry (library)' : 'Henry (own constant)'
    case 'modifiedRaoult':
      return e.gammaInf === undefined ? 'modified Raoult (library)' : `modified Raoult γ∞ ${fmtNumber(e.gammaInf, 3)}`
    case 'table':
      return `x–y table (${e.points.length} points)`
  }
}

/**
 * A proposed option name from the inputs the run actually used (never the form's current
 * draft): 'Design · K 0.43 · 97 % · L/Lmin 1.5'. An optimisation chooses recovery and solvent
 * factor itself, so only its equilibrium is named.
 */
export function runLabel(r: RunView): string {
  const kind = r.kind === 'optimize' ? 'Optimum' : 'Design'
  const c = r.inputs
  if (!c) return kind
  const parts = [kind, equilibriumLabel(c)]
  if (r.kind !== 'optimize') parts.push(`${fmtNumber(c.recovery * 100, 4)} %`, `L/Lmin ${fmtNumber(c.solventFactor, 3)}`)
  return parts.join(' · ')
}
