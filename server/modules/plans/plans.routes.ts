import { z } from 'zod'
import {
  FillSheetQuerySchema,
  PlanApproveInputSchema,
  PlanAssignInputSchema,
  PlanAssignResultSchema,
  PlanCreateInputSchema,
  PlanDetailSchema,
  PlanEmailInputSchema,
  PlanEmailResultSchema,
  PlanIdParamsSchema,
  PlanLineSpecSchema,
  PlanListQuerySchema,
  PlanListSchema,
  PlanQueueSchema,
  TechnicianOptionsSchema,
} from '#shared/schemas/plan.ts'
import { defineRoute } from '../../lib/route.ts'
import {
  approvePlan,
  assignPlan,
  createPlan,
  emailFillSheet,
  fillSheet,
  getLineSpec,
  getPlanDetail,
  listPlans,
  PLAN_READERS,
  PLANNERS,
  planQueue,
  technicianOptions,
} from './plans.service.ts'

// fixed paths first: /api/plans/queue must not be read as /api/plans/:id

defineRoute({
  method: 'get',
  path: '/api/plans/queue',
  summary: "The blender's queues: accepted orders whose lines lack an approved plan, and plans awaiting approval",
  tags: ['plans'],
  access: PLANNERS,
  response: PlanQueueSchema,
  handler: ({ em }) => planQueue(em),
})

defineRoute({
  method: 'get',
  path: '/api/plans/technicians',
  summary: 'Active technicians a plan can be assigned or e-mailed to',
  tags: ['plans'],
  access: PLANNERS,
  response: TechnicianOptionsSchema,
  handler: ({ em }) => technicianOptions(em),
})

defineRoute({
  method: 'get',
  path: '/api/plans/order-lines/:id',
  summary: 'The specification of an order line as the plan workspace needs it',
  tags: ['plans'],
  access: PLAN_READERS,
  params: z.strictObject({ id: z.coerce.number().int().positive() }),
  response: PlanLineSpecSchema,
  handler: ({ em, params }) => getLineSpec(em, params.id),
})

defineRoute({
  method: 'get',
  path: '/api/plans',
  summary: 'Stored fill plans, newest first (filter by order line and status)',
  tags: ['plans'],
  access: PLAN_READERS,
  query: PlanListQuerySchema,
  response: PlanListSchema,
  handler: ({ em, query }) => listPlans(em, query),
})

defineRoute({
  method: 'post',
  path: '/api/plans',
  summary: 'Compute a fill plan on the server for an order line (and cylinder) and store it as the next version; earlier versions are superseded',
  tags: ['plans'],
  access: PLANNERS,
  body: PlanCreateInputSchema,
  response: PlanDetailSchema,
  successStatus: 201,
  handler: ({ em, user, body }) => createPlan(em, user, body),
})

defineRoute({
  method: 'get',
  path: '/api/plans/:id',
  summary: 'One stored plan with its specification, request, computed result and runs',
  tags: ['plans'],
  access: PLAN_READERS,
  params: PlanIdParamsSchema,
  response: PlanDetailSchema,
  handler: ({ em, params }) => getPlanDetail(em, params.id),
})

defineRoute({
  method: 'post',
  path: '/api/plans/:id/approve',
  summary: 'Approve a plan (409 when stale or replaced, 422 while a blocking finding stands); the order becomes planned when all its lines are',
  tags: ['plans'],
  access: PLANNERS,
  params: PlanIdParamsSchema,
  body: PlanApproveInputSchema,
  response: PlanDetailSchema,
  handler: ({ em, user, params, body }) => approvePlan(em, user, params.id, body.version),
})

defineRoute({
  method: 'post',
  path: '/api/plans/:id/assign',
  summary: 'Book cylinders and a technician for an approved plan (one fill run per cylinder)',
  tags: ['plans'],
  access: PLANNERS,
  params: PlanIdParamsSchema,
  body: PlanAssignInputSchema,
  response: PlanAssignResultSchema,
  handler: ({ em, user, params, body }) => assignPlan(em, user, params.id, body),
})

defineRoute({
  method: 'get',
  path: '/api/plans/:id/fill-sheet.pdf',
  summary: 'Printable fill sheet (A4 or US Letter): steps with gauge and absolute targets, windows, temperature table, cautions, sign-off',
  tags: ['plans'],
  access: ['admin', 'blender', 'technician', 'qa'],
  params: PlanIdParamsSchema,
  query: FillSheetQuerySchema,
  produces: 'application/pdf',
  handler: async ({ em, params, query, res }) => {
    const { pdf, filename } = await fillSheet(em, params.id, query.size)
    res.setHeader('Content-Type', 'application/pdf')
    res.setHeader('Content-Disposition', `inline; filename="${filename}"`)
    res.setHeader('Cache-Control', 'no-store')
    res.send(pdf)
  },
})

defineRoute({
  method: 'post',
  path: '/api/plans/:id/email-sheet',
  summary: 'E-mail the fill sheet PDF to a technician',
  tags: ['plans'],
  access: PLANNERS,
  params: PlanIdParamsSchema,
  body: PlanEmailInputSchema,
  response: PlanEmailResultSchema,
  handler: ({ em, deps, user, params, body }) => emailFillSheet(em, deps, user, params.id, body.technicianId),
})
