import { describe, it, expect } from 'vitest'
import { caseToSI, evaluateCase } from '../../server/engine/index.ts'
import { priceDesign, loadPreset, type CostBreakdown as EngineCostBreakdown } from '../../server/engine/costing/index.ts'
import { optimise } from '../../server/engine/optimisation/optimise.ts'
import { publicDesign, publicOptimisation, type PublicOptimiseResult } from '../../server/services/engine-gateway.ts'
import { searchSpecSchema } from '../../shared/schemas/search.ts'
import {
  pricedDesignSchema,
  optimisationResultSchema,
  runResultSchema,
  type CostBreakdown,
  type OptimisationResult,
  type KnownFields,
} from '../../shared/schemas/results.ts'
import demo from '../../data/demo-studies.json' with { type: 'json' }

// Compile-time: what the edge returns is the shared contract (npm run typecheck fails otherwise).
const optimisationAnswer = (r: PublicOptimiseResult): KnownFields<OptimisationResult> => r
const costAnswer = (b: EngineCostBreakdown): KnownFields<CostBreakdown> => b

const demoCase = demo.studies[0]!.inputs
const basis = loadPreset('halvard-cobalt-ridge')

describe('the engine answers match the shared answer schemas', () => {
  it('a priced design parses, and the parse keeps every field the engine sent', () => {
    const engine = evaluateCase(demoCase)
    const priced = publicDesign(engine, priceDesign(engine, basis)) as ReturnType<typeof publicDesign> & ReturnType<typeof priceDesign>
    const parsed = pricedDesignSchema.parse(JSON.parse(JSON.stringify(priced)))
    expect(Object.keys(parsed).sort()).toEqual(Object.keys(priced).sort())
    expect(Object.keys(parsed.summary).sort()).toEqual(Object.keys(priced.summary).sort())
    expect(costAnswer(priced.costBreakdown).totalAnnualCost).toBe(priced.totalAnnualCost)
  })

  it('an optimisation parses, as itself and as a stored run result', () => {
    const res = publicOptimisation(optimise(caseToSI(demoCase), basis, searchSpecSchema.parse({})))
    const json = JSON.parse(JSON.stringify(optimisationAnswer(res))) as unknown
    const parsed = optimisationResultSchema.parse(json)
    expect(Object.keys(parsed).sort()).toEqual(Object.keys(res).sort())
    expect(Object.keys(parsed.optimum).sort()).toEqual(Object.keys(res.optimum).sort())
    expect(runResultSchema.safeParse(json).success).toBe(true)
  })

  it('a field added to the answer is kept, not dropped, by the parse', () => {
    const design = evaluateCase(demoCase)
    const withExtra = { ...design, summary: { ...design.summary, fractionOfFloodTarget: 0.97 }, boundHits: [{ variable: 'solventFactor', bound: 'upper' }] }
    const parsed = pricedDesignSchema.parse(withExtra)
    expect(parsed.summary.fractionOfFloodTarget).toBe(0.97)
    expect(parsed.boundHits).toEqual(withExtra.boundHits)
  })

  it('refuses an answer that lacks a required field or carries a non-number', () => {
    const design = evaluateCase(demoCase)
    const { checks: _dropped, ...noChecks } = design
    expect(pricedDesignSchema.safeParse(noChecks).success).toBe(false)
    expect(pricedDesignSchema.safeParse({ ...design, summary: { ...design.summary, diameter: 'wide' } }).success).toBe(false)
  })
})

describe('the engine version', () => {
  it('is the package version, defined once', async () => {
    const { ENGINE_VERSION } = await import('../../server/engine/index.ts')
    const pkg = (await import('../../package.json', { with: { type: 'json' } })).default
    expect(ENGINE_VERSION).toBe(pkg.version)
  })
})
