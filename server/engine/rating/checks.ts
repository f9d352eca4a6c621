/**
 * The tray checks of a standing column: the same checks, limits and wording as the design
 * (pass / warn / fail with value and limit), evaluated on the hydraulic states of the two
 * column ends at the installed geometry.
 */
import type { CheckResult } from '../contract.ts'
import { WEEP_FROUDE_LIMIT } from '../hydraulics/tray.ts'
import type { TrayState } from './trayState.ts'

/** The limits that bound the operating window (each a check's limit). */
export const RATING_LIMITS = {
  /** fraction of flood, common practice */
  flood: 0.85,
  /** fractional entrainment psi, common practice */
  entrainment: 0.1,
  /** hole Froude number, benitez2009 Illus. 4.8 */
  weepFroude: WEEP_FROUDE_LIMIT,
  /** downcomer backup / (t + h_w)/2, sinnott2005 */
  backupRatio: 1,
  /** downcomer residence time [s], common practice */
  residence: 3,
  /** pressure drop per tray [Pa], common practice */
  pressureDrop: 1000,
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

/** The tray checks (keys as the design's). `turndown` is the state at the turndown gas rate. */
export function ratingChecks(w: WorstEnd, turndown: TrayState, turndownFraction: number): CheckResult[] {
  const L = RATING_LIMITS
  const f = w.fractionFlood
  return [
    {
      key: 'flooding',
      source: 'Fair flooding correlation (fair1961 via treybal1980 / benitez2009) at the installed net area; 85 % limit: commonPractice',
      label: 'Percent of flood',
      status: f < L.flood ? 'pass' : f < 1 ? 'warn' : 'fail',
      value: 100 * f,
      limit: 100 * L.flood,
      unit: '%',
      advice: f < L.flood ? undefined : 'Lower the gas rate (or the solvent rate when the flow parameter is high); the column cannot take this load',
    },
    {
      key: 'pressureDropPerTray',
      source: 'dry tray (Liebson orifice fit) + clear liquid (bennett1983) + residual head, benitez2009 ch. 4; 1000 Pa limit: commonPractice',
      label: 'Pressure drop per tray',
      status: w.dP <= L.pressureDrop ? 'pass' : w.dP <= 1.5 * L.pressureDrop ? 'warn' : 'fail',
      value: w.dP,
      limit: L.pressureDrop,
      unit: 'Pa',
      advice: w.dP <= L.pressureDrop ? undefined : 'Lower the gas rate; check the blower can deliver the column pressure drop',
    },
    {
      key: 'weeping',
      source: 'hole Froude number >= 0.5, benitez2009 ch. 4 (Illus. 4.8)',
      label: 'Weeping (hole Froude number)',
      status: w.Fr >= L.weepFroude ? 'pass' : w.Fr >= 0.8 * L.weepFroude ? 'warn' : 'fail',
      value: w.Fr,
      limit: L.weepFroude,
      unit: '-',
      advice: w.Fr >= L.weepFroude ? undefined : 'Raise the gas rate (recycle) or blank part of the hole area',
    },
    {
      key: 'entrainment',
      source: 'fractional entrainment from benitez2009 eqs 4.45-4.47; 0.10 limit: commonPractice',
      label: 'Fractional entrainment',
      status: w.psi <= L.entrainment ? 'pass' : w.psi <= 1.5 * L.entrainment ? 'warn' : 'fail',
      value: w.psi,
      limit: L.entrainment,
      unit: '-',
      advice: w.psi <= L.entrainment ? undefined : 'Lower the gas rate',
    },
    {
      key: 'turndown',
      source: 'hole Froude number >= 0.5 (benitez2009) at the turndown gas rate; turndown fraction: commonPractice',
      label: `Weeping at turndown (${Math.round(100 * turndownFraction)} % of this gas rate)`,
      status: turndown.Fr >= L.weepFroude ? 'pass' : 'warn',
      value: turndown.Fr,
      limit: L.weepFroude,
      unit: '-',
      advice: turndown.Fr >= L.weepFroude ? undefined : 'The trays may weep if the gas rate falls this far',
    },
    {
      key: 'downcomerBackup',
      source: 'backup = weir + crest (Francis, sinnott2005) + tray head + apron loss (treybal1980); limit (t + hw)/2, sinnott2005',
      label: 'Downcomer backup',
      status: w.backupRatio <= 0.9 * L.backupRatio ? 'pass' : w.backupRatio <= L.backupRatio ? 'warn' : 'fail',
      value: w.backup,
      limit: w.backupLimit,
      unit: 'm',
      advice: w.backupRatio <= 0.9 ? undefined : 'Lower the solvent or gas rate; the downcomers are close to backing up',
    },
    {
      key: 'downcomerResidence',
      source: 'residence = A_d h_backup / q_L, sinnott2005; >= 3 s: commonPractice',
      label: 'Downcomer residence time',
      status: w.residence >= L.residence ? 'pass' : w.residence >= 2 ? 'warn' : 'fail',
      value: w.residence,
      limit: L.residence,
      unit: 's',
      advice: w.residence >= L.residence ? undefined : 'Lower the solvent rate; vapour may be carried under in the downcomer',
    },
  ]
}
