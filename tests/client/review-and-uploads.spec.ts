/**
 * Review panel and upload problems. The expectations come from the API contract, not from the
 * components: error details of a CSV use the path `file:line N` (DEVELOPERS.md, "Every error
 * body"), a study is returned only with a comment (shared/schemas/review.ts, returnBody), and
 * approving posts to /approve with the reviewer's comment (server/routes/review.ts).
 */
import { afterEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import { ApiError } from '@/api/http.ts'
import { fileIssues } from '@/api/uploads.ts'
import type { StudyView } from '@/api/types.ts'
import UploadIssues from '@/components/uploads/UploadIssues.vue'
import StudyReview from '@/components/review/StudyReview.vue'
import { fakeFetch, testVuetify } from './helpers.ts'

afterEach(() => {
  vi.unstubAllGlobals()
})

describe('fileIssues', () => {
  it('reads the line number from file:line N and keeps file-wide problems without a line', () => {
    const err = new ApiError(400, 'validation', 'The file has 2 errors; nothing was saved.', [
      { path: 'file:line 4', message: 'x: "abc" is not a number' },
      { path: 'file', message: 'An equilibrium table needs at least 3 points; the file has 2.' },
      { path: 'body.name', message: 'is too long' },
    ])
    expect(fileIssues(err)).toEqual([
      { line: 4, column: null, message: 'x: "abc" is not a number' },
      { line: null, column: null, message: 'An equilibrium table needs at least 3 points; the file has 2.' },
    ])
    expect(fileIssues(new Error('not an API error'))).toEqual([])
  })
})

describe('UploadIssues', () => {
  it('lists each error with its line and column, and warnings apart', () => {
    const w = mount(UploadIssues, {
      props: {
        errors: [{ line: 3, column: 'x', message: "'abc' is not a number" }],
        warnings: [{ line: null, column: null, message: 'The table does not start at x = 0.' }],
      },
      global: { plugins: [testVuetify()] },
    })
    const errors = w.find('[data-testid="upload-errors"]')
    expect(errors.text()).toContain("Line 3 · x: 'abc' is not a number")
    expect(errors.text()).toContain('1 error in the file')
    expect(w.find('[data-testid="upload-warnings"]').text()).toContain('File: The table does not start at x = 0.')
  })
})

function reviewStudy(over: Partial<StudyView> = {}): StudyView {
  return {
    id: 7, name: 'Fermenter vent scrubber FV-201', description: '', status: 'in_review', ownerId: 3, ownerName: 'Nora Castellanos',
    targetRecovery: 0.985, optimumTac: null, lastRunAt: null, updatedAt: '2026-11-30T10:00:00Z', revision: 1, lockVersion: 2,
    inputs: {} as StudyView['inputs'], runs: [], options: [], recommendedOptionId: null,
    can: { edit: false, run: false, pin: false, submit: false, review: true, comment: true, archive: false, logOperation: false },
    ...over,
  }
}

async function mountReview(study: StudyView) {
  const pinia = createPinia()
  setActivePinia(pinia)
  const router = createRouter({ history: createMemoryHistory(), routes: [{ path: '/:p(.*)*', name: 'study', component: { template: '<div />' } }] })
  const w = mount(StudyReview, { props: { siteId: 1, study }, global: { plugins: [pinia, router, testVuetify()] } })
  await flushPromises()
  return w
}

describe('StudyReview (reviewer)', () => {
  it('does not return a study without a comment, and approves with the comment given', async () => {
    const calls = fakeFetch((method, url) => {
      if (method === 'GET' && url.endsWith('/comments')) return { status: 200, body: [] }
      if (method === 'POST' && url.endsWith('/approve')) return { status: 200, body: reviewStudy({ status: 'approved' }) }
      return { status: 404, body: { error: { code: 'not_found', message: 'no', details: [] } } }
    })
    const w = await mountReview(reviewStudy())
    await w.find('[data-testid="return"]').trigger('click')
    await flushPromises()
    expect(w.text()).toContain('Say what needs to change before returning the study.')
    expect(calls.filter((c) => c.method === 'POST')).toEqual([])

    await w.find('[data-testid="decision-comment"] textarea').setValue('Solvent rate agreed.')
    await w.find('[data-testid="approve"]').trigger('click')
    await flushPromises()
    const post = calls.find((c) => c.method === 'POST')
    expect(post?.url).toBe('/api/v1/sites/1/studies/7/approve')
    expect(post?.body).toEqual({ comment: 'Solvent rate agreed.' })
    expect(w.emitted('changed')).toHaveLength(1)
  })

  it('offers no decision to someone who may not review', async () => {
    fakeFetch(() => ({ status: 200, body: [] }))
    const w = await mountReview(reviewStudy({ can: { edit: false, run: false, pin: false, submit: false, review: false, comment: true, archive: false, logOperation: false } }))
    expect(w.find('[data-testid="approve"]').exists()).toBe(false)
    expect(w.find('[data-testid="return"]').exists()).toBe(false)
    expect(w.find('[data-testid="add-comment"]').exists()).toBe(true)
  })
})
