/**
 * Sign-in per demo role: each person sees what their role allows (navigation, buttons, sites).
 * Runs against the built client served by the real server with the seeded demo scenario.
 */
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { baseUrl, openBrowser, shot, signIn, type BrowserSession } from './support.ts'

let s: BrowserSession

beforeEach(async () => {
  s = await openBrowser()
})
afterEach(async () => {
  await s.close()
})

async function navTitles(): Promise<string[]> {
  const nav = s.page.getByRole('navigation', { name: 'Main' })
  await nav.waitFor()
  return (await nav.locator('.v-list-item-title').allInnerTexts()).map((t) => t.trim())
}

describe('sign-in by role', () => {
  it('admin sees People & sites and the list of people', async () => {
    await signIn(s.page, 'admin')
    expect(await navTitles()).toEqual(expect.arrayContaining(['Portfolio', 'Compare', 'Cost basis', 'People & sites']))
    await s.page.getByRole('link', { name: /People & sites/ }).click()
    await s.page.getByRole('heading', { name: 'People & sites' }).waitFor()
    const table = s.page.getByTestId('people-table')
    await table.getByText('bay.engineer@halvard.example').waitFor()
    await expect(table.getByText('economist@halvard.example').count()).resolves.toBe(1)
    await shot(s.page, 'admin-people')
    expect(s.problems).toEqual([])
  })

  it('admin creates a site in the form dialog: a code in use is marked on the Code field, a free one creates the site', async () => {
    await signIn(s.page, 'admin')
    await s.page.goto(`${baseUrl}/people`)
    await s.page.getByRole('tab', { name: /Sites/ }).click()
    await s.page.getByRole('button', { name: 'New site' }).click()
    const dialog = s.page.getByTestId('new-site-dialog')
    await dialog.getByLabel('Name').fill('Lantern Point pilot plant')
    await dialog.getByLabel('Code', { exact: true }).fill('cobalt-ridge')
    await dialog.getByRole('button', { name: 'Create site' }).click()
    await dialog.getByText('is taken').waitFor()
    const code = `lantern-${Date.now().toString(36)}`
    await dialog.getByLabel('Code', { exact: true }).fill(code)
    await dialog.getByRole('button', { name: 'Create site' }).click()
    await dialog.waitFor({ state: 'hidden' })
    await s.page.getByText(code).first().waitFor()
    await shot(s.page, 'admin-site-created')
    expect(s.problems.filter((p) => !p.includes('409'))).toEqual([])
  })

  it('engineer sees the portfolio with a New study button and no People & sites', async () => {
    await signIn(s.page, 'engineer')
    const titles = await navTitles()
    expect(titles).toEqual(expect.arrayContaining(['Portfolio', 'Compare', 'Cost basis']))
    expect(titles).not.toContain('People & sites')
    await s.page.getByTestId('new-study').waitFor()
    await expect(s.page.getByTestId('nav-role').innerText()).resolves.toBe('Engineer')
    await shot(s.page, 'engineer-portfolio')
    expect(s.problems).toEqual([])
  })

  it('economist may edit the cost basis but not create studies', async () => {
    await signIn(s.page, 'economist')
    expect(await navTitles()).not.toContain('People & sites')
    await expect(s.page.getByTestId('nav-role').innerText()).resolves.toBe('Economist')
    await s.page.getByTestId('studies-table').waitFor()
    await expect(s.page.getByTestId('new-study').count()).resolves.toBe(0)
    await s.page.getByRole('link', { name: /Cost basis/ }).click()
    await s.page.getByTestId('new-draft').waitFor()
    expect(s.problems).toEqual([])
  })

  it('reviewer reads: no New study, no New draft', async () => {
    await signIn(s.page, 'reviewer')
    await expect(s.page.getByTestId('nav-role').innerText()).resolves.toBe('Reviewer')
    expect(await navTitles()).not.toContain('People & sites')
    await s.page.getByTestId('studies-table').waitFor()
    await expect(s.page.getByTestId('new-study').count()).resolves.toBe(0)
    await s.page.getByRole('link', { name: /Cost basis/ }).click()
    await s.page.getByRole('heading', { name: 'Site cost basis' }).waitFor()
    await s.page.getByText('Economists keep the cost basis; you can read it.').waitFor()
    await expect(s.page.getByTestId('new-draft').count()).resolves.toBe(0)
    expect(s.problems).toEqual([])
  })

  it('Marrow Bay engineer sees only Marrow Bay', async () => {
    await signIn(s.page, 'bayEngineer')
    const picker = s.page.getByTestId('site-picker')
    await expect(picker.innerText()).resolves.toContain('Marrow Bay coatings plant')
    await picker.click()
    const options = s.page.getByRole('option')
    await options.first().waitFor()
    expect(await options.allInnerTexts()).toEqual([expect.stringContaining('Marrow Bay coatings plant')])
    await s.page.keyboard.press('Escape')
    await shot(s.page, 'bay-engineer-portfolio')
    // the other site is not reachable by address either
    const sites = (await (await s.page.request.get(`${baseUrl}/api/v1/sites`)).json()) as { id: number; code: string }[]
    expect(sites.map((x) => x.code)).toEqual(['marrow-bay'])
    expect(s.problems).toEqual([])
  })

  it('a signed-out visitor is sent to sign-in and back afterwards', async () => {
    await s.page.goto(`${baseUrl}/compare`)
    await s.page.waitForURL(/\/sign-in\?redirect=/)
    await s.page.getByLabel('E-mail').fill('engineer@halvard.example')
    await s.page.getByLabel('Password').fill('scrubwright-demo')
    await s.page.getByRole('button', { name: /sign in/i }).click()
    await s.page.waitForURL(/\/compare/)
    await s.page.getByRole('heading', { name: 'Compare options' }).waitFor()
  })

  it('signs out from the person menu; the portfolio then asks for sign-in again', async () => {
    await signIn(s.page, 'economist')
    await s.page.getByTestId('person-menu').click()
    await s.page.getByTestId('sign-out').click()
    await s.page.waitForURL(/\/sign-in/)
    await s.page.goto(`${baseUrl}/portfolio`)
    await s.page.waitForURL(/\/sign-in\?redirect=/)
    await s.page.getByLabel('E-mail').waitFor()
  })
})
