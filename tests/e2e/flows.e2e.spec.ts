/**
 * Layouts and flows: the app bar on a phone, changing one's own password, notifications that read
 * as sentences, correcting and flagging operating months in the person's units, and case files
 * and the portfolio CSV. Each test prepares what it needs through the API.
 */
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { readFileSync } from 'node:fs'
import type { APIRequestContext, Locator, Page } from 'playwright-core'
import { siteIdOf, apiSignOut, apiSignIn, tag, api, baseUrl, DEMO_EMAILS, DEMO_PASSWORD, openBrowser, shot, type BrowserSession } from './support.ts'

let s: BrowserSession

beforeEach(async () => {
  s = await openBrowser()
})
afterEach(async () => {
  await s.close()
})

const INPUTS = {
  gas: { flow: 180, temperature: 30, pressure: 110, soluteMoleFraction: 0.012, carrier: 'carbon dioxide' },
  solute: 'ethanol',
  solvent: 'water',
  equilibrium: { model: 'constantK', K: 0.43 },
  recovery: 0.97,
  solventFactor: 1.5,
}

/** A study with a design run (and that design pinned as an option). */
async function designedStudy(r: APIRequestContext, siteId: number, name: string): Promise<{ id: number; optionId: number; solventFlow: number }> {
  const created = await r.post(api(`/sites/${siteId}/studies`), { data: { name, description: 'Prepared for a browser test', inputs: INPUTS } })
  expect(created.ok()).toBe(true)
  const study = (await created.json()) as { id: number }
  const run = await r.post(api(`/sites/${siteId}/studies/${study.id}/runs`), { data: { kind: 'design' } })
  expect(run.ok()).toBe(true)
  const runBody = (await run.json()) as { id: number; result: { summary: { solventFlow: number } } }
  const opt = await r.post(api(`/sites/${siteId}/studies/${study.id}/options`), { data: { runId: runBody.id, name: 'Base design', notes: '' } })
  expect(opt.ok()).toBe(true)
  return { id: study.id, optionId: ((await opt.json()) as { id: number }).id, solventFlow: runBody.result.summary.solventFlow }
}

async function signInAs(p: Page, email: string, password: string): Promise<void> {
  await p.goto(`${baseUrl}/sign-in`)
  await p.waitForLoadState('networkidle')
  const e = p.getByTestId('email').locator('input')
  const w = p.getByTestId('password').locator('input')
  for (let i = 0; i < 5; i++) {
    await e.fill(email)
    await w.fill(password)
    if ((await e.inputValue()) === email && (await w.inputValue()) === password) break
    await p.waitForTimeout(300)
  }
  await p.getByTestId('sign-in').click()
  await p.waitForURL((u) => !u.pathname.startsWith('/sign-in'), { timeout: 15000 })
}

/** Wait until the element is laid out at least `minWidth` px wide and wholly inside the viewport. */
async function onScreen(p: Page, l: Locator, minWidth = 24): Promise<void> {
  await l.waitFor()
  const vw = p.viewportSize()!.width
  await expect
    .poll(async () => {
      const b = await l.boundingBox()
      return b !== null && b.width >= minWidth && b.x >= 0 && b.x + b.width <= vw + 0.5
    }, { timeout: 10000 })
    .toBe(true)
}

describe('phone layout', () => {
  it('at 390 px the site picker, the units, notifications and the account menu are on screen and work', async () => {
    const p = s.page
    // a tablet first: the account menu and notifications fit beside the site picker
    await p.setViewportSize({ width: 768, height: 1024 })
    await signInAs(p, DEMO_EMAILS.economist, DEMO_PASSWORD)
    await p.getByTestId('studies-table').waitFor()
    await onScreen(p, p.getByTestId('site-picker'), 150)
    await onScreen(p, p.getByTestId('notifications'))
    await onScreen(p, p.getByTestId('person-menu'))
    await shot(p, 'shell-768')

    await p.setViewportSize({ width: 390, height: 844 })
    await p.getByTestId('studies-table').waitFor()
    const picker = p.getByTestId('site-picker')
    await onScreen(p, picker, 150)
    await onScreen(p, p.getByTestId('unit-switch'))
    await onScreen(p, p.getByTestId('notifications'))
    await onScreen(p, p.getByTestId('person-menu'))
    await shot(p, 'shell-390')

    // change site from the phone: the economist works at both sites
    const before = (await picker.innerText()).trim()
    await picker.click()
    const other = p.getByRole('option').filter({ hasNotText: before.split('\n').pop()! })
    await other.first().waitFor()
    const otherName = (await other.first().innerText()).split('\n')[0]!.trim()
    await other.first().click()
    await expect.poll(async () => (await picker.innerText()).includes(otherName), { timeout: 10000 }).toBe(true)

    // notifications open inside the screen
    await p.getByTestId('notifications').click()
    await onScreen(p, p.getByTestId('notifications-panel'), 200)
    await p.keyboard.press('Escape')

    // the account menu: change password and sign out are on screen
    await p.getByTestId('person-menu').click()
    await onScreen(p, p.getByTestId('change-password'), 100)
    await onScreen(p, p.getByTestId('sign-out'), 100)
    await shot(p, 'shell-390-account-menu')
    await p.getByTestId('sign-out').click()
    await p.waitForURL(/\/sign-in/)
    expect(s.problems).toEqual([])
  })
})

