/**
 * Safety findings. Each check names the rule's source next to it.
 */
import { describe, expect, it } from 'vitest'
import { computeFillPlan } from '#shared/planning/index.ts'
import { vapourPressurePa } from '#shared/physics/index.ts'
import { expectClose } from '#tests/support/expect-close.ts'
import { ATM, BAR, celsius, codes, m21, REF } from './support.ts'

const co2InN2 = (x: number, pBarAbs: number, model: 'ideal' | 'gerg-2008' = 'ideal') =>
  m21({
    model,
    target: [
      { gasId: 'carbon-dioxide', x },
      { gasId: 'nitrogen', x: 1 - x },
    ],
    sources: [
      { id: 'CO2', gasId: 'carbon-dioxide' },
      { id: 'N2', gasId: 'nitrogen' },
    ],
    balanceGasId: 'nitrogen',
    finalPressurePa: pBarAbs * BAR,
    referenceTemperatureK: celsius(20),
    fillTemperatureK: celsius(20),
    minimumTemperatureK: celsius(20),
  })

describe('condensation (partial pressure vs vapour pressure at the minimum temperature)', () => {
  it('the library vapour pressure of CO2 at 20 °C is the NIST value, about 57.3 bar', () => {
    const ref = REF.co2VapourPressure20C
    expectClose(vapourPressurePa('carbon-dioxide', ref.temperatureK)!, ref.value, ref.tolerance, { source: ref.source })
  })

  it('50 % CO2 at 200 bar at 20 °C blocks: 100 bar of CO2 > 57.3 bar (NIST WebBook), final state and the CO2 step', () => {
    for (const model of ['ideal', 'gerg-2008'] as const) {
      const plan = computeFillPlan(co2InN2(0.5, 200, model))
      const blocks = plan.warnings.filter((w) => w.code === 'CONDENSATION')
      expect(blocks.length, model).toBeGreaterThanOrEqual(2)
      expect(blocks.every((w) => w.severity === 'block')).toBe(true)
      expect(blocks.map((w) => w.step)).toContain(0)
      expect(plan.approvable).toBe(false)
      // the numbers are still there
      expect(plan.steps).toHaveLength(2)
    }
  })

  it('ideal gas at 200 bar: 28 % CO2 (56 bar) passes, 29 % (58 bar) is blocked — vapour pressure 57.3 bar (NIST WebBook)', () => {
    // hand: x·p = 0.28 × 200 = 56 bar < 57.3 ; 0.29 × 200 = 58 bar > 57.3 (the CO2 step itself sits at the same partial pressure)
    expect(codes(computeFillPlan(co2InN2(0.28, 200)), 'block')).not.toContain('CONDENSATION')
    expect(codes(computeFillPlan(co2InN2(0.29, 200)), 'block')).toContain('CONDENSATION')
    // 56/57.3 = 0.977 ≥ 0.9: less than 10 % margin (common practice, no source)
    expect(codes(computeFillPlan(co2InN2(0.28, 200)), 'caution')).toContain('NEAR_CONDENSATION')
  })

  it('M21 at 200 bar abs, −20 °C minimum: blocked; the finished cylinder passes the screen down to about −3 °C (DOMAIN §6.6: fails at −5 °C, passes at 0 °C)', () => {
    const plan = computeFillPlan(m21({ minimumTemperatureK: celsius(-20) }))
    expect(codes(plan, 'block')).toContain('CONDENSATION')
    const tMin = plan.minimumSafeTemperatureK! - 273.15
    expect(tMin).toBeGreaterThan(-5)
    expect(tMin).toBeLessThan(0)
  })
})

