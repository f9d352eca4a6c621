/**
 * The standing column of an approved study: move the flows and watch recovery, percent flood and
 * the checks follow; the operating window; SI, US and a phone-width screen; and the operating
 * log's monitoring (efficiency drift, cost-gap split). The study is prepared through the API.
 */
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { apiSignOut, apiSignIn, siteIdOf, tag, api, baseUrl, DEMO_EMAILS, DEMO_PASSWORD, openBrowser, shot, type BrowserSession, type DemoPerson } from './support.ts'

let s: BrowserSession
beforeEach(async () => {
  s = await openBrowser()
})
afterEach(async () => {
  await s.close()
})

/** An approved Cobalt Ridge study with four logged months (the last three with a low recovery). */
async function approvedWithLog(p: Page): Promise<{ siteId: number; id: number }> {
  await apiSignIn(p.request, 'engineer')
  const siteId = await siteIdOf(p.request, 'cobalt-ridge')
  const created = await p.request.post(api(`/sites/${siteId}/studies`), {
    data: {
      name: `Standing column ${tag()}`,
      description: 'Fermenter vent scrubber for the standing-column browser test',
      inputs: {
        gas: { flow: 420, temperature: 32, pressure: 115, soluteMoleFraction: 0.015, carrier: 'carbon dioxide' },
        solute: 'ethanol',
        solvent: { name: 'water', temperature: 30, density: 995, viscosity: 0.8, surfaceTension: 70 },
        equilibrium: { model: 'constantK', K: 0.62 },
        recovery: 0.985,
        solventFactor: 1.35,
        tray: { holeDiameter: 4.5, holePitch: 12, thickness: 2, spacing: 0.6, floodFraction: 0.78, foamingFactor: 0.9, weirHeight: 50 },
      },
    },
  })
  const id = ((await created.json()) as { id: number }).id
  const run = (await (await p.request.post(api(`/sites/${siteId}/studies/${id}/runs`), { data: { kind: 'design' } })).json()) as { id: number; result: { summary: { gasFlow: number; solventFlow: number } } }
  const opt = (await (await p.request.post(api(`/sites/${siteId}/studies/${id}/options`), { data: { runId: run.id, name: 'Base design', notes: '' } })).json()) as { id: number }
  expect((await p.request.post(api(`/sites/${siteId}/studies/${id}/submit`), { data: { recommendedOptionId: opt.id, comment: '' } })).ok()).toBe(true)
  await apiSignOut(p)
  await apiSignIn(p.request, 'reviewer')
  expect((await p.request.post(api(`/sites/${siteId}/studies/${id}/approve`), { data: { comment: 'Approved for the standing-column test' } })).ok()).toBe(true)
  await apiSignOut(p)
  await apiSignIn(p.request, 'engineer')
  const { gasFlow: G, solventFlow: L } = run.result.summary
  const months = [
    { month: '2026-05', gasFlow: G, solventFlow: L, recovery: 0.986 },
    { month: '2026-06', gasFlow: G * 1.05, solventFlow: L * 1.25, recovery: 0.96, inletMoleFraction: 0.013 },
    { month: '2026-07', gasFlow: G * 0.95, solventFlow: L, recovery: 0.95 },
    { month: '2026-08', gasFlow: G * 1.25, solventFlow: L * 1.1, recovery: 0.94 },
  ]
  for (const m of months) expect((await p.request.post(api(`/sites/${siteId}/studies/${id}/operating-entries`), { data: m })).ok()).toBe(true)
  await apiSignOut(p)
  return { siteId, id }
}

