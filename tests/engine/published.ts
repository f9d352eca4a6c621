/**
 * Published check values: { source, where, expected, tolerance } with the source named.
 * Tolerance is absolute and matches the digits printed in the source.
 * Tags: C read in the source, D derived from a C
 * formula, M from memory (tests using M values say so).
 */
import { expect } from 'vitest'

export interface PublishedCheck {
  source: string
  where: string
  expected: number
  tolerance: number
}

export function expectPublished(check: PublishedCheck, actual: number): void {
  const diff = Math.abs(actual - check.expected)
  expect(
    diff <= check.tolerance,
    `${check.source} (${check.where}): expected ${check.expected} +/- ${check.tolerance}, got ${actual}`,
  ).toBe(true)
}
