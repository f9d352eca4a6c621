/**
 * A study's case file is the command line's case file: exported inputs read back unchanged, are
 * designed by the engine exactly as the stored inputs are (what `npm run design` does with the
 * file), and a bad file answers every problem with its field path.
 */
import { describe, it, expect } from 'vitest'
import { readFileSync } from 'node:fs'
import { caseFileName, caseFileText, readCaseFile } from '../../shared/caseFile.ts'
import { evaluateCase } from '../../server/engine/index.ts'

const demo = JSON.parse(readFileSync('data/demo-studies.json', 'utf8')) as { studies: { name: string; description: string; inputs: Record<string, unknown> }[] }

describe('case files', () => {
  it('exports each demo study as a case file that reads back to the same inputs', () => {
    for (const s of demo.studies) {
      const text = caseFileText(s)
      const file = JSON.parse(text) as Record<string, unknown>
      expect(Object.keys(file).slice(0, 2)).toEqual(['name', 'description'])
      const back = readCaseFile(text)
      expect(back).toEqual({ ok: true, name: s.name, description: s.description, inputs: s.inputs })
    }
  })

  it('the exported file designs as the stored inputs do (the command line reads the same object)', () => {
    const s = demo.studies[0]!
    const fromFile = evaluateCase(JSON.parse(caseFileText(s)))
    const fromStudy = evaluateCase(s.inputs)
    expect(fromFile.summary).toEqual(fromStudy.summary)
  })

  it('reads the shipped example case files', () => {
    for (const f of ['design.json', 'design-acetone.json', 'design-table.json']) {
      const r = readCaseFile(readFileSync(`data/examples/${f}`, 'utf8'))
      expect(r.ok, f).toBe(true)
      if (r.ok) expect(r.name).toBe((JSON.parse(readFileSync(`data/examples/${f}`, 'utf8')) as { name: string }).name)
    }
  })

  it('lists every problem with its field path, refuses a batch and bad JSON', () => {
    const bad = readCaseFile(JSON.stringify({ name: 'Bad', gas: { flow: 'lots', temperature: 30, pressure: 110, soluteMoleFraction: 0.012 }, solute: 'ethanol', solvent: 'water', equilibrium: { model: 'constantK', K: 0.43 }, recovery: '97 %' }))
    expect(bad.ok).toBe(false)
    if (!bad.ok) {
      const paths = bad.problems.map((p) => p.path)
      expect(paths).toEqual(expect.arrayContaining(['gas.flow', 'recovery', 'solventFactor']))
      expect(bad.problems.find((p) => p.path === 'solventFactor')!.message).toMatch(/required/)
    }
    const batch = readCaseFile(readFileSync('data/examples/design-batch.json', 'utf8'))
    expect(batch.ok).toBe(false)
    if (!batch.ok) expect(batch.problems[0]!.message).toMatch(/batch of \d+ cases/)
    const notJson = readCaseFile('{ "gas": ')
    expect(notJson.ok).toBe(false)
    if (!notJson.ok) expect(notJson.problems[0]).toMatchObject({ path: '', message: expect.stringMatching(/not valid JSON/) })
  })

  it('names the file after the study', () => {
    expect(caseFileName('Fermenter vent scrubber FV-201')).toBe('fermenter-vent-scrubber-fv-201.json')
    expect(caseFileName('<b>??</b>')).toBe('bb.json')
    expect(caseFileName('***')).toBe('study.json')
  })
})
