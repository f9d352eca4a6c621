import { expect } from 'vitest'
import { chromium, type APIRequestContext, type BrowserContext, type Page } from 'playwright-core'
import { mkdtempSync, mkdirSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'

/** Browser-test harness: Debian's chromium driven by playwright-core against the served app. */
export const baseUrl = process.env.E2E_BASE_URL ?? 'http://127.0.0.1:8647'
export const DEMO_PASSWORD = 'scrubwright-demo'
export const DEMO_EMAILS = {
  admin: 'admin@halvard.example',
  economist: 'economist@halvard.example',
  engineer: 'engineer@halvard.example',
  reviewer: 'reviewer@halvard.example',
  bayEngineer: 'bay.engineer@halvard.example',
} as const
export type DemoPerson = keyof typeof DEMO_EMAILS

export const screenshotDir = path.resolve('screenshots')

export interface BrowserSession {
  context: BrowserContext
  page: Page
  /** Console errors and failed requests seen so far (tests assert this stays empty). */
  problems: string[]
  close(): Promise<void>
}

export async function openBrowser(): Promise<BrowserSession> {
  const profile = mkdtempSync(path.join(tmpdir(), 'sw-chromium-'))
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    viewport: { width: 1440, height: 900 },
    args: [
      '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update',
      '--disable-sync', '--no-first-run', '--disable-quic', '--disable-dev-shm-usage',
    ],
  })
  const page = context.pages()[0] ?? (await context.newPage())
  const problems: string[] = []
  page.on('console', (m) => {
    if (m.type() === 'error' && !/status of 40[134]/.test(m.text())) problems.push(`console: ${m.text()}`)
  })
  page.on('pageerror', (e) => problems.push(`pageerror: ${e.message}`))
  return {
    context,
    page,
    problems,
    async close() {
      await context.close()
      rmSync(profile, { recursive: true, force: true })
    },
  }
}

/** Sign in through the sign-in page as one of the demo people and wait for the app shell. */
export async function signIn(page: Page, who: DemoPerson): Promise<void> {
  await page.goto(`${baseUrl}/sign-in`)
  const email = page.getByLabel('E-mail')
  const password = page.getByLabel('Password', { exact: true })
  // On a loaded machine a late focus change can send typing to the wrong field: fill, check, refill.
  for (let attempt = 0; attempt < 3; attempt++) {
    await email.fill(DEMO_EMAILS[who])
    await password.fill(DEMO_PASSWORD)
    if ((await email.inputValue()) === DEMO_EMAILS[who] && (await password.inputValue()) === DEMO_PASSWORD) break
    await page.waitForTimeout(300)
  }
  await page.getByRole('button', { name: /sign in/i }).click()
  await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'), { timeout: 15000 })
}

/** Save a full-page screenshot to screenshots/NAME.png (ignored by git) after transitions settle. */
export async function shot(page: Page, name: string): Promise<string> {
  mkdirSync(screenshotDir, { recursive: true })
  await page.waitForTimeout(400)
  const file = path.join(screenshotDir, `${name}.png`)
  await page.screenshot({ path: file, fullPage: true })
  return file
}

/** A path of the app's API under test. */
export const api = (p: string) => `${baseUrl}/api/v1${p}`

/** A short random tag that keeps names one run creates apart from another run's. */
export const tag = () => `${Date.now().toString(36)}${Math.floor(Math.random() * 1296).toString(36)}`

/** Sign in an API request context (and so the page it belongs to) as a demo person. */
export async function apiSignIn(r: APIRequestContext, who: DemoPerson): Promise<void> {
  const res = await r.post(api('/auth/login'), { data: { email: DEMO_EMAILS[who], password: DEMO_PASSWORD } })
  expect(res.ok()).toBe(true)
}

/** Sign out of the API session and drop the cookies so the browser can sign in as someone else. */
export async function apiSignOut(p: Page): Promise<void> {
  await p.request.post(api('/auth/logout'))
  await p.context().clearCookies()
}

/** The id of a demo site by its code. */
export async function siteIdOf(r: APIRequestContext, code: string): Promise<number> {
  const sites = (await (await r.get(api('/sites'))).json()) as { id: number; code: string }[]
  const id = sites.find((x) => x.code === code)?.id
  expect(id).toBeDefined()
  return id as number
}
