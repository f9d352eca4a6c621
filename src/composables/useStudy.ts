import { computed, ref, shallowRef, watch } from 'vue'
import { studiesApi } from '@/api/studies.ts'
import { designsApi } from '@/api/designs.ts'
import { ApiError, fieldErrors } from '@/api/http.ts'
import { designOf, isOptimizeResult, type CaseInput, type ComponentEntry, type RunView, type StudyView } from '@/api/types.ts'
import { useAsync } from './useAsync.ts'
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
  const draft = ref<CaseInput | null>(null)
  const name = ref('')
  const description = ref('')
  /** The optimiser's search limits (only the fields the engineer set; the rest take defaults). */
  const search = ref<Record<string, unknown>>({})
  const dirty = ref(false)
  const runningKind = ref<'design' | 'optimize' | null>(null)
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

  /** The study with its latest design and optimisation runs. */
  const opening = useAsync(async (site: number, id: number) => {
    caseMod.value = await (caseModule ??= import('@shared/schemas/case.ts'))
    const s = await studiesApi.get(site, id)
    const lastDesign = s.runs.find((r) => r.kind === 'design')
    const lastOptimize = s.runs.find((r) => r.kind === 'optimize')
    const [d, o] = await Promise.all([
      lastDesign ? studiesApi.getRun(site, s.id, lastDesign.id) : Promise.resolve(null),
      lastOptimize ? studiesApi.getRun(site, s.id, lastOptimize.id) : Promise.resolve(null),
    ])
    return { s, d, o }
  })
  const components = useAsync(async () => {
    const l = await designsApi.components()
    return Array.isArray(l) ? l : l.items
  })

  async function load(): Promise<void> {
    conflict.value = false
    serverErrors.value = {}
    if (library.value.length === 0 && !components.loading.value) {
      void components.run().then((l) => {
        if (l) library.value = l
      })
    }
    const got = await opening.run(siteId(), studyId())
    if (!got) return
    adopt(got.s)
    designRun.value = got.d
    optimizeRun.value = got.o
  }

  const can = computed(() => study.value?.can)
  const canEdit = computed(() => can.value?.edit === true)

  const saving = useAsync((site: number, id: number, body: Parameters<typeof studiesApi.update>[2]) => studiesApi.update(site, id, body))
  /** A run of the engine on the saved inputs, then the study as it stands after it. */
  const running = useAsync(async (site: number, id: number, kind: 'design' | 'optimize') => {
    const r = await studiesApi.run(site, id, kind)
    return { r, fresh: await studiesApi.get(site, id) }
  })

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
    const updated = await saving.run(siteId(), s.id, {
      name: name.value.trim(),
      description: description.value,
      inputs: draft.value,
      search: Object.keys(search.value).length > 0 ? search.value : null,
      lockVersion: s.lockVersion,
    })
    if (!updated) {
      const err = saving.error.value
      if (err instanceof ApiError && err.status === 409) conflict.value = true
      serverErrors.value = fieldErrors(err, ['inputs.'])
      actionError.value = err
      return false
    }
    adopt({ ...s, ...updated }, true)
    dirty.value = false
    return true
  }

  async function run(kind: 'design' | 'optimize'): Promise<boolean> {
    const s = study.value
    if (!s) return false
    if (blockedReason.value) {
      actionError.value = new ApiError(400, 'validation', blockedReason.value)
      return false
    }
    if (dirty.value && !(await save())) return false
    runningKind.value = kind
    actionError.value = null
    serverErrors.value = {}
    const done = await running.run(siteId(), s.id, kind)
    runningKind.value = null
    if (!done) {
      serverErrors.value = fieldErrors(running.error.value, ['inputs.'])
      actionError.value = running.error.value
      return false
    }
    if (kind === 'design') designRun.value = done.r
    else optimizeRun.value = done.r
    adopt(done.fresh, true)
    return true
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
    study, status: opening.status, error: opening.error, draft, name, description, search, dirty, saving: saving.loading, running: runningKind, actionError, conflict, errors, problems, blockedReason, library,
    designRun, optimizeRun, currentRun, design, optimisation, cautions, can, canEdit,
    load, save, run, pin, removeOption,
  }
}

export type StudyWorkspace = ReturnType<typeof useStudy>
