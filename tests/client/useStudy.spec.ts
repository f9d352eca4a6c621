/**
 * The study workspace's state: saving with optimistic locking, a stale save reported as a
 * conflict, a run saving unsaved edits first, and engine errors placed on the input fields.
 */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { useStudy } from '@/composables/useStudy.ts'
import { defaultCase } from '@/utils/defaultCase.ts'
import { fakeFetch } from './helpers.ts'

function studyBody(lockVersion = 3) {
  return {
    id: 7, name: 'Fermenter vent scrubber', description: '', status: 'draft', ownerId: 3, ownerName: 'Nora Castellanos',
    targetRecovery: 0.97, optimumTac: null, lastRunAt: null, updatedAt: '2026-12-01T10:00:00Z', revision: 1, lockVersion,
    inputs: defaultCase(), search: null, runs: [], options: [],
    can: { edit: true, run: true, pin: true, submit: true, review: false, comment: true, archive: true, logOperation: false },
  }
}

beforeEach(() => setActivePinia(createPinia()))
afterEach(() => vi.unstubAllGlobals())

describe('useStudy', () => {
  it('loads the study as a clean draft', async () => {
    fakeFetch((_m, url) => (url.includes('/components') ? { status: 200, body: [] } : { status: 200, body: studyBody() }))
    const ws = useStudy(() => 1, () => 7)
    await ws.load()
    await flushPromises()
    expect(ws.status.value).toBe('success')
    expect(ws.canEdit.value).toBe(true)
    expect(ws.dirty.value).toBe(false)
    expect(ws.draft.value?.recovery).toBe(0.97)
  })

  it('saves edits with the lock version it read', async () => {
    const calls = fakeFetch((method, url) => {
      if (url.includes('/components')) return { status: 200, body: [] }
      if (method === 'PUT') return { status: 200, body: { ...studyBody(4), inputs: { ...defaultCase(), recovery: 0.95 } } }
      return { status: 200, body: studyBody(3) }
    })
    const ws = useStudy(() => 1, () => 7)
    await ws.load()
    await flushPromises()
    if (ws.draft.value) ws.draft.value.recovery = 0.95
    await flushPromises()
    expect(ws.dirty.value).toBe(true)
    expect(await ws.save()).toBe(true)
    const put = calls.find((c) => c.method === 'PUT')
    expect(put?.url).toBe('/api/v1/sites/1/studies/7')
    expect(put?.body).toMatchObject({ lockVersion: 3, inputs: { recovery: 0.95 }, search: null })
    expect(ws.dirty.value).toBe(false)
    expect(ws.study.value?.lockVersion).toBe(4)
  })

  it('reports a stale save (409) as a conflict and keeps the edits', async () => {
    fakeFetch((method, url) => {
      if (url.includes('/components')) return { status: 200, body: [] }
      if (method === 'PUT') return { status: 409, body: { error: { code: 'conflict', message: 'The study was changed by someone else.', details: [] } } }
      return { status: 200, body: studyBody() }
    })
    const ws = useStudy(() => 1, () => 7)
    await ws.load()
    await flushPromises()
    if (ws.draft.value) ws.draft.value.solventFactor = 1.8
    await flushPromises()
    expect(await ws.save()).toBe(false)
    expect(ws.conflict.value).toBe(true)
    expect(ws.draft.value?.solventFactor).toBe(1.8)
    expect(ws.dirty.value).toBe(true)
  })

  it('saves unsaved edits before a run, and puts engine errors on the fields', async () => {
    const calls = fakeFetch((method, url) => {
      if (url.includes('/components')) return { status: 200, body: [] }
      if (method === 'PUT') return { status: 200, body: studyBody(4) }
      if (method === 'POST' && url.endsWith('/runs')) {
        return {
          status: 422,
          body: { error: { code: 'infeasible_design', message: 'No design meets these inputs.', details: [{ path: 'body.inputs.solventFactor', message: 'too close to the minimum for the trays' }] } },
        }
      }
      return { status: 200, body: studyBody() }
    })
    const ws = useStudy(() => 1, () => 7)
    await ws.load()
    await flushPromises()
    if (ws.draft.value) ws.draft.value.solventFactor = 1.01
    await flushPromises()
    expect(await ws.run('design')).toBe(false)
    const order = calls.filter((c) => c.method !== 'GET').map((c) => c.method)
    expect(order).toEqual(['PUT', 'POST'])
    expect(ws.errors.value.solventFactor).toEqual(['too close to the minimum for the trays'])
    expect(ws.problems.value.map((p) => p.label)).toEqual(['Solvent factor L / Lmin'])
    expect(ws.running.value).toBeNull()
    // an edit clears what the server said about the old inputs
    if (ws.draft.value) ws.draft.value.solventFactor = 1.4
    await flushPromises()
    expect(ws.errors.value).toEqual({})
  })

  it('lists every problem at once as the person types; nothing is sent while any is left', async () => {
    const calls = fakeFetch((_m, url) => (url.includes('/components') ? { status: 200, body: [] } : { status: 200, body: studyBody() }))
    const ws = useStudy(() => 1, () => 7)
    await ws.load()
    await flushPromises()
    const d = ws.draft.value!
    ;(d.gas as Record<string, unknown>).flow = -300
    d.recovery = 1.2
    d.solventFactor = 0.8
    delete (d.gas as Record<string, unknown>).soluteMoleFraction
    await flushPromises()
    expect(ws.errors.value['gas.flow']).toEqual(['-300 kmol/h: the gas flow must be positive'])
    expect(ws.errors.value.recovery).toEqual(['120 %: recovery must be below 100 %'])
    expect(ws.errors.value.solventFactor).toEqual(['0.8: L/Lmin must be above 1'])
    expect(ws.errors.value['gas.soluteMoleFraction']).toEqual(['required: enter the solute in the gas'])
    expect(ws.blockedReason.value).toMatch(/^4 inputs need attention/)
    expect(await ws.save()).toBe(false)
    expect(await ws.run('design')).toBe(false)
    expect(calls.some((c) => c.method !== 'GET')).toBe(false)
  })

  it('checks the case with the shared schema before saving', async () => {
    const calls = fakeFetch((_m, url) => (url.includes('/components') ? { status: 200, body: [] } : { status: 200, body: studyBody() }))
    const ws = useStudy(() => 1, () => 7)
    await ws.load()
    await flushPromises()
    if (ws.draft.value) (ws.draft.value.gas as Record<string, unknown>).flow = { value: 10, unit: 'parsec' }
    await flushPromises()
    expect(await ws.save()).toBe(false)
    expect(Object.keys(ws.errors.value).some((k) => k.startsWith('gas.flow'))).toBe(true)
    expect(calls.some((c) => c.method === 'PUT')).toBe(false)
  })
})
