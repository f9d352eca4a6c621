/**
 * The import-cycle rule of `npm run lint` follows single-file components: a cycle through a .vue
 * file is an error, and the same shape without the back edge is not. The fixtures live in
 * tests/lint-fixtures/ (ignored by the ordinary lint run; linted here with the project's own
 * configuration). Rule of the project, not a published check.
 */
import { describe, expect, it } from 'vitest'
import { ESLint } from 'eslint'

const DIR = 'tests/lint-fixtures/vue-cycle'

async function cycleErrors(files: string[]): Promise<string[]> {
  const eslint = new ESLint({ ignore: false })
  const results = await eslint.lintFiles(files.map((f) => `${DIR}/${f}`))
  return results.flatMap((r) => r.messages.filter((m) => m.ruleId === 'import-x/no-cycle').map((m) => `${r.filePath.split('/').pop()}: ${m.message}`))
}

describe('the import-cycle rule sees .vue files', () => {
  it('reports the cycle CyclePanel.vue -> cycle-labels.ts -> CyclePanel.vue, from both ends', async () => {
    const errors = await cycleErrors(['CyclePanel.vue', 'cycle-labels.ts'])
    expect(errors.some((e) => e.startsWith('CyclePanel.vue:'))).toBe(true)
    expect(errors.some((e) => e.startsWith('cycle-labels.ts:'))).toBe(true)
  })

  it('reports nothing for the same shape without the back edge', async () => {
    expect(await cycleErrors(['PlainPanel.vue', 'plain-labels.ts'])).toEqual([])
  })
})
