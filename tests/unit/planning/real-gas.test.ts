/**
 * Real-gas plans: re-derive the finished state independently from the steps' pressures with the model's
 * own density (physics core, not the planner), and compare with numbers the domain research computed.
 */
import { describe, expect, it } from 'vitest'
import { compareModels, computeFillPlan } from '#shared/planning/index.ts'
import { prepareModel } from '#shared/physics/index.ts'
import { expectClose } from '#tests/support/expect-close.ts'
import { ATM, BAR, celsius, m21, REF, rederive } from './support.ts'

describe('GERG-2008 plan re-derived from its step pressures', () => {
  it('M21 at 200 bar abs: the step pressures reproduce 18.000 % CO2 and 200 bar at 15 °C', () => {
    const plan = computeFillPlan(m21())
    const back = rederive(plan, 'gerg-2008', 0.05)
    expectClose(back.x.get('carbon-dioxide')!, 0.18, { abs: 1e-9 })
    expectClose(back.settledPressurePa, 200 * BAR, { rel: 1e-9 })
  })

  it('5-component natural-gas-like mixture at 150 bar gauge, filled warm at 30 °C', () => {
    const input = m21({
      target: [
        { gasId: 'methane', x: 0.85 },
        { gasId: 'ethane', x: 0.06 },
        { gasId: 'propane', x: 0.02 },
        { gasId: 'carbon-dioxide', x: 0.03 },
        { gasId: 'nitrogen', x: 0.04 },
      ],
      sources: ['methane', 'ethane', 'propane', 'carbon-dioxide', 'nitrogen'].map((g) => ({ id: g, gasId: g })),
      finalPressurePa: 150 * BAR + ATM,
      fillTemperatureK: celsius(30),
      cylinder: { ...m21().cylinder, waterVolumeM3: 0.01 },
    })
    const plan = computeFillPlan(input)
    const back = rederive(plan, 'gerg-2008', 0.01)
    for (const t of input.target) expectClose(back.x.get(t.gasId)!, t.x, { abs: 1e-9 }, { gas: t.gasId })
    expectClose(back.settledPressurePa, 150 * BAR + ATM, { rel: 1e-9 })
    // balance (methane) last, propane (smallest) first
    expect(plan.steps[0].label).toBe('propane')
    expect(plan.steps.at(-1)!.label).toBe('methane')
  })

  it('agrees with the domain research: M21 first step 88.4 mol CO2 at 33.1 bar (DOMAIN §6.6, calc with GERG-2008)', () => {
    const ref = REF.m21FirstStep
    const plan = computeFillPlan(m21())
    expectClose(plan.steps[0].molesAdded, ref.co2Moles, ref.tolerance, { source: ref.source })
    expectClose(plan.steps[0].cumulativePressurePa / BAR, ref.pressureBarAbs, ref.tolerance, { source: ref.source })
  })

  it('N2 isochore from 200 bar at 15 °C (DOMAIN §6.7, calc with GERG-2008) through the plan’s temperature checks', () => {
    const ref = REF.nitrogenIsochore
    const rho = prepareModel('gerg-2008', { gasIds: ['nitrogen'], x: [1] }).densityMolPerM3(ref.fillTemperatureK, ref.fillBarAbs * BAR)
    const eos = prepareModel('gerg-2008', { gasIds: ['nitrogen'], x: [1] })
    for (const pt of ref.points)
      expectClose(eos.pressurePa(pt.temperatureK, rho) / BAR, pt.pressureBar, ref.tolerance, { T: pt.temperatureK, source: ref.source })
    const plan = computeFillPlan(
      m21({
        target: [{ gasId: 'nitrogen', x: 1 }],
        sources: [{ id: 'N2', gasId: 'nitrogen' }],
        cylinderRules: 'us',
        cylinder: { ...m21().cylinder, servicePressurePa: 200 * BAR + ATM },
      }),
    )
    const at70F = plan.pressureChecks.find((c) => c.label.startsWith('pressure at 70 °F'))!
    expectClose(at70F.pressurePa / BAR, 206.1, { abs: 0.35 }, { source: ref.source })
    expect(at70F.pass).toBe(false)
    expect(plan.warnings.some((w) => w.code === 'US_OVER_SERVICE_AT_70F' && w.severity === 'block')).toBe(true)
  })
})

describe('compareModels', () => {
  it('the ideal-gas Dalton plan for M21 really gives about 20.0 % CO2 by GERG-2008 (DOMAIN §2.2, calc)', () => {
    const ref = REF.m21IdealPlanRealCo2
    const result = compareModels(m21(), ['ideal', 'peng-robinson', 'gerg-2008'])
    expect(result.reference).toBe('gerg-2008')
    const ideal = result.entries.find((e) => e.model === 'ideal')!
    const co2 = ideal.realised.find((q) => q.gasId === 'carbon-dioxide')!
    expectClose(co2.realised, ref.value, ref.tolerance, { source: ref.source })
    expect(ideal.withinTolerance).toBe(false)
    // GERG's own plan reproduces the target when reality is GERG
    const gerg = result.entries.find((e) => e.model === 'gerg-2008')!
    expectClose(gerg.realised.find((q) => q.gasId === 'carbon-dioxide')!.realised, 0.18, { abs: 1e-9 })
    expectClose(gerg.realisedFinalPressurePa!, 200 * BAR, { rel: 1e-9 })
  })

  it('falls back to Peng–Robinson as reference when GERG-2008 does not cover a gas (SF6), and says so', () => {
    const input = m21({
      target: [
        { gasId: 'sulfur-hexafluoride', x: 0.01 },
        { gasId: 'nitrogen', x: 0.99 },
      ],
      sources: [
        { id: 'SF6', gasId: 'sulfur-hexafluoride' },
        { id: 'N2', gasId: 'nitrogen' },
      ],
      finalPressurePa: 100 * BAR,
    })
    const result = compareModels(input, ['ideal', 'gerg-2008'])
    expect(result.reference).toBe('peng-robinson')
    expect(result.referenceNote).toMatch(/does not cover SF6/)
    const gerg = result.entries.find((e) => e.model === 'gerg-2008')!
    expect(gerg.plan!.warnings.some((w) => w.code === 'MODEL_FALLBACK')).toBe(true)
  })
})
