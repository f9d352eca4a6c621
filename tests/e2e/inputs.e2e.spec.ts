/**
 * The study inputs an engineer can trust: every field checks its range as it is typed (the shared
 * field rules, in the person's units), all problems are listed at once with a link to each field,
 * Save and Run say why they are off, blanks and letters are never replaced by the old value,
 * equilibrium models keep their values, the lean solvent has a temperature, an x-y table measured
 * away from the column temperature is warned about, and blank optional fields show the default.
 */
import { mkdirSync } from 'node:fs'
import path from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { openBrowser, shot, signIn, type BrowserSession } from './support.ts'

/** How long a condition may take to come true on a loaded machine (polled, not slept). */
const WAIT = { timeout: 20000, interval: 100 }

let s: BrowserSession
const tag = Date.now().toString(36)
/** Screenshots for people to look at (outside the repository when SHOTS_DIR is set). */
const shotsDir = process.env.SHOTS_DIR
async function look(p: Page, name: string): Promise<void> {
  if (!shotsDir) {
    await shot(p, name)
    return
  }
  mkdirSync(shotsDir, { recursive: true })
  await expect.poll(() => p.evaluate(() => document.getAnimations().filter((a) => a.playState === 'running' && a.effect?.getTiming().iterations !== Infinity).length), WAIT).toBe(0)
  await p.screenshot({ path: path.join(shotsDir, `${name}.png`), fullPage: true })
}

const input = (p: Page, testid: string) => p.getByTestId(testid).locator('input')

/** The stored study as the API gives it (the page's own session cookie). */
async function storedStudy(p: Page): Promise<{ inputs: Record<string, unknown>; runs: { id: number; kind: string }[] }> {
  const m = /\/sites\/(\d+)\/studies\/(\d+)/.exec(new URL(p.url()).pathname)
  if (!m) throw new Error(`not on a study page: ${p.url()}`)
  return p.evaluate(async ([site, study]) => {
    const r = await fetch(`/api/v1/sites/${site}/studies/${study}`, { headers: { Accept: 'application/json' } })
    return r.json()
  }, [m[1], m[2]] as const)
}

async function setUnitSystem(p: Page, system: 'SI' | 'US'): Promise<void> {
  const status = await p.evaluate(async (unitSystem) => {
    const r = await fetch('/api/v1/auth/me', { method: 'PATCH', headers: { 'Content-Type': 'application/json', Accept: 'application/json' }, body: JSON.stringify({ unitSystem }) })
    return r.status
  }, system)
  expect(status).toBe(200)
}

async function newStudy(p: Page, name: string): Promise<void> {
  await p.getByRole('link', { name: /portfolio/i }).first().click()
  await p.getByTestId('new-study').click()
  await p.getByTestId('new-study-name').locator('input').fill(name)
  await p.getByTestId('create-study').click()
  await p.waitForURL(/\/studies\/\d+\/streams/)
  await input(p, 'gas-flow').waitFor()
  await expect.poll(() => input(p, 'gas-flow').isEnabled(), WAIT).toBe(true)
}

beforeAll(async () => {
  s = await openBrowser()
  // leaving a page with unsaved edits asks first: these tests leave on purpose
  s.page.on('dialog', (d) => void d.accept())
  await signIn(s.page, 'engineer')
  await setUnitSystem(s.page, 'SI')
})
afterAll(async () => {
  await setUnitSystem(s.page, 'SI').catch(() => undefined)
  await s.close()
})

