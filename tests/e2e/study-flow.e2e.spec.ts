/**
 * The engineer's whole job in the browser: create a study, change an input, run a design and an
 * optimisation, look at the column, the tray checks and the cost curves, pin two options and
 * compare them.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { baseUrl, openBrowser, shot, signIn, type BrowserSession } from './support.ts'

let s: BrowserSession
const studyName = `Vent scrubber trial ${Date.now().toString(36)}`
let studyPath = ''

beforeAll(async () => {
  s = await openBrowser()
  await signIn(s.page, 'engineer')
})
afterAll(async () => {
  await s.close()
})

describe('engineer: study from inputs to compared options', () => {
  it('creates a study and lands on Streams & targets', async () => {
    const p = s.page
    await p.getByTestId('new-study').click()
    await p.getByTestId('new-study-name').locator('input').fill(studyName)
    await p.getByTestId('create-study').click()
    await p.waitForURL(/\/studies\/\d+\/streams/)
    studyPath = new URL(p.url()).pathname.replace(/\/streams$/, '')
    await expect(p.getByTestId('study-title').innerText()).resolves.toBe(studyName)
    await p.getByTestId('gas-flow').locator('input').waitFor()
  })

  it('changes the recovery target and runs a design', async () => {
    const p = s.page
    const recovery = p.getByTestId('recovery').locator('input')
    await recovery.fill('95')
    await p.getByText('Unsaved changes').waitFor()
    await shot(p, 'study-streams')
    await p.getByTestId('run-design').click()
    await p.waitForURL(/\/column$/)
    await p.getByTestId('column-staging').waitFor()
    await p.getByRole('img', { name: /Operating diagram/ }).waitFor()
    await p.locator('.apexcharts-svg').first().waitFor()
    // the cautions of the result are on screen (vessel estimate, flammable solute)
    const cautions = p.getByTestId('cautions')
    await expect(cautions.innerText()).resolves.toMatch(/preliminary/i)
    await expect(cautions.innerText()).resolves.toMatch(/flammable/i)
    await shot(p, 'study-column')
  })

  it('shows the tray checks with a verdict each', async () => {
    const p = s.page
    await p.getByTestId('tab-checks').click()
    const rows = p.getByTestId('checks-table').locator('tbody tr')
    await rows.first().waitFor()
    const n = await rows.count()
    expect(n).toBeGreaterThan(3)
    const verdicts = await p.getByTestId('checks-table').locator('tbody .v-chip').allInnerTexts()
    expect(verdicts).toHaveLength(n)
    for (const v of verdicts) expect(['Pass', 'Warn', 'Fail']).toContain(v.trim())
    await shot(p, 'study-checks')
  })

  it('pins the design as an option', async () => {
    const p = s.page
    await p.getByTestId('tab-options').click()
    await p.getByTestId('pin-option').click()
    await p.getByTestId('option-name').locator('input').fill('Design at 95 %')
    await p.getByTestId('confirm-pin').click()
    await p.getByTestId('options-table').getByText('Design at 95 %').waitFor()
  })

  it('optimises and shows the cost curves with the optimum and the sensitivity', async () => {
    const p = s.page
    await p.getByTestId('tab-economics').click()
    await p.getByTestId('optimise').click()
    await p.getByTestId('optimum-summary').waitFor({ timeout: 60000 })
    await p.getByRole('img', { name: /Total annualised cost against Recovery/ }).waitFor()
    await p.getByRole('img', { name: /Total annualised cost against Solvent factor/ }).waitFor()
    await p.getByRole('img', { name: /Sensitivity of the optimum TAC/ }).waitFor()
    await p.getByTestId('cost-table').waitFor()
    await p.waitForTimeout(800)
    await expect(p.locator('.apexcharts-point-annotations').count()).resolves.toBeGreaterThan(0)
    await shot(p, 'study-economics')
  })

  it('pins the optimum and compares the two options', async () => {
    const p = s.page
    await p.getByTestId('tab-options').click()
    await p.getByTestId('pin-option').click()
    await p.getByTestId('option-name').locator('input').fill('Lowest-cost optimum')
    await p.getByTestId('confirm-pin').click()
    const table = p.getByTestId('options-table')
    await table.getByText('Lowest-cost optimum').waitFor()
    await table.getByRole('checkbox', { name: /Design at 95 %/ }).check()
    await table.getByRole('checkbox', { name: /Lowest-cost optimum/ }).check()
    await p.getByTestId('compare-selected').click()
    await p.waitForURL(/\/compare\?options=/)
    const cmp = p.getByTestId('compare-table')
    await cmp.waitFor()
    await cmp.getByText('Design at 95 %').waitFor()
    await cmp.getByText('Lowest-cost optimum').waitFor()
    // the two options differ at least in trays or cost: some rows are highlighted
    await expect(cmp.locator('td.diff-cell').count()).resolves.toBeGreaterThan(0)
    await p.getByRole('img', { name: /Total annualised cost against Recovery/ }).waitFor()
    await shot(p, 'compare')
    expect(s.problems).toEqual([])
  })

  it('submits the optimum for review, and the reviewer approves it', async () => {
    const p = s.page
    await p.goto(`${baseUrl}${studyPath}/review`)
    await p.getByTestId('recommended-select').click()
    await p.getByRole('option', { name: 'Lowest-cost optimum' }).click()
    await p.getByTestId('submit-note').locator('textarea').fill('Lowest annual cost with all tray checks acceptable.')
    await p.getByTestId('submit-review').click()
    await p.getByText('In review').first().waitFor()

    const r = await openBrowser()
    try {
      await signIn(r.page, 'reviewer')
      await r.page.goto(`${baseUrl}${studyPath}/review`)
      await r.page.getByTestId('approve').click()
      await r.page.getByText('Approved', { exact: true }).first().waitFor()
      await shot(r.page, 'review-approved')
      expect(r.problems).toEqual([])
    } finally {
      await r.close()
    }
  })
})
