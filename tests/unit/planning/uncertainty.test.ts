/**
 * Uncertainty of a partial-pressure fill (GUM, JCGM 100:2008) checked against the hand calculation of
 * DOMAIN §8, and of a gravimetric fill against the derivative of the ISO 6142-1 composition formula.
 */
import { describe, expect, it } from 'vitest'
import { computeFillPlan } from '#shared/planning/index.ts'
import { expectClose } from '#tests/support/expect-close.ts'
import { ATM, BAR, m21, REF, rederive } from './support.ts'

describe('predicted composition uncertainty', () => {
  it('x = 18 %, P = 200 bar, 0–250 bar class 0.25 gauge: u(x) ≈ 0.18 %-points (DOMAIN §8, uncorrelated readings)', () => {
    const ref = REF.ppUncertaintyExample
    const plan = computeFillPlan(
      m21({
        model: 'ideal',
        finalPressurePa: 200 * BAR + ATM,
        gauge: { spanPa: 250 * BAR, accuracyClassPercent: 0.25, resolutionPa: 1e-6 * BAR },
        temperatureUncertaintyK: 0,
        atmosphericPressureUncertaintyPa: 0,
      }),
    )
    // hand: u(p) = 0.0025 × 250 bar / √3 = 0.360844 bar; P = 201.01325 bar abs
    // u(x)² = u(p1)²/P² + x²·u(P)²/P²  →  u(x) = 0.360844·√(1 + 0.18²)/201.01325 = 0.00182398
    const up = (0.0025 * 250) / Math.sqrt(3)
    const hand = (up * Math.sqrt(1 + 0.18 ** 2)) / 201.01325
    const co2 = plan.predictedComposition.find((p) => p.gasId === 'carbon-dioxide')!
    expectClose(co2.u, hand, { rel: 1e-6 })
    expectClose(co2.u, ref.value, ref.tolerance, { source: ref.source })
    expectClose(co2.expandedU, 2 * hand, { rel: 1e-6 })
    expect(plan.uncertaintyMethod).toMatch(/JCGM 100:2008/)
  })

  it('gravimetric binary: u(x_A) from ∂x/∂m (ISO 6142-1 formula differentiated by hand)', () => {
    // x_A = (m_A/M_A) / (m_A/M_A + m_B/M_B) ; ∂x_A/∂m_A = x_A(1 − x_A)/m_A ; ∂x_A/∂m_B = −x_A(1 − x_A)/m_B
    // each mass is a difference of two readings: u(m) = √2·r/√12 with r = 1 g
    const plan = computeFillPlan(m21({ model: 'ideal', method: 'gravimetric', scale: { resolutionKg: 0.001 } }))
    const mA = plan.steps[0].massAddedKg
    const mB = plan.steps[1].massAddedKg
    const um = Math.SQRT2 * (0.001 / Math.sqrt(12))
    const x = 0.18
    const hand = Math.sqrt(((x * (1 - x) * um) / mA) ** 2 + ((x * (1 - x) * um) / mB) ** 2)
    expectClose(plan.predictedComposition.find((p) => p.gasId === 'carbon-dioxide')!.u, hand, { rel: 1e-9 })
  })

  it('GERG-2008 sensitivities agree with re-deriving the composition from perturbed readings (central differences)', () => {
    const gauge = { spanPa: 250 * BAR, accuracyClassPercent: 0.25, resolutionPa: 0.1 * BAR }
    const plan = computeFillPlan(m21({ gauge }))
    const up = Math.sqrt(((0.0025 * 250 * BAR) / Math.sqrt(3)) ** 2 + (0.1 * BAR) ** 2 / 12)
    for (const k of [0, 1]) {
      const h = 0.01 * BAR
      const shifted = (d: number) => ({ ...plan, steps: plan.steps.map((s, j) => (j === k ? { ...s, cumulativePressurePa: s.cumulativePressurePa + d } : s)) })
      const xPlus = rederive(shifted(h), 'gerg-2008', 0.05).x.get('carbon-dioxide')!
      const xMinus = rederive(shifted(-h), 'gerg-2008', 0.05).x.get('carbon-dioxide')!
      const numeric = (Math.abs(xPlus - xMinus) / (2 * h)) * up
      const reported = plan.uncertaintyBudget.find(
        (b) => b.gasId === 'carbon-dioxide' && b.input === `step ${k + 1} (${plan.steps[k].label}) reading: pressure`,
      )!
      // forward-difference EOS derivatives in the planner against central differences of the whole inference here
      expectClose(reported.contribution, numeric, { rel: 1e-3 }, { step: k })
    }
  })
})
