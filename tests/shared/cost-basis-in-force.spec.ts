import { describe, it, expect } from 'vitest'
import { versionInForce, earlierDateImpact } from '../../shared/costBasisInForce.ts'

// The product's rule (no outside source): the published version with the latest effective date on
// or before the date; the same effective date -> the later publication.
const v = (version: number, effectiveDate: string | null, publishedAt: string | null, status = 'published') => ({ version, status, effectiveDate, publishedAt })

describe('versionInForce', () => {
  const history = [
    v(1, '2026-03-01', '2026-02-20T09:00:00Z'),
    v(2, '2026-01-01', '2026-04-02T09:00:00Z'), // published later, dated earlier
    v(3, '2026-06-01', '2026-05-01T09:00:00Z'),
    v(4, null, null, 'draft'),
  ]

  it('takes the latest effective date on or before the date, not the newest version number', () => {
    expect(versionInForce(history, '2026-04-15')?.version).toBe(1)
    expect(versionInForce(history, '2026-02-01')?.version).toBe(2)
    expect(versionInForce(history, '2026-06-01')?.version).toBe(3)
  })

  it('nothing is in force before the earliest effective date; drafts never are', () => {
    expect(versionInForce(history, '2025-12-31')).toBeNull()
    expect(versionInForce([v(1, null, null, 'draft')], '2030-01-01')).toBeNull()
  })

  it('a month means its first day', () => {
    expect(versionInForce(history, '2026-03')?.version).toBe(1)
    expect(versionInForce(history, '2026-02')?.version).toBe(2)
  })

  it('ties on the effective date go to the later publication', () => {
    const tie = [v(5, '2026-03-01', '2026-03-05T10:00:00Z'), v(6, '2026-03-01', '2026-03-01T10:00:00Z')]
    expect(versionInForce(tie, '2026-03-02')?.version).toBe(5)
  })

  it('publishing before the version in force says what it changes; otherwise nothing to confirm', () => {
    const text = earlierDateImpact(history, 4, '2026-02-15', '2026-04-15')
    expect(text).toContain('Version 1 is in force from 2026-03-01')
    expect(text).toContain('up to the day before 2026-03-01')
    expect(earlierDateImpact(history, 4, '2026-03-01', '2026-04-15')).toBeNull()
    expect(earlierDateImpact(history, 4, '2026-05-01', '2026-04-15')).toBeNull()
    expect(earlierDateImpact([], 1, '2020-01-01', '2026-04-15')).toBeNull()
  })
})
