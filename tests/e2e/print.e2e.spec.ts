/**
 * Paper: the study workspace and the compare page printed from the browser. In print media the
 * app bar and the side menu are gone, every section of the workspace is shown (not only the
 * open tab) and each section starts on a new page. The print preview is saved as a PDF to
 * screenshots/ for a person to read.
 */
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { mkdirSync } from 'node:fs'
import path from 'node:path'
import type { Page } from 'playwright-core'
import { tag, api, apiSignIn, baseUrl, openBrowser, screenshotDir, signIn, siteIdOf, type BrowserSession } from './support.ts'

let s: BrowserSession

beforeEach(async () => {
  s = await openBrowser()
})
afterEach(async () => {
  await s.close()
})

/** A study of its own with a design and an optimisation, both pinned as options (API, as the signed-in engineer). */
async function studyWithOptions(page: Page): Promise<{ siteId: number; studyId: number; options: number[] }> {
  const siteId = await siteIdOf(page.request, 'cobalt-ridge')
  const created = await page.request.post(api(`/sites/${siteId}/studies`), {
    data: {
      name: `Print check ${tag()}`,
      description: 'Fermenter vent scrubber printed from the browser',
      inputs: {
        gas: { flow: 180, temperature: 30, pressure: 110, soluteMoleFraction: 0.012, carrier: 'carbon dioxide' },
        solute: 'ethanol',
        solvent: 'water',
        equilibrium: { model: 'constantK', K: 0.43 },
        recovery: 0.97,
        solventFactor: 1.5,
      },
    },
  })
  expect(created.ok()).toBe(true)
  const studyId = ((await created.json()) as { id: number }).id
  const options: number[] = []
  for (const kind of ['design', 'optimize'] as const) {
    const run = await page.request.post(api(`/sites/${siteId}/studies/${studyId}/runs`), { data: { kind }, timeout: 120000 })
    expect(run.ok()).toBe(true)
    const runId = ((await run.json()) as { id: number }).id
    const opt = await page.request.post(api(`/sites/${siteId}/studies/${studyId}/options`), { data: { runId, name: kind === 'design' ? 'As designed' : 'Lowest cost' } })
    expect(opt.ok()).toBe(true)
    options.push(((await opt.json()) as { id: number }).id)
  }
  return { siteId, studyId, options }
}

/** The print preview of the page as a PDF under screenshots/; returns its page count. */
async function printPreview(page: Page, name: string): Promise<number> {
  mkdirSync(screenshotDir, { recursive: true })
  const pdf = await page.pdf({ path: path.join(screenshotDir, `${name}.pdf`), format: 'A4', printBackground: true })
  return (pdf.toString('latin1').match(/\/Type\s*\/Page[^s]/g) ?? []).length
}

const SECTIONS = ['Streams & targets', 'Column', 'Tray checks', 'Economics', 'Options', 'Review']