describe('liquefied parent gases (DOMAIN §6.5 rule 2, common practice)', () => {
  const mix = (order: 'auto' | 'as-given') =>
    computeFillPlan(
      m21({
        model: 'ideal',
        target: [
          { gasId: 'helium', x: 0.1 },
          { gasId: 'carbon-dioxide', x: 0.25 },
          { gasId: 'argon', x: 0.65 },
        ],
        sources: [
          { id: 'He', gasId: 'helium' },
          { id: 'CO2', gasId: 'carbon-dioxide' },
          { id: 'Ar', gasId: 'argon' },
        ],
        finalPressurePa: 200 * BAR,
        fillTemperatureK: celsius(20),
        referenceTemperatureK: celsius(20),
        minimumTemperatureK: celsius(20),
        order,
      }),
    )

  it('auto puts CO2 first: 0.25 × 200 = 50 bar stays below its 57.3 bar vapour pressure at 20 °C (NIST WebBook)', () => {
    const plan = mix('auto')
    expect(plan.steps.map((s) => s.label)).toEqual(['carbon-dioxide', 'helium', 'argon'])
    expect(plan.orderRules.join(' ')).toMatch(/Liquefiable parent gases/)
    expect(codes(plan, 'block')).toEqual([])
  })

  it('as given (He first) the CO2 step must reach (0.10 + 0.25) × 200 = 70 bar > 57.3 bar: it cannot be delivered → block', () => {
    const plan = mix('as-given')
    expect(plan.steps[1].label).toBe('carbon-dioxide')
    const w = plan.warnings.find((x) => x.code === 'SOURCE_ABOVE_VAPOUR_PRESSURE')!
    expect([w.severity, w.step]).toEqual(['block', 1])
  })
})

describe('oxygen: 23.5 % (OSHA 29 CFR 1910.146(b) "oxygen enriched atmosphere"; DOMAIN §6.1 app rule)', () => {
  const premix = (x: number, clean = false) =>
    m21({
      model: 'ideal',
      target: [
        { gasId: 'oxygen', x },
        { gasId: 'nitrogen', x: 1 - x },
      ],
      sources: [
        {
          id: 'oxidant',
          composition: [
            { gasId: 'oxygen', x },
            { gasId: 'nitrogen', x: 1 - x },
          ],
        },
      ],
      cylinder: { ...m21().cylinder, oxygenClean: clean },
    })

  it('23.4 % O2 from a 23.4 % premix in a cylinder not oxygen-clean: no block', () => {
    expect(codes(computeFillPlan(premix(0.234)), 'block')).not.toContain('OXYGEN_NOT_CLEAN')
  })

  it('23.6 % O2: block unless the cylinder is oxygen-clean', () => {
    expect(codes(computeFillPlan(premix(0.236)), 'block')).toContain('OXYGEN_NOT_CLEAN')
    const clean = computeFillPlan(premix(0.236, true))
    expect(codes(clean, 'block')).not.toContain('OXYGEN_NOT_CLEAN')
    expect(codes(clean, 'caution')).toContain('OXYGEN_ENRICHED')
  })

  it('21 % O2 made from pure O2 blocks in a non-clean cylinder: the pure-O2 addition counts', () => {
    const plan = computeFillPlan(
      m21({
        model: 'ideal',
        target: [
          { gasId: 'oxygen', x: 0.21 },
          { gasId: 'nitrogen', x: 0.79 },
        ],
        sources: [
          { id: 'O2', gasId: 'oxygen' },
          { id: 'N2', gasId: 'nitrogen' },
        ],
      }),
    )
    const o2 = plan.warnings.filter((w) => w.code === 'OXYGEN_NOT_CLEAN')
    expect(o2.length).toBeGreaterThan(0)
    expect(o2.some((w) => w.step === 0)).toBe(true)
    // above 40 %: oxygen-service design (46 CFR 197.326)
    expect(codes(plan, 'caution')).toContain('OXYGEN_SERVICE')
    expect(o2[0].caution).toMatch(/local codes/)
  })

  it('synthetic air from an air source needs no oxygen-clean cylinder (20.96 % O2)', () => {
    const plan = computeFillPlan(m21({ model: 'ideal', target: [{ gasId: 'air', x: 1 }], sources: [{ id: 'air', gasId: 'air' }] }))
    expect(codes(plan, 'block')).toEqual([])
  })
})

