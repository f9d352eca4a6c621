/** Operating log of an approved study: months entered or imported, each priced against the design. */
import type { OperatingEntryBody } from '@shared/schemas/operating.ts'
import { http } from './http.ts'
import { postFile } from './uploads.ts'
import type { Monitoring } from './rating.ts'

export type OperatingEntryInput = OperatingEntryBody

export interface OperatingEntry {
  id: number
  month: string
  gasFlow: number
  solventFlow: number
  inletMoleFraction?: number | null
  outletMoleFraction: number | null
  recovery: number | null
  powerKw: number | null
  notes: string
  lockVersion: number
}

export interface CostParts {
  solvent: number
  electricity: number
  lostProduct: number
  emission: number
  capital: number
  total: number
}

export interface TrackingFlag {
  code: string
  severity: 'warn' | 'fail'
  message: string
}

export interface MonthResult {
  month: string
  hours: number
  throughputRatio: number
  recovery: number | null
  actual: CostParts
  design: CostParts
  gap: number
  soluteLostKg: number
  percentFloodEstimate: number
  flags: TrackingFlag[]
  costBasisVersion?: number
}

export interface OperatingLog {
  entries: OperatingEntry[]
  months: MonthResult[]
  toDate: { actual: number; design: number; gap: number }
  design: { summary: Record<string, number>; runId: number; costBasisVersion: number | null } | null
  /** Each month rated with the as-built column (null before the first month). */
  monitoring?: Monitoring | null
  /** Why the months could not be rated with the built column, when they could not. */
  monitoringIssue?: string | null
}

const base = (siteId: number, studyId: number) => `/sites/${siteId}/studies/${studyId}/operating-entries`

export const operatingApi = {
  list: (siteId: number, studyId: number): Promise<OperatingLog> => http.get(base(siteId, studyId)),
  create: (siteId: number, studyId: number, entry: OperatingEntryInput): Promise<OperatingLog> => http.post(base(siteId, studyId), entry),
  importCsv: (siteId: number, studyId: number, file: File): Promise<OperatingLog> => postFile(`${base(siteId, studyId)}/import`, file),
  /** Correct a logged month; `lockVersion` is the version the person saw (409 when stale). */
  update: (siteId: number, studyId: number, entryId: number, body: { entry: OperatingEntryInput; lockVersion: number }): Promise<OperatingLog> =>
    http.put(`${base(siteId, studyId)}/${entryId}`, body),
  remove: (siteId: number, studyId: number, entryId: number): Promise<unknown> => http.del(`${base(siteId, studyId)}/${entryId}`),
}
