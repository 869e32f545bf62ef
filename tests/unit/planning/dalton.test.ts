/**
 * With the ideal-gas model a partial-pressure plan is Dalton's law: each cumulative pressure is the
 * cumulative amount fraction times the final pressure (scaled by T_fill/T_ref), and n = pV/(RT).
 * Hand calculations written out below; R = 8.314462618 J/(mol·K) (CODATA 2018).
 */
import { describe, expect, it } from 'vitest'
import { computeFillPlan } from '#shared/planning/index.ts'
import { expectClose } from '#tests/support/expect-close.ts'
import { ATM, BAR, celsius, m21 } from './support.ts'

const R = 8.314462618

describe('ideal-gas plan = Dalton', () => {
  it('Ar/CO2 82/18 at 200 bar gauge, 15 °C: CO2 to 35.169135 bar gauge, Ar to 200 bar gauge', () => {
    // final absolute pressure 200 bar + 1.01325 bar = 201.01325 bar
    // CO2 first (minor first): p_CO2 = 0.18 × 201.01325 = 36.182385 bar abs = 35.169135 bar gauge
    // N = pV/(RT) = 201.01325e5 Pa × 0.05 m³ / (8.314462618 × 288.15) = 419.5105… mol
    const plan = computeFillPlan(m21({ model: 'ideal', finalPressurePa: 200 * BAR + ATM }))
    expect(plan.steps.map((s) => s.label)).toEqual(['carbon-dioxide', 'argon'])
    expectClose(plan.steps[0].cumulativePressurePa, 0.18 * 201.01325 * BAR, { rel: 1e-12 }, { step: 'CO2 abs' })
    expectClose(plan.steps[0].cumulativeGaugePressurePa, 35.169135 * BAR, { rel: 1e-12 }, { step: 'CO2 gauge' })
    expectClose(plan.steps[1].cumulativeGaugePressurePa, 200 * BAR, { rel: 1e-12 }, { step: 'Ar gauge' })
    const N = (201.01325e5 * 0.05) / (R * 288.15)
    expectClose(plan.totalMoles, N, { rel: 1e-12 })
    expectClose(plan.steps[0].molesAdded, 0.18 * N, { rel: 1e-12 })
    // mass of CO2 = 0.18 N × 44.0095 g/mol (ISO 6976:2016 Table A.2 molar mass)
    expectClose(plan.steps[0].massAddedKg, 0.18 * N * 0.0440095, { rel: 1e-12 })
    expectClose(plan.steps[1].cumulativeMassKg, 0.18 * N * 0.0440095 + 0.82 * N * 0.039948, { rel: 1e-12 })
    expect(plan.solution.method).toBe('direct')
  })

  it('trimix He/O2/N2 35/21/44 at 232 bar abs, filled at 30 °C, settled at 15 °C: p_k = Σx · P · T_fill/T_ref', () => {
    const plan = computeFillPlan({
      ...m21({ model: 'ideal' }),
      target: [
        { gasId: 'oxygen', x: 0.21 },
        { gasId: 'helium', x: 0.35 },
        { gasId: 'nitrogen', x: 0.44 },
      ],
      sources: [
        { id: 'N2', gasId: 'nitrogen' },
        { id: 'He', gasId: 'helium' },
        { id: 'O2', gasId: 'oxygen' },
      ],
      finalPressurePa: 232 * BAR,
      fillTemperatureK: celsius(30),
      cylinder: { ...m21().cylinder, oxygenClean: true },
    })
    // order: O2 (0.21) then He (0.35), balance N2 last
    expect(plan.steps.map((s) => s.label)).toEqual(['oxygen', 'helium', 'nitrogen'])
    const scale = 232 * (303.15 / 288.15) // bar at fill temperature for the full cylinder = 244.0770…
    expectClose(plan.steps[0].cumulativePressurePa / BAR, 0.21 * scale, { rel: 1e-12 })
    expectClose(plan.steps[1].cumulativePressurePa / BAR, 0.56 * scale, { rel: 1e-12 })
    expectClose(plan.steps[2].cumulativePressurePa / BAR, 1.0 * scale, { rel: 1e-12 })
    // temperature table at +10 K: p ∝ T at constant density
    const row = plan.steps[1].temperatureTable.find((t) => Math.abs(t.temperatureK - celsius(40)) < 1e-9)!
    expectClose(row.pressurePa / BAR, 0.56 * 232 * (313.15 / 288.15), { rel: 1e-12 })
    for (const p of plan.predictedComposition) expectClose(p.x, p.target, { abs: 1e-12 }, { gas: p.gasId })
  })

  it('tolerance window of a minor step: ±5 % relative of the CO2 amount, Ar as planned (hand calculation)', () => {
    // CO2 amount n may vary δ with Ar fixed: x = (0.18N + δ)/(N + δ) within 0.171..0.189
    //   low:  (0.18N + δ) = 0.171(N + δ) → δ = −0.009N/0.829 ; high: δ = 0.009N/0.811 (the Ar bound is looser)
    // Ar's own bound: 0.82N/(N + δ) ≥ 0.779 → δ ≤ 0.052631…N, not binding
    const plan = computeFillPlan(m21({ model: 'ideal', blendToleranceRelative: 0.05 }))
    const N = plan.totalMoles
    expectClose(plan.steps[0].window.molesLow, 0.18 * N - (0.009 * N) / 0.829, { rel: 1e-12 })
    expectClose(plan.steps[0].window.molesHigh, 0.18 * N + (0.009 * N) / 0.811, { rel: 1e-12 })
    // ideal gas: pressure proportional to amount
    expectClose(plan.steps[0].window.pressureHighPa, (plan.steps[0].window.molesHigh / N) * 200 * BAR, { rel: 1e-12 })
  })
})
