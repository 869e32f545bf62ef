/**
 * The fill-planning engine: pure functions, SI inside, no I/O. Runs in the browser and on the server.
 */
export { computeFillPlan } from './fill-plan.ts'
export { replanFromActuals } from './replan.ts'
export type { ReplanOption, ReplanResult, ReplanStatus, StepActual, InferredStepReport } from './replan.ts'
export { compareModels } from './compare.ts'
export type { ModelComparison, ModelComparisonEntry, RealisedComponent } from './compare.ts'
export { planBatch, STANDARD_PRESSURE_PA, STANDARD_TEMPERATURE_K } from './batch.ts'
export type { BatchPlan, BatchSourceUse } from './batch.ts'
export { PlanningInputError } from './errors.ts'
export {
  compareModelsFromRequest,
  fillPlanFromRequest,
  inputFromRequest,
  planBatchFromRequest,
  planToResponse,
  replanFromRequest,
} from './wire.ts'
export { RULES, CAUTIONS } from './rules.ts'
export { ORDER_RULES } from './order.ts'
export type * from './types.ts'
