/**
 * Units everywhere on the economics screens, charts that read well, compare with names that hold
 * markup, and the solvent allocation before and after solving. Each test prepares its own studies
 * through the API and puts the person back on SI units at the end. Every wait is on a condition.
 */
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import type { APIRequestContext, Locator, Page } from 'playwright-core'
import { tag, api, baseUrl, siteIdOf, DEMO_EMAILS, DEMO_PASSWORD, openBrowser, shot, type BrowserSession, type DemoPerson } from './support.ts'

let s: BrowserSession

beforeEach(async () => {
  s = await openBrowser()
})
afterEach(async () => {
  // the unit system is stored per person: leave it as the other browser tests expect it
  await s.page.request.patch(api('/auth/me'), { data: { unitSystem: 'SI' } }).catch(() => undefined)
  await s.close()
})

/** Sign in through the API; the browser context shares the cookie, so the app is signed in too. */
async function signInAs(p: Page, who: DemoPerson): Promise<number> {
  const res = await p.request.post(api('/auth/login'), { data: { email: DEMO_EMAILS[who], password: DEMO_PASSWORD } })
  expect(res.ok()).toBe(true)
  const id = await siteIdOf(p.request, 'cobalt-ridge')
  // the app opens on the site it remembers
  await p.addInitScript((siteId) => localStorage.setItem('scrubwright.siteId', String(siteId)), id)
  return id
}

async function setUnits(p: Page, system: 'SI' | 'US'): Promise<void> {
  const me = await p.request.patch(api('/auth/me'), { data: { unitSystem: system } })
  expect(me.ok()).toBe(true)
}

