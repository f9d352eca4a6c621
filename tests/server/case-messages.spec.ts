/**
 * Case errors speak the person's units and words: a study with a negative gas flow, a recovery
 * over 100 % or L/Lmin below 1 is refused on save and on design, with the value as the person
 * typed it in their unit system (X-Unit-System), never the engine's SI value or a bare bound.
 */
import { describe, it, expect } from 'vitest'
import { readFileSync } from 'node:fs'
import { api, tokenFor, siteIds } from './helpers.ts'

const demo = JSON.parse(readFileSync('data/demo-studies.json', 'utf8')) as { studies: { inputs: Record<string, unknown> }[] }
const ethanolCase = demo.studies[0]!.inputs as { gas: Record<string, unknown> } & Record<string, unknown>

const nonsense = { ...ethanolCase, gas: { ...ethanolCase.gas, flow: -300 }, recovery: 1.2, solventFactor: 0.8 }

type Detail = { path: string; message: string }
const byPath = (details: Detail[]) => Object.fromEntries(details.map((d) => [d.path, d.message]))

describe('case errors in the person\'s units and words', () => {
  it('a study with nonsense is not saved: every problem at once, in SI units by default', async () => {
    const { cobalt } = await siteIds()
    const eng = { Authorization: `Bearer ${await tokenFor('engineer')}` }
    const r = await api().post(`/api/v1/sites/${cobalt}/studies`).set(eng).send({ name: 'Nonsense', inputs: nonsense })
    expect(r.status).toBe(400)
    const m = byPath(r.body.error.details)
    expect(m['body.inputs.gas.flow']).toBe('-300 kmol/h: the gas flow must be positive')
    expect(m['body.inputs.recovery']).toBe('120 %: recovery must be below 100 %')
    expect(m['body.inputs.solventFactor']).toBe('0.8: L/Lmin must be above 1')
    for (const d of r.body.error.details as Detail[]) {
      expect(d.message).not.toMatch(/got|expected number|<1|83\.33/)
    }
  })

  it('an edit with X-Unit-System: US names the value in US customary units', async () => {
    const { cobalt } = await siteIds()
    const eng = { Authorization: `Bearer ${await tokenFor('engineer')}` }
    const created = await api().post(`/api/v1/sites/${cobalt}/studies`).set(eng).send({ name: 'Units of the messages', inputs: ethanolCase })
    expect(created.status).toBe(201)
    const bad = { ...ethanolCase, gas: { ...ethanolCase.gas, flow: -300, temperature: -300 } }
    const r = await api()
      .put(`/api/v1/sites/${cobalt}/studies/${created.body.id}`)
      .set(eng)
      .set('X-Unit-System', 'US')
      .send({ inputs: bad, lockVersion: created.body.lockVersion })
    expect(r.status).toBe(400)
    const m = byPath(r.body.error.details)
    // 300 kmol/h = 661.4 lbmol/h (1 lb = 0.45359237 kg exactly, NIST SP 811 B.8)
    expect(m['body.inputs.gas.flow']).toBe('-661.4 lbmol/h: the gas flow must be positive')
    // -300 °C = -508 °F (t_F = 1.8 t_C + 32)
    expect(m['body.inputs.gas.temperature']).toBe('-508 °F: the gas temperature must be above absolute zero')
    const stored = await api().get(`/api/v1/sites/${cobalt}/studies/${created.body.id}`).set(eng)
    expect(stored.body.inputs.gas.flow).toBe(ethanolCase.gas.flow)
  })

  it('a design request with a quantity in its own unit names it in the person\'s system', async () => {
    const eng = { Authorization: `Bearer ${await tokenFor('engineer')}` }
    const c = { ...ethanolCase, gas: { ...ethanolCase.gas, flow: { value: -83.3333, unit: 'mol/s' } }, tray: { floodFraction: 1.1 } }
    const r = await api().post('/api/v1/designs/evaluate').set(eng).set('X-Unit-System', 'SI').send(c)
    expect(r.status).toBe(400)
    const m = byPath(r.body.error.details)
    // 83.3333 mol/s × 3.6 = 300.0 kmol/h
    expect(m['body.gas.flow']).toBe('-300 kmol/h: the gas flow must be positive')
    expect(m['body.tray.floodFraction']).toBe('110 %: the approach to flood must be below 100 %')
  })

  it('a blank required field is named as missing, letters as not a number', async () => {
    const { cobalt } = await siteIds()
    const eng = { Authorization: `Bearer ${await tokenFor('engineer')}` }
    const gas = { ...ethanolCase.gas }
    delete gas.soluteMoleFraction
    const r = await api().post(`/api/v1/sites/${cobalt}/studies`).set(eng).send({ name: 'Blank', inputs: { ...ethanolCase, gas, recovery: 'high' } })
    expect(r.status).toBe(400)
    const m = byPath(r.body.error.details)
    expect(m['body.inputs.gas.soluteMoleFraction']).toBe('required: enter the solute in the gas')
    expect(m['body.inputs.recovery']).toBe('not a number: enter recovery')
  })
})
