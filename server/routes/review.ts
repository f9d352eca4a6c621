import type { Router } from 'express'
import { defineRoutes, parse, ANY_ROLE } from './define.ts'
import * as review from '../services/review.ts'
import { outbox } from '../services/outbox.ts'
import { idParam } from '../../shared/schemas/common.ts'
import { submitBody, approveBody, returnBody, commentBody } from '../../shared/schemas/review.ts'
import type { Config } from '../config.ts'
import { commentAnswer, notificationAnswer, outboxAnswer, studyAnswer } from '../../shared/schemas/answers.ts'
import { z } from 'zod'

const study = (p: unknown) => parse(idParam, p, 'params.studyId')

export function reviewRoutes(router: Router, cfg: Config): Router {
  return defineRoutes(router, [
    {
      method: 'post', path: '/sites/:siteId/studies/:studyId/submit', access: { kind: 'site', roles: ['engineer'] },
      summary: 'Submit a draft or returned study for review with a recommended option',
      status: 200,
      doc: { body: submitBody, response: studyAnswer },
      handler: (req) => review.submit(req.site!.id, study(req.params.studyId), parse(submitBody, req.body), req.user!, req.requestId),
    },
    {
      method: 'post', path: '/sites/:siteId/studies/:studyId/approve', access: { kind: 'site', roles: ['reviewer'] },
      summary: 'Approve a study in review (it becomes frozen)',
      status: 200,
      doc: { body: approveBody, response: studyAnswer },
      handler: (req) => review.approve(req.site!.id, study(req.params.studyId), parse(approveBody, req.body), req.user!, req.requestId),
    },
    {
      method: 'post', path: '/sites/:siteId/studies/:studyId/return', access: { kind: 'site', roles: ['reviewer'] },
      summary: 'Return a study in review with comments',
      status: 200,
      doc: { body: returnBody, response: studyAnswer },
      handler: (req) => review.returnStudy(req.site!.id, study(req.params.studyId), parse(returnBody, req.body), req.user!, req.requestId),
    },
    {
      method: 'post', path: '/sites/:siteId/studies/:studyId/revise', access: { kind: 'site', roles: ['engineer'] },
      summary: 'Start a revision (a new draft) of an approved study',
      doc: { response: studyAnswer },
      handler: (req) => review.revise(req.site!.id, study(req.params.studyId), req.user!, req.requestId),
    },
    {
      method: 'get', path: '/sites/:siteId/studies/:studyId/comments', access: { kind: 'site', roles: ANY_ROLE },
      summary: 'The review thread: comments and state changes',
      doc: { response: z.array(commentAnswer) },
      handler: (req) => review.thread(req.site!.id, study(req.params.studyId)),
    },
    {
      method: 'post', path: '/sites/:siteId/studies/:studyId/comments', access: { kind: 'site', roles: ANY_ROLE },
      summary: 'Add a comment to the thread',
      doc: { body: commentBody, response: z.array(commentAnswer) },
      handler: (req) => review.comment(req.site!.id, study(req.params.studyId), parse(commentBody, req.body).body, req.user!, req.requestId),
    },
    {
      method: 'get', path: '/sites/:siteId/notifications', access: { kind: 'site', roles: ANY_ROLE },
      summary: 'What changed in the site\'s studies since the person last looked',
      doc: { response: z.array(notificationAnswer) },
      handler: (req) => review.notifications(req.site!.id, req.user!),
    },
    {
      method: 'get', path: '/outbox', access: { kind: 'systemAdmin' },
      summary: 'Development only: mail captured by the local fake mail server, and the delivery queue',
      doc: { response: outboxAnswer },
      handler: () => outbox(cfg.MAIL_MODE),
    },
  ])
}
