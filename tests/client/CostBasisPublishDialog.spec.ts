import { describe, it, expect, afterEach, vi } from 'vitest'
import { mount, flushPromises, type VueWrapper } from '@vue/test-utils'
import { nextTick } from 'vue'
import CostBasisPublishDialog from '@/components/costBasis/CostBasisPublishDialog.vue'
import { isoDate } from '@shared/costBasisInForce.ts'
import { stubVisualViewport, testVuetify } from './helpers.ts'

// The rule of the product (no outside source): the version in force is the published one with the
// latest effective date on or before today; publishing with an earlier date must be confirmed.
const today = isoDate()
const versions = [
  { version: 1, status: 'published', effectiveDate: '2020-03-01', publishedAt: '2020-02-20T09:00:00Z' },
  { version: 2, status: 'draft', effectiveDate: null, publishedAt: null },
]

stubVisualViewport()

let wrapper: VueWrapper | null = null
afterEach(() => {
  wrapper?.unmount()
  wrapper = null
  document.body.innerHTML = ''
})

async function openDialog() {
  wrapper = mount(CostBasisPublishDialog, {
    props: { modelValue: false, versions, draftVersion: 2, publishing: false, error: '', fieldErrors: [] },
    attachTo: document.body,
    global: { plugins: [testVuetify()] },
  })
  await wrapper.setProps({ modelValue: true })
  await flushPromises()
  await vi.waitFor(() => expect(document.querySelector('[data-testid="effective-date"] input')).not.toBeNull())
  return wrapper
}

const dateInput = () => document.querySelector<HTMLInputElement>('[data-testid="effective-date"] input')!
const publishButton = () => document.querySelector<HTMLButtonElement>('[data-testid="confirm-publish"]')!

async function typeDate(value: string) {
  const input = dateInput()
  input.value = value
  input.dispatchEvent(new Event('input'))
  await nextTick()
}

describe('publishing a cost-basis version', () => {
  it('starts at today; a later date publishes without a question', async () => {
    const w = await openDialog()
    expect(dateInput().value).toBe(today)
    expect(document.querySelector('[data-testid="earlier-date-impact"]')).toBeNull()
    publishButton().click()
    await flushPromises()
    expect(w.emitted('publish')).toEqual([[{ effectiveDate: today, confirmEarlierDate: undefined }]])
  })

  it('a date before the version in force says what it changes and needs confirming', async () => {
    const w = await openDialog()
    await typeDate('2020-01-15')
    await vi.waitFor(() => expect(document.querySelector('[data-testid="earlier-date-impact"]')).not.toBeNull())
    const text = document.querySelector('[data-testid="earlier-date-impact"]')!.textContent ?? ''
    expect(text).toContain('Version 1 is in force from 2020-03-01')
    expect(text).toContain('Version 2 dated 2020-01-15 will not be in force today')
    expect(publishButton().disabled).toBe(true)
    publishButton().click()
    await flushPromises()
    expect(w.emitted('publish')).toBeUndefined()

    document.querySelector<HTMLInputElement>('[data-testid="confirm-earlier-date"] input')!.click()
    await nextTick()
    expect(publishButton().disabled).toBe(false)
    publishButton().click()
    await flushPromises()
    expect(w.emitted('publish')).toEqual([[{ effectiveDate: '2020-01-15', confirmEarlierDate: true }]])
  })

  it('opens at today again after a different date was typed', async () => {
    const w = await openDialog()
    await typeDate('2020-01-15')
    await w.setProps({ modelValue: false })
    await flushPromises()
    await w.setProps({ modelValue: true })
    await flushPromises()
    await vi.waitFor(() => expect(dateInput().value).toBe(today))
    expect(document.querySelector('[data-testid="earlier-date-impact"]')).toBeNull()
  })
})