/** A fermenter-vent study with a run of the given kind, optionally pinned under `optionName`. */
async function studyWithRun(r: APIRequestContext, siteId: number, name: string, opts: { kind?: 'design' | 'optimize'; gasFlow?: number; optionName?: string } = {}) {
  const created = await r.post(api(`/sites/${siteId}/studies`), {
    data: {
      name,
      description: 'Prepared by the units browser test',
      inputs: {
        gas: { flow: opts.gasFlow ?? 180, temperature: 30, pressure: 110, soluteMoleFraction: 0.012, carrier: 'carbon dioxide' },
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
  const run = await r.post(api(`/sites/${siteId}/studies/${study.id}/runs`), { data: { kind: opts.kind ?? 'design' }, timeout: 110000 })
  expect(run.ok()).toBe(true)
  const runId = ((await run.json()) as { id: number }).id
  let optionId: number | null = null
  if (opts.optionName) {
    const o = await r.post(api(`/sites/${siteId}/studies/${study.id}/options`), { data: { runId, name: opts.optionName, notes: '' } })
    expect(o.ok()).toBe(true)
    optionId = ((await o.json()) as { id: number }).id
  }
  return { id: study.id, optionId }
}

/** Wait until the locator's text satisfies the test (re-read until then). */
async function textMatches(l: Locator, test: (t: string) => boolean, what: string, timeout = 20000): Promise<string> {
  let last = ''
  try {
    await expect.poll(async () => test((last = (await l.innerText().catch(() => '')).trim())), { timeout }).toBe(true)
  } catch {
    throw new Error(`${what}: the text did not match in time; last text "${last}"`)
  }
  return last
}
async function inputMatches(l: Locator, test: (t: string) => boolean, what: string): Promise<string> {
  let last = ''
  try {
    await expect.poll(async () => test((last = await l.inputValue().catch(() => ''))), { timeout: 20000 }).toBe(true)
  } catch {
    throw new Error(`${what}: the value did not match in time; last value "${last}"`)
  }
  return last
}

/** Every numeric axis label of the page's charts: separators, at most 4 decimals (SVG text: textContent). */
async function axisLabelsReadWell(p: Page): Promise<void> {
  const labels = p.locator('.apexcharts-xaxis-label, .apexcharts-yaxis-label')
  const labelTexts = async () => (await labels.evaluateAll((els) => els.map((e) => e.textContent ?? ''))).map((t) => t.trim())
  await expect.poll(async () => (await labelTexts()).filter((t) => /\d/.test(t)).length, { timeout: 20000 }).toBeGreaterThan(10)
  const texts = (await labelTexts()).filter((t) => /^[-−\d]/.test(t))
  for (const t of texts) expect(t, `axis label "${t}"`).toMatch(/^[-−]?\d{1,3}(,\d{3})*(\.\d{1,4})?$/)
  expect(texts.some((t) => /\d,\d{3}/.test(t)), 'a label of 1,000 or more with its separator').toBe(true)
}

const num = (t: string) => Number(t.replace(/[\s,\u00a0\u202f]/g, ''))
// 1 US gallon = 3.785411784e-3 m³ exactly (NIST SP 811, appendix B): 1000 gal = 3.785411784 m³
const M3_PER_1000_GAL = 3.785411784

describe('cost basis in real units', () => {
  it('the unit switch shows the solvent price per 1000 gal and per gallon, electricity per kWh', async () => {
    const p = s.page
    await signInAs(p, 'economist')
    await setUnits(p, 'SI')
    await p.goto(`${baseUrl}/cost-basis`)
    const solvent = p.getByTestId('cb-utilities.solventCost')
    const power = p.getByTestId('cb-utilities.electricityPrice')
    await textMatches(solvent, (t) => /\/m³/.test(t), 'solvent price per m³ in SI')
    const perM3 = num(await inputMatches(solvent.locator('input'), (v) => Number.isFinite(num(v)) && v !== '', 'solvent price'))
    const perKWh = await power.locator('input').inputValue()
    await expect(power.innerText()).resolves.toMatch(/\/kWh/)
    await shot(p, 'units-cost-basis-si')

    await p.getByTestId('unit-switch').getByRole('button', { name: 'US customary' }).click()
    await textMatches(solvent, (t) => /\/1,000 gal/.test(t), 'solvent price per 1000 gal in US units')
    const per1000 = num(await inputMatches(solvent.locator('input'), (v) => num(v) !== perM3, 'converted solvent price'))
    expect(per1000).toBeCloseTo(perM3 * M3_PER_1000_GAL, 4)
    await textMatches(p.getByTestId('cb-per-gallon'), (t) => /\/gal/.test(t), 'per-gallon price')
    await expect(power.locator('input').inputValue()).resolves.toBe(perKWh)
    await expect(power.innerText()).resolves.toMatch(/\/kWh/)
    // the material data follow too: the shell density in lb/ft³
    await p.getByRole('button', { name: /Shell material/ }).click()
    await textMatches(p.getByTestId('cb-materials.shellDensity'), (t) => /lb\/ft³/.test(t), 'density in lb/ft³')
    await shot(p, 'units-cost-basis-us')
    await p.setViewportSize({ width: 390, height: 844 })
    await solvent.scrollIntoViewIfNeeded()
    await shot(p, 'units-cost-basis-us-390')

    await p.setViewportSize({ width: 1440, height: 900 })
    // the phone row (with its own unit switch) goes once the layout has seen the wider window
    await p.getByTestId('phone-bar').waitFor({ state: 'detached' })
    await p.getByTestId('unit-switch').getByRole('button', { name: 'SI' }).click()
    await textMatches(solvent, (t) => /\/m³/.test(t), 'back to per m³')
    await expect(solvent.locator('input').inputValue()).resolves.toBe(String(perM3))
    expect(s.problems).toEqual([])
  })
})

describe('economics in the person’s units', () => {
  it('search limits, chart axes and cost-item sizes follow the unit system', async () => {
    const p = s.page
    const siteId = await signInAs(p, 'engineer')
    const st = await studyWithRun(p.request, siteId, `Units economics ${tag()}`, { kind: 'optimize' })
    await setUnits(p, 'SI')
    await p.goto(`${baseUrl}/sites/${siteId}/studies/${st.id}/economics`)
    await p.getByTestId('optimum-summary').waitFor()

    // search limits: spacings in mm in SI
    await p.getByRole('button', { name: /Search limits/ }).click()
    const spacings = p.getByTestId('search-spacings')
    await inputMatches(spacings.locator('input'), (v) => v === '450, 500, 600, 750, 900', 'SI spacings in mm')
    await expect(spacings.innerText()).resolves.toMatch(/\(mm\)/)
    const diameter = p.getByLabel('Largest diameter', { exact: true })
    await inputMatches(diameter, (v) => v === '6', 'largest diameter 6 m')

    // cost-item sizes: the correlation in lb, ft, hp, gpm·ft^0.5 is shown in kg, m, kW, m³/h·m^0.5
    const shell = p.getByTestId('cost-size-shell')
    await textMatches(shell, (t) => /\bkg\b/.test(t) && /lb in the correlation/.test(t), 'shell size in kg with the lb hint')
    await textMatches(p.getByTestId('cost-size-pump'), (t) => /m³\/h·m\^0\.5/.test(t), 'pump size in m³/h·m^0.5')
    await textMatches(p.getByTestId('cost-size-motor'), (t) => /\bkW\b/.test(t) && /hp in the correlation/.test(t), 'motor size in kW')

    // chart axes: numbers with separators and a few digits, never 300000.000000000000
    const charts = p.locator('.apexcharts-svg')
    await expect.poll(() => charts.count(), { timeout: 30000 }).toBeGreaterThanOrEqual(3)
    await axisLabelsReadWell(p)
    await shot(p, 'units-economics-si')

    // US customary: spacings in whole inches, sizes in lb and hp
    await p.getByTestId('unit-switch').getByRole('button', { name: 'US customary' }).click()
    await inputMatches(spacings.locator('input'), (v) => v === '18, 20, 24, 30, 36', 'US spacings in inches')
    await expect(spacings.innerText()).resolves.toMatch(/\(in\)/)
    await inputMatches(diameter, (v) => v === '20', 'largest diameter 20 ft')
    await inputMatches(p.getByLabel('Largest height', { exact: true }), (v) => v === '175', 'largest height 175 ft')
    await textMatches(shell, (t) => /\blb\b/.test(t) && !/\bkg\b/.test(t), 'shell size in lb')
    await textMatches(p.getByTestId('cost-size-pump'), (t) => /gpm·ft\^0\.5/.test(t), 'pump size in gpm·ft^0.5')
    await textMatches(p.getByTestId('optimum-summary'), (t) => /\bft\b/.test(t) && /\bin\b/.test(t), 'diameter in ft and spacing in in')
    // optimising in US units uses the spacings shown: the optimum's spacing is a whole-inch one
    await p.getByTestId('optimise').click()
    await textMatches(p.getByTestId('optimum-summary'), (t) => /Tray spacing\s*(18|20|24|30|36) in\b/.test(t), 'optimum on a whole-inch spacing', 120000)
    await inputMatches(spacings.locator('input'), (v) => v === '18, 20, 24, 30, 36', 'US spacings kept')
    // advice on a search bound speaks the same units: a spacing in inches, never metres or a raw token
    const spacingHit = p.getByTestId('bound-hit').filter({ hasText: 'tray spacing' })
    if (/Tray spacing\s*(18|36) in\b/.test(await p.getByTestId('optimum-summary').innerText())) {
      await textMatches(spacingHit, (t) => /\((18|36) in\)/.test(t), 'the spacing on its bound in inches')
    }
    for (const t of await p.getByTestId('bound-hit').allInnerTexts()) expect(t).not.toMatch(/\d m\b|\{\w+:/)
    // the charts were drawn again with the new optimum: their labels still read well
    await axisLabelsReadWell(p)
    await shot(p, 'units-economics-us')
    await p.setViewportSize({ width: 390, height: 844 })
    await shot(p, 'units-economics-us-390')
    expect(s.problems).toEqual([])
  }, 300000)
})

describe('compare', () => {
  it('at 390 px each chosen option keeps its remove button on screen, however long its name', async () => {
    const p = s.page
    const siteId = await signInAs(p, 'engineer')
    const t = tag()
    const long = 'Fermenter vent scrubber for the north hall, second train'
    const a = await studyWithRun(p.request, siteId, `${long} A ${t}`, { optionName: 'As designed for the summer months' })
    const b = await studyWithRun(p.request, siteId, `${long} B ${t}`, { gasFlow: 179, optionName: 'As designed for the winter months' })
    await p.setViewportSize({ width: 390, height: 844 })
    await p.goto(`${baseUrl}/compare?options=${a.id}-${a.optionId},${b.id}-${b.optionId}`)
    await p.getByTestId('compare-table').waitFor()
    const remove = p.getByRole('button', { name: 'Remove As designed for the winter months' })
    await remove.waitFor()
    // the button lies within the page's width (not cut off by the chip running past the card)
    const right = () => remove.evaluate((e) => e.getBoundingClientRect().right)
    await expect.poll(right).toBeLessThanOrEqual(390)
    await expect.poll(right).toBeGreaterThan(0)
    await shot(p, 'compare-chips-390')
    await remove.click()
    await p.getByRole('button', { name: 'Remove As designed for the winter months' }).waitFor({ state: 'detached' })
    expect(s.problems).toEqual([])
  })

  it('option names stay text in the table, legend and tooltip; each optimum in its option’s colour and shape', async () => {
    const p = s.page
    const dialogs: string[] = []
    p.on('dialog', (d) => {
      dialogs.push(d.message())
      void d.dismiss()
    })
    const siteId = await signInAs(p, 'engineer')
    const t = tag()
    const evil = '<img src=x onerror=alert(1)>'
    const bold = '<b>bold</b>'
    // nearly the same design twice: the optima lie on top of each other, where labels would collide
    const a = await studyWithRun(p.request, siteId, `Compare markup A ${t}`, { gasFlow: 180, optionName: evil })
    const b = await studyWithRun(p.request, siteId, `Compare markup B ${t}`, { gasFlow: 179, optionName: bold })
    await setUnits(p, 'SI')
    await p.goto(`${baseUrl}/compare?options=${a.id}-${a.optionId},${b.id}-${b.optionId}`)

    const table = p.getByTestId('compare-table')
    await textMatches(table.locator('thead'), (x) => x.includes(evil) && x.includes(bold), 'names as text in the table head')
    const legend = p.locator('.apexcharts-legend-text')
    await expect.poll(async () => (await legend.allInnerTexts()).filter((x) => x === evil || x === bold).length, { timeout: 20000 }).toBeGreaterThanOrEqual(4)

    // one marker per option on each chart, in the option's colour, with distinct shapes
    const markers = p.locator('.apexcharts-point-annotation-marker.optimum-marker')
    await expect.poll(() => markers.count(), { timeout: 20000 }).toBe(4)
    const chart = p.locator('.v-card', { has: p.getByText('TAC against recovery', { exact: true }) }).first()
    const m0 = chart.locator('.optimum-0')
    const m1 = chart.locator('.optimum-1')
    const fill0 = await m0.getAttribute('fill')
    const fill1 = await m1.getAttribute('fill')
    expect(fill0).toBeTruthy()
    expect(fill0).not.toBe(fill1)
    await expect(chart.getByTestId('optimum-0').locator('path').getAttribute('fill')).resolves.toBe(fill0)
    await expect(chart.getByTestId('optimum-1').locator('path').getAttribute('fill')).resolves.toBe(fill1)
    const shape = (d: string | null) => (d ?? '').replace(/[-\d.eE]+/g, '').replace(/[\s,]+/g, '')
    expect(shape(await m0.getAttribute('d'))).not.toBe(shape(await m1.getAttribute('d')))
    await textMatches(chart.getByTestId('optima-list'), (x) => x.includes(evil) && x.includes(bold), 'optima listed by name')

    // no two texts drawn on a chart overlap (axis labels, annotation labels, legend)
    const boxes = await chart.locator('.apexcharts-point-annotations text, .apexcharts-xaxis-label, .apexcharts-legend-text').evaluateAll((els) =>
      els.map((e) => e.getBoundingClientRect()).filter((r) => r.width > 0 && r.height > 0).map((r) => ({ x: r.x, y: r.y, w: r.width, h: r.height })),
    )
    for (let i = 0; i < boxes.length; i++)
      for (let j = i + 1; j < boxes.length; j++) {
        const u = boxes[i]!
        const v = boxes[j]!
        const overlap = u.x < v.x + v.w - 1 && v.x < u.x + u.w - 1 && u.y < v.y + v.h - 1 && v.y < u.y + u.h - 1
        expect(overlap, `texts ${i} and ${j} overlap`).toBe(false)
      }

    // the tooltip names the option as text
    const box = await m1.boundingBox()
    expect(box).not.toBeNull()
    const tip = chart.locator('.apexcharts-tooltip')
    await expect
      .poll(async () => {
        await p.mouse.move((box?.x ?? 0) + (box?.width ?? 0) / 2 + 1, (box?.y ?? 0) + (box?.height ?? 0) / 2)
        await p.mouse.move((box?.x ?? 0) + (box?.width ?? 0) / 2, (box?.y ?? 0) + (box?.height ?? 0) / 2)
        return (await tip.innerText().catch(() => '')).includes('<')
      }, { timeout: 20000 })
      .toBe(true)
    await expect(tip.innerText()).resolves.toMatch(/<(b>bold<\/b|img src=x onerror=alert\(1\))>/)

    // nothing became markup anywhere
    expect(await p.locator('img[src="x"]').count()).toBe(0)
    expect(await p.locator('.apexcharts-canvas b, .compare-table b, [data-testid=optima-list] b').count()).toBe(0)
    expect(dialogs).toEqual([])
    await shot(p, 'units-compare-si')

    await setUnits(p, 'US')
    await p.reload()
    await textMatches(table, (x) => /Tray spacing\s+in\b/.test(x), 'tray spacing in inches')
    await expect.poll(() => markers.count(), { timeout: 20000 }).toBe(4)
    await shot(p, 'units-compare-us')
    await p.setViewportSize({ width: 390, height: 844 })
    await shot(p, 'units-compare-us-390')
    expect(dialogs).toEqual([])
    expect(s.problems).toEqual([])
  }, 180000)
})

describe('solvent allocation', () => {
  it('shows each design solvent flow before solving, in the person’s units', async () => {
    const p = s.page
    const siteId = await signInAs(p, 'engineer')
    const t = tag()
    const a = await studyWithRun(p.request, siteId, `Allocation flows A ${t}`, { gasFlow: 180 })
    const list = (await (await p.request.get(api(`/sites/${siteId}/allocations/absorbers`))).json()) as { studyId: number; designFlow: number | null }[]
    const flow = list.find((x) => x.studyId === a.id)?.designFlow
    expect(flow).toBeGreaterThan(0)
    await setUnits(p, 'SI')
    await p.goto(`${baseUrl}/allocation`)
    const cell = p.getByTestId(`alloc-design-${a.id}`)
    const si = num(await textMatches(cell, (x) => /\d/.test(x), 'design flow in m³/h'))
    expect(si).toBeCloseTo(flow as number, 2)
    await textMatches(p.getByTestId('alloc-units').locator('thead'), (x) => x.includes('Design flow (m³/h)'), 'm³/h heading')
    await shot(p, 'units-allocation-si')

    await p.getByTestId('unit-switch').getByRole('button', { name: 'US customary' }).click()
    await textMatches(p.getByTestId('alloc-units').locator('thead'), (x) => x.includes('Design flow (gpm)'), 'gpm heading')
    // 1 gpm = 0.2271247 m³/h (NIST SP 811: gallon 3.785412 E-03 m³)
    const us = num(await textMatches(cell, (x) => Math.abs(num(x) - si) > 1e-6, 'design flow in gpm'))
    expect(us).toBeCloseTo((flow as number) / 0.2271247, 0)
    await shot(p, 'units-allocation-us')
    await p.setViewportSize({ width: 390, height: 844 })
    await shot(p, 'units-allocation-us-390')
    expect(s.problems).toEqual([])
  }, 150000)

  it('an infeasible supply gives one message and is not saved', async () => {
    const p = s.page
    const siteId = await signInAs(p, 'engineer')
    const t = tag()
    const a = await studyWithRun(p.request, siteId, `Allocation short A ${t}`, { gasFlow: 180 })
    const b = await studyWithRun(p.request, siteId, `Allocation short B ${t}`, { gasFlow: 120 })
    await setUnits(p, 'SI')
    await p.goto(`${baseUrl}/allocation`)
    // wait until both new absorbers are listed with their design flows, then choose only them
    await textMatches(p.getByTestId(`alloc-design-${a.id}`), (x) => /\d/.test(x), 'design flow A')
    await textMatches(p.getByTestId(`alloc-design-${b.id}`), (x) => /\d/.test(x), 'design flow B')
    const boxes = p.getByTestId('alloc-units').locator('[data-testid^="alloc-unit-"]')
    const want = new Set([`alloc-unit-${a.id}`, `alloc-unit-${b.id}`])
    await expect
      .poll(async () => {
        let ok = true
        for (const box of await boxes.all()) {
          const input = box.locator('input[type=checkbox]')
          const id = (await box.getAttribute('data-testid')) ?? ''
          if ((await input.isChecked()) !== want.has(id)) {
            await input.click()
            ok = false
          }
        }
        return ok
      }, { timeout: 20000 })
      .toBe(true)
    const da = num(await p.getByTestId(`alloc-design-${a.id}`).innerText())
    const db = num(await p.getByTestId(`alloc-design-${b.id}`).innerText())
    // half the design flows are the lowest flows; a quarter of their sum cannot be split
    await p.getByTestId('alloc-limit').locator('input').fill(String(Number(((da + db) * 0.25).toPrecision(3))))
    const name = `Too little ${t}`
    await p.getByTestId('alloc-name').locator('input').fill(name)
    await p.getByTestId('alloc-solve').click()
    const result = p.getByTestId('alloc-result')
    await expect.poll(() => result.getAttribute('data-feasible').catch(() => null), { timeout: 20000 }).toBe('false')
    const text = await result.innerText()
    expect(text).toMatch(/No feasible split/)
    expect(text).toMatch(/not saved/)
    expect(text).not.toMatch(/does not bind/)
    expect(await result.getByTestId('alloc-shadow').count()).toBe(0)
    expect(await result.getByTestId('alloc-split').count()).toBe(0)
    // not in the saved list (read through the API, which the page also reads)
    const saved = (await (await p.request.get(api(`/sites/${siteId}/allocations`))).json()) as { name: string }[]
    expect(saved.some((x) => x.name === name)).toBe(false)
    await shot(p, 'units-allocation-infeasible')

    // a supply above the sum of the design flows solves, with a split row per absorber
    await p.getByTestId('alloc-limit').locator('input').fill(String(Math.ceil((da + db) * 2)))
    await p.getByTestId('alloc-solve').click()
    await expect.poll(() => result.getAttribute('data-feasible').catch(() => null), { timeout: 20000 }).toBe('true')
    await expect.poll(() => result.getByTestId('alloc-split').locator('tbody tr').count(), { timeout: 20000 }).toBe(2)
    await result.locator('.apexcharts-svg').waitFor()
    await textMatches(p.getByTestId('alloc-saved'), (x) => x.includes(name), 'the feasible answer is saved')
    await shot(p, 'units-allocation-solved')
    expect(s.problems).toEqual([])
  }, 150000)
})
