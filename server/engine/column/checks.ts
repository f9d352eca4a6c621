/**
 * The tray and column checks. Every limit is data: its value, its direction ('max': the value
 * must stay at or below it; 'min': at or above it), the margin that turns a pass into a warning,
 * and its source.
 */
import type { CheckResult } from '../contract.ts'
import { WEEP_FROUDE_LIMIT } from '../hydraulics/tray.ts'
import type { TrayState } from './trays.ts'
import { cite } from '../references.ts'

export interface CheckLimit {
  key: CheckResult['key']
  label: string
  unit: string
  /** 'max': pass when value <= limit; 'min': pass when value >= limit */
  direction: 'max' | 'min'
  /** the limit, in `unit` (null when it depends on the design, e.g. the backup limit) */
  limit: number | null
  /** where a warning turns into a failure, as a multiple of the limit */
  failAt: number | null
  /** method of the value and source of the limit (reference keys in references.ts, checked by `cite`) */
  source: string
  advice: string
}

/** The checks' limits as data. */
export const CHECK_LIMITS: Record<string, CheckLimit> = {
  flooding: {
    key: 'flooding',
    label: 'Percent of flood',
    unit: '%',
    direction: 'max',
    limit: 85,
    failAt: 100 / 85,
    source: cite`Fair flooding correlation (${'fair1961'} via ${'treybal1980'} / ${'benitez2009'}); 85 % limit: ${'commonPractice'}`,
    advice: 'Increase the diameter or the tray spacing, or lower the gas load',
  },
  pressureDropPerTray: {
    key: 'pressureDropPerTray',
    label: 'Pressure drop per tray',
    unit: 'Pa',
    direction: 'max',
    limit: 1000,
    failAt: 1.5,
    source: cite`dry tray (Liebson orifice fit, ${'liebson1957'}) + clear liquid (${'bennett1983'}) + residual head, ${'benitez2009'} ch. 4; 1000 Pa limit: ${'commonPractice'}`,
    advice: 'Increase the hole area (larger holes or smaller pitch) or lower the weir',
  },
  weeping: {
    key: 'weeping',
    label: 'Weeping (hole Froude number)',
    unit: '-',
    direction: 'min',
    limit: WEEP_FROUDE_LIMIT,
    failAt: 0.8,
    source: cite`hole Froude number >= 0.5, ${'benitez2009'} ch. 4 (Illus. 4.8)`,
    advice: 'Reduce the hole area (smaller holes, larger pitch, blanking) or the weir height',
  },
  entrainment: {
    key: 'entrainment',
    label: 'Fractional entrainment',
    unit: '-',
    direction: 'max',
    limit: 0.1,
    failAt: 1.5,
    source: cite`fractional entrainment from ${'benitez2009'} eqs 4.45-4.47; 0.10 limit: ${'commonPractice'}`,
    advice: 'Lower the fraction of flood or increase the tray spacing',
  },
  turndown: {
    key: 'turndown',
    label: 'Weeping at turndown',
    unit: '-',
    direction: 'min',
    limit: WEEP_FROUDE_LIMIT,
    failAt: null, // a warning only: the turndown range is a choice
    source: cite`hole Froude number >= 0.5 (${'benitez2009'}) at the turndown gas rate; turndown fraction: ${'commonPractice'}`,
    advice: 'The trays may weep at the lowest gas rate: reduce the hole area or accept a smaller turndown range',
  },
  downcomerBackup: {
    key: 'downcomerBackup',
    label: 'Downcomer backup',
    unit: 'm',
    direction: 'max',
    limit: null, // (t + h_w)/2, from the design
    failAt: 1 / 0.9,
    source: cite`backup = weir + crest (Francis, ${'sinnott2005'}) + tray head + apron loss (${'treybal1980'}); limit (t + hw)/2 with a warning above 90 % of it, ${'sinnott2005'}`,
    advice: 'Increase the tray spacing or the downcomer clearance, or reduce the tray pressure drop',
  },
  downcomerResidence: {
    key: 'downcomerResidence',
    label: 'Downcomer residence time',
    unit: 's',
    direction: 'min',
    limit: 3,
    failAt: 2 / 3,
    source: cite`residence = A_d h_backup / q_L, ${'sinnott2005'}; >= 3 s: ${'commonPractice'}`,
    advice: 'Increase the downcomer area',
  },
}

/**
 * Verdict of one check. With direction 'max': pass at value <= limit, warn up to failAt x limit,
 * then fail. With 'min': pass at value >= limit, warn down to failAt x limit, then fail.
 * The downcomer backup passes up to 90 % of its limit (sinnott2005 margin) and fails above it.
 */
export function verdict(d: CheckLimit, value: number, limit: number): CheckResult {
  let status: CheckResult['status']
  if (d.key === 'downcomerBackup') {
    const r = value / limit
    status = r <= 0.9 ? 'pass' : r <= 1 ? 'warn' : 'fail'
  } else if (d.direction === 'max') {
    status = value <= limit ? 'pass' : d.failAt === null || value <= d.failAt * limit ? 'warn' : 'fail'
  } else {
    status = value >= limit ? 'pass' : d.failAt === null || value >= d.failAt * limit ? 'warn' : 'fail'
  }
  return {
    key: d.key,
    label: d.label,
    status,
    value,
    limit,
    direction: d.direction,
    unit: d.unit,
    advice: status === 'pass' ? undefined : d.advice,
    source: d.source,
  }
}

/** The seven checks at the worst end of each. */
export function trayChecks(ts: TrayState): CheckResult[] {
  const b = ts.bottom
  const t = ts.top
  const L = CHECK_LIMITS
  const fracFlood = Math.max(b.fractionFlood, t.fractionFlood)
  const dPtray = Math.max(b.dP, t.dP)
  const Fr = Math.min(b.Fr, t.Fr)
  const psi = Math.max(b.psi, t.psi)
  const hB = b.backup / b.backupLimit >= t.backup / t.backupLimit ? b : t
  const residence = Math.min(b.residence, t.residence)
  const turndown = verdict(L.turndown!, ts.turndownFr, L.turndown!.limit!)
  turndown.label = `Weeping at turndown (${Math.round(100 * ts.turndownFraction)} % of design gas)`
  return [
    verdict(L.flooding!, 100 * fracFlood, L.flooding!.limit!),
    verdict(L.pressureDropPerTray!, dPtray, L.pressureDropPerTray!.limit!),
    verdict(L.weeping!, Fr, L.weeping!.limit!),
    verdict(L.entrainment!, psi, L.entrainment!.limit!),
    turndown,
    verdict(L.downcomerBackup!, hB.backup, hB.backupLimit),
    verdict(L.downcomerResidence!, residence, L.downcomerResidence!.limit!),
  ]
}
