/**
 * The robust optimum: the lowest EXPECTED total annualised cost among designs whose probability
 * of meeting the recovery floor (the search's lowest recovery, or the emission limit) is at least
 * the confidence asked for.
 *
 * Method. Every candidate design is rated in the same sampled worlds (common random numbers:
 * one Latin hypercube of `searchSamples` draws, drawn once), so two candidates differ only by
 * their columns and the comparison is not blurred by sampling noise. The tray spacing and the
 * design fraction of flood are held at the nominal optimum's; the search runs over the solvent
 * factor (a grid over its bounds, then a finer grid around the best) and the design recovery,
 * which sets the trays: for each solvent factor the lowest design recovery that reaches the
 * confidence is found by bisection (the probability rises with the design recovery), and a few
 * higher recoveries are priced too (more trays can cost less in lost product). Candidates must
 * pass the same checks and limits as the nominal search. The winner is re-checked with the full
 * sample count; if it falls short there, the next cheapest candidates are tried.
 */
import type { CostBasisData } from '../../../shared/schemas/costBasis.ts'
import type { SearchSpec } from '../../../shared/schemas/search.ts'
import type { RobustSpec } from '../../../shared/schemas/uncertainty.ts'
import { markSI, type RobustResultSI } from '../../../shared/summaryUnits.ts'
import { uncertaintySpecSchema } from '../../../shared/schemas/uncertainty.ts'
import type { CaseSI } from '../case.ts'
import type { DesignResult } from '../contract.ts'
import { designSI } from '../design.ts'
import { Evaluator, toR, toU, type OptimiseResult } from '../optimisation/evaluator.ts'
import { recoveryBounds, soluteInKgPerHour } from '../optimisation/driver.ts'
import { fixColumn } from './column.ts'
import { drawSamples, rateAll, type SampleSet, type Target } from './propagate.ts'
import { proportionError } from './statistics.ts'

const LEAN = { profile: false, detail: false } as const

interface Candidate {
  u: number
  s: number
  design: DesignResult
  p: number
  expectedTac: number
}

function judge(c: CaseSI, basis: CostBasisData, design: DesignResult, set: SampleSet, target: Target): { p: number; expectedTac: number } {
  const fc = fixColumn(c, design, basis)
  const out = rateAll(fc, set, target)
  let k = 0, sum = 0, m = 0
  for (let i = 0; i < set.n; i++) {
    k += out.meets[i]!
    const t = out.totalAnnualCost[i]!
    if (Number.isFinite(t)) {
      sum += t
      m++
    }
  }
  return { p: k / set.n, expectedTac: m > 0 ? sum / m : Infinity }
}

/**
 * The robust optimum beside a nominal optimum of the same case, basis and search.
 * Never throws for a confidence that cannot be met: the answer says so (`found: false`).
 */
