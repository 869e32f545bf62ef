/**
 * Fill-planning cost, ms per plan: the 5-component partial-pressure plan for each model (the engine alone,
 * computeFillPlan, and with the wire mapping the API adds, fillPlanFromRequest), a re-plan from actuals after an
 * overshoot, the plan that carries a premix proposal, and the growth with the number of components (2..8).
 */
import { MODEL_IDS, type ModelId } from '../../shared/physics/index.ts'
import { computeFillPlan, fillPlanFromRequest, inputFromRequest, replanFromRequest } from '../../shared/planning/index.ts'
import { FillPlanRequestSchema, ReplanRequestSchema } from '../../shared/schemas/fill-plan.ts'
import { PLAN_COMPONENT_COUNTS, planRequest, premixPlanRequest, replanRequest } from '../lib/fixtures.ts'
import { measure } from '../lib/micro.ts'
import { type Report, round } from '../lib/report.ts'
import { modelKey } from './physics.ts'

export function runPlanning(report: Report, options: { quick: boolean }): void {
  const section = 'fill planning (CPU ms per plan, best of 7 batches)'
  const micro = options.quick ? { batchMs: 20, samples: 3, warmupMs: 40 } : { batchMs: 60, samples: 7, warmupMs: 120 }
  const ms = (fn: () => unknown) => round(measure(() => (fn() === undefined ? 0 : 1), micro).nsPerOp / 1e6, 3)

  for (const model of MODEL_IDS) {
    const req = FillPlanRequestSchema.parse(planRequest(5, model))
    const input = inputFromRequest(req)
    const k = modelKey(model)
    report.add(
      section,
      `plan_5c_${k}_ms`,
      ms(() => computeFillPlan(input)),
      `computeFillPlan, 5 components, ${model}`,
    )
    report.add(
      section,
      `plan_5c_${k}_wire_ms`,
      ms(() => fillPlanFromRequest(req)),
      `fillPlanFromRequest (SI mapping + response), 5 components, ${model}`,
    )
  }
  for (const model of MODEL_IDS) {
    const req = ReplanRequestSchema.parse(replanAfterOvershoot(model))
    report.add(
      section,
      `replan_5c_${modelKey(model)}_ms`,
      ms(() => replanFromRequest(req)),
      `replanFromRequest after steps 1-2 (step 2 overshot), ${model}`,
    )
  }
  const premix = FillPlanRequestSchema.parse(premixPlanRequest('gerg-2008'))
  if (!fillPlanFromRequest(premix).premixProposal)
    report.note('the premix fixture no longer triggers a premix proposal: plan_5c_premix_gerg2008_ms times a plain plan')
  report.add(
    section,
    'plan_5c_premix_gerg2008_ms',
    ms(() => fillPlanFromRequest(premix)),
    'fillPlanFromRequest, 5 components with a 0.2 % step: plan + premix proposal, gerg-2008',
  )

  const growthSection = 'plan cost per component count (CPU ms per plan, computeFillPlan)'
  for (const model of ['ideal', 'peng-robinson', 'gerg-2008'] as const satisfies readonly ModelId[]) {
    for (const n of PLAN_COMPONENT_COUNTS) {
      const input = inputFromRequest(FillPlanRequestSchema.parse(planRequest(n, model)))
      const key = `plan_${n}c_${modelKey(model)}_ms`
      if (report.get(key) !== undefined) continue
      report.add(
        growthSection,
        key,
        ms(() => computeFillPlan(input)),
        `${n} components, ${model}`,
      )
    }
  }
  report.budget({ key: 'plan_5c_gerg2008', label: '5-component GERG-2008 plan (computeFillPlan), ms', figure: 'plan_5c_gerg2008_ms', limit: 2, kind: 'below' })
  report.budget({
    key: 'plan_5c_gerg2008_wire',
    label: '5-component GERG-2008 plan with wire mapping (fillPlanFromRequest), ms',
    figure: 'plan_5c_gerg2008_wire_ms',
    limit: 2,
    kind: 'below',
  })
}

/** Steps 1 and 2 of the 5-component plan read back, step 2 0.4 bar over its planned cumulative pressure. */
function replanAfterOvershoot(model: ModelId) {
  const planned = fillPlanFromRequest(FillPlanRequestSchema.parse(planRequest(5, model)))
  return replanRequest(
    model,
    planned.steps.slice(0, 2).map((s) => s.cumulativeGaugePressure.value),
  )
}