describe('account', () => {
  it('a person changes their own password from the account menu; the rule is checked as they type', async () => {
    const p = s.page
    await apiSignIn(p.request, 'admin')
    const email = `new-person-${tag()}@halvard.example`
    const first = 'first-password-given'
    const made = await p.request.post(api('/people'), { data: { email, name: 'New Person', password: first, isAdmin: false } })
    expect(made.ok()).toBe(true)
    await apiSignOut(p)

    await signInAs(p, email, first)
    await p.getByTestId('person-menu').click()
    await p.getByTestId('change-password').click()
    const dialog = p.getByTestId('password-dialog')
    await dialog.waitFor()
    const save = p.getByTestId('password-save')
    await expect(save.isDisabled()).resolves.toBe(true)
    await expect(p.getByTestId('password-why').innerText()).resolves.toMatch(/Enter the current password/)

    await p.getByTestId('password-current').locator('input').fill('not-the-password')
    await p.getByTestId('password-new').locator('input').fill('password1234')
    await p.getByTestId('password-repeat').locator('input').fill('password1234')
    await dialog.getByText('The new password is one of the most common passwords; choose another.').first().waitFor()
    await expect(save.isDisabled()).resolves.toBe(true)
    await p.getByTestId('password-new').locator('input').fill(email)
    await dialog.getByText('The new password must not be your e-mail address.').first().waitFor()

    const next = 'a quiet harbour at dawn'
    await p.getByTestId('password-new').locator('input').fill(next)
    await p.getByTestId('password-repeat').locator('input').fill(next)
    await expect.poll(() => save.isDisabled()).toBe(false)
    await save.click()
    // the wrong current password is named on its field; the person stays signed in
    await dialog.getByText('The current password is not right.').waitFor()
    await shot(p, 'account-password-dialog')
    await p.getByTestId('password-current').locator('input').fill(first)
    await save.click()
    await p.getByTestId('password-changed').waitFor()
    await dialog.waitFor({ state: 'hidden' })

    // signed out and in again: only the new password works
    await p.getByTestId('person-menu').click()
    await p.getByTestId('sign-out').click()
    await p.waitForURL(/\/sign-in/)
    expect((await p.request.post(api('/auth/login'), { data: { email, password: first } })).status()).toBe(401)
    await signInAs(p, email, next)
    // the deliberate wrong-password answer is a 400 on the field, nothing else went wrong
    expect(s.problems.filter((m) => !/status of 400/.test(m))).toEqual([])
  })
})

describe('notifications', () => {
  it('read as sentences with the review action first', async () => {
    const p = s.page
    await apiSignIn(p.request, 'engineer')
    const siteId = await siteIdOf(p.request, 'cobalt-ridge')
    const me = (await (await p.request.get(api('/auth/me'))).json()) as { name: string }
    const st = await designedStudy(p.request, siteId, `Notified ${tag()}`)
    const sub = await p.request.post(api(`/sites/${siteId}/studies/${st.id}/submit`), { data: { recommendedOptionId: st.optionId, comment: '' } })
    expect(sub.ok()).toBe(true)
    await apiSignOut(p)

    await signInAs(p, DEMO_EMAILS.reviewer, DEMO_PASSWORD)
    await p.getByTestId('notifications').click()
    const lines = p.getByTestId(`notification-change-${st.id}`)
    await lines.first().waitFor()
    await expect.poll(() => lines.count()).toBe(2)
    await expect(lines.nth(0).innerText()).resolves.toMatch(new RegExp(`^${me.name} submitted the study for review ·`))
    await expect(lines.nth(1).innerText()).resolves.toMatch(new RegExp(`^${me.name} ran a design ·`))
    await shot(p, 'notifications-sentences')
    expect(s.problems).toEqual([])
  })
})

