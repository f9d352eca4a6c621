/**
 * The tray checks of a standing column: the design's checks (limits as data with direction,
 * column/checks.ts), evaluated on the hydraulic states of the two column ends at the installed
 * geometry.
 */
import type { CheckResult } from '../contract.ts'
import { CHECK_LIMITS, verdict } from '../column/checks.ts'
import type { TrayState } from './trayState.ts'

/** The limits that bound the operating window: each the corresponding check's limit (column/checks.ts). */
export const RATING_LIMITS = {
  /** fraction of flood */
  flood: CHECK_LIMITS.flooding!.limit! / 100,
  /** fractional entrainment psi */
  entrainment: CHECK_LIMITS.entrainment!.limit!,
  /** hole Froude number */
  weepFroude: CHECK_LIMITS.weeping!.limit!,
  /** downcomer backup / (t + h_w)/2, sinnott2005 */
  backupRatio: 1,
}

/** Worst-end values of the two ends. */
export interface WorstEnd {
  fractionFlood: number
  dP: number
  Fr: number
  psi: number
  backupRatio: number
  backup: number
  backupLimit: number
  residence: number
}

export function worstEnd(bot: TrayState, top: TrayState): WorstEnd {
  const rb = bot.backup / bot.backupLimit
  const rt = top.backup / top.backupLimit
  const hB = rb >= rt ? bot : top
  return {
    fractionFlood: Math.max(bot.fractionFlood, top.fractionFlood),
    dP: Math.max(bot.dP, top.dP),
    Fr: Math.min(bot.Fr, top.Fr),
    psi: Math.max(bot.psi, top.psi),
    backupRatio: Math.max(rb, rt),
    backup: hB.backup,
    backupLimit: hB.backupLimit,
    residence: Math.min(bot.residence, top.residence),
  }
}

/** What to do about a failing check on a column that stands (the design's advice changes the design). */
const RATING_ADVICE: Record<string, string> = {
  flooding: 'Lower the gas rate (or the solvent rate when the flow parameter is high); the column cannot take this load',
  pressureDropPerTray: 'Lower the gas rate; check the blower can deliver the column pressure drop',
  weeping: 'Raise the gas rate (recycle) or blank part of the hole area',
  entrainment: 'Lower the gas rate',
  turndown: 'The trays may weep if the gas rate falls this far',
  downcomerBackup: 'Lower the solvent or gas rate; the downcomers are close to backing up',
  downcomerResidence: 'Lower the solvent rate; vapour may be carried under in the downcomer',
}

/**
 * The tray checks (keys, limits, directions and verdicts as the design's: column/checks.ts),
 * with advice for a standing column. `turndown` is the state at the turndown gas rate.
 */
export function ratingChecks(w: WorstEnd, turndown: TrayState, turndownFraction: number): CheckResult[] {
  const L = CHECK_LIMITS
  const out = [
    verdict(L.flooding!, 100 * w.fractionFlood, L.flooding!.limit!),
    verdict(L.pressureDropPerTray!, w.dP, L.pressureDropPerTray!.limit!),
    verdict(L.weeping!, w.Fr, L.weeping!.limit!),
    verdict(L.entrainment!, w.psi, L.entrainment!.limit!),
    verdict(L.turndown!, turndown.Fr, L.turndown!.limit!),
    verdict(L.downcomerBackup!, w.backup, w.backupLimit),
    verdict(L.downcomerResidence!, w.residence, L.downcomerResidence!.limit!),
  ]
  out[4]!.label = `Weeping at turndown (${Math.round(100 * turndownFraction)} % of this gas rate)`
  for (const c of out) {
    if (c.status !== 'pass') c.advice = RATING_ADVICE[c.key] ?? c.advice
    if (c.key === 'flooding') c.source = `${c.source}; at the installed net area`
  }
  return out
}
