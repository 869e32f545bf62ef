/**
 * What the choice of model costs: plan with each model, then follow that plan's pressure targets in a
 * cylinder where the gas behaves as GERG-2008 says, infer the amounts with GERG-2008 and report the
 * composition that would really come out (DOMAIN §8 "plan with model A, reality per GERG").
 * When GERG-2008 does not cover a component, Peng–Robinson is the reference instead, and the result says so.
 */
import { MODEL_IDS, type ModelId } from '../physics/types.ts'
import { guardPhysics, PlanningInputError } from './errors.ts'
import { computeFillPlan } from './fill-plan.ts'
import { gasFacts } from './gas-model.ts'
import { inferSteps } from './inference.ts'
import { buildPlan, eosCache } from './plan-core.ts'
import { resolveInput } from './resolve.ts'
import type { FillPlan, FillPlanInput } from './types.ts'

export interface RealisedComponent {
  readonly gasId: string
  readonly target: number
  /** planned (predicted by the plan's own model) */
  readonly planned: number
  /** what the reference model says the plan really produces */
  readonly realised: number
  /** realised − target, amount fraction */
  readonly deviation: number
  /** (realised − target)/target */
  readonly deviationRelative: number | null
  /** |deviationRelative| / blend tolerance: above 1 the cylinder is out of specification */
  readonly toleranceUsed: number | null
}

export interface ModelComparisonEntry {
  readonly model: ModelId
  readonly plan: FillPlan | null
  readonly error: string | null
  readonly realised: readonly RealisedComponent[]
  /** settled pressure at the reference temperature that the reference model predicts, absolute */
  readonly realisedFinalPressurePa: number | null
  /** largest |deviationRelative| over target components */
  readonly worstDeviationRelative: number | null
  readonly withinTolerance: boolean | null
}

export interface ModelComparison {
  readonly reference: ModelId
  readonly referenceNote: string
  readonly entries: readonly ModelComparisonEntry[]
}

export function compareModels(input: FillPlanInput, models: readonly ModelId[] = MODEL_IDS): ModelComparison {
  return guardPhysics(() => compareModelsUnguarded(input, models))
}

function compareModelsUnguarded(input: FillPlanInput, models: readonly ModelId[]): ModelComparison {
  const r = resolveInput(input)
  const uncovered = r.components.filter((id) => !gasFacts(id).gergCovered)
  const reference: ModelId = uncovered.length === 0 ? 'gerg-2008' : 'peng-robinson'
  const referenceNote =
    uncovered.length === 0
      ? 'Reference: GERG-2008 (Kunz & Wagner 2012), which covers every component.'
      : `GERG-2008 does not cover ${uncovered.map((id) => gasFacts(id).formula).join(', ')}; the reference is Peng–Robinson instead, and the GERG-2008 plan uses the physics core's cubic fallback for those gases.`
  const refNotes = new Set<string>()
  const refEos = eosCache(r, refNotes, reference)
  const entries: ModelComparisonEntry[] = models.map((model) => {
    let plan: FillPlan
    try {
      plan = computeFillPlan({ ...input, model, proposePremix: false })
    } catch (error) {
      if (error instanceof PlanningInputError) {
        return { model, plan: null, error: error.message, realised: [], realisedFinalPressurePa: null, worstDeviationRelative: null, withinTolerance: null }
      }
      throw error
    }
    const built = buildPlan(resolveInput({ ...input, model }), input.asOfDate)
    // residual amount as the reference model reads the same residual pressure
    const start = r.components.map(() => 0)
    if (r.residual) {
      const n0 = refEos(r.residual.a).densityMolPerM3(r.residual.temperatureK, r.residual.pressurePa) * r.volumeM3
      r.residual.a.forEach((ai, i) => {
        start[i] = ai * n0
      })
    }
    const realisedSteps = inferSteps(
      refEos,
      r.volumeM3,
      start,
      built.stepSources,
      plan.steps.map((s) =>
        input.method === 'gravimetric'
          ? { kind: 'scale' as const, cumulativeMassKg: s.cumulativeMassKg }
          : { kind: 'pressure' as const, pressurePa: s.cumulativePressurePa, temperatureK: r.fillTemperatureK },
      ),
      plan.steps.map((s) => s.molesAdded),
      'plan',
    )
    const last = realisedSteps[realisedSteps.length - 1]
    const realised: RealisedComponent[] = r.components.flatMap((gasId, i) => {
      const target = r.target[i]
      const planned = plan.predictedComposition.find((p) => p.gasId === gasId)?.x ?? 0
      if (!(target > 0) && !(last.x[i] > 0)) return []
      const deviationRelative = target > 0 ? (last.x[i] - target) / target : null
      return [
        {
          gasId,
          target,
          planned,
          realised: last.x[i],
          deviation: last.x[i] - target,
          deviationRelative,
          toleranceUsed: deviationRelative === null ? null : Math.abs(deviationRelative) / r.toleranceRelative,
        },
      ]
    })
    const realisedFinalPressurePa = refEos(last.x).pressurePa(r.referenceTemperatureK, last.cumulativeMoles / r.volumeM3)
    const worst = Math.max(...realised.filter((q) => q.deviationRelative !== null).map((q) => Math.abs(q.deviationRelative!)))
    return { model, plan, error: null, realised, realisedFinalPressurePa, worstDeviationRelative: worst, withinTolerance: worst <= r.toleranceRelative }
  })
  return { reference, referenceNote: [referenceNote, ...refNotes].join(' '), entries }
}
