import type { CostBasisInput } from '@shared/schemas/costBasis.ts'
import { http } from './http.ts'
import type { CostBasisVersion, CostBasisVersionRow, CostPreset } from './types.ts'

const base = (siteId: number) => `/sites/${siteId}/cost-bases`

export const costBasesApi = {
  list: (siteId: number): Promise<CostBasisVersionRow[] | { items: CostBasisVersionRow[] }> => http.get(base(siteId)),
  get: (siteId: number, id: number): Promise<CostBasisVersion> => http.get(`${base(siteId)}/${id}`),
  create: (siteId: number, body: { name?: string; basedOnId?: number; preset?: string }): Promise<CostBasisVersion> =>
    http.post(base(siteId), body),
  update: (
    siteId: number,
    id: number,
    body: { name: string; notes: string; data: CostBasisInput; lockVersion: number },
  ): Promise<CostBasisVersion> => http.put(`${base(siteId)}/${id}`, body),
  publish: (siteId: number, id: number, body: { effectiveDate: string; lockVersion: number; confirmEarlierDate?: boolean }): Promise<CostBasisVersion> =>
    http.post(`${base(siteId)}/${id}/publish`, body),
  discard: (siteId: number, id: number): Promise<unknown> => http.del(`${base(siteId)}/${id}`),
  presets: (): Promise<CostPreset[] | { items: CostPreset[] }> => http.get('/cost-presets'),
}
