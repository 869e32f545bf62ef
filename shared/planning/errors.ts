import { PhysicsInputError } from '../physics/index.ts'

/**
 * Errors the planning engine throws for input it cannot plan. The server's error handler maps
 * `status` to the HTTP status (400: malformed or inconsistent input; 422: well-formed input whose
 * target cannot be reached with the given sources, residual gas or cylinder).
 */
export class PlanningInputError extends Error {
  constructor(
    message: string,
    /** the input field the message is about, e.g. "target", "sources[1].impurities", "cylinder.residual" */
    readonly field: string,
    /** 400 for bad input, 422 for an unreachable target */
    readonly status: 400 | 422 = 400,
  ) {
    super(message)
    this.name = 'PlanningInputError'
  }
}

/**
 * Run planner code and turn a physics-core input error (a state a model cannot evaluate, a gas it does
 * not cover) into a PlanningInputError (422) naming the model, so the API never answers with a 500.
 */
export function guardPhysics<T>(run: () => T): T {
  try {
    return run()
  } catch (error) {
    if (error instanceof PhysicsInputError)
      throw new PlanningInputError(`the equation of state cannot evaluate this plan: ${error.message}`, error.field === 'gas' ? 'target' : 'model', 422)
    throw error
  }
}
