/**
 * No NaN or Infinity leaves the engine: the summary, checks and profile are verified (a
 * non-finite value is a structured 'numericalFailure'); non-finite detail numbers become null.
 */
import type { DesignResult, DesignSummary } from '../contract.ts'
import { InfeasibleDesignError } from '../errors.ts'

/** Sum of the numbers of an object tree, cheap, to detect a non-finite value in the detail. */
export function numericSum(o: unknown, depth = 0): number {
  if (typeof o === 'number') return o
  if (o === null || typeof o !== 'object' || depth > 6) return 0
  let s = 0
  if (Array.isArray(o)) {
    for (let i = 0; i < o.length; i++) s += numericSum(o[i], depth + 1)
    return s
  }
  const rec = o as Record<string, unknown>
  for (const k in rec) s += numericSum(rec[k], depth + 1)
  return s
}

/** The sum of the summary's numbers (non-finite when one of them is), field by field. */
export function summaryChecksum(s: DesignSummary): number {
  return (
    s.minimumSolventFlow + s.solventFlow + s.absorptionFactor + s.theoreticalStages + s.actualTrays + s.outletGasSoluteMoleFraction + s.richSolventSoluteMoleFraction +
    s.gasDensity + s.flowParameter + s.capacityFactor + s.floodingVelocity + s.downcomerAreaFraction + s.holeAreaFraction + s.traySpacing + s.diameter + s.selectedDiameter +
    s.pressureDropPerTray + s.columnPressureDrop + s.columnHeight + s.recovery + s.solventFactor + s.floodFraction + s.gasFlow + s.gasVolumetricFlow + s.solventMassFlow +
    s.solventVolumetricFlow + s.soluteInGas + s.soluteAbsorbed + s.soluteLost + s.operatingPressure + s.designPressure + s.shellThickness + s.shellMass + s.percentFlood +
    (s.fractionOfFloodTarget ?? 0) + (s.overallEfficiency ?? 0) + (s.achievedRecovery ?? 0)
  )
}

export function guardFinite(r: DesignResult, detailChecksum: number): void {
  if (!Number.isFinite(summaryChecksum(r.summary))) {
    const s = r.summary as unknown as Record<string, unknown>
    for (const k in s) {
      const v = s[k]
      if (typeof v === 'number' && !Number.isFinite(v)) throw nonFinite(`summary.${k}`)
    }
  }
  for (let i = 0; i < r.checks.length; i++) {
    const ch = r.checks[i]!
    if (!Number.isFinite(ch.value) || !Number.isFinite(ch.limit)) throw nonFinite(`checks.${ch.key}`)
  }
  const st = r.profile.stages
  for (let i = 0; i < st.length; i++) if (!Number.isFinite(st[i]!.x) || !Number.isFinite(st[i]!.y)) throw nonFinite('profile.stages')
  if (!Number.isFinite(r.profile.theoreticalStages) || !Number.isFinite(r.profile.lastStageFraction)) throw nonFinite('profile.theoreticalStages')
  if (!Number.isFinite(detailChecksum)) {
    const d = r.detail as Record<string, unknown>
    for (const k in d) scrub(d[k])
  }
}

function scrub(o: unknown): void {
  if (o === null || typeof o !== 'object') return
  const rec = o as Record<string, unknown>
  for (const k in rec) {
    const v = rec[k]
    if (typeof v === 'number') {
      if (!Number.isFinite(v)) rec[k] = null
    } else if (v && typeof v === 'object') scrub(v)
  }
}

function nonFinite(where: string): InfeasibleDesignError {
  return new InfeasibleDesignError([{ path: where, code: 'numericalFailure', message: `The calculation produced a non-finite number (${where}); the inputs are probably far outside the correlations' ranges` }])
}