export function robustOptimum(c: CaseSI, basis: CostBasisData, search: SearchSpec, nominal: OptimiseResult, robust: RobustSpec): RobustResultSI {
  const t0 = performance.now()
  const spec = robust.uncertainty ?? uncertaintySpecSchema.parse({})
  const [rLo, rHi] = recoveryBounds(search, soluteInKgPerHour(c))
  const target: Target = search.emissionLimit !== undefined ? { kind: 'emissionLimit', recovery: rLo, emissionLimit: search.emissionLimit } : { kind: 'recovery', recovery: rLo, emissionLimit: null }
  const o = nominal.optimum
  const designEfficiency = o.design.summary.overallEfficiency ?? (c.efficiency.model === 'fixed' ? c.efficiency.value : 1)
  const searchSet = drawSamples(spec, c, designEfficiency, robust.searchSamples)
  const fullSet = drawSamples(spec, c, designEfficiency, spec.samples)
  const tIndex = Math.max(0, search.traySpacings.indexOf(o.traySpacing))
  const ev = new Evaluator((v) => designSI(c, v, LEAN), search, rLo, rHi)
  const seen = new Map<string, Candidate | null>()
  const at = (u: number, s: number): Candidate | null => {
    const key = `${u}|${s}`
    if (seen.has(key)) return seen.get(key)!
    const x = { u, s, f: o.floodFraction, t: tIndex }
    let cand: Candidate | null = null
    if (typeof ev.designAt(x) !== 'string') {
      // the evaluator keeps summaries only: the column to rate needs the whole result
      const d = ev.resultAt(x)
      cand = { u, s, design: d, ...judge(c, basis, d, searchSet, target) }
    }
    seen.set(key, cand)
    return cand
  }
  const uLo = toU(rLo), uHi = toU(rHi)
  const good: Candidate[] = []
  const explore = (s: number) => {
    const top = at(uHi, s)
    if (!top || top.p < robust.confidence) {
      // the highest recovery may fail a check: walk down a little before giving up
      let found = false
      for (const f of [0.9, 0.8, 0.7]) {
        const cand = at(uLo + f * (uHi - uLo), s)
        if (cand && cand.p >= robust.confidence) found = true
      }
      if (!found) return
    }
    let lo = uLo, hi = uHi
    const first = at(uLo, s)
    if (first && first.p >= robust.confidence) hi = uLo
    else {
      for (let i = 0; i < 8; i++) {
        const mid = 0.5 * (lo + hi)
        const cand = at(mid, s)
        if (cand && cand.p >= robust.confidence) hi = mid
        else lo = mid
      }
    }
    for (let k = 0; k <= 2; k++) {
      const cand = at(hi + ((uHi - hi) * k) / 4, s)
      if (cand && cand.p >= robust.confidence) good.push(cand)
    }
  }
  const sMin = search.solventFactor.min, sMax = search.solventFactor.max
  const grid = Array.from({ length: 8 }, (_, i) => sMin + ((sMax - sMin) * i) / 7)
  grid.push(o.solventFactor)
  for (const s of grid) explore(s)
  const nom = at(toU(o.recovery), o.solventFactor)
  if (nom && nom.p >= robust.confidence) good.push(nom)
  if (good.length) {
    const best = good.reduce((a, b) => (b.expectedTac < a.expectedTac ? b : a))
    const step = (sMax - sMin) / 7
    for (const f of [-0.5, 0.5]) {
      const s = best.s + f * step
      if (s >= sMin && s <= sMax) explore(s)
    }
  }
  // re-check with the full sample count, cheapest first
  good.sort((a, b) => a.expectedTac - b.expectedTac)
  const unique = good.filter((g, i) => good.findIndex((h) => h.u === g.u && h.s === g.s) === i)
  let winner: (Candidate & { pFull: number; tacFull: number }) | null = null
  for (const g of unique.slice(0, 6)) {
    const full = judge(c, basis, g.design, fullSet, target)
    if (full.p >= robust.confidence) {
      winner = { ...g, pFull: full.p, tacFull: full.expectedTac }
      break
    }
  }
  const nomFull = judge(c, basis, o.design, fullSet, target)
  const ns = o.design.summary
  const nominalOut = {
    recovery: o.recovery,
    solventFactor: o.solventFactor,
    actualTrays: o.actualTrays,
    selectedDiameter: o.selectedDiameter,
    solventFlow: ns.solventFlow, // mol/s (kmol/h at the edge: robustToPublic)
    totalAnnualCost: o.totalAnnualCost,
    expectedTotalAnnualCost: nomFull.expectedTac,
    probabilityMeetsFloor: nomFull.p,
  }
  const base = {
    confidence: robust.confidence,
    currency: basis.general.currency,
    floor: { recovery: rLo, emissionLimit: search.emissionLimit ?? null },
    heldAtNominalOptimum: ['traySpacing', 'floodFraction'],
    nominal: nominalOut,
    searchSamples: robust.searchSamples,
    checkSamples: spec.samples,
    candidates: seen.size,
  }
  if (!winner) {
    return markSI({
      ...base,
      found: false,
      reason: `No design within the search bounds reaches a ${(100 * robust.confidence).toFixed(1)} % chance of meeting the floor (recovery ${rLo.toFixed(4)}) with the tray spacing and fraction of flood of the nominal optimum; widen the recovery or solvent-factor bounds, or lower the confidence.`,
      robust: null,
      margin: null,
      ms: performance.now() - t0,
    })
  }
  const ws = winner.design.summary
  const wTac = ev.evaluate({ u: winner.u, s: winner.s, f: o.floodFraction, t: tIndex }, basis).tac
  return markSI({
    ...base,
    found: true,
    robust: {
      recovery: toR(winner.u),
      solventFactor: winner.s,
      traySpacing: o.traySpacing,
      floodFraction: o.floodFraction,
      actualTrays: ws.actualTrays,
      selectedDiameter: ws.selectedDiameter,
      solventFlow: ws.solventFlow,
      totalAnnualCost: wTac,
      expectedTotalAnnualCost: winner.tacFull,
      probabilityMeetsFloor: winner.pFull,
      probabilityStandardError: proportionError(Math.round(winner.pFull * spec.samples), spec.samples).standardError,
    },
    margin: {
      extraTrays: ws.actualTrays - o.actualTrays,
      extraSolventFlow: ws.solventFlow - ns.solventFlow,
      extraSolventFraction: ws.solventFlow / ns.solventFlow - 1,
      extraTotalAnnualCost: wTac - o.totalAnnualCost,
      extraExpectedTotalAnnualCost: winner.tacFull - nomFull.expectedTac,
    },
    ms: performance.now() - t0,
  })
}
