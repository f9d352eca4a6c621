import { computed, ref, shallowRef, watch } from 'vue'
import { studiesApi } from '@/api/studies.ts'
import { designsApi } from '@/api/designs.ts'
import { ApiError, fieldErrors } from '@/api/http.ts'
import { designOf, isOptimizeResult, type CaseInput, type ComponentEntry, type RunView, type StudyView } from '@/api/types.ts'
import type { AsyncStatus } from './useAsync.ts'
import { searchSpecSchema } from '@shared/schemas/search.ts'
import { ruleFor, setUnitSystemSource } from '@shared/schemas/caseRules.ts'
import { useSessionStore } from '@/stores/session.ts'

function clone<T>(v: T): T {
  return JSON.parse(JSON.stringify(v)) as T
}

type CaseModule = typeof import('@shared/schemas/case.ts')
let caseModule: Promise<CaseModule> | null = null

/** One input that needs attention: where it is, what the form calls it and what is wrong. */
export interface InputProblem {
  path: string
  label: string
  message: string
}

/** The form's name for a field path (the shared field rules), else the path in words. */
export function fieldLabel(path: string): string {
  if (path === 'name') return 'Study name'
  const rule = ruleFor(path)
  if (rule) {
    const point = /^equilibrium\.points\.(\d+)\.([01])$/.exec(path)
    return point ? `${point[2] === '0' ? 'x' : 'y'}${Number(point[1]) + 1} of the x–y table` : rule.label
  }
  if (path.startsWith('search')) return `Search limits: ${path.slice(7) || 'all'}`
  return path.replace(/\./g, ' › ')
}

/**
 * One study in the workspace: the stored study, an editable copy of its inputs, the latest
 * design and optimisation runs, saving with optimistic locking and running the engine.
 */