describe('print', () => {
  it('prints the study workspace without the side menu and app bar, every section on its own page', async () => {
    const { page } = s
    await signIn(page, 'engineer')
    const { siteId, studyId } = await studyWithOptions(page)
    await page.goto(`${baseUrl}/sites/${siteId}/studies/${studyId}/column`)
    await page.getByTestId('column-staging').waitFor()
    // on screen: the menu and the app bar are there, and only the open tab's section
    await page.locator('.v-navigation-drawer').waitFor({ state: 'visible' })
    await page.locator('.v-app-bar').waitFor({ state: 'visible' })
    await page.getByTestId('checks-table').waitFor({ state: 'hidden' })

    await page.emulateMedia({ media: 'print' })
    await page.locator('.v-navigation-drawer').waitFor({ state: 'hidden' })
    await page.locator('.v-app-bar').waitFor({ state: 'hidden' })
    await page.getByRole('tab', { name: 'Economics' }).waitFor({ state: 'hidden' })
    for (const title of SECTIONS) await page.locator(`[data-print-title="${title}"]`).waitFor({ state: 'visible' })
    // the sections' content, not only their frames
    await page.getByLabel('Gas flow into the column').first().waitFor({ state: 'visible' })
    for (const id of ['column-staging', 'checks-table', 'optimum-summary', 'options-table', 'review-panel']) await page.getByTestId(id).waitFor({ state: 'visible' })
    // a page break before each section after the first
    const breaks = await page.locator('[data-print-title]').evaluateAll((els) => els.map((e) => getComputedStyle(e).breakBefore))
    expect(breaks).toEqual(['auto', ...SECTIONS.slice(1).map(() => 'page')])

    const pages = await printPreview(page, 'print-workspace')
    expect(pages).toBeGreaterThanOrEqual(SECTIONS.length)
    expect(s.problems).toEqual([])
  })

  it('prints the operating log of an approved study without its entry forms: the logged months, chart and totals stay', async () => {
    const { page } = s
    await signIn(page, 'engineer')
    const { siteId, studyId, options } = await studyWithOptions(page)
    expect((await page.request.post(api(`/sites/${siteId}/studies/${studyId}/submit`), { data: { recommendedOptionId: options[0] } })).ok()).toBe(true)
    await apiSignIn(page.request, 'reviewer')
    expect((await page.request.post(api(`/sites/${siteId}/studies/${studyId}/approve`), { data: { comment: 'For the print test' } })).ok()).toBe(true)
    await apiSignIn(page.request, 'engineer')
    const logged = await page.request.post(api(`/sites/${siteId}/studies/${studyId}/operating-entries`), { data: { month: '2026-03', gasFlow: 180, solventFlow: 300, recovery: 0.965, powerKw: 12 } })
    expect(logged.ok()).toBe(true)

    await page.goto(`${baseUrl}/sites/${siteId}/studies/${studyId}/operating`)
    await page.getByTestId('op-table').waitFor()
    // on screen: the month form and the CSV import are there
    for (const id of ['op-form', 'op-file', 'op-import']) await page.getByTestId(id).waitFor({ state: 'visible' })

    await page.emulateMedia({ media: 'print' })
    await page.locator('[data-print-title="Operating log"]').waitFor({ state: 'visible' })
    for (const id of ['op-form', 'op-file', 'op-import']) await page.getByTestId(id).waitFor({ state: 'hidden' })
    await page.getByText('Import months from a CSV').waitFor({ state: 'hidden' })
    await page.getByTestId('op-row-2026-03').waitFor({ state: 'visible' })
    await page.getByTestId('op-total-actual').waitFor({ state: 'visible' })
    // the column of row buttons (correct, remove) is screen-only too
    await expect.poll(() => page.getByTestId('op-table').locator('th:visible, td:visible').evaluateAll((els) => els.filter((e) => e.querySelector('.v-btn') || /Correct or remove/.test(e.textContent ?? '')).length)).toBe(0)
    await printPreview(page, 'print-operating')
    expect(s.problems).toEqual([])
  })

  it('prints the compare page without the side menu, the picker or buttons', async () => {
    const { page } = s
    await signIn(page, 'engineer')
    const { studyId, options } = await studyWithOptions(page)
    await page.goto(`${baseUrl}/compare?options=${options.map((o) => `${studyId}-${o}`).join(',')}`)
    const table = page.locator('.print-section')
    await table.waitFor({ state: 'visible' })
    await page.locator('.v-navigation-drawer').waitFor({ state: 'visible' })

    await page.emulateMedia({ media: 'print' })
    await page.locator('.v-navigation-drawer').waitFor({ state: 'hidden' })
    await page.locator('.v-app-bar').waitFor({ state: 'hidden' })
    await page.locator('[data-print-hide]').first().waitFor({ state: 'hidden' })
    await page.getByText('TAC against recovery').waitFor({ state: 'visible' })
    await page.getByText('TAC against solvent factor').waitFor({ state: 'visible' })
    await table.waitFor({ state: 'visible' })
    expect(await table.evaluate((e) => getComputedStyle(e).breakBefore)).toBe('page')
    // on paper (A4 less the margins: 186 mm by 269 mm, 703 by 1017 px at 96 px per inch) the two
    // charts share the first page with the title and the chosen options, and are kept together
    const charts = page.locator('.print-together')
    expect(await charts.evaluate((e) => getComputedStyle(e).breakInside)).toBe('avoid')
    await page.setViewportSize({ width: 703, height: 1017 })
    const bottomOfSecondChart = () =>
      page.locator('.print-together .v-card').nth(1).evaluate((e) => e.getBoundingClientRect().bottom + window.scrollY)
    await expect.poll(bottomOfSecondChart).toBeLessThanOrEqual(1017)
    expect(await printPreview(page, 'print-compare')).toBeGreaterThanOrEqual(2)
    expect(s.problems).toEqual([])
  })
})