describe('study inputs: nothing nonsensical is saved or run', () => {
  it('lists a negative gas flow, a recovery over 100 % and L/Lmin below 1 at once, in the person\'s units; Save and Run are off and say why', async () => {
    const p = s.page
    await newStudy(p, `Inputs check ${tag}`)
    await input(p, 'gas-flow').fill('-300')
    await input(p, 'recovery').fill('120')
    await input(p, 'solvent-factor').fill('0.8')
    const list = p.getByTestId('input-problems')
    await list.getByText('-300 kmol/h: the gas flow must be positive').waitFor()
    await list.getByText('120 %: recovery must be below 100 %').waitFor()
    await list.getByText('0.8: L/Lmin must be above 1').waitFor()
    // each message sits on its field too
    await p.getByTestId('gas-flow').getByText('-300 kmol/h: the gas flow must be positive').waitFor()
    await expect.poll(() => p.getByTestId('save-study').isDisabled(), WAIT).toBe(true)
    await expect.poll(() => p.getByTestId('run-design').isDisabled(), WAIT).toBe(true)
    await expect.poll(() => p.getByTestId('blocked-reason').innerText(), WAIT).toMatch(/3 inputs need attention/)
    await expect(p.getByTestId('run-design').getAttribute('aria-describedby')).resolves.toBe('blocked-reason')
    await look(p, 'inputs-problems-si')
    // the link of a problem focuses its field
    await list.getByRole('link', { name: 'Recovery of the solute' }).click()
    await expect.poll(() => p.evaluate(() => document.activeElement?.id), WAIT).toBe('field-recovery')
    // nothing was stored
    const stored = await storedStudy(p)
    expect((stored.inputs.gas as { flow: number }).flow).toBe(180)
    expect(stored.inputs.recovery).toBe(0.97)
    expect(s.problems).toEqual([])
  })

  it('a blank required field and letters in a number are errors; the old value is never used', async () => {
    const p = s.page
    await input(p, 'gas-flow').fill('180')
    await input(p, 'recovery').fill('97')
    await input(p, 'solvent-factor').fill('1.5')
    await p.getByTestId('input-problems').waitFor({ state: 'detached' })
    await input(p, 'gas-solute').fill('')
    await p.getByTestId('input-problems').getByText('required: enter the solute in the gas').waitFor()
    await input(p, 'gas-flow').fill('12a')
    await p.getByTestId('input-problems').getByText('not a number: enter the gas flow').waitFor()
    await expect.poll(() => p.getByTestId('run-design').isDisabled(), WAIT).toBe(true)
    // another section and back: the edits and their problems are still there (the study is not reloaded)
    await p.getByTestId('tab-column').click()
    await p.waitForURL(/\/column$/)
    await p.getByRole('tab', { name: /Streams/ }).click()
    await p.waitForURL(/\/streams$/)
    await p.getByTestId('input-problems').getByText('required: enter the solute in the gas').waitFor()
    await p.getByTestId('input-problems').getByText('not a number: enter the gas flow').waitFor()
    await expect.poll(() => input(p, 'gas-solute').inputValue(), WAIT).toBe('')
    // with a new value in place, the run uses exactly what is on the screen
    await input(p, 'gas-flow').fill('200')
    await input(p, 'gas-solute').fill('1.5')
    await p.getByTestId('input-problems').waitFor({ state: 'detached' })
    await p.getByTestId('run-design').click()
    await p.waitForURL(/\/column$/)
    await p.getByTestId('column-staging').waitFor()
    const stored = await storedStudy(p)
    const gas = stored.inputs.gas as { flow: number; soluteMoleFraction: number }
    expect(gas.soluteMoleFraction).toBeCloseTo(0.015, 12)
    expect(gas.flow).toBe(200)
  })

  it('switching the equilibrium model away and back keeps K; the proposed option name comes from the run\'s inputs', async () => {
    const p = s.page
    await p.getByRole('tab', { name: /Streams/ }).click()
    await input(p, 'eq-k').fill('0.43')
    await p.getByRole('radio', { name: "Henry's law" }).check()
    await p.getByTestId('eq-k').waitFor({ state: 'detached' })
    await p.getByRole('radio', { name: 'Constant K' }).check()
    await expect.poll(() => input(p, 'eq-k').inputValue(), WAIT).toBe('0.43')
    // a model tried for the first time starts blank, never with a made-up value
    await p.getByRole('radio', { name: 'Modified Raoult' }).check()
    await p.getByRole('radio', { name: 'Constant K' }).check()
    await expect.poll(() => input(p, 'eq-k').inputValue(), WAIT).toBe('0.43')
    await input(p, 'eq-k').fill('0.5')
    await p.getByTestId('run-design').click()
    await p.waitForURL(/\/column$/)
    await p.getByTestId('column-staging').waitFor()
    await p.getByTestId('tab-options').click()
    await p.getByTestId('pin-option').click()
    await expect.poll(() => p.getByTestId('option-name').locator('input').inputValue(), WAIT).toBe('Design · K 0.5 · 97 % · L/Lmin 1.5')
    await expect.poll(() => p.getByTestId('pin-run-inputs').innerText(), WAIT).toMatch(/K 0\.5/)
    await p.keyboard.press('Escape')
  })

  it('the lean solvent has its own temperature, used by the run', async () => {
    const p = s.page
    await p.getByRole('tab', { name: /Streams/ }).click()
    await input(p, 'solvent-temperature').waitFor()
    await expect(input(p, 'solvent-temperature').getAttribute('placeholder')).resolves.toBe('default: the gas temperature')
    await input(p, 'solvent-temperature').fill('20')
    await p.getByText('Unsaved changes').waitFor()
    await p.getByTestId('run-design').click()
    await p.waitForURL(/\/column$/)
    await p.getByTestId('column-staging').waitFor()
    const stored = await storedStudy(p)
    expect(stored.inputs.solvent).toEqual({ name: 'water', temperature: 20 })
  })

  it('an x-y table measured away from the column temperature is warned about', async () => {
    const p = s.page
    await p.getByRole('tab', { name: /Streams/ }).click()
    await p.getByRole('radio', { name: 'x–y table' }).check()
    await input(p, 'eq-table-temperature').fill('50')
    // column at the lean-solvent temperature, 20 °C
    await expect.poll(() => p.getByTestId('table-temperature-warning').innerText(), WAIT).toMatch(/measured at 50 °C but the column runs at 20 °C/)
    await input(p, 'eq-table-temperature').fill('21')
    await p.getByTestId('table-temperature-warning').waitFor({ state: 'detached' })
    await p.getByRole('radio', { name: 'Constant K' }).check()
    await expect.poll(() => input(p, 'eq-k').inputValue(), WAIT).toBe('0.5')
  })

  it('blank optional fields show the engine\'s default and each field its help with a typical range, in SI and US units', async () => {
    const p = s.page
    const hole = p.locator('#field-tray-holeDiameter')
    await hole.fill('')
    await expect.poll(() => hole.getAttribute('placeholder'), WAIT).toBe('default: 4.5')
    await expect.poll(() => p.locator('.v-input', { has: hole }).innerText(), WAIT).toMatch(/\bmm\b/)
    await expect.poll(() => p.getByTestId('gas-flow').innerText(), WAIT).toMatch(/Typical 10–5000 kmol\/h/)
    await input(p, 'gas-flow').fill('-300')
    await p.getByTestId('input-problems').waitFor()
    await look(p, 'inputs-form-si')

    await setUnitSystem(p, 'US')
    await p.reload()
    await input(p, 'gas-flow').waitFor()
    await expect.poll(() => input(p, 'gas-flow').isEnabled(), WAIT).toBe(true)
    await expect.poll(() => p.locator('#field-tray-holeDiameter').getAttribute('placeholder'), WAIT).toBe('default: 0.1772')
    await expect.poll(() => p.locator('.v-input', { has: p.locator('#field-tray-holeDiameter') }).innerText(), WAIT).toMatch(/\bin\b/)
    await expect.poll(() => p.getByTestId('gas-flow').innerText(), WAIT).toMatch(/Typical 22–11000 lbmol\/h/)
    // 300 kmol/h = 661.4 lbmol/h (1 lb = 0.45359237 kg exactly, NIST SP 811)
    await input(p, 'gas-flow').fill('-661.4')
    await p.getByTestId('input-problems').getByText('-661.4 lbmol/h: the gas flow must be positive').waitFor()
    await input(p, 'recovery').fill('120')
    await p.getByTestId('input-problems').getByText('120 %: recovery must be below 100 %').waitFor()
    await look(p, 'inputs-form-us')
    await p.setViewportSize({ width: 390, height: 844 })
    await look(p, 'inputs-form-us-390')
    await setUnitSystem(p, 'SI')
    await p.reload()
    await input(p, 'gas-flow').waitFor()
    await input(p, 'gas-flow').fill('-300')
    await p.getByTestId('input-problems').waitFor()
    await look(p, 'inputs-form-si-390')
    await p.setViewportSize({ width: 1440, height: 900 })
    expect(s.problems).toEqual([])
  })
})
