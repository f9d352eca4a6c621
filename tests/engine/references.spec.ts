/**
 * The bibliographies: keys typed, so a citation to a missing key does not compile (the
 * `@ts-expect-error` lines below fail `npm run typecheck` the day a missing key compiles), and
 * every entry complete enough to find the equation (authors, title, year, and a page, DOI, ISBN or
 * a note with the equation).
 * Rule (not a published check).
 */
import { describe, expect, it } from 'vitest'
import { REFERENCES, cite, type ReferenceKey } from '../../server/engine/references.ts'
import { costingReferences, type CostingReferenceKey } from '../../server/engine/costing/references.ts'
import { DESIGN_REFERENCES } from '../../server/engine/design.ts'

describe('reference keys', () => {
  it('a citation to a missing key does not compile', () => {
    // @ts-expect-error 'fair1962' is not a key of REFERENCES
    const typo: ReferenceKey = 'fair1962'
    // @ts-expect-error nor of the cost model's bibliography
    const costTypo: CostingReferenceKey = 'seider2099'
    // @ts-expect-error a source text built with cite names keys only
    const text = cite`Fair (${'fair1962'})`
    expect([typo, costTypo, text]).toEqual(['fair1962', 'seider2099', 'Fair (fair1962)'])
  })

  it('cite gives the plain source text with its keys', () => {
    expect(cite`Fair flooding correlation (${'fair1961'} via ${'treybal1980'}); limit: ${'commonPractice'}`).toBe(
      'Fair flooding correlation (fair1961 via treybal1980); limit: commonPractice',
    )
  })

  it('every entry is filed under its own key and says where to look', () => {
    for (const [k, r] of Object.entries(REFERENCES)) {
      expect(r.key).toBe(k)
      expect(r.authors.length && r.title.length && r.year > 1800).toBeTruthy()
      // a release or standard without pages carries its equation or clause in the note
      if (r.tag !== 'CP') expect('page' in r || 'doi' in r || 'isbn' in r || 'note' in r, `${k}: page, DOI, ISBN or note`).toBe(true)
    }
    for (const [k, r] of Object.entries(costingReferences)) {
      expect(r.key).toBe(k)
      expect(r.authors.length && r.title.length && r.year > 1800).toBeTruthy()
    }
  })

  it("the design's reference list names only known keys", () => {
    for (const k of DESIGN_REFERENCES) expect(REFERENCES[k].key).toBe(k)
  })
})
