/**
 * Property test (fast-check): for valid random inputs the plan never holds NaN or ±Infinity, the
 * cumulative pressures rise step by step, and the predicted composition sums to 1.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { computeFillPlan, PlanningInputError } from '#shared/planning/index.ts'
import type { FillPlanInput } from '#shared/planning/index.ts'

const GASES = ['nitrogen', 'argon', 'helium', 'oxygen', 'carbon-dioxide', 'methane', 'hydrogen', 'carbon-monoxide'] as const

function nonFinite(value: unknown, path = ''): string[] {
  if (typeof value === 'number') return Number.isFinite(value) ? [] : [path]
  if (Array.isArray(value)) return value.flatMap((v, i) => nonFinite(v, `${path}[${i}]`))
  if (value && typeof value === 'object') return Object.entries(value).flatMap(([k, v]) => nonFinite(v, `${path}.${k}`))
  return []
}

const inputArb = fc
  .record({
    gases: fc.shuffledSubarray([...GASES], { minLength: 1, maxLength: 4 }),
    weights: fc.array(fc.double({ min: 0.01, max: 1, noNaN: true }), { minLength: 4, maxLength: 4 }),
    pBar: fc.double({ min: 5, max: 300, noNaN: true }),
    tRef: fc.double({ min: 273, max: 313, noNaN: true }),
    tFill: fc.double({ min: 263, max: 333, noNaN: true }),
    volumeL: fc.double({ min: 1, max: 50, noNaN: true }),
    model: fc.constantFrom('ideal', 'peng-robinson', 'srk', 'van-der-waals', 'gerg-2008'),
    method: fc.constantFrom('partial-pressure', 'gravimetric'),
    order: fc.constantFrom('auto', 'as-given'),
  })
  .map((r): FillPlanInput => {
    const w = r.gases.map((_, i) => r.weights[i])
    const sum = w.reduce((s, v) => s + v, 0)
    return {
      target: r.gases.map((g, i) => ({ gasId: g, x: w[i] / sum })),
      finalPressurePa: r.pBar * 1e5,
      referenceTemperatureK: r.tRef,
      fillTemperatureK: r.tFill,
      atmosphericPressurePa: 101_325,
      cylinder: { waterVolumeM3: r.volumeL / 1000, servicePressurePa: 200e5, oxygenClean: false, residual: { kind: 'evacuated' } },
      sources: r.gases.map((g) => ({ id: g, gasId: g })),
      method: r.method as FillPlanInput['method'],
      model: r.model as FillPlanInput['model'],
      order: r.order as FillPlanInput['order'],
      asOfDate: '2025-01-01',
      proposePremix: false,
    }
  })

describe('fill plan properties', () => {
  it('no NaN or Infinity anywhere, rising pressures, fractions summing to 1', () => {
    let planned = 0
    let rejected = 0
    fc.assert(
      fc.property(inputArb, (input) => {
        let plan: ReturnType<typeof computeFillPlan>
        try {
          plan = computeFillPlan(input)
        } catch (error) {
          // a two-phase or out-of-range state is reported as a typed error, never a crash
          if (error instanceof PlanningInputError) {
            rejected++
            return true
          }
          throw error
        }
        planned++
        expect(nonFinite(plan)).toEqual([])
        // pressures rise step by step, or the plan says why not (a two-phase state is a block, never silent)
        for (let k = 1; k < plan.steps.length; k++) {
          if (plan.steps[k].cumulativePressurePa > plan.steps[k - 1].cumulativePressurePa) continue
          expect(plan.warnings.some((w) => w.code === 'PRESSURE_NOT_RISING' && w.step === k && w.severity === 'block')).toBe(true)
        }
        const sum = plan.predictedComposition.reduce((s, p) => s + p.x, 0)
        expect(Math.abs(sum - 1)).toBeLessThan(1e-9)
        return true
      }),
      { numRuns: 60, seed: 20250601 },
    )
    // the inputs are valid: nearly all of them must give a plan, or the test would prove nothing
    expect(planned).toBeGreaterThanOrEqual(0.9 * (planned + rejected))
  })
})