describe('operating log', () => {
  it('flags months against the design, names a duplicate month, corrects a month, shows SI and US', async () => {
    const p = s.page
    await apiSignIn(p.request, 'engineer')
    const siteId = await siteIdOf(p.request, 'cobalt-ridge')
    const st = await designedStudy(p.request, siteId, `Operating flows ${tag()}`)
    expect((await p.request.post(api(`/sites/${siteId}/studies/${st.id}/submit`), { data: { recommendedOptionId: st.optionId, comment: '' } })).ok()).toBe(true)
    await apiSignOut(p)
    await apiSignIn(p.request, 'reviewer')
    expect((await p.request.post(api(`/sites/${siteId}/studies/${st.id}/approve`), { data: { comment: 'For the operating flows test' } })).ok()).toBe(true)
    await apiSignOut(p)

    await signInAs(p, DEMO_EMAILS.engineer, DEMO_PASSWORD)
    expect((await p.request.patch(api('/auth/me'), { data: { unitSystem: 'SI' } })).ok()).toBe(true)
    await p.goto(`${baseUrl}/sites/${siteId}/studies/${st.id}/operating`)
    await p.getByTestId('operating-log').waitFor()
    await p.getByText('No months logged yet.', { exact: false }).waitFor()
    await p.getByTestId('op-gas').getByText('kmol/h').waitFor()

    const lowSolvent = Math.round(st.solventFlow * 0.8)
    async function logMonth(month: string, gas: string, solvent: string, extra: { inlet?: string } = {}): Promise<void> {
      await p.getByTestId('op-month').locator('input').fill(month)
      await p.getByTestId('op-gas').locator('input').fill(gas)
      await p.getByTestId('op-solvent').locator('input').fill(solvent)
      if (extra.inlet !== undefined) await p.getByTestId('op-inlet').locator('input').fill(extra.inlet)
      await p.getByTestId('op-measured').locator('input').fill('96.5')
      await p.getByTestId('op-add').click()
    }
    // 200 kmol/h against the design's 180, with ample solvent; then the design gas with too little solvent
    await logMonth('2026-04', '200', String(Math.round(st.solventFlow * 2)), { inlet: '1.1' })
    await p.getByTestId('op-row-2026-04').waitFor()
    await p.getByTestId('op-row-2026-04').getByTestId('flag-gasAboveDesign').waitFor()
    await expect(p.getByTestId('op-row-2026-04').innerText()).resolves.toContain('1.1')
    await logMonth('2026-05', '180', String(lowSolvent))
    await p.getByTestId('op-row-2026-05').getByTestId('flag-solventBelowDesign').waitFor()
    await expect(p.getByTestId('op-row-2026-05').getByTestId('flag-gasAboveDesign').count()).resolves.toBe(0)

    // the same month again: the error names it, on the month field
    await logMonth('2026-05', '180', String(lowSolvent))
    await p.getByTestId('op-month').getByText('2026-05 is logged already').waitFor()
    await shot(p, 'operating-flags-si')

    // open April for correction and cancel: the form shows April, then empties
    await p.getByTestId('op-edit-2026-04').click()
    await expect.poll(() => p.getByTestId('op-gas').locator('input').inputValue()).toBe('200')
    await expect(p.getByTestId('op-inlet').locator('input').inputValue()).resolves.toBe('1.1')
    await p.getByTestId('op-cancel').click()
    await expect.poll(() => p.getByTestId('op-gas').locator('input').inputValue()).toBe('')
    // correct May: the form holds May's numbers; enough solvent now, and the flag goes
    await p.getByTestId('op-edit-2026-05').click()
    await expect.poll(() => p.getByTestId('op-solvent').locator('input').inputValue()).toBe(String(lowSolvent))
    await expect(p.getByTestId('op-gas').locator('input').inputValue()).resolves.toBe('180')
    await p.getByTestId('op-solvent').locator('input').fill(String(Math.ceil(st.solventFlow * 1.05)))
    await p.getByTestId('op-save').click()
    await p.getByTestId('op-add').waitFor()
    await expect.poll(() => p.getByTestId('op-row-2026-05').getByTestId('flag-solventBelowDesign').count(), { timeout: 15000 }).toBe(0)
    await expect(p.getByTestId('op-row-2026-05').innerText()).resolves.toContain(String(Math.ceil(st.solventFlow * 1.05)))

    // US customary: 200 kmol/h = 200 × 2.204623 = 440.92 lbmol/h (lb = 0.45359237 kg exactly, NIST SP 811)
    expect((await p.request.patch(api('/auth/me'), { data: { unitSystem: 'US' } })).ok()).toBe(true)
    await p.reload()
    await p.getByTestId('op-row-2026-04').waitFor()
    await p.getByTestId('op-table').getByText('Gas flow (lbmol/h)').waitFor()
    await expect.poll(async () => (await p.getByTestId('op-row-2026-04').innerText()).includes('440.9')).toBe(true)
    await p.getByTestId('op-gas').getByText('lbmol/h').waitFor()
    await shot(p, 'operating-flags-us')
    // a month typed in lbmol/h is stored in kmol/h: 396.83 lbmol/h = 180.00 kmol/h
    await p.getByTestId('op-month').locator('input').fill('2026-06')
    await p.getByTestId('op-gas').locator('input').fill('396.83')
    await p.getByTestId('op-solvent').locator('input').fill(String(Math.ceil(st.solventFlow * 1.05 * 2.204623)))
    await p.getByTestId('op-add').click()
    await p.getByTestId('op-row-2026-06').waitFor()
    const log = (await (await p.request.get(api(`/sites/${siteId}/studies/${st.id}/operating-entries`))).json()) as { entries: { month: string; gasFlow: number }[] }
    expect(log.entries.find((e) => e.month === '2026-06')!.gasFlow).toBeCloseTo(180, 2)
    await p.request.patch(api('/auth/me'), { data: { unitSystem: 'SI' } })
    // the duplicate month answered 409 on purpose
    expect(s.problems.filter((m) => !/status of 409/.test(m))).toEqual([])
  })
})

