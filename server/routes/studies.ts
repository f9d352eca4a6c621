import type { Router } from 'express'
import { defineRoutes, parse, ANY_ROLE } from './define.ts'
import * as svc from '../services/studies.ts'
import * as runs from '../services/runs.ts'
import { idParam } from '../../shared/schemas/common.ts'
import { storedRunSchema } from '../../shared/schemas/results.ts'
import { studyListQuery, createStudyBody, updateStudyBody, createRunBody, createOptionBody } from '../../shared/schemas/studies.ts'
import { optionAnswer, runComparisonAnswer, runHeadAnswer, studyAnswer, studyListAnswer } from '../../shared/schemas/answers.ts'
import { z } from 'zod'

const study = (p: unknown) => parse(idParam, p, 'params.studyId')

export function studyRoutes(router: Router): Router {
  return defineRoutes(router, [
    {
      method: 'get', path: '/sites/:siteId/studies', access: { kind: 'site', roles: ANY_ROLE }, summary: 'Studies of the site: paged, filtered (status, q) and sorted',
      doc: { query: studyListQuery, response: studyListAnswer },
      handler: (req) => svc.listStudies(req.site!.id, parse(studyListQuery, req.query, 'query')),
    },
    {
      method: 'post', path: '/sites/:siteId/studies', access: { kind: 'site', roles: ['engineer'] }, summary: 'Create a study with its case',
      doc: { body: createStudyBody, response: studyAnswer },
      handler: (req) => svc.createStudy(req.site!.id, parse(createStudyBody, req.body), req.user!, req.requestId),
    },
    {
      method: 'get', path: '/sites/:siteId/studies/:studyId', access: { kind: 'site', roles: ANY_ROLE }, summary: 'One study with runs, options and what the caller may do',
      doc: { response: studyAnswer },
      handler: (req) => svc.getStudy(req.site!.id, study(req.params.studyId), req.user!),
    },
    {
      method: 'put', path: '/sites/:siteId/studies/:studyId', access: { kind: 'site', roles: ['engineer'] }, summary: 'Edit a draft or returned study (optimistic locking on lockVersion)',
      doc: { body: updateStudyBody, response: studyAnswer },
      handler: (req) => svc.updateStudy(req.site!.id, study(req.params.studyId), parse(updateStudyBody, req.body), req.user!, req.requestId),
    },
    {
      method: 'post', path: '/sites/:siteId/studies/:studyId/archive', access: { kind: 'site', roles: ['engineer'] }, summary: 'Archive a study',
      status: 200,
      doc: { response: studyAnswer },
      handler: (req) => svc.archiveStudy(req.site!.id, study(req.params.studyId), req.user!, req.requestId),
    },
    {
      method: 'get', path: '/sites/:siteId/studies/:studyId/runs', access: { kind: 'site', roles: ANY_ROLE }, summary: 'Runs of a study, newest first',
      doc: { response: z.array(runHeadAnswer) },
      handler: (req) => runs.listRuns(req.site!.id, study(req.params.studyId)),
    },
    {
      method: 'post', path: '/sites/:siteId/studies/:studyId/runs', access: { kind: 'site', roles: ['engineer'] }, summary: 'Evaluate or optimise the study with the cost basis in force, and store the run',
      doc: { body: createRunBody, response: storedRunSchema },
      handler: (req) => runs.createRun(req.site!.id, study(req.params.studyId), parse(createRunBody, req.body).kind, req.user!, req.requestId),
    },
    {
      method: 'get', path: '/sites/:siteId/studies/:studyId/runs/:runId', access: { kind: 'site', roles: ANY_ROLE }, summary: 'One stored run, exactly as computed',
      doc: { response: storedRunSchema },
      handler: (req) => runs.getRun(req.site!.id, study(req.params.studyId), parse(idParam, req.params.runId, 'params.runId')),
    },
    {
      method: 'post', path: '/sites/:siteId/studies/:studyId/runs/:runId/compare-current', access: { kind: 'site', roles: ANY_ROLE },
      summary: 'Recompute a stored run against the newest published cost basis (not stored) and list what changed',
      status: 200,
      doc: { response: runComparisonAnswer },
      handler: (req) => runs.compareWithCurrent(req.site!.id, study(req.params.studyId), parse(idParam, req.params.runId, 'params.runId')),
    },
    {
      method: 'get', path: '/sites/:siteId/studies/:studyId/options', access: { kind: 'site', roles: ANY_ROLE }, summary: 'Pinned options with headline numbers',
      doc: { response: z.array(optionAnswer) },
      handler: (req) => svc.studyOptions(req.site!.id, study(req.params.studyId)),
    },
    {
      method: 'post', path: '/sites/:siteId/studies/:studyId/options', access: { kind: 'site', roles: ['engineer'] }, summary: 'Pin a run as a named option',
      doc: { body: createOptionBody, response: optionAnswer },
      handler: (req) => svc.pinOption(req.site!.id, study(req.params.studyId), parse(createOptionBody, req.body), req.user!, req.requestId),
    },
    {
      method: 'delete', path: '/sites/:siteId/studies/:studyId/options/:optionId', access: { kind: 'site', roles: ['engineer'] }, summary: 'Unpin an option',
      handler: async (req) => {
        await svc.removeOption(req.site!.id, study(req.params.studyId), parse(idParam, req.params.optionId, 'params.optionId'), req.user!, req.requestId)
      },
    },
  ])
}
