/**
 * Re-planning from actual readings. "Lands within tolerance" is checked by re-deriving the finished
 * cylinder independently (physics core densities) from the step pressures of the new plan.
 */
import { describe, expect, it } from 'vitest'
import { computeFillPlan, PlanningInputError, replanFromActuals } from '#shared/planning/index.ts'
import { prepareModel } from '#shared/physics/index.ts'
import { ATM, BAR, celsius, m21, rederive } from './support.ts'

const ternary = () =>
  m21({
    target: [
      { gasId: 'carbon-dioxide', x: 0.05 },
      { gasId: 'helium', x: 0.2 },
      { gasId: 'argon', x: 0.75 },
    ],
    sources: [
      { id: 'Ar', gasId: 'argon' },
      { id: 'He', gasId: 'helium' },
      { id: 'CO2', gasId: 'carbon-dioxide' },
    ],
    finalPressurePa: 150 * BAR + ATM,
    blendToleranceRelative: 0.05,
    cylinder: { ...m21().cylinder, waterVolumeM3: 0.02, servicePressurePa: 200 * BAR + ATM },
    gauge: { spanPa: 250 * BAR, accuracyClassPercent: 0.25, resolutionPa: 0.1 * BAR },
  })

/** Pressure the CO2 step would read if `factor` × the planned CO2 went in (GERG-2008, pure CO2 in an evacuated cylinder). */
function co2Reading(factor: number): number {
  const plan = computeFillPlan(ternary())
  const n = plan.steps[0].molesAdded * factor
  return prepareModel('gerg-2008', { gasIds: ['carbon-dioxide'], x: [1] }).pressurePa(celsius(15), n / 0.02)
}

describe('replanFromActuals', () => {
  it('readings on plan → on track', () => {
    const plan = computeFillPlan(ternary())
    expect(plan.steps[0].label).toBe('carbon-dioxide')
    const result = replanFromActuals(ternary(), [{ stepIndex: 0, pressurePa: plan.steps[0].cumulativePressurePa, temperatureK: celsius(15) }])
    expect(result.status).toBe('on-track')
    expect(Math.abs(result.inferredSteps[0].deviationRelative)).toBeLessThan(1e-9)
  })

  it('CO2 overshoot by 3 %: later targets adjusted, the finished cylinder lands within ±5 %', () => {
    const result = replanFromActuals(ternary(), [{ stepIndex: 0, pressurePa: co2Reading(1.03), temperatureK: celsius(15) }])
    expect(result.status).toBe('adjusted')
    expect(result.inferredSteps[0].deviationRelative).toBeCloseTo(0.03, 6)
    const rest = result.remainingPlan!
    const back = rederive(rest, 'gerg-2008', 0.02)
    for (const [gas, x] of [
      ['carbon-dioxide', 0.05],
      ['helium', 0.2],
      ['argon', 0.75],
    ] as const) {
      expect(Math.abs(back.x.get(gas)! - x) / x, gas).toBeLessThanOrEqual(0.05)
    }
    expect(Math.abs(back.settledPressurePa - (150 * BAR + ATM)) / (150 * BAR)).toBeLessThan(1e-9)
  })

  it('CO2 overshoot by 20 %: cannot meet at 150 bar; topping up to a higher pressure within service pressure does', () => {
    const result = replanFromActuals(ternary(), [{ stepIndex: 0, pressurePa: co2Reading(1.2), temperatureK: celsius(15) }])
    expect(result.status).toBe('cannot-meet')
    const topUp = result.options.find((o) => o.kind === 'top-up')!
    expect(topUp).toBeDefined()
    // hand estimate: CO2 is 1.2 × 5 % of the planned amount; it is within +5 % when N' ≥ N·1.2/1.05 ≈ 1.143 N → about 170 bar
    expect(topUp.finalPressurePa!).toBeGreaterThan(160 * BAR)
    expect(topUp.finalPressurePa!).toBeLessThanOrEqual(200 * BAR + ATM)
    const back = rederive(topUp.plan!, 'gerg-2008', 0.02)
    for (const [gas, x] of [
      ['carbon-dioxide', 0.05],
      ['helium', 0.2],
      ['argon', 0.75],
    ] as const) {
      expect(Math.abs(back.x.get(gas)! - x) / x, gas).toBeLessThanOrEqual(0.05 + 1e-9)
    }
    expect(result.options.map((o) => o.kind)).toEqual(expect.arrayContaining(['vent', 'remake']))
    const vent = result.options.find((o) => o.kind === 'vent')!
    const backVent = rederive(vent.plan!, 'gerg-2008', 0.02)
    expect(Math.abs(backVent.x.get('carbon-dioxide')! - 0.05) / 0.05).toBeLessThanOrEqual(0.05 + 1e-9)
  })

  it('a scale reading works as well (gravimetric): 2 % light on CO2 is absorbed by the later steps', () => {
    const input = { ...ternary(), method: 'gravimetric' as const }
    const plan = computeFillPlan(input)
    const result = replanFromActuals(input, [{ stepIndex: 0, scaleMassKg: plan.steps[0].cumulativeMassKg * 0.98 }])
    expect(result.status).toBe('adjusted')
    expect(result.inferredSteps[0].deviationRelative).toBeCloseTo(-0.02, 9)
  })

  it('a reading below the previous one is rejected with a reason', () => {
    const plan = computeFillPlan(ternary())
    expect(() =>
      replanFromActuals(ternary(), [
        { stepIndex: 0, pressurePa: plan.steps[0].cumulativePressurePa, temperatureK: celsius(15) },
        { stepIndex: 1, pressurePa: plan.steps[0].cumulativePressurePa * 0.5, temperatureK: celsius(15) },
      ]),
    ).toThrow(PlanningInputError)
  })
})
