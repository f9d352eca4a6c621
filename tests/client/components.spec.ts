/**
 * Component behaviour: the percentage field, the tray-check table in US customary units and the
 * cost-basis form's marking of fields that differ from the published version.
 * Unit factors: NIST SP 811 (2008), Appendix B.8 — 1 in = 0.0254 m (exact);
 * inch of water (conventional) = 2.490 889 E+02 Pa.
 */
import { beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import AppNumberField from '@/components/base/AppNumberField.vue'
import StudyTrayChecks from '@/components/study/StudyTrayChecks.vue'
import CostBasisForm from '@/components/costBasis/CostBasisForm.vue'
import AppErrorAlert from '@/components/base/AppErrorAlert.vue'
import { ApiError } from '@/api/http.ts'
import { useSessionStore } from '@/stores/session.ts'
import { useUnitsStore } from '@/stores/units.ts'
import { demoUser, testVuetify } from './helpers.ts'
import type { CheckResult } from '@/api/types.ts'

let pinia: Pinia

beforeEach(() => {
  pinia = createPinia()
  setActivePinia(pinia)
})

describe('AppNumberField with a percentage scale', () => {
  it('shows a fraction as a percentage and emits the fraction', async () => {
    const w = mount(AppNumberField, { props: { modelValue: 0.97, label: 'Recovery', unit: '%', scale: 100 }, global: { plugins: [testVuetify()] } })
    expect(w.find('input').element.value).toBe('97')
    await w.find('input').setValue('95.5')
    expect(w.emitted('update:modelValue')?.at(-1)?.[0]).toBeCloseTo(0.955, 12)
  })
})

describe('AppNumberField and a value set from outside', () => {
  it('redisplays a value equal to one it emitted earlier (type 5, the form shows 7, then 5 again)', async () => {
    const w = mount(AppNumberField, { props: { modelValue: 3, label: 'Stages' }, global: { plugins: [testVuetify()] } })
    await w.find('input').setValue('5')
    await w.setProps({ modelValue: 5 })
    await w.setProps({ modelValue: 7 })
    expect(w.find('input').element.value).toBe('7')
    await w.setProps({ modelValue: 5 })
    expect(w.find('input').element.value).toBe('5')
  })

  it('with a case path, letters emit NaN and keep the text; blank emits null', async () => {
    const w = mount(AppNumberField, { props: { modelValue: 0.97, path: 'targets.recovery' }, global: { plugins: [testVuetify()] } })
    await w.find('input').setValue('abc')
    expect(w.emitted('update:modelValue')?.at(-1)?.[0]).toBeNaN()
    await w.setProps({ modelValue: Number.NaN })
    expect(w.find('input').element.value).toBe('abc')
    await w.find('input').setValue(' ')
    expect(w.emitted('update:modelValue')?.at(-1)?.[0]).toBeNull()
  })
})

describe('StudyTrayChecks', () => {
  const checks: CheckResult[] = [
    { key: 'pressureDropPerTray', label: 'Pressure drop per tray', status: 'pass', value: 498.17782, limit: 1000, direction: 'max', unit: 'Pa' },
    { key: 'downcomerBackup', label: 'Downcomer backup', status: 'warn', value: 0.254, limit: 0.3, unit: 'm', advice: 'Increase the tray spacing' },
    { key: 'entrainment', label: 'Fractional entrainment', status: 'fail', value: 0.15, limit: 0.1, unit: '-', advice: 'Lower the fraction of flood' },
  ]

  it('shows each check with its verdict and the advice only when it does not pass', async () => {
    useSessionStore().user = demoUser()
    await useUnitsStore().ensureLoaded()
    const w = mount(StudyTrayChecks, { props: { checks }, global: { plugins: [pinia, testVuetify()] } })
    await flushPromises()
    const rows = w.findAll('tbody tr')
    expect(rows).toHaveLength(3)
    expect(rows[0]?.text()).toContain('Pass')
    expect(rows[0]?.text()).not.toContain('Increase')
    expect(rows[1]?.text()).toContain('Warn')
    expect(rows[1]?.text()).toContain('Increase the tray spacing')
    expect(rows[2]?.text()).toContain('Fail')
    expect(w.text()).toContain('1 pass · 1 warn · 1 fail')
  })

  it('converts Pa to inH2O and m to in for US customary (NIST SP 811: inch of water, conventional = 249.0889 Pa; 1 in = 0.0254 m)', async () => {
    useSessionStore().user = demoUser({ unitSystem: 'US' })
    await useUnitsStore().ensureLoaded()
    const w = mount(StudyTrayChecks, { props: { checks }, global: { plugins: [pinia, testVuetify()] } })
    await flushPromises()
    const rows = w.findAll('tbody tr')
    const cells = (i: number) => rows[i]?.findAll('td').map((c) => c.text()) ?? []
    expect(cells(0)[1]).toBe('2') // 498.17782 Pa / 249.08891 Pa = 2 inH2O
    expect(cells(0)[3]).toBe('inH2O')
    expect(cells(1)[1]).toBe('10') // 0.254 m / 0.0254 = 10 in
    expect(cells(1)[3]).toBe('in')
    expect(cells(2)[3]).toBe('–')
  })

  it('shows each limit with its direction: at most for a maximum, at least for a minimum', async () => {
    useSessionStore().user = demoUser()
    await useUnitsStore().ensureLoaded()
    const withMin: CheckResult[] = [...checks, { key: 'weeping', label: 'Weeping (hole Froude number)', status: 'pass', value: 2.37, limit: 0.5, direction: 'min', unit: '-' }]
    const w = mount(StudyTrayChecks, { props: { checks: withMin }, global: { plugins: [pinia, testVuetify()] } })
    await flushPromises()
    const cells = (i: number) => w.findAll('tbody tr')[i]?.findAll('td').map((c) => c.text()) ?? []
    expect(cells(0)[2]).toMatch(/^\u2264 1[,\u202f ]?000$/)
    expect(cells(3)[2]).toBe('\u2265 0.5')
  })
})

describe('CostBasisForm', () => {
  const published = { name: 'Basis', general: { currency: 'USD', operatingHours: 8400 }, utilities: { electricityPrice: 0.085, solventCost: 0.25 } }

  it('marks only the fields that differ from the published version, and counts them', async () => {
    const draft = JSON.parse(JSON.stringify(published)) as typeof published
    draft.utilities.electricityPrice = 0.102
    const w = mount(CostBasisForm, {
      props: { data: draft, reference: published, readonly: false, errors: {} },
      global: { plugins: [testVuetify()] },
    })
    await flushPromises()
    expect(w.find('[data-testid="changed-count"]').text()).toContain('1 field differ')
    const changed = w.findAll('[data-changed="true"]')
    expect(changed).toHaveLength(1)
    expect(changed[0]?.text()).toContain('Electricity price')
    expect(changed[0]?.text()).toContain('published value: 0.085')
  })

  it('writes an edit into the draft and reports the change', async () => {
    const draft = JSON.parse(JSON.stringify(published)) as typeof published
    const w = mount(CostBasisForm, {
      props: { data: draft, reference: published, readonly: false, errors: {} },
      global: { plugins: [testVuetify()] },
    })
    await flushPromises()
    const input = w.find('[data-testid="cb-general.operatingHours"] input')
    await input.setValue('8000')
    expect(draft.general.operatingHours).toBe(8000)
    expect(w.emitted('change')).toBeTruthy()
  })
})

describe('AppErrorAlert', () => {
  it('says "Not allowed" for a 403 and lists the details by field', () => {
    const err = new ApiError(403, 'forbidden', 'Forbidden', [{ path: 'body.inputs.recovery', message: 'cannot be changed now' }])
    const w = mount(AppErrorAlert, { props: { error: err }, global: { plugins: [testVuetify()] } })
    expect(w.text()).toContain('Not allowed')
    expect(w.text()).toContain('recovery:')
    expect(w.text()).toContain('cannot be changed now')
  })

  it('offers "Try again" only when the page can retry', async () => {
    const err = new ApiError(500, 'internal', 'Database unavailable')
    const bare = mount(AppErrorAlert, { props: { error: err }, global: { plugins: [testVuetify()] } })
    expect(bare.text()).not.toContain('Try again')
    const retry = vi.fn()
    const w = mount(AppErrorAlert, { props: { error: err, onRetry: retry }, global: { plugins: [testVuetify()] } })
    const button = w.findAll('button').find((b) => b.text() === 'Try again')
    expect(button).toBeDefined()
    await button?.trigger('click')
    expect(retry).toHaveBeenCalledOnce()
  })
})