describe('ISO 10156 calculation (Tci, K from memory and unverified — DOMAIN §6.2 [calc])', () => {
  const binary = (fuel: string, x: number, inert: string) =>
    computeFillPlan(
      m21({
        model: 'ideal',
        target: [
          { gasId: fuel, x },
          { gasId: inert, x: 1 - x },
        ],
        sources: [
          { id: fuel, gasId: fuel },
          { id: inert, gasId: inert },
        ],
      }),
    )

  it('5 % H2 in N2: Σ = 5/5.7 = 0.877, not flammable (forming gas ships non-flammable)', () => {
    // A' = 0.05/(0.05 + 0.95·K_N2=1) = 0.05 ; Σ = 5/5.7
    const plan = binary('hydrogen', 0.05, 'nitrogen')
    expectClose(plan.classification.flammabilityIndex!, 5 / 5.7, { rel: 1e-9 })
    expect(plan.classification.flammable).toBe(false)
    expect(plan.classification.division).toBe('2.2')
    // the H2 step itself (pure H2) is a flammable state
    expect(codes(plan, 'caution')).toContain('FLAMMABLE_INTERMEDIATE')
  })

  it('5 % H2 in Ar: Σ = 1.532, flammable (Ar/H2 95/5 ships as UN1954)', () => {
    // A' = 0.05/(0.05 + 0.95·0.55) = 0.087336 ; Σ = 8.7336/5.7 = 1.5322
    const plan = binary('hydrogen', 0.05, 'argon')
    expectClose(plan.classification.flammabilityIndex!, ((0.05 / (0.05 + 0.95 * 0.55)) * 100) / 5.7, { rel: 1e-9 })
    expectClose(plan.classification.flammabilityIndex!, 1.532, { abs: 5e-4 })
    expect(plan.classification.flammable).toBe(true)
    expect(plan.classification.division).toBe('2.1')
    expect(codes(plan, 'caution')).toContain('FLAMMABLE_MIXTURE')
  })

  it('P10 (10 % CH4 in Ar): Σ = 1.175, flammable', () => {
    const plan = binary('methane', 0.1, 'argon')
    expectClose(plan.classification.flammabilityIndex!, ((0.1 / (0.1 + 0.9 * 0.55)) * 100) / 14.3, { rel: 1e-9 })
    expectClose(plan.classification.flammabilityIndex!, 1.175, { abs: 5e-4 })
  })

  it('2 % H2 + 3 % CH4 in N2: Σ = 2/5.7 + 3/14.3 = 0.561, not flammable', () => {
    const plan = computeFillPlan(
      m21({
        model: 'ideal',
        target: [
          { gasId: 'hydrogen', x: 0.02 },
          { gasId: 'methane', x: 0.03 },
          { gasId: 'nitrogen', x: 0.95 },
        ],
        sources: [
          { id: 'H2', gasId: 'hydrogen' },
          { id: 'CH4', gasId: 'methane' },
          { id: 'N2', gasId: 'nitrogen' },
        ],
      }),
    )
    expectClose(plan.classification.flammabilityIndex!, 2 / 5.7 + 3 / 14.3, { rel: 1e-9 })
    expect(plan.classification.flammable).toBe(false)
  })

  it('O2/CO2 70/30 (meat MAP): oxidising power 0.7/(0.7 + 1.5·0.3) = 0.609 > 0.235 → oxidising, 5.1 subsidiary', () => {
    const plan = computeFillPlan(
      m21({
        model: 'ideal',
        target: [
          { gasId: 'oxygen', x: 0.7 },
          { gasId: 'carbon-dioxide', x: 0.3 },
        ],
        sources: [
          { id: 'O2', gasId: 'oxygen' },
          { id: 'CO2', gasId: 'carbon-dioxide' },
        ],
        finalPressurePa: 100 * BAR,
        cylinder: { ...m21().cylinder, oxygenClean: true },
      }),
    )
    expectClose(plan.classification.oxidisingPower!, 0.7 / (0.7 + 1.5 * 0.3), { rel: 1e-9 })
    expect(plan.classification.oxidising).toBe(true)
    expect(plan.classification.subsidiary).toContain('5.1')
  })
})

