/**
 * Wire schemas and the wire ↔ SI mapping: units in, units out, the response matches its schema.
 */
import { describe, expect, it } from 'vitest'
import {
  BatchResponseSchema,
  CompareModelsResponseSchema,
  FillPlanRequestSchema,
  FillPlanResponseSchema,
  ReplanResponseSchema,
} from '#shared/schemas/fill-plan.ts'
import { compareModelsFromRequest, fillPlanFromRequest, PlanningInputError, planBatchFromRequest, replanFromRequest } from '#shared/planning/index.ts'
import { expectClose } from '#tests/support/expect-close.ts'

const request = {
  target: [
    { gas: 'carbon-dioxide', fraction: 0.18 },
    { gas: 'argon', fraction: 0.82, balance: true },
  ],
  finalPressure: { value: 200, unit: 'bar', reference: 'gauge' },
  referenceTemperature: { value: 15, unit: 'C' },
  fillTemperature: { value: 15, unit: 'C' },
  cylinder: {
    waterVolume: { value: 50, unit: 'L' },
    servicePressure: { value: 300, unit: 'bar', reference: 'gauge' },
    oxygenClean: false,
    nextTestDate: '2030-01-01',
  },
  minimumTemperature: { value: 15, unit: 'C' },
  sources: [{ gas: 'argon', purity: 0.99999 }, { gas: 'carbon-dioxide' }],
  order: 'auto',
  model: 'ideal',
  method: 'partial-pressure',
  asOfDate: '2025-06-01',
}

describe('FillPlanRequestSchema', () => {
  it('accepts the documented request and rejects fractions given as percentages or a source without gas', () => {
    expect(FillPlanRequestSchema.safeParse(request).success).toBe(true)
    expect(FillPlanRequestSchema.safeParse({ ...request, target: [{ gas: 'argon', fraction: 82 }] }).success).toBe(false)
    expect(FillPlanRequestSchema.safeParse({ ...request, sources: [{ purity: 0.9 }] }).success).toBe(false)
    expect(FillPlanRequestSchema.safeParse({ ...request, order: 'random' }).success).toBe(false)
  })
})

describe('fillPlanFromRequest', () => {
  it('bar gauge in, bar out: CO2 step at 35.169135 bar gauge (Dalton, hand: 0.18 × 201.01325 − 1.01325)', () => {
    const res = fillPlanFromRequest(FillPlanRequestSchema.parse(request))
    expect(FillPlanResponseSchema.safeParse(res).success).toBe(true)
    expect(res.steps[0].gas).toBe('carbon-dioxide')
    expect(res.steps[0].cumulativeGaugePressure.unit).toBe('bar')
    expectClose(res.steps[0].cumulativeGaugePressure.value, 35.169135, { rel: 1e-9 })
    expectClose(res.steps[0].cumulativePressure.value, 36.182385, { rel: 1e-9 })
    expect(res.steps[0].cumulativePressure.reference).toBe('absolute')
    expect(res.totalMoles.unit).toBe('mol')
    expect(res.predictedComposition.find((p) => p.gas === 'carbon-dioxide')!.coverageFactor).toBe(2)
    expect(res.steps[0].temperatureTable.map((r) => r.temperature.value)).toEqual([5, 10, 15, 20, 25])
  })

  it('psi and °F in, psi out: 2000 psig at 70 °F (1 psi = 6894.757293 Pa, NIST SP 811)', () => {
    const res = fillPlanFromRequest(
      FillPlanRequestSchema.parse({
        ...request,
        finalPressure: { value: 2000, unit: 'psi', reference: 'gauge' },
        referenceTemperature: { value: 70, unit: 'F' },
        fillTemperature: { value: 70, unit: 'F' },
        cylinder: { ...request.cylinder, servicePressure: { value: 2400, unit: 'psi', reference: 'gauge' } },
        minimumTemperature: { value: 70, unit: 'F' },
        displayUnits: { pressure: 'psi', temperature: 'F' },
      }),
    )
    // hand: absolute = 2000 psi + 101325/6894.757293 = 2014.6959 psia ; CO2 = 0.18 × 2014.6959 − 14.6959 = 347.94 psig
    expectClose(res.steps[0].cumulativeGaugePressure.value, 0.18 * (2000 + 101325 / 6894.757293168361) - 101325 / 6894.757293168361, { rel: 1e-9 })
    expect(res.steps[1].cumulativeGaugePressure.unit).toBe('psi')
    expectClose(res.fillTemperature.value, 70, { abs: 1e-9 })
  })

  it('a bad request surfaces as PlanningInputError with the field', () => {
    expect(() => fillPlanFromRequest(FillPlanRequestSchema.parse({ ...request, target: [{ gas: 'argon', fraction: 0.5 }] }))).toThrow(PlanningInputError)
  })

  it('replan, compare and batch responses match their schemas', () => {
    const req = FillPlanRequestSchema.parse(request)
    const plan = fillPlanFromRequest(req)
    const replan = replanFromRequest({
      plan: req,
      actuals: [{ stepIndex: 0, pressure: plan.steps[0].cumulativeGaugePressure, temperature: { value: 15, unit: 'C' } }],
    })
    expect(ReplanResponseSchema.safeParse(replan).success).toBe(true)
    expect(replan.status).toBe('on-track')
    const cmp = compareModelsFromRequest({ ...req, models: ['ideal', 'gerg-2008'] })
    expect(CompareModelsResponseSchema.safeParse(cmp).success).toBe(true)
    const batch = planBatchFromRequest({ plan: req, cylinderCount: 3 })
    expect(BatchResponseSchema.safeParse(batch).success).toBe(true)
  })
})
