import { ref, shallowRef } from 'vue'
import { studiesApi } from '@/api/studies.ts'
import type { OptionRow, RunView } from '@/api/types.ts'

export interface ComparedOption {
  key: string
  studyId: number
  studyName: string
  option: OptionRow
  run: RunView
}

/** Parse "studyId-optionId,studyId-optionId" from the address. */
export function parseOptionKeys(q: unknown): { studyId: number; optionId: number; key: string }[] {
  if (typeof q !== 'string' || !q) return []
  return q
    .split(',')
    .map((k) => {
      const [s, o] = k.split('-').map(Number)
      return { studyId: s ?? NaN, optionId: o ?? NaN, key: k }
    })
    .filter((k) => Number.isInteger(k.studyId) && Number.isInteger(k.optionId))
    .slice(0, 4)
}

/** Load two to four pinned options (from one or several studies) with their full runs. */
export function useCompare() {
  const items = shallowRef<ComparedOption[]>([])
  const status = ref<'idle' | 'loading' | 'success' | 'error'>('idle')
  const error = shallowRef<unknown>(null)
  let seq = 0

  async function load(siteId: number, keys: { studyId: number; optionId: number; key: string }[]): Promise<void> {
    const mine = ++seq
    if (keys.length === 0) {
      items.value = []
      status.value = 'idle'
      return
    }
    status.value = 'loading'
    error.value = null
    try {
      const studyIds = [...new Set(keys.map((k) => k.studyId))]
      const studies = new Map(await Promise.all(studyIds.map(async (id) => [id, await studiesApi.get(siteId, id)] as const)))
      const out: ComparedOption[] = []
      for (const k of keys) {
        const study = studies.get(k.studyId)
        const option = study?.options.find((o) => o.id === k.optionId)
        if (!study || !option) continue
        const run = await studiesApi.getRun(siteId, k.studyId, option.runId)
        out.push({ key: k.key, studyId: k.studyId, studyName: study.name, option, run })
      }
      if (mine !== seq) return
      items.value = out
      status.value = 'success'
    } catch (err) {
      if (mine !== seq) return
      error.value = err
      status.value = 'error'
    }
  }

  return { items, status, error, load }
}