describe('case files and the portfolio CSV', () => {
  it('downloads a study as a case file, starts a study from one, and exports the portfolio without formulas', async () => {
    const p = s.page
    await apiSignIn(p.request, 'engineer')
    const siteId = await siteIdOf(p.request, 'cobalt-ridge')
    const t = tag()
    const st = await designedStudy(p.request, siteId, `Case file ${t}`)
    const evil = await p.request.post(api(`/sites/${siteId}/studies`), { data: { name: `=HYPERLINK("http://x.invalid","${t}")`, description: '@SUM(1)', inputs: INPUTS } })
    expect(evil.ok()).toBe(true)
    await apiSignOut(p)

    await signInAs(p, DEMO_EMAILS.engineer, DEMO_PASSWORD)
    await p.getByTestId('study-search').locator('input').fill(t)
    await p.getByTestId(`case-file-${st.id}`).waitFor()
    const [download] = await Promise.all([p.waitForEvent('download'), p.getByTestId(`case-file-${st.id}`).click()])
    expect(download.suggestedFilename()).toBe(`case-file-${t}.json`)
    const file = JSON.parse(readFileSync((await download.path())!, 'utf8')) as Record<string, unknown>
    expect(file.name).toBe(`Case file ${t}`)
    expect(file.gas).toEqual(INPUTS.gas)
    expect(file.recovery).toBe(0.97)

    // the portfolio as CSV: the study named like a formula is text, with an apostrophe
    const [csv] = await Promise.all([p.waitForEvent('download'), p.getByTestId('export-portfolio-csv').click()])
    expect(csv.suggestedFilename()).toMatch(/^portfolio-cobalt-ridge-\d{4}-\d{2}-\d{2}\.csv$/)
    const csvText = readFileSync((await csv.path())!, 'utf8')
    expect(csvText).toContain('Study,Description,Status')
    expect(csvText).toContain(`"'=HYPERLINK(""http://x.invalid"",""${t}"")"`)
    expect(csvText).toContain("'@SUM(1)")
    expect(csvText).toContain(`Case file ${t}`)

    // import: a file with problems lists each with its field, nothing is created
    await p.getByTestId('import-case').click()
    await p.getByTestId('import-case-dialog').waitFor()
    const input = p.getByTestId('import-case-file').locator('input[type=file]')
    const bad = { ...file, gas: { ...INPUTS.gas, flow: 'lots' }, solventFactor: undefined }
    await input.setInputFiles({ name: 'bad.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(bad)) })
    const problems = p.getByTestId('import-case-problems')
    await problems.getByText('gas.flow').waitFor()
    await problems.getByText('solventFactor').waitFor()
    await expect(p.getByTestId('import-case-create').isDisabled()).resolves.toBe(true)
    await shot(p, 'import-case-problems')
    // the downloaded file itself starts a study
    await input.setInputFiles({ name: 'good.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify({ ...file, name: `Imported ${t}` })) })
    await expect.poll(() => p.getByTestId('import-case-name').locator('input').inputValue()).toBe(`Imported ${t}`)
    await p.getByTestId('import-case-create').click()
    await p.waitForURL(/\/studies\/\d+/)
    const newId = Number(/\/studies\/(\d+)/.exec(p.url())![1])
    const made = (await (await p.request.get(api(`/sites/${siteId}/studies/${newId}`))).json()) as { name: string; inputs: Record<string, unknown> }
    expect(made.name).toBe(`Imported ${t}`)
    expect(made.inputs).toEqual(INPUTS)
    expect(s.problems).toEqual([])
  })
})
