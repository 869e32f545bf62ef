/**
 * Bad input never crashes generically: PlanningInputError with the field and 400 (bad input) or 422 (unreachable).
 */
import { describe, expect, it } from 'vitest'
import { computeFillPlan, PlanningInputError } from '#shared/planning/index.ts'
import type { FillPlanInput } from '#shared/planning/index.ts'
import { BAR, m21 } from './support.ts'

function planningError(input: FillPlanInput): PlanningInputError {
  try {
    computeFillPlan(input)
  } catch (error) {
    if (error instanceof PlanningInputError) return error
    throw error
  }
  throw new Error('expected a PlanningInputError')
}

describe('PlanningInputError', () => {
  it('fractions that do not sum to 1 (±1e-6) → 400 on target', () => {
    const e = planningError(
      m21({
        target: [
          { gasId: 'carbon-dioxide', x: 0.18 },
          { gasId: 'argon', x: 0.8 },
        ],
      }),
    )
    expect([e.status, e.field]).toEqual([400, 'target'])
    // within 1e-6 is accepted
    expect(() =>
      computeFillPlan(
        m21({
          target: [
            { gasId: 'carbon-dioxide', x: 0.18 },
            { gasId: 'argon', x: 0.8200005 },
          ],
        }),
      ),
    ).not.toThrow()
  })

  it('unknown gas → 400 naming the field', () => {
    const e = planningError(
      m21({
        target: [
          { gasId: 'unobtainium', x: 0.18 },
          { gasId: 'argon', x: 0.82 },
        ],
      }),
    )
    expect([e.status, e.field]).toEqual([400, 'target[0].gas'])
  })

  it('a target component no source supplies → 422', () => {
    const e = planningError(
      m21({
        target: [
          { gasId: 'helium', x: 0.3 },
          { gasId: 'argon', x: 0.7 },
        ],
        sources: [
          { id: 'Ar', gasId: 'argon' },
          { id: 'CO2', gasId: 'carbon-dioxide' },
        ],
      }),
    )
    expect(e.status).toBe(422)
    expect(e.message).toMatch(/no source supplies helium/)
  })

  it('a premix too weak for the target (CO2 10 % in Ar cannot make 18 %) → 422, no non-negative solution', () => {
    const e = planningError(
      m21({
        sources: [
          { id: 'Ar', gasId: 'argon' },
          {
            id: 'CO2 10 %',
            composition: [
              { gasId: 'carbon-dioxide', x: 0.1 },
              { gasId: 'argon', x: 0.9 },
            ],
          },
        ],
      }),
    )
    expect([e.status, e.field]).toEqual([422, 'target'])
  })

  it('residual gas holding more CO2 than the finished cylinder may → 422 on cylinder.residual', () => {
    const e = planningError(
      m21({
        cylinder: {
          ...m21().cylinder,
          residual: { kind: 'residual', pressurePa: 50 * BAR, composition: [{ gasId: 'carbon-dioxide', x: 1 }] },
        },
        finalPressurePa: 100 * BAR,
        minimumTemperatureK: 320,
      }),
    )
    expect([e.status, e.field]).toEqual([422, 'cylinder.residual'])
  })

  it('a residual of the right composition is used as a parent gas', () => {
    const plan = computeFillPlan(
      m21({
        cylinder: {
          ...m21().cylinder,
          residual: {
            kind: 'residual',
            pressurePa: 20 * BAR,
            composition: [
              { gasId: 'carbon-dioxide', x: 0.18 },
              { gasId: 'argon', x: 0.82 },
            ],
          },
        },
      }),
    )
    expect(plan.initial.moles).toBeGreaterThan(0)
    expect(plan.orderRules[0]).toMatch(/residual/)
    expect(plan.steps[0].cumulativePressurePa).toBeGreaterThan(plan.initial.pressurePa)
  })

  it('negative volume, zero pressure, bad purity → 400', () => {
    expect(planningError(m21({ cylinder: { ...m21().cylinder, waterVolumeM3: -1 } })).status).toBe(400)
    expect(planningError(m21({ finalPressurePa: 0 })).field).toBe('finalPressure')
    expect(
      planningError(
        m21({
          sources: [
            { id: 'Ar', gasId: 'argon', purity: 1.5 },
            { id: 'CO2', gasId: 'carbon-dioxide' },
          ],
        }),
      ).field,
    ).toBe('sources[0].purity')
  })

  it('impurities are carried: N2 balance with 5 ppm O2 and 3 ppm H2O puts them in the predicted composition', () => {
    const plan = computeFillPlan(
      m21({
        target: [
          { gasId: 'carbon-dioxide', x: 0.18 },
          { gasId: 'nitrogen', x: 0.82 },
        ],
        sources: [
          { id: 'CO2', gasId: 'carbon-dioxide' },
          {
            id: 'N2',
            gasId: 'nitrogen',
            purity: 0.99999,
            impurities: [
              { gasId: 'oxygen', x: 5e-6 },
              { gasId: 'water', x: 3e-6 },
            ],
          },
        ],
      }),
    )
    const o2 = plan.predictedComposition.find((p) => p.gasId === 'oxygen')!
    // hand: O2 = 5e-6 × (N2 source share ≈ 0.82) = 4.1e-6
    expect(o2.x).toBeCloseTo(5e-6 * 0.82, 9)
    expect(plan.predictedComposition.find((p) => p.gasId === 'carbon-dioxide')!.x).toBeCloseTo(0.18, 9)
  })
})
