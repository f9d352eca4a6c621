/**
 * CSV uploads (equilibrium tables, vendor quotes) and cost-curve fits. Files go as multipart
 * (field `file`); answers and errors have the same shapes as every other request.
 */
import type {
  CsvIssue,
  EquilibriumPreview,
  EquilibriumTableView,
  FitAdopt,
  FitPoint,
  FitResult,
  FittableType,
  QuoteRowInput,
  QuotesPreview,
  QuoteView,
} from '@shared/schemas/uploads.ts'
import { API_BASE, ApiError, http, toApiError } from './http.ts'
import type { CostBasisVersion } from './types.ts'

export type { CsvIssue, EquilibriumPreview, EquilibriumTableView, FitAdopt, FitPoint, FitResult, FittableType, QuoteRowInput, QuotesPreview, QuoteView }

/** POST one file (and optional text fields) as multipart; JSON answer or an ApiError. */
export async function postFile<T>(path: string, file: File, fields: Record<string, string | number | undefined> = {}): Promise<T> {
  const form = new FormData()
  form.append('file', file, file.name)
  for (const [k, v] of Object.entries(fields)) if (v !== undefined && v !== '') form.append(k, String(v))
  let res: Response
  try {
    res = await fetch(API_BASE + path, { method: 'POST', body: form, credentials: 'same-origin', headers: { Accept: 'application/json' } })
  } catch {
    throw new ApiError(0, 'network', 'The server cannot be reached. Check the connection and try again.')
  }
  const text = await res.text()
  let body: unknown = null
  try {
    body = text ? JSON.parse(text) : null
  } catch {
    body = null
  }
  if (!res.ok) throw toApiError(res.status, body)
  return body as T
}

/** Line-numbered problems of a file from a 400 answer (details with path `file:line N` or `file`). */
export function fileIssues(err: unknown): CsvIssue[] {
  if (!(err instanceof ApiError)) return []
  return err.details
    .filter((d) => d.path.startsWith('file'))
    .map((d) => {
      const m = /^file:line (\d+)$/.exec(d.path)
      return { line: m ? Number(m[1]) : null, column: null, message: d.message }
    })
}

const site = (siteId: number) => `/sites/${siteId}`

export const uploadsApi = {
  previewEquilibrium: (siteId: number, file: File, fields: { name?: string; solute?: string; temperature?: number }): Promise<EquilibriumPreview> =>
    postFile(`${site(siteId)}/uploads/equilibrium/preview`, file, fields),
  saveEquilibrium: (siteId: number, file: File, fields: { name?: string; solute?: string; temperature?: number }): Promise<EquilibriumTableView> =>
    postFile(`${site(siteId)}/uploads/equilibrium`, file, fields),
  equilibriumTables: (siteId: number): Promise<EquilibriumTableView[]> => http.get(`${site(siteId)}/equilibrium-tables`),
  previewQuotes: (siteId: number, file: File): Promise<QuotesPreview> => postFile(`${site(siteId)}/uploads/quotes/preview`, file),
  saveQuotes: (siteId: number, file: File): Promise<{ uploadRef: string; fileName: string; count: number; quotes: QuoteView[]; warnings: CsvIssue[] }> =>
    postFile(`${site(siteId)}/uploads/quotes`, file),
  quotes: (siteId: number): Promise<QuoteView[]> => http.get(`${site(siteId)}/quotes`),
  deleteQuote: (siteId: number, id: number): Promise<unknown> => http.del(`${site(siteId)}/quotes/${id}`),
  fit: (siteId: number, body: { equipmentType: FittableType; costBasisId?: number }): Promise<FitResult> =>
    http.post(`${site(siteId)}/quotes/fit`, body),
  adoptFit: (siteId: number, costBasisId: number, body: FitAdopt & { lockVersion: number }): Promise<CostBasisVersion> =>
    http.post(`${site(siteId)}/cost-bases/${costBasisId}/adopt-fit`, body),
}
