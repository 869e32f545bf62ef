/**
 * Shared inputs and an independent re-derivation for the planning tests. The re-derivation uses the
 * physics core directly (not the planner) to turn step pressures into amounts.
 */
import { prepareModel, type ModelId } from '#shared/physics/index.ts'
import type { FillPlan, FillPlanInput } from '#shared/planning/index.ts'
import reference from '#tests/fixtures/planning/reference-values.json' with { type: 'json' }

export const REF = reference.entries
export const ATM = 101_325
export const BAR = 1e5
export const celsius = (c: number): number => c + 273.15

/** Ar + 18 % CO2 in a 50 L cylinder at 200 bar absolute, 15 °C (ISO 14175 M21). */
export function m21(overrides: Partial<FillPlanInput> = {}): FillPlanInput {
  return {
    target: [
      { gasId: 'carbon-dioxide', x: 0.18 },
      { gasId: 'argon', x: 0.82 },
    ],
    finalPressurePa: 200 * BAR,
    referenceTemperatureK: celsius(15),
    fillTemperatureK: celsius(15),
    atmosphericPressurePa: ATM,
    cylinder: {
      waterVolumeM3: 0.05,
      servicePressurePa: 300 * BAR,
      oxygenClean: false,
      nextTestDate: '2030-01-01',
      residual: { kind: 'evacuated' },
    },
    sources: [
      { id: 'Ar', gasId: 'argon' },
      { id: 'CO2', gasId: 'carbon-dioxide' },
    ],
    method: 'partial-pressure',
    model: 'gerg-2008',
    order: 'auto',
    asOfDate: '2025-06-01',
    minimumTemperatureK: celsius(15),
    proposePremix: false,
    ...overrides,
  }
}

export interface Rederived {
  readonly moles: number[]
  readonly totalMoles: number
  readonly x: Map<string, number>
  readonly settledPressurePa: number
}

/**
 * From the steps' cumulative pressures at fill temperature, re-derive the amounts with the model's
 * density: for each step solve N_k = ρ(T, p_k; x^(k))·V where x^(k) depends on N_k (fixed point),
 * then the final composition and its pressure at the reference temperature.
 */
export function rederive(plan: FillPlan, model: ModelId, volumeM3: number): Rederived {
  const amounts = new Map<string, number>()
  for (const c of plan.initial.composition) amounts.set(c.gasId, (amounts.get(c.gasId) ?? 0) + c.x * plan.initial.moles)
  let N = plan.initial.moles
  const moles: number[] = []
  const mixtureOf = (m: Map<string, number>, total: number) => {
    const ids = [...m.keys()].filter((k) => (m.get(k) ?? 0) > 0)
    return { gasIds: ids, x: ids.map((k) => m.get(k)! / total) }
  }
  for (const step of plan.steps) {
    let Nk = N + step.molesAdded * 0.9
    for (let it = 0; it < 50; it++) {
      const trial = new Map(amounts)
      for (const c of step.sourceComposition) trial.set(c.gasId, (trial.get(c.gasId) ?? 0) + c.x * (Nk - N))
      const rho = prepareModel(model, mixtureOf(trial, Nk), { allowCubicFallback: true }).densityMolPerM3(plan.fillTemperatureK, step.cumulativePressurePa)
      const next = rho * volumeM3
      if (Math.abs(next - Nk) < 1e-12 * next) {
        Nk = next
        break
      }
      Nk = next
    }
    for (const c of step.sourceComposition) amounts.set(c.gasId, (amounts.get(c.gasId) ?? 0) + c.x * (Nk - N))
    moles.push(Nk - N)
    N = Nk
  }
  const mix = mixtureOf(amounts, N)
  const settledPressurePa = prepareModel(model, mix, { allowCubicFallback: true }).pressurePa(plan.referenceTemperatureK, N / volumeM3)
  return { moles, totalMoles: N, x: new Map(mix.gasIds.map((id, i) => [id, mix.x[i]])), settledPressurePa }
}

export function codes(plan: Pick<FillPlan, 'warnings'>, severity?: 'info' | 'caution' | 'block'): string[] {
  return plan.warnings.filter((w) => !severity || w.severity === severity).map((w) => w.code)
}
