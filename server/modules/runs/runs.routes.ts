import type { Role } from '#shared/schemas/auth.ts'
import {
  ConfirmReplanInputSchema,
  CreateRunsInputSchema,
  MyRunsQuerySchema,
  ReassignRunInputSchema,
  RecordReadingInputSchema,
  RecordReadingResultSchema,
  RunDetailSchema,
  RunIdParamsSchema,
  RunListQuerySchema,
  RunLookupQuerySchema,
  RunSummaryListSchema,
  RunSummarySchema,
  RunVersionInputSchema,
} from '#shared/schemas/run.ts'
import { defineRoute } from '../../lib/route.ts'
import {
  completeRun,
  confirmReplan,
  createRunsForPlan,
  getRunDetail,
  listMyRuns,
  listRuns,
  lookupRunByBarcode,
  pauseRun,
  reassignRun,
  recordReading,
  resumeRun,
} from './runs.service.ts'

/** Who works at the manifold (a technician only on runs assigned to them; checked in the service). */
const FILLERS: readonly Role[] = ['technician', 'blender', 'admin']
/** Who plans and books the manifold. */
const PLANNERS: readonly Role[] = ['blender', 'admin']

defineRoute({
  method: 'get',
  path: '/api/runs/mine',
  summary: 'My fills for a day (default today), with unfinished fills of earlier days',
  tags: ['runs'],
  access: FILLERS,
  query: MyRunsQuerySchema,
  response: RunSummaryListSchema,
  handler: ({ em, user, query }) => listMyRuns(em, user, query.date),
})

defineRoute({
  method: 'get',
  path: '/api/runs/lookup',
  summary: 'The open fill of a scanned cylinder barcode that I may work on',
  tags: ['runs'],
  access: FILLERS,
  query: RunLookupQuerySchema,
  response: RunSummarySchema,
  handler: ({ em, user, query }) => lookupRunByBarcode(em, user, query.barcode),
})

defineRoute({
  method: 'get',
  path: '/api/runs',
  summary: 'Fill runs by day, state, technician or plan',
  tags: ['runs'],
  access: ['blender', 'admin', 'qa'],
  query: RunListQuerySchema,
  response: RunSummaryListSchema,
  handler: ({ em, query }) => listRuns(em, query),
})

defineRoute({
  method: 'post',
  path: '/api/runs',
  summary: 'Book cylinders for an approved plan: one fill run each, assigned to a technician',
  tags: ['runs'],
  access: PLANNERS,
  body: CreateRunsInputSchema,
  response: RunSummaryListSchema,
  successStatus: 201,
  handler: ({ em, user, body }) => createRunsForPlan(em, user, body.planId, body.cylinderIds, body.technicianId, body.scheduledFor),
})

defineRoute({
  method: 'get',
  path: '/api/runs/:id',
  summary: 'One fill run: steps with targets and temperature tables, readings, waiting re-plan',
  tags: ['runs'],
  access: [...FILLERS, 'qa'],
  params: RunIdParamsSchema,
  response: RunDetailSchema,
  handler: ({ em, user, params }) => getRunDetail(em, user, params.id),
})

defineRoute({
  method: 'post',
  path: '/api/runs/:id/readings',
  summary: 'Record a reading on the current step (idempotent by clientRequestId; stale version is 409)',
  tags: ['runs'],
  access: FILLERS,
  params: RunIdParamsSchema,
  body: RecordReadingInputSchema,
  response: RecordReadingResultSchema,
  successStatus: 201,
  handler: ({ em, user, params, body }) => recordReading(em, user, params.id, body),
})

defineRoute({
  method: 'post',
  path: '/api/runs/:id/pause',
  summary: 'Pause a fill run',
  tags: ['runs'],
  access: FILLERS,
  params: RunIdParamsSchema,
  body: RunVersionInputSchema,
  response: RunDetailSchema,
  handler: ({ em, user, params, body }) => pauseRun(em, user, params.id, body),
})

defineRoute({
  method: 'post',
  path: '/api/runs/:id/resume',
  summary: 'Resume a paused fill run',
  tags: ['runs'],
  access: FILLERS,
  params: RunIdParamsSchema,
  body: RunVersionInputSchema,
  response: RunDetailSchema,
  handler: ({ em, user, params, body }) => resumeRun(em, user, params.id, body),
})

defineRoute({
  method: 'post',
  path: '/api/runs/:id/replan/confirm',
  summary: 'Confirm one option of the re-plan after an overshoot',
  tags: ['runs'],
  access: FILLERS,
  params: RunIdParamsSchema,
  body: ConfirmReplanInputSchema,
  response: RunDetailSchema,
  handler: ({ em, user, params, body }) => confirmReplan(em, user, params.id, body),
})

defineRoute({
  method: 'post',
  path: '/api/runs/:id/complete',
  summary: 'Finish a fill run whose steps are all recorded (cylinder to analysis)',
  tags: ['runs'],
  access: FILLERS,
  params: RunIdParamsSchema,
  body: RunVersionInputSchema,
  response: RunDetailSchema,
  handler: ({ em, user, params, body }) => completeRun(em, user, params.id, body),
})

defineRoute({
  method: 'put',
  path: '/api/runs/:id/assignment',
  summary: 'Move a fill run not yet finished to another technician or day',
  tags: ['runs'],
  access: PLANNERS,
  params: RunIdParamsSchema,
  body: ReassignRunInputSchema,
  response: RunDetailSchema,
  handler: ({ em, user, params, body }) => reassignRun(em, user, params.id, body),
})
