/**
 * computeFillPlan: the plan, plus a premix proposal when an addition is too small to measure.
 */
import { guardPhysics } from './errors.ts'
import { buildPlan } from './plan-core.ts'
import { proposePremix } from './premix.ts'
import { resolveInput } from './resolve.ts'
import type { FillPlan, FillPlanInput } from './types.ts'

/**
 * Plan a cylinder fill (SI in, SI out). Throws PlanningInputError (400 bad input, 422 unreachable target).
 * Safety findings never stop the plan being computed: they are returned as warnings, and any 'block'
 * makes `approvable` false.
 */
export function computeFillPlan(input: FillPlanInput): FillPlan {
  return guardPhysics(() => planWithProposal(input))
}

function planWithProposal(input: FillPlanInput): FillPlan {
  const { plan } = buildPlan(resolveInput(input), input.asOfDate)
  if (input.proposePremix === false) return plan
  const proposal = proposePremix(input, plan, input.asOfDate)
  if (!proposal) return plan
  return {
    ...plan,
    premixProposal: proposal,
    warnings: [
      ...plan.warnings,
      {
        code: 'PREMIX_PROPOSED',
        severity: 'info',
        message: `${proposal.stages.length} premix stage(s) proposed: ${proposal.stages.map((s) => s.label).join(' → ')}, then the product from the premix.`,
      },
    ],
  }
}
