/**
 * The economist drafts and publishes a cost basis; the reviewer reads a study and the cost basis
 * but cannot change either.
 */
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { baseUrl, openBrowser, shot, signIn, siteIdOf, type BrowserSession } from './support.ts'

let s: BrowserSession

beforeEach(async () => {
  s = await openBrowser()
})
afterEach(async () => {
  await s.close()
})

describe('economist', () => {
  it('drafts a new cost basis, sees the changed field, saves and publishes it', async () => {
    const p = s.page
    await signIn(p, 'economist')
    await p.getByRole('link', { name: /Cost basis/ }).click()
    await p.getByTestId('new-draft').click()
    await p.getByTestId('create-draft').click()
    await p.getByTestId('save-cost-basis').waitFor()
    const price = p.getByTestId('cb-utilities.electricityPrice').locator('input')
    const before = Number(await price.inputValue())
    expect(before).toBeGreaterThan(0)
    // a small change, so other browser tests in the same run see nearly the same prices
    await price.fill(String(Math.round((before + 0.001) * 10000) / 10000))
    await expect(p.getByTestId('changed-count').innerText()).resolves.toMatch(/^1 field differ/)
    await p.locator('[data-changed="true"]').first().waitFor()
    await p.getByTestId('save-cost-basis').click()
    await p.getByText('Draft saved.').waitFor()
    await shot(p, 'cost-basis-draft')
    await p.getByTestId('publish').click()
    await p.getByTestId('effective-date').locator('input').fill(new Date().toISOString().slice(0, 10))
    await p.getByTestId('confirm-publish').click()
    // once published the version is read only and in force
    await p.getByText('Read only').first().waitFor()
    await expect(p.getByTestId('save-cost-basis').count()).resolves.toBe(0)
    await expect(p.getByTestId('versions-list').innerText()).resolves.toMatch(/Published/)
    await shot(p, 'cost-basis-published')
    expect(s.problems).toEqual([])
  })
})

describe('reviewer', () => {
  it('opens a study read only: no save, no run, no pin, inputs locked', async () => {
    const p = s.page
    // an engineer prepares a study through the API
    const login = await p.request.post(`${baseUrl}/api/v1/auth/login`, {
      data: { email: 'engineer@halvard.example', password: 'scrubwright-demo' },
    })
    expect(login.ok()).toBe(true)
    const siteId = await siteIdOf(p.request, 'cobalt-ridge')
    const created = await p.request.post(`${baseUrl}/api/v1/sites/${siteId}/studies`, {
      data: {
        name: `Review sample ${Date.now().toString(36)}`,
        description: 'Fermenter vent scrubber for review',
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
    const study = (await created.json()) as { id: number }
    await p.request.post(`${baseUrl}/api/v1/auth/logout`)
    await p.context().clearCookies()

    await signIn(p, 'reviewer')
    await p.goto(`${baseUrl}/sites/${siteId}/studies/${study.id}/streams`)
    await p.getByTestId('read-only').waitFor()
    await expect(p.getByTestId('save-study').count()).resolves.toBe(0)
    await expect(p.getByTestId('run-design').count()).resolves.toBe(0)
    const flow = p.getByTestId('gas-flow').locator('input')
    await expect(flow.getAttribute('readonly')).resolves.not.toBeNull()
    await p.getByTestId('tab-options').click()
    await expect(p.getByTestId('pin-option').count()).resolves.toBe(0)
    await p.getByTestId('tab-economics').click()
    await expect(p.getByTestId('optimise').count()).resolves.toBe(0)
    await shot(p, 'reviewer-study')
    expect(s.problems).toEqual([])
  })
})