export function useStudy(siteId: () => number, studyId: () => number) {
  const study = shallowRef<StudyView | null>(null)
  const status = ref<AsyncStatus>('idle')
  const error = shallowRef<unknown>(null)
  const draft = ref<CaseInput | null>(null)
  const name = ref('')
  const description = ref('')
  /** The optimiser's search limits (only the fields the engineer set; the rest take defaults). */
  const search = ref<Record<string, unknown>>({})
  const dirty = ref(false)
  const saving = ref(false)
  const running = ref<'design' | 'optimize' | null>(null)
  const actionError = shallowRef<unknown>(null)
  const conflict = ref(false)
  /** Field messages from the server's last answer (cleared when the inputs change). */
  const serverErrors = ref<Record<string, string[]>>({})
  const caseMod = shallowRef<CaseModule | null>(null)
  const session = useSessionStore()
  // messages of the shared rules name values in the person's unit system
  setUnitSystemSource(() => session.unitSystem)
  caseModule ??= import('@shared/schemas/case.ts')
  void caseModule.then((m) => (caseMod.value = m))

  /** The check of the shared rules as the person types: every problem at once, in their units. */
  const liveErrors = computed<Record<string, string[]>>(() => {
    const out: Record<string, string[]> = {}
    void session.unitSystem // messages follow the unit switch
    const m = caseMod.value
    if (!m || !draft.value) return out
    const parsed = m.caseSchema.safeParse(draft.value)
    if (!parsed.success) for (const i of parsed.error.issues) (out[i.path.map(String).join('.')] ??= []).push(i.message)
    if (!name.value.trim()) out.name = ['required: give the study a name']
    const searchCheck = searchSpecSchema.safeParse(search.value)
    if (!searchCheck.success) for (const i of searchCheck.error.issues) (out[['search', ...i.path.map(String)].join('.')] ??= []).push(i.message)
    return out
  })
  /** Every field message: the live check, then what the server said. */
  const errors = computed<Record<string, string[]>>(() => {
    const out: Record<string, string[]> = {}
    for (const src of [liveErrors.value, serverErrors.value]) {
      for (const [k, v] of Object.entries(src)) out[k] = [...new Set([...(out[k] ?? []), ...v])]
    }
    return out
  })
  const problems = computed<InputProblem[]>(() =>
    Object.entries(errors.value).flatMap(([path, messages]) => messages.map((message) => ({ path, label: fieldLabel(path), message }))),
  )
  /** Why Save and Run are off, or '' when they are not. */
  const blockedReason = computed(() => {
    const n = Object.keys(liveErrors.value).length
    if (n === 0) return ''
    return `${n === 1 ? 'One input needs' : `${n} inputs need`} attention before the study can be saved or run.`
  })
  const designRun = shallowRef<RunView | null>(null)
  const optimizeRun = shallowRef<RunView | null>(null)
  const library = ref<ComponentEntry[]>([])

  let loadingDraft = false
  watch(
    [draft, name, description, search],
    () => {
      if (!loadingDraft) dirty.value = true
      serverErrors.value = {}
    },
    { deep: true },
  )

  function adopt(s: StudyView, keepDraft = false): void {
    study.value = s
    if (!keepDraft) {
      loadingDraft = true
      draft.value = clone(s.inputs)
      name.value = s.name
      description.value = s.description ?? ''
      search.value = clone(s.search ?? {})
      dirty.value = false
      // let the deep watcher see the new draft before we start tracking edits again
      void Promise.resolve().then(() => {
        loadingDraft = false
        dirty.value = false
      })
    }
  }

  async function loadRuns(s: StudyView): Promise<void> {
    const lastDesign = s.runs.find((r) => r.kind === 'design')
    const lastOptimize = s.runs.find((r) => r.kind === 'optimize')
    const [d, o] = await Promise.all([
      lastDesign ? studiesApi.getRun(siteId(), s.id, lastDesign.id) : Promise.resolve(null),
      lastOptimize ? studiesApi.getRun(siteId(), s.id, lastOptimize.id) : Promise.resolve(null),
    ])
    designRun.value = d
    optimizeRun.value = o
  }

  async function load(): Promise<void> {
    status.value = 'loading'
    error.value = null
    conflict.value = false
    serverErrors.value = {}
    try {
      caseMod.value = await (caseModule ??= import('@shared/schemas/case.ts'))
      const s = await studiesApi.get(siteId(), studyId())
      adopt(s)
      await loadRuns(s)
      status.value = 'success'
    } catch (err) {
      error.value = err
      status.value = 'error'
    }
    if (library.value.length === 0) {
      designsApi
        .components()
        .then((l) => {
          library.value = Array.isArray(l) ? l : l.items
        })
        .catch(() => undefined)
    }
  }

  const can = computed(() => study.value?.can)
  const canEdit = computed(() => can.value?.edit === true)

  /** Save the inputs; returns false when it could not (errors are shown). */
  async function save(): Promise<boolean> {
    const s = study.value
    if (!s || !draft.value) return false
    actionError.value = null
    conflict.value = false
    if (!caseMod.value) caseMod.value = await (caseModule ??= import('@shared/schemas/case.ts'))
    if (blockedReason.value) {
      actionError.value = new ApiError(400, 'validation', blockedReason.value)
      return false
    }
    saving.value = true
    try {
      const updated = await studiesApi.update(siteId(), s.id, {
        name: name.value.trim(),
        description: description.value,
        inputs: draft.value,
        search: Object.keys(search.value).length > 0 ? search.value : null,
        lockVersion: s.lockVersion,
      })
      adopt({ ...s, ...updated }, true)
      dirty.value = false
      return true
    } catch (err) {
      if (err instanceof ApiError && err.status === 409) conflict.value = true
      serverErrors.value = fieldErrors(err, ['inputs.'])
      actionError.value = err
      return false
    } finally {
      saving.value = false
    }
  }

  async function run(kind: 'design' | 'optimize'): Promise<boolean> {
    const s = study.value
    if (!s) return false
    if (blockedReason.value) {
      actionError.value = new ApiError(400, 'validation', blockedReason.value)
      return false
    }
    if (dirty.value && !(await save())) return false
    running.value = kind
    actionError.value = null
    serverErrors.value = {}
    try {
      const r = await studiesApi.run(siteId(), s.id, kind)
      if (kind === 'design') designRun.value = r
      else optimizeRun.value = r
      const fresh = await studiesApi.get(siteId(), s.id)
      adopt(fresh, true)
      return true
    } catch (err) {
      serverErrors.value = fieldErrors(err, ['inputs.'])
      actionError.value = err
      return false
    } finally {
      running.value = null
    }
  }

  async function pin(runId: number, optionName: string, notes: string): Promise<void> {
    const s = study.value
    if (!s) return
    await studiesApi.pin(siteId(), s.id, { runId, name: optionName, notes })
    adopt(await studiesApi.get(siteId(), s.id), true)
  }

  async function removeOption(optionId: number): Promise<void> {
    const s = study.value
    if (!s) return
    await studiesApi.removeOption(siteId(), s.id, optionId)
    adopt(await studiesApi.get(siteId(), s.id), true)
  }

  /** The newest run of either kind: what Column, Tray checks and Economics show. */
  const currentRun = computed<RunView | null>(() => {
    const d = designRun.value
    const o = optimizeRun.value
    if (d && o) return d.id > o.id ? d : o
    return d ?? o
  })
  const design = computed(() => designOf(currentRun.value?.result))
  const optimisation = computed(() => (isOptimizeResult(optimizeRun.value?.result) ? optimizeRun.value.result : null))
  const cautions = computed(() => {
    const list = [...(design.value?.cautions ?? []), ...(currentRun.value === optimizeRun.value ? (optimisation.value?.cautions ?? []) : [])]
    return [...new Set(list)]
  })

  return {
    study, status, error, draft, name, description, search, dirty, saving, running, actionError, conflict, errors, problems, blockedReason, library,
    designRun, optimizeRun, currentRun, design, optimisation, cautions, can, canEdit,
    load, save, run, pin, removeOption,
  }
}

export type StudyWorkspace = ReturnType<typeof useStudy>
