import { computed } from 'vue'
import { useAsync } from './useAsync.ts'
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
  const req = useAsync(async (siteId: number, keys: { studyId: number; optionId: number; key: string }[]): Promise<ComparedOption[]> => {
    if (keys.length === 0) return []
    const studyIds = [...new Set(keys.map((k) => k.studyId))]
    const studies = new Map(await Promise.all(studyIds.map(async (id) => [id, await studiesApi.get(siteId, id)] as const)))
    const found = keys.flatMap((k) => {
      const study = studies.get(k.studyId)
      const option = study?.options.find((o) => o.id === k.optionId)
      return study && option ? [{ k, study, option }] : []
    })
    return Promise.all(
      found.map(async ({ k, study, option }) => ({ key: k.key, studyId: k.studyId, studyName: study.name, option, run: await studiesApi.getRun(siteId, k.studyId, option.runId) })),
    )
  })
  const items = computed<ComparedOption[]>(() => req.data.value ?? [])

  async function load(siteId: number, keys: { studyId: number; optionId: number; key: string }[]): Promise<void> {
    await req.run(siteId, keys)
  }

  return { items, status: req.status, error: req.error, load, retry: req.retry }
}
