/** Review of a study (submit, approve, return, revise), its comment thread and site notifications. */
import type { ReviewEventView } from '@shared/schemas/review.ts'
import type { NotificationChange, StudyNotification } from '@shared/schemas/answers.ts'
import { http } from './http.ts'
import type { StudyView } from './types.ts'

export type { ReviewEventView }

export type { NotificationChange, StudyNotification }

const study = (siteId: number, studyId: number) => `/sites/${siteId}/studies/${studyId}`

export const reviewApi = {
  submit: (siteId: number, studyId: number, body: { recommendedOptionId: number; comment: string }): Promise<StudyView> =>
    http.post(`${study(siteId, studyId)}/submit`, body),
  approve: (siteId: number, studyId: number, body: { comment: string }): Promise<StudyView> =>
    http.post(`${study(siteId, studyId)}/approve`, body),
  returnStudy: (siteId: number, studyId: number, body: { comment: string }): Promise<StudyView> =>
    http.post(`${study(siteId, studyId)}/return`, body),
  revise: (siteId: number, studyId: number): Promise<StudyView> => http.post(`${study(siteId, studyId)}/revise`, {}),
  thread: (siteId: number, studyId: number): Promise<ReviewEventView[]> => http.get(`${study(siteId, studyId)}/comments`),
  comment: (siteId: number, studyId: number, body: string): Promise<ReviewEventView[]> =>
    http.post(`${study(siteId, studyId)}/comments`, { body }),
  notifications: (siteId: number): Promise<StudyNotification[]> => http.get(`/sites/${siteId}/notifications`),
}
