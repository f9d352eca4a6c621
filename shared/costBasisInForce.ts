/**
 * Which version of a site's cost basis is in force on a date. One rule, used by the Cost basis
 * page, every design and optimisation run, the operating log and the study report:
 *
 *   the version in force on a date is the published version with the latest effective date on or
 *   before that date; between two with the same effective date, the one published later.
 *
 * Before the earliest effective date nothing is in force.
 */

export interface DatedVersion {
  version: number
  status: string
  /** YYYY-MM-DD; null for drafts. */
  effectiveDate: string | null
  /** ISO timestamp (or Date) of publication; null for drafts. */
  publishedAt: string | Date | null
}

/** The calendar date (YYYY-MM-DD) of a moment, in the local time of the process. */
export function isoDate(d: Date = new Date()): string {
  const mm = String(d.getMonth() + 1).padStart(2, '0')
  const dd = String(d.getDate()).padStart(2, '0')
  return `${d.getFullYear()}-${mm}-${dd}`
}

function publishedTime(v: DatedVersion): number {
  if (v.publishedAt === null) return -Infinity
  const t = new Date(v.publishedAt).getTime()
  return Number.isFinite(t) ? t : -Infinity
}

/** Positive when a comes into force after b (later date, or same date and published later). */
function laterInForce(a: DatedVersion, b: DatedVersion): number {
  const byDate = (a.effectiveDate ?? '').localeCompare(b.effectiveDate ?? '')
  if (byDate !== 0) return byDate
  const byPublication = publishedTime(a) - publishedTime(b)
  if (byPublication !== 0) return byPublication
  return a.version - b.version
}

/** The version in force on `on` (YYYY-MM-DD, or a month YYYY-MM meaning its first day), or null. */
export function versionInForce<T extends DatedVersion>(versions: readonly T[], on: string = isoDate()): T | null {
  const day = /^\d{4}-\d{2}$/.test(on) ? `${on}-01` : on.slice(0, 10)
  let best: T | null = null
  for (const v of versions) {
    if (v.status !== 'published' || v.effectiveDate === null || v.effectiveDate > day) continue
    if (best === null || laterInForce(v, best) > 0) best = v
  }
  return best
}

/**
 * What publishing a draft with `effectiveDate` changes, when that date is before the effective
 * date of the version in force today; null when it is not (then nothing needs confirming).
 */
export function earlierDateImpact(versions: readonly DatedVersion[], draftVersion: number, effectiveDate: string, today: string = isoDate()): string | null {
  const inForce = versionInForce(versions, today)
  if (!inForce || inForce.effectiveDate === null || effectiveDate >= inForce.effectiveDate) return null
  const laterOnes = versions
    .filter((v) => v.status === 'published' && v.effectiveDate !== null && v.effectiveDate > effectiveDate)
    .sort((a, b) => laterInForce(a, b))
  const until = laterOnes[0]?.effectiveDate ?? inForce.effectiveDate
  return (
    `Version ${inForce.version} is in force from ${inForce.effectiveDate}. ` +
    `Version ${draftVersion} dated ${effectiveDate} will not be in force today: it only prices dates from ${effectiveDate} ` +
    `up to the day before ${until} (operating-log months in that span change), and version ${inForce.version} stays in force for new runs.`
  )
}
