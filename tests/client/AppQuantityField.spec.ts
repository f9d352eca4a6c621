/**
 * The unit-aware number field. Expected conversions use the exact factors published in
 * NIST SP 811 (2008), Appendix B: 1 lb = 0.45359237 kg, 1 ft = 0.3048 m,
 * 1 psi = 6.894757 kPa, t/°C = (t/°F − 32)/1.8.
 */
import { beforeEach, describe, expect, it } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import AppQuantityField from '@/components/base/AppQuantityField.vue'
import { useSessionStore } from '@/stores/session.ts'
import { useUnitsStore } from '@/stores/units.ts'
import { demoUser, testVuetify } from './helpers.ts'
import type { QuantityKind } from '@shared/units.ts'
import type { Quantity } from '@/api/types.ts'

async function setup(system: 'SI' | 'US', kind: QuantityKind, modelValue: Quantity | null) {
  const pinia = createPinia()
  setActivePinia(pinia)
  const session = useSessionStore()
  session.user = demoUser({ unitSystem: system })
  await useUnitsStore().ensureLoaded()
  const wrapper = mount(AppQuantityField, {
    props: { modelValue, kind, label: 'Quantity' },
    global: { plugins: [pinia, testVuetify()] },
  })
  await flushPromises()
  return { wrapper, session }
}

function shown(wrapper: Awaited<ReturnType<typeof setup>>['wrapper']): number {
  return Number(wrapper.find('input').element.value)
}

describe('AppQuantityField', () => {
  beforeEach(() => {
    localStorage.clear()
  })

  it('shows a case value in SI as it is, with the unit as suffix', async () => {
    const { wrapper } = await setup('SI', 'molarFlow', 180)
    expect(shown(wrapper)).toBe(180)
    expect(wrapper.text()).toContain('kmol/h')
  })

  it('shows kmol/h as lbmol/h in US customary (1 lbmol = 0.45359237 kmol, NIST SP 811)', async () => {
    const { wrapper } = await setup('US', 'molarFlow', 180)
    expect(shown(wrapper)).toBeCloseTo(180 / 0.45359237, 1) // 396.83
    expect(wrapper.text()).toContain('lbmol/h')
  })

  it('emits degC for a temperature typed in degF (86 °F = 30 °C, NIST SP 811)', async () => {
    const { wrapper } = await setup('US', 'temperature', 20)
    await wrapper.find('input').setValue('86')
    const emitted = wrapper.emitted('update:modelValue')
    expect(emitted).toBeTruthy()
    expect(emitted?.at(-1)?.[0]).toBeCloseTo(30, 9)
  })

  it('emits kPa for a pressure typed in psi (1 psi = 6.894757 kPa, NIST SP 811)', async () => {
    const { wrapper } = await setup('US', 'pressure', 101.325)
    await wrapper.find('input').setValue('14.5')
    const v = wrapper.emitted('update:modelValue')?.at(-1)?.[0]
    expect(typeof v).toBe('number')
    expect(v as number).toBeCloseTo(14.5 * 6.894757, 3) // 99.974 kPa
  })

  it('reads a {value, unit} case value in its own unit (1 ft = 0.3048 m, NIST SP 811)', async () => {
    const { wrapper } = await setup('SI', 'length', { value: 2, unit: 'ft' })
    expect(shown(wrapper)).toBeCloseTo(0.6096, 6)
  })

  it('accepts a decimal comma', async () => {
    const { wrapper } = await setup('SI', 'smallLength', 5)
    await wrapper.find('input').setValue('4,5')
    expect(wrapper.emitted('update:modelValue')?.at(-1)?.[0]).toBeCloseTo(4.5, 12)
  })

  it('flags text that is not a number and emits nothing for it', async () => {
    const { wrapper } = await setup('SI', 'smallLength', 5)
    await wrapper.find('input').setValue('five')
    expect(wrapper.emitted('update:modelValue')).toBeUndefined()
    expect(wrapper.text()).toContain('Enter a number')
  })

  it('emits null when cleared', async () => {
    const { wrapper } = await setup('SI', 'smallLength', 5)
    await wrapper.find('input').setValue('')
    expect(wrapper.emitted('update:modelValue')?.at(-1)?.[0]).toBeNull()
  })

  it('redisplays when the person switches unit system (50 mm = 1.9685 in, NIST SP 811: 1 in = 25.4 mm)', async () => {
    const { wrapper, session } = await setup('SI', 'smallLength', 50)
    expect(shown(wrapper)).toBe(50)
    session.user = demoUser({ unitSystem: 'US' })
    await flushPromises()
    expect(shown(wrapper)).toBeCloseTo(50 / 25.4, 4)
    expect(wrapper.text()).toContain('in')
  })

  it('redisplays a value set from outside that equals one it emitted earlier (type 5, another study shows 7, back to 5)', async () => {
    const { wrapper } = await setup('SI', 'smallLength', 3)
    await wrapper.find('input').setValue('5')
    expect(wrapper.emitted('update:modelValue')?.at(-1)?.[0]).toBe(5)
    await wrapper.setProps({ modelValue: 5 }) // the form takes what was typed
    await wrapper.setProps({ modelValue: 7 }) // another study's value
    expect(shown(wrapper)).toBe(7)
    await wrapper.setProps({ modelValue: 5 }) // back to the first study
    expect(shown(wrapper)).toBe(5)
  })

  it('redisplays the model after the person typed letters and the form reset it to a value typed before', async () => {
    const { wrapper } = await setup('SI', 'smallLength', 3)
    await wrapper.find('input').setValue('5')
    await wrapper.setProps({ modelValue: 5 })
    await wrapper.find('input').setValue('5x')
    expect(wrapper.text()).toContain('Enter a number')
    await wrapper.setProps({ modelValue: 3 }) // reset to the saved value...
    await wrapper.setProps({ modelValue: 5 }) // ...then to the value typed before
    expect(wrapper.find('input').element.value).toBe('5')
    expect(wrapper.text()).not.toContain('Enter a number')
  })

  it('shows server error messages on the field', async () => {
    const pinia = createPinia()
    setActivePinia(pinia)
    useSessionStore().user = demoUser()
    await useUnitsStore().ensureLoaded()
    const wrapper = mount(AppQuantityField, {
      props: { modelValue: -5, kind: 'molarFlow', label: 'Gas flow', errorMessages: ['must be positive'] },
      global: { plugins: [pinia, testVuetify()] },
    })
    await flushPromises()
    expect(wrapper.text()).toContain('must be positive')
  })
})