describe('fuel and oxidiser (EIGA Doc 139 / CGA P-58 principles, common practice)', () => {
  it('2.5 % CH4 in air from pure CH4 and air: the air addition passes through the flammable range → block', () => {
    const plan = computeFillPlan(
      m21({
        model: 'ideal',
        target: [
          { gasId: 'methane', x: 0.025 },
          { gasId: 'air', x: 0.975 },
        ],
        sources: [
          { id: 'CH4', gasId: 'methane' },
          { id: 'air', gasId: 'air' },
        ],
        finalPressurePa: 100 * BAR,
      }),
    )
    expect(codes(plan, 'block')).toContain('FUEL_OXIDISER_SEQUENCE')
    expect(plan.approvable).toBe(false)
  })

  it('detector mix 2.5 % CH4 / 18 % O2 / N2 from a 10 % CH4 premix: fuel first, inert, oxidiser last; no block', () => {
    const plan = computeFillPlan(
      m21({
        model: 'ideal',
        target: [
          { gasId: 'methane', x: 0.025 },
          { gasId: 'oxygen', x: 0.18 },
          { gasId: 'nitrogen', x: 0.795 },
        ],
        sources: [
          { id: 'O2', gasId: 'oxygen' },
          { id: 'N2', gasId: 'nitrogen' },
          {
            id: 'CH4 10 % in N2',
            composition: [
              { gasId: 'methane', x: 0.1 },
              { gasId: 'nitrogen', x: 0.9 },
            ],
          },
        ],
        finalPressurePa: 100 * BAR,
        cylinder: { ...m21().cylinder, oxygenClean: true },
      }),
    )
    expect(plan.steps.map((s) => s.sourceId)).toEqual(['CH4 10 % in N2', 'N2', 'O2'])
    expect(plan.orderRules.join(' ')).toMatch(/oxidisers last/)
    expect(codes(plan, 'block')).toEqual([])
    // 2.5 % CH4 is 57 % of its LFL in air (4.4 %, IEC 60079-20-1): caution from 50 % on
    expect(codes(plan, 'caution')).toContain('FUEL_OXIDISER_NEAR_LFL')
  })
})

describe('other findings', () => {
  it('cylinder past its test date → block', () => {
    const plan = computeFillPlan(m21({ asOfDate: '2031-02-01' }))
    expect(codes(plan, 'block')).toContain('CYLINDER_TEST_OVERDUE')
  })

  it('NO with O2 → block (physics core incompatibility list)', () => {
    const plan = computeFillPlan(
      m21({
        model: 'peng-robinson',
        target: [
          { gasId: 'nitric-oxide', x: 0.01 },
          { gasId: 'oxygen', x: 0.2 },
          { gasId: 'nitrogen', x: 0.79 },
        ],
        sources: [
          { id: 'NO', gasId: 'nitric-oxide' },
          { id: 'O2', gasId: 'oxygen' },
          { id: 'N2', gasId: 'nitrogen' },
        ],
        finalPressurePa: 50 * BAR,
        cylinder: { ...m21().cylinder, oxygenClean: true },
      }),
    )
    expect(codes(plan, 'block')).toContain('INCOMPATIBLE_COMPONENTS')
  })

  it('toxic component: handling caution; 1 % H2S in N2 has LC50_mix = 712/0.01 = 71 200 ppm > 5000 → not 2.3 (LC50 712 ppm from memory, ADR P200)', () => {
    const plan = computeFillPlan(
      m21({
        model: 'gerg-2008',
        target: [
          { gasId: 'hydrogen-sulfide', x: 0.01 },
          { gasId: 'nitrogen', x: 0.99 },
        ],
        sources: [
          { id: 'H2S', gasId: 'hydrogen-sulfide' },
          { id: 'N2', gasId: 'nitrogen' },
        ],
        finalPressurePa: 50 * BAR,
      }),
    )
    expectClose(plan.classification.lc50MixPpm!, 712 / 0.01, { rel: 1e-9 })
    expect(plan.classification.toxic).toBe(false)
    const tox = plan.warnings.find((w) => w.code === 'TOXIC_COMPONENT')!
    expect(tox.caution).toMatch(/Toxic gas/)
  })

  it('EU rules: 250 bar settled in a 200 bar service cylinder → over service pressure and over 2/3 of a 300 bar test pressure', () => {
    const plan = computeFillPlan(
      m21({
        target: [{ gasId: 'nitrogen', x: 1 }],
        sources: [{ id: 'N2', gasId: 'nitrogen' }],
        finalPressurePa: 250 * BAR + ATM,
        cylinder: { ...m21().cylinder, servicePressurePa: 200 * BAR + ATM, testPressurePa: 300 * BAR + ATM },
      }),
    )
    expect(codes(plan, 'block')).toEqual(expect.arrayContaining(['OVER_SERVICE_PRESSURE', 'EU_OVER_TWO_THIRDS_TEST']))
  })
})
