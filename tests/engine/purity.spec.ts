/**
 * The design hot path imports neither zod nor mathjs (nor anything outside the engine but
 * the contract); shared/units.ts and the case schema import only mathjs / zod.
 */
import { readFileSync, readdirSync, statSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'

function tsFiles(dir: string): string[] {
  const out: string[] = []
  for (const f of readdirSync(dir)) {
    const p = join(dir, f)
    if (statSync(p).isDirectory()) out.push(...tsFiles(p))
    else if (p.endsWith('.ts')) out.push(p)
  }
  return out
}
function imports(file: string): string[] {
  const src = readFileSync(file, 'utf8')
  return [...src.matchAll(/^\s*import\s[^'"]*['"]([^'"]+)['"]/gm)].map((m) => m[1]!)
}

describe('engine purity', () => {
  const hot = ['server/engine/design.ts', ...['properties', 'equilibrium', 'balances', 'efficiency', 'hydraulics', 'vessel', 'numerics'].flatMap((d) => tsFiles(`server/engine/${d}`))]
  it('the design hot path imports no zod, no mathjs and nothing outside the engine', () => {
    for (const f of hot) {
      for (const i of imports(f)) {
        expect(i, `${f} imports ${i}`).not.toMatch(/^(zod|mathjs)$/)
        expect(i.startsWith('.'), `${f} imports ${i}`).toBe(true)
        expect(i, `${f} imports ${i}`).not.toMatch(/\.\.\/\.\.\//)
      }
    }
  })
  it('shared/units.ts imports nothing (mathjs is loaded only for a unit outside its table); the case schema only zod, the units and its field rules', () => {
    expect(imports('shared/units.ts')).toEqual([])
    expect(imports('shared/units-mathjs.ts').sort()).toEqual(['./units.ts', 'mathjs'])
    expect(imports('shared/schemas/case.ts').sort()).toEqual(['../units.ts', './caseRules.ts', 'zod'])
    expect(imports('shared/schemas/caseRules.ts')).toEqual(['../units.ts'])
  })
})