async function signInAs(p: Page, who: DemoPerson): Promise<void> {
  await p.goto(`${baseUrl}/sign-in`)
  await p.waitForLoadState('networkidle')
  const email = p.getByTestId('email').locator('input')
  const password = p.getByTestId('password').locator('input')
  for (let i = 0; i < 5; i++) {
    await email.fill(DEMO_EMAILS[who])
    await password.fill(DEMO_PASSWORD)
    if ((await email.inputValue()) === DEMO_EMAILS[who] && (await password.inputValue()) === DEMO_PASSWORD) break
    await p.waitForTimeout(300)
  }
  await p.getByTestId('sign-in').click()
  await p.waitForURL((u) => !u.pathname.startsWith('/sign-in'), { timeout: 15000 })
}

/** Wait until a test id's text differs from `before`. */
async function changedFrom(p: Page, testId: string, before: string): Promise<string> {
  await p.waitForFunction(([id, b]) => {
    const el = document.querySelector(`[data-testid="${id}"]`)
    return el !== null && el.textContent !== null && el.textContent.trim() !== b
  }, [testId, before] as const, { timeout: 20000 })
  return (await p.getByTestId(testId).innerText()).trim()
}

describe('standing column', () => {
  it('flows move recovery, percent flood and the checks; the window, SI and US, a phone screen, and monitoring in the log', async () => {
    const p = s.page
    const { siteId, id } = await approvedWithLog(p)
    await signInAs(p, 'engineer')
    await p.goto(`${baseUrl}/sites/${siteId}/studies/${id}/standing`)
    const view = p.getByTestId('standing-column')
    await view.getByTestId('standing-recovery').waitFor()
    await view.locator('.apexcharts-svg').first().waitFor()
    const rec0 = (await p.getByTestId('standing-recovery').innerText()).trim()
    const flood0 = (await p.getByTestId('standing-flood').innerText()).trim()
    expect(rec0).toMatch(/%/)

    // more gas: lower recovery, higher percent flood
    const gasField = p.getByTestId('standing-gas').locator('input')
    const g0 = Number(await gasField.inputValue())
    await gasField.fill(String(Math.round(g0 * 1.4)))
    const rec1 = await changedFrom(p, 'standing-recovery', rec0)
    const flood1 = await changedFrom(p, 'standing-flood', flood0)
    expect(parseFloat(rec1)).toBeLessThan(parseFloat(rec0))
    expect(parseFloat(flood1)).toBeGreaterThan(parseFloat(flood0))
    await p.getByText('Downcomer backup').first().waitFor()
    await shot(p, 'standing-column-si')

    // far beyond flooding: the window says so
    await gasField.fill(String(Math.round(g0 * 3)))
    await p.getByTestId('standing-outside').waitFor({ timeout: 20000 })
    await p.getByTestId('standing-reset').click()
    await changedFrom(p, 'standing-flood', (await p.getByTestId('standing-flood').innerText()).trim())

    // US customary: the flows show in lbmol/h
    const me = await p.request.patch(api('/auth/me'), { data: { unitSystem: 'US' } })
    expect(me.ok()).toBe(true)
    await p.reload()
    await p.getByTestId('standing-recovery').waitFor()
    await p.getByText('lbmol/h').first().waitFor()
    await view.locator('.apexcharts-svg').first().waitFor()
    await shot(p, 'standing-column-us')

    // a phone-width screen
    await p.setViewportSize({ width: 390, height: 844 })
    await p.getByTestId('standing-gas').waitFor()
    await shot(p, 'standing-column-390')
    await p.setViewportSize({ width: 1440, height: 900 })
    await p.request.patch(api('/auth/me'), { data: { unitSystem: 'SI' } })

    // the operating log: efficiency over time with the drift warning, the cost-gap split
    await p.goto(`${baseUrl}/sites/${siteId}/studies/${id}/operating`)
    await p.getByTestId('op-monitoring').waitFor()
    await p.getByTestId('op-drift').waitFor()
    await expect(p.getByTestId('op-monitoring-table').locator('tbody tr').count()).resolves.toBe(4)
    await p.getByTestId('op-monitoring').locator('.apexcharts-svg').nth(2).waitFor()
    await shot(p, 'operating-monitoring')
    expect(s.problems).toEqual([])
  })
})
