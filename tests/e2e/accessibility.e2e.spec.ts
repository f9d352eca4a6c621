/**
 * Accessibility of every main screen: axe-core (injected from node_modules) finds no serious or
 * critical violation of the WCAG 2 A/AA rules it checks, in both unit systems where numbers show.
 */
import { readFileSync } from 'node:fs'
import path from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { baseUrl, openBrowser, signIn, type BrowserSession } from './support.ts'

/** How long a condition may take to come true on a loaded machine (polled, not slept). */
const WAIT = { timeout: 20000, interval: 100 }

const axeSource = readFileSync(path.resolve('node_modules/axe-core/axe.min.js'), 'utf8')

interface Violation {
  id: string
  impact: string | null
  help: string
  nodes: { target: unknown[]; failureSummary?: string }[]
}

/** Serious and critical violations on the page as it is now, one line each. */
async function axeProblems(p: Page): Promise<string[]> {
  // evaluated through the debugging protocol: the app's Content Security Policy allows no inline script
  if (!(await p.evaluate(() => 'axe' in window))) await p.evaluate(axeSource)
  const violations = await p.evaluate(async () => {
    const w = window as unknown as { axe: { run: (ctx: Document, opts: object) => Promise<{ violations: Violation[] }> } }
    const r = await w.axe.run(document, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] }, resultTypes: ['violations'] })
    return r.violations
  })
  if (process.env.A11Y_LOG) {
    const { appendFileSync } = await import('node:fs')
    appendFileSync(process.env.A11Y_LOG, JSON.stringify({ url: p.url(), v: violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => ({ id: v.id, nodes: v.nodes.map((n) => ({ t: n.target, h: (n as { html?: string }).html })) })) }) + '\n')
  }
  return violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id} (${v.impact}): ${v.help} at ${v.nodes.slice(0, 3).map((n) => JSON.stringify(n.target)).join(', ')}`)
}

/** Transitions and other finite animations still running on the page. */
function finiteAnimations(p: Page): Promise<number> {
  return p.evaluate(() => document.getAnimations().filter((a) => a.playState === 'running' && a.effect?.getTiming().iterations !== Infinity).length)
}

/** Wait until the page's own loading has settled: no progress bars or skeletons are left. */
async function settled(p: Page): Promise<void> {
  await p.locator('.v-skeleton-loader').first().waitFor({ state: 'detached' })
  await expect.poll(() => p.locator('.v-progress-linear--active, .v-progress-circular--indeterminate').count(), WAIT).toBe(0)
  await expect.poll(() => finiteAnimations(p), WAIT).toBe(0) // transitions of tabs and dialogs have ended
}

let s: BrowserSession
let eng: BrowserSession
let studyPath = ''
let compareKeys: string[] = []

/** JSON from the API with the page's session (writes carry the page's origin). */
async function call<T>(p: Page, method: string, url: string, body?: unknown): Promise<T> {
  const r = await p.evaluate(
    async ([m, u, b]) => {
      const res = await fetch(`/api/v1${u}`, { method: m, headers: { 'Content-Type': 'application/json', Accept: 'application/json' }, body: b === undefined ? undefined : JSON.stringify(b) })
      return { status: res.status, body: await res.json() }
    },
    [method, url, body] as const,
  )
  if (r.status >= 300) throw new Error(`${method} ${url}: ${r.status} ${JSON.stringify(r.body)}`)
  return r.body as T
}

beforeAll(async () => {
  // an approved study with two options, so that every section (standing column, operating log) and compare show
  eng = await openBrowser()
  await signIn(eng.page, 'engineer')
  const e = eng.page
  const sites = await call<{ id: number; code: string }[]>(e, 'GET', '/sites')
  const siteId = sites.find((x) => x.code === 'cobalt-ridge')!.id
  const list = await call<{ items: { id: number }[] }>(e, 'GET', `/sites/${siteId}/studies?q=FV-201`)
  const demo = await call<{ inputs: unknown }>(e, 'GET', `/sites/${siteId}/studies/${list.items[0]!.id}`)
  const study = await call<{ id: number }>(e, 'POST', `/sites/${siteId}/studies`, { name: `Accessible study ${Date.now().toString(36)}`, description: '', inputs: demo.inputs })
  const base = `/sites/${siteId}/studies/${study.id}`
  const design = await call<{ id: number }>(e, 'POST', `${base}/runs`, { kind: 'design' })
  const optimum = await call<{ id: number }>(e, 'POST', `${base}/runs`, { kind: 'optimize' })
  const a = await call<{ id: number; studyId: number }>(e, 'POST', `${base}/options`, { runId: design.id, name: 'Design as entered', notes: '' })
  const b = await call<{ id: number }>(e, 'POST', `${base}/options`, { runId: optimum.id, name: 'Lowest-cost optimum', notes: '' })
  await call(e, 'POST', `${base}/submit`, { recommendedOptionId: b.id, comment: 'For the accessibility check.' })
  s = await openBrowser()
  await signIn(s.page, 'reviewer')
  await call(s.page, 'POST', `${base}/approve`, { comment: 'Approved.' })
  await s.close()
  s = await openBrowser()
  await signIn(s.page, 'admin')
  studyPath = base
  compareKeys = [`${study.id}-${a.id}`, `${study.id}-${b.id}`]
})
afterAll(async () => {
  await s.close()
  await eng.close()
})

describe('accessibility: no serious or critical axe violations', () => {
  it('sign-in', async () => {
    const b = await openBrowser()
    try {
      await b.page.goto(`${baseUrl}/sign-in`)
      await b.page.getByLabel('E-mail').waitFor()
      await settled(b.page)
      expect((await axeProblems(b.page)).join('\n')).toBe('')
    } finally {
      await b.close()
    }
  })

  it('portfolio', async () => {
    const p = s.page
    await p.goto(`${baseUrl}/portfolio`)
    await p.getByRole('heading', { level: 1 }).waitFor()
    // the list has rows (which studies are on the first page depends on what other tests created)
    await p.getByTestId('studies-table').locator('tbody tr a').first().waitFor()
    await settled(p)
    expect((await axeProblems(p)).join('\n')).toBe('')
  })

  for (const section of ['streams', 'column', 'checks', 'economics', 'options', 'review', 'standing', 'operating']) {
    it(`study workspace: ${section}`, async () => {
      const p = s.page
      await p.goto(`${baseUrl}${studyPath}/${section}`)
      await p.getByTestId('study-title').waitFor()
      await settled(p)
      expect((await axeProblems(p)).join('\n')).toBe('')
    })
  }

  it('study workspace: the streams form with problems listed', async () => {
    const p = eng.page
    await p.goto(`${baseUrl}/portfolio`)
    await p.getByTestId('new-study').click()
    await p.getByTestId('new-study-name').locator('input').fill(`Accessible inputs ${Date.now().toString(36)}`)
    await p.getByTestId('create-study').click()
    await p.waitForURL(/\/studies\/\d+\/streams/)
    await expect.poll(() => p.getByTestId('gas-flow').locator('input').isEnabled(), WAIT).toBe(true)
    await p.getByTestId('gas-flow').locator('input').fill('-300')
    await p.getByTestId('input-problems').waitFor()
    await settled(p)
    expect((await axeProblems(p)).join('\n')).toBe('')
  })

  it('compare', async () => {
    const p = s.page
    await p.goto(`${baseUrl}/compare?options=${compareKeys.join(',')}`)
    await p.getByTestId('compare-table').waitFor()
    await settled(p)
    expect((await axeProblems(p)).join('\n')).toBe('')
  })

  for (const [name, url] of [
    ['cost basis', '/cost-basis'],
    ['solvent allocation', '/allocation'],
    ['people & sites', '/people'],
    ['outbox', '/outbox'],
  ] as const) {
    it(name, async () => {
      const p = s.page
      await p.goto(`${baseUrl}${url}`)
      await p.getByRole('heading', { level: 1 }).waitFor()
      await settled(p)
      expect((await axeProblems(p)).join('\n')).toBe('')
    })
  }
})
