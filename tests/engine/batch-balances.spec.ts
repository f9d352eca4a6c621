/**
 * The typed-array batch path (server/engine/batch/balances.ts) against the scalar design
 * (evaluateCase, the public design function): the same minimum solvent, solvent, absorption
 * factor and ideal stages to 1e-12 relative, for random cases (fast-check), by the Kremser method
 * and stage by stage; and the same refusals. A cross-check of two paths of the product (rule:
 * one method, one answer); the published checks of the method itself are in kremser.spec.ts.
 */
import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { readFileSync } from 'node:fs'
import { caseToSI, evaluateCase, InfeasibleDesignError } from '../../server/engine/index.ts'
import { BATCH_STATUS, designBalancesBatch } from '../../server/engine/batch/balances.ts'

const base = JSON.parse(readFileSync('data/examples/design.json', 'utf8')) as Record<string, unknown>
const BALANCE_CODES = new Set(BATCH_STATUS.slice(1))

const caseArb = fc.record({
  flow: fc.double({ min: 20, max: 3000, noNaN: true }),
  yIn: fc.double({ min: 1e-4, max: 0.05, noNaN: true }),
  K: fc.double({ min: 0.2, max: 4, noNaN: true }),
  recovery: fc.double({ min: 0.5, max: 0.995, noNaN: true }),
  solventFactor: fc.double({ min: 1.05, max: 3, noNaN: true }),
  lean: fc.oneof(fc.constant(0), fc.double({ min: 0, max: 0.9, noNaN: true })),
})

function rel(a: number, b: number): number {
  return a === b ? 0 : Math.abs(a - b) / Math.max(Math.abs(a), Math.abs(b))
}

for (const method of ['kremser', 'stageByStage'] as const) {
  describe(`batch balances, ${method}: the same numbers as the scalar design`, () => {
    it('random cases agree to 1e-12 relative, refusals agree', () => {
      let compared = 0
      fc.assert(
        fc.property(fc.array(caseArb, { minLength: 1, maxLength: 8 }), (cases) => {
          const raws = cases.map((k) => {
            const y1 = (1 - k.recovery) * k.yIn
            return {
              ...base,
              method,
              gas: { ...(base.gas as object), flow: k.flow, soluteMoleFraction: k.yIn },
              solvent: { ...(base.solvent as object), soluteMoleFraction: (k.lean * y1) / k.K },
              equilibrium: { model: 'constantK', K: k.K },
              recovery: k.recovery,
              solventFactor: k.solventFactor,
            }
          })
          const si = raws.map((r) => caseToSI(r))
          const out = designBalancesBatch(
            {
              gasFlow: Float64Array.from(si, (c) => c.gas.flow),
              yIn: Float64Array.from(si, (c) => c.gas.soluteMoleFraction),
              x0: Float64Array.from(si, (c) => c.solvent.soluteMoleFraction),
              K: Float64Array.from(cases, (k) => k.K),
              recovery: Float64Array.from(si, (c) => c.recovery),
              solventFactor: Float64Array.from(si, (c) => c.solventFactor),
            },
            method,
          )
          raws.forEach((raw, i) => {
            let summary
            try {
              summary = evaluateCase(raw).summary
            } catch (e) {
              if (!(e instanceof InfeasibleDesignError)) throw e
              const code = e.issues[0]!.code
              if (BALANCE_CODES.has(code as (typeof BATCH_STATUS)[number])) expect(BATCH_STATUS[out.status[i]!]).toBe(code)
              return // refused later, by the hydraulics: not part of the balance
            }
            expect(BATCH_STATUS[out.status[i]!]).toBe('ok')
            compared++
            expect(rel(out.minimumSolventFlow[i]!, summary.minimumSolventFlow)).toBeLessThanOrEqual(1e-12)
            expect(rel(out.solventFlow[i]!, summary.solventFlow)).toBeLessThanOrEqual(1e-12)
            expect(rel(out.absorptionFactor[i]!, summary.absorptionFactor)).toBeLessThanOrEqual(1e-12)
            expect(rel(out.theoreticalStages[i]!, summary.theoreticalStages)).toBeLessThanOrEqual(1e-12)
            expect(rel(out.outletGasSoluteMoleFraction[i]!, summary.outletGasSoluteMoleFraction)).toBeLessThanOrEqual(1e-12)
            expect(rel(out.richSolventSoluteMoleFraction[i]!, summary.richSolventSoluteMoleFraction)).toBeLessThanOrEqual(1e-12)
          })
        }),
        { numRuns: 60, seed: 20261202 },
      )
      expect(compared).toBeGreaterThan(50)
    }, 120_000)

    it('bad numbers and an over-loaded lean solvent are refused case by case, never NaN', () => {
      const out = designBalancesBatch(
        { gasFlow: [100, 100, -1, 100], yIn: [0.01, 0.01, 0.01, 0.01], x0: [0, 0.05, 0, 0], K: [1, 1, 1, 1], recovery: [0.9, 0.9, 0.9, 1.2], solventFactor: [1.5, 1.5, 1.5, 1.5] },
        method,
      )
      expect(Array.from(out.status, (s) => BATCH_STATUS[s])).toEqual(['ok', 'leanSolventLoaded', 'invalidInput', 'invalidInput'])
      for (const a of [out.theoreticalStages, out.solventFlow, out.absorptionFactor]) for (const v of a) expect(Number.isFinite(v)).toBe(true)
    })
  })
}
