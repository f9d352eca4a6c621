import { runResultSchema } from '@shared/schemas/results.ts'
import { API_BASE, ApiError, http, type Query } from './http.ts'
import type { CaseInput, OptionRow, Paged, RunRow, RunView, StudyRow, StudyView } from './types.ts'

export interface StudyListQuery extends Query {
  page: number
  pageSize: number
  status?: string
  q?: string
  sort?: string
}

const base = (siteId: number) => `/sites/${siteId}/studies`

/** Check a stored run's result against the shared answer schemas (fields the page does not know are kept). */
async function checkedRun(p: Promise<RunView>): Promise<RunView> {
  const run = await p
  if (run.result !== null && !runResultSchema.safeParse(run.result).success) {
    throw new ApiError(200, 'badResponse', 'The server sent a run this page does not understand.')
  }
  return run
}

export const studiesApi = {
  list: (siteId: number, query: StudyListQuery): Promise<Paged<StudyRow> & { currency?: string | null }> => http.get(base(siteId), { query }),
  create: (siteId: number, body: { name: string; description: string; inputs: CaseInput }): Promise<StudyView> =>
    http.post(base(siteId), body),
  get: (siteId: number, studyId: number): Promise<StudyView> => http.get(`${base(siteId)}/${studyId}`),
  update: (
    siteId: number,
    studyId: number,
    body: { name: string; description: string; inputs: CaseInput; search?: Record<string, unknown> | null; lockVersion: number },
  ): Promise<StudyView> => http.put(`${base(siteId)}/${studyId}`, body),
  archive: (siteId: number, studyId: number): Promise<unknown> => http.post(`${base(siteId)}/${studyId}/archive`, {}),
  run: (siteId: number, studyId: number, kind: 'design' | 'optimize'): Promise<RunView> =>
    checkedRun(http.post(`${base(siteId)}/${studyId}/runs`, { kind })),
  runs: (siteId: number, studyId: number): Promise<RunRow[]> => http.get(`${base(siteId)}/${studyId}/runs`),
  getRun: (siteId: number, studyId: number, runId: number): Promise<RunView> =>
    checkedRun(http.get(`${base(siteId)}/${studyId}/runs/${runId}`)),
  pin: (siteId: number, studyId: number, body: { runId: number; name: string; notes: string }): Promise<OptionRow> =>
    http.post(`${base(siteId)}/${studyId}/options`, body),
  options: (siteId: number, studyId: number): Promise<OptionRow[]> => http.get(`${base(siteId)}/${studyId}/options`),
  removeOption: (siteId: number, studyId: number, optionId: number): Promise<unknown> =>
    http.del(`${base(siteId)}/${studyId}/options/${optionId}`),
}

/** Address of the printable report or spreadsheet (the browser sends the session cookie). */
export function studyFileUrl(siteId: number, studyId: number, kind: 'report.pdf' | 'export.xlsx'): string {
  return `${API_BASE}${base(siteId)}/${studyId}/${kind}`
}
