/**
 * Premix proposal for additions too small to measure, and gas needed for a batch.
 */
import { describe, expect, it } from 'vitest'
import { computeFillPlan, planBatch } from '#shared/planning/index.ts'
import { expectClose } from '#tests/support/expect-close.ts'
import { ATM, BAR, celsius, codes, m21 } from './support.ts'

const coInN2 = (x: number) =>
  m21({
    target: [
      { gasId: 'carbon-monoxide', x },
      { gasId: 'nitrogen', x: 1 - x },
    ],
    sources: [
      { id: 'CO', gasId: 'carbon-monoxide' },
      { id: 'N2', gasId: 'nitrogen' },
    ],
    finalPressurePa: 150 * BAR + ATM,
    cylinder: { ...m21().cylinder, waterVolumeM3: 0.01 },
    gauge: { spanPa: 250 * BAR, accuracyClassPercent: 0.25, resolutionPa: 0.1 * BAR },
    blendToleranceRelative: 0.1,
    proposePremix: true,
  })

describe('premix proposal', () => {
  it('1000 ppm CO in N2 at 150 bar: the 0.15 bar CO step is not measurable on a 0–250 bar gauge → premix first, then product', () => {
    const plan = computeFillPlan(coInN2(1000e-6))
    // hand: CO step ≈ 1000e-6 × 151 bar = 0.15 bar < 10 × 0.1 bar resolution (common practice, no source)
    expect(codes(plan, 'caution')).toContain('STEP_NOT_MEASURABLE')
    const proposal = plan.premixProposal!
    expect(proposal.stages.length).toBeGreaterThanOrEqual(1)
    const product = proposal.productPlan
    const premixStep = product.steps.find((s) => s.sourceId === proposal.stages.at(-1)!.label)!
    expect(premixStep.pressureRisePa).toBeGreaterThanOrEqual(10 * 0.1 * BAR)
    expect(product.warnings.filter((w) => w.step === premixStep.index && (w.code === 'STEP_NOT_MEASURABLE' || w.code === 'UNCERTAINTY_OVER_BUDGET'))).toEqual(
      [],
    )
    // the product still makes 1000 ppm CO
    expectClose(product.predictedComposition.find((p) => p.gasId === 'carbon-monoxide')!.x, 1000e-6, { rel: 1e-6 })
    // the chain is measurable end to end with this gauge at a ±10 % budget
    for (const stage of proposal.stages) expect(codes(stage.plan, 'caution'), stage.label).not.toContain('STEP_NOT_MEASURABLE')
    expect(proposal.reason).not.toMatch(/still has a step/)
    // every premix stage is a plan of its own, made from the pure gas (first stage) or the previous premix
    expect(proposal.stages[0].plan.steps.some((s) => s.label === 'carbon-monoxide')).toBe(true)
  })

  it('18 % CO2 needs no premix', () => {
    expect(computeFillPlan({ ...m21(), proposePremix: true }).premixProposal).toBeUndefined()
  })
})

describe('planBatch', () => {
  it('10 cylinders need 10 × the gas of one; standard volume of the ideal model is nRT/p at 15 °C, 101.325 kPa', () => {
    const input = m21({ model: 'ideal' })
    const one = computeFillPlan(input)
    const batch = planBatch(input, 10)
    const co2 = batch.sources.find((s) => s.sourceId === 'CO2')!
    expectClose(co2.moles, 10 * one.steps[0].molesAdded, { rel: 1e-12 })
    expectClose(co2.massKg, 10 * one.steps[0].massAddedKg, { rel: 1e-12 })
    expectClose(co2.standardVolumeM3, (co2.moles * 8.314462618 * celsius(15)) / 101_325, { rel: 1e-12 })
    expect(batch.notes.join(' ')).toMatch(/ISO 6142-1 excludes batch/)
    expect(() => planBatch(input, 0)).toThrow(/cylinder count/)
  })
})
