/**
 * Gas needed for a batch of identical cylinders made from one plan.
 */
import { guardPhysics, PlanningInputError } from './errors.ts'
import { computeFillPlan } from './fill-plan.ts'
import { prepareComposition } from './gas-model.ts'
import { resolveInput } from './resolve.ts'
import type { FillPlan, FillPlanInput } from './types.ts'

/** Standard reference conditions for gas volumes: 15 °C, 101.325 kPa (ISO 13443). */
export const STANDARD_TEMPERATURE_K = 288.15
export const STANDARD_PRESSURE_PA = 101_325

export interface BatchSourceUse {
  readonly sourceId: string
  readonly label: string
  readonly molesPerCylinder: number
  readonly massPerCylinderKg: number
  readonly moles: number
  readonly massKg: number
  /** volume at 15 °C, 101.325 kPa with the plan's model (real gas), m³ */
  readonly standardVolumeM3: number
}

export interface BatchPlan {
  readonly cylinderCount: number
  readonly plan: FillPlan
  readonly sources: readonly BatchSourceUse[]
  readonly standardConditions: string
  readonly notes: readonly string[]
}

export function planBatch(input: FillPlanInput, cylinderCount: number): BatchPlan {
  return guardPhysics(() => planBatchUnguarded(input, cylinderCount))
}

function planBatchUnguarded(input: FillPlanInput, cylinderCount: number): BatchPlan {
  if (!Number.isInteger(cylinderCount) || cylinderCount < 1 || cylinderCount > 10_000) {
    throw new PlanningInputError('cylinder count must be a whole number from 1 to 10000', 'cylinderCount')
  }
  const plan = computeFillPlan(input)
  const r = resolveInput(input)
  const sources: BatchSourceUse[] = r.sources.flatMap((src) => {
    const steps = plan.steps.filter((s) => s.sourceId === src.id)
    if (steps.length === 0) return []
    const molesPerCylinder = steps.reduce((s, st) => s + st.molesAdded, 0)
    const massPerCylinderKg = steps.reduce((s, st) => s + st.massAddedKg, 0)
    const rho = prepareComposition(input.model, r.components, src.a).eos.densityMolPerM3(STANDARD_TEMPERATURE_K, STANDARD_PRESSURE_PA)
    const moles = molesPerCylinder * cylinderCount
    return [
      {
        sourceId: src.id,
        label: src.label,
        molesPerCylinder,
        massPerCylinderKg,
        moles,
        massKg: massPerCylinderKg * cylinderCount,
        standardVolumeM3: moles / rho,
      },
    ]
  })
  return {
    cylinderCount,
    plan,
    sources,
    standardConditions: 'm³ at 15 °C, 101.325 kPa (ISO 13443), real gas by the plan’s model',
    notes: [
      'Equal pressures on one manifold are not equal amounts when cylinder volumes or temperatures differ.',
      'ISO 6142-1 excludes batch production: analyse every cylinder or follow a sampling plan.',
      'Line, manifold and purge losses are not included.',
    ],
  }
}
