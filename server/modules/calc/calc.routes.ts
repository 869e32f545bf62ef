import { compareModelsFromRequest, fillPlanFromRequest, planBatchFromRequest, replanFromRequest } from '#shared/planning/index.ts'
import { StateRequestSchema, StateResponseSchema } from '#shared/schemas/calc.ts'
import {
  BatchRequestSchema,
  BatchResponseSchema,
  CompareModelsRequestSchema,
  CompareModelsResponseSchema,
  FillPlanRequestSchema,
  FillPlanResponseSchema,
  ReplanRequestSchema,
  ReplanResponseSchema,
} from '#shared/schemas/fill-plan.ts'
import { defineRoute } from '../../lib/route.ts'
import { computeState, rethrowWithWireField } from './calc.service.ts'

/** Runs an engine call; physics field names are reported the way the API names them. */
function run<T>(fn: () => T): T {
  try {
    return fn()
  } catch (err) {
    rethrowWithWireField(err)
  }
}

defineRoute({
  method: 'post',
  path: '/api/calc/state',
  summary: 'State of a gas mixture at a temperature and pressure under one equation of state (Z, molar volume, density, partial pressures)',
  tags: ['calc'],
  access: 'signed-in',
  body: StateRequestSchema,
  response: StateResponseSchema,
  handler: ({ body }) => computeState(body),
})

defineRoute({
  method: 'post',
  path: '/api/calc/fill-plan',
  summary: 'Compute a fill plan (steps, targets, tolerance windows, findings). Blocking findings are reported, not refused',
  tags: ['calc'],
  access: 'signed-in',
  body: FillPlanRequestSchema,
  response: FillPlanResponseSchema,
  handler: ({ body }) => run(() => fillPlanFromRequest(body)),
})

defineRoute({
  method: 'post',
  path: '/api/calc/fill-plan/compare',
  summary: 'Plan the same fill with several equations of state and show the composition each plan would really produce (per GERG-2008)',
  tags: ['calc'],
  access: 'signed-in',
  body: CompareModelsRequestSchema,
  response: CompareModelsResponseSchema,
  handler: ({ body }) => run(() => compareModelsFromRequest(body)),
})

defineRoute({
  method: 'post',
  path: '/api/calc/fill-plan/replan',
  summary: 'Re-plan the remaining steps from the readings taken so far (after an overshoot or undershoot)',
  tags: ['calc'],
  access: 'signed-in',
  body: ReplanRequestSchema,
  response: ReplanResponseSchema,
  handler: ({ body }) => run(() => replanFromRequest(body)),
})

defineRoute({
  method: 'post',
  path: '/api/calc/fill-plan/batch',
  summary: 'Plan a batch of identical cylinders: parent-gas use per cylinder and for the batch',
  tags: ['calc'],
  access: 'signed-in',
  body: BatchRequestSchema,
  response: BatchResponseSchema,
  handler: ({ body }) => run(() => planBatchFromRequest(body)),
})
