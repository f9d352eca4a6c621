/**
 * The one form dialog (create person, create site): the form's own check before sending, the
 * server's refusal on the field it names, a message about no field in the banner, and a fresh
 * form each time it opens.
 */
import { describe, it, expect, afterEach, beforeEach, vi } from 'vitest'
import { mount, flushPromises, type VueWrapper } from '@vue/test-utils'
import { nextTick } from 'vue'
import PeopleCreateSiteDialog from '@/components/people/PeopleCreateSiteDialog.vue'
import { fakeFetch, stubVisualViewport, testVuetify } from './helpers.ts'

let wrapper: VueWrapper | null = null
beforeEach(stubVisualViewport)
afterEach(() => {
  wrapper?.unmount()
  wrapper = null
  document.body.innerHTML = ''
  vi.unstubAllGlobals()
})

async function openDialog() {
  wrapper = mount(PeopleCreateSiteDialog, { props: { modelValue: false }, attachTo: document.body, global: { plugins: [testVuetify()] } })
  await wrapper.setProps({ modelValue: true })
  await flushPromises()
  await vi.waitFor(() => expect(document.querySelector('[data-testid="new-site-dialog"] input')).not.toBeNull())
  return wrapper
}

function field(label: string): HTMLInputElement | HTMLTextAreaElement {
  const el = [...document.querySelectorAll('[data-testid="new-site-dialog"] .v-input')].find((x) => x.querySelector('label')?.textContent?.trim() === label)
  const input = el?.querySelector<HTMLInputElement | HTMLTextAreaElement>('input, textarea')
  if (!input) throw new Error(`no field ${label}`)
  return input
}
function messagesOf(label: string): string {
  const el = [...document.querySelectorAll('[data-testid="new-site-dialog"] .v-input')].find((x) => x.querySelector('label')?.textContent?.trim() === label)
  return el?.querySelector('.v-messages')?.textContent ?? ''
}
async function type(label: string, value: string) {
  const input = field(label)
  input.value = value
  input.dispatchEvent(new Event('input'))
  await nextTick()
}
async function submit() {
  document.querySelector<HTMLButtonElement>('[data-testid="new-site-dialog"] button[type="submit"]')!.click()
  await flushPromises()
}
const banner = () => document.querySelector('[data-testid="new-site-dialog"] [role="alert"]')?.textContent ?? ''

describe('the form dialog (new site)', () => {
  it('checks the form before sending: a bad code is marked on its field and nothing is sent', async () => {
    const calls = fakeFetch(() => ({ status: 201, body: {} }))
    await openDialog()
    await type('Name', 'Lantern Point')
    await type('Code', 'Not A Code!')
    await submit()
    expect(calls).toHaveLength(0)
    await vi.waitFor(() => expect(messagesOf('Code')).not.toBe(''))
  })

  it('puts the server refusal on the field its path names, and closes with done after a success', async () => {
    let answer: { status: number; body?: unknown } = {
      status: 409,
      body: { error: { code: 'conflict', message: 'A site with this code exists.', details: [{ path: 'body.code', message: 'already used by another site' }] } },
    }
    const calls = fakeFetch(() => answer)
    const w = await openDialog()
    await type('Name', 'Lantern Point')
    await type('Code', 'lantern-point')
    await submit()
    expect(calls.map((c) => [c.method, c.body])).toEqual([['POST', { name: 'Lantern Point', code: 'lantern-point', description: '' }]])
    await vi.waitFor(() => expect(messagesOf('Code')).toContain('already used by another site'))
    expect(banner()).toBe('')
    answer = { status: 201, body: { id: 9 } }
    await type('Code', 'lantern-point-2')
    await submit()
    expect(w.emitted('created')).toHaveLength(1)
    expect(w.emitted('update:modelValue')?.at(-1)).toEqual([false])
  })

  it('shows a refusal about no field of the form in the banner, and opens fresh the next time', async () => {
    fakeFetch(() => ({ status: 503, body: { error: { code: 'unavailable', message: 'The database is not reachable.', details: [] } } }))
    const w = await openDialog()
    await type('Name', 'Lantern Point')
    await type('Code', 'lantern-point')
    await submit()
    await vi.waitFor(() => expect(banner()).toContain('The database is not reachable.'))
    await w.setProps({ modelValue: false })
    await w.setProps({ modelValue: true })
    await flushPromises()
    await vi.waitFor(() => expect(banner()).toBe(''))
    expect(field('Name').value).toBe('')
  })
})
