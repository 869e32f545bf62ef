import { describe, expect, it } from 'vitest'
import {
  concentrations,
  fractionFromMassConcentrationMgPerM3,
  fractionToPercent,
  fractionToPpb,
  fractionToPpm,
  fromAmountFraction,
  massConcentrationMgPerM3FromFraction,
  massFractionsFromMoleFractions,
  moleFractionsFromMassFractions,
  moleFractionsFromVolumeFractions,
  percentToFraction,
  PhysicsInputError,
  ppbToFraction,
  ppmToFraction,
  pureCompressibilities,
  toAmountFraction,
  volumeConcentrations,
  volumeFractions,
  volumeFractionsFromMoleFractions,
} from '../../../shared/physics/index.ts'
import examples from '../../fixtures/physics/domain-brief-iso-14912-examples.json' with { type: 'json' }
import { expectClose } from '../../support/expect-close.ts'

const vf = examples.volumeFraction

describe(`ISO 14912 conversions — ${examples.source.citation} (${examples.source.status})`, () => {
  it(`φ(CO2) = ${vf.expectedVolumeFractionCO2} for x = 0.18 in Ar at 15 °C, 1 atm (ISO 6976 Z values)`, () => {
    const phi = volumeFractionsFromMoleFractions(vf.x, vf.pureCompressibilities)
    expectClose(phi[1], vf.expectedVolumeFractionCO2, { abs: vf.tolerance.abs }, { x: vf.x, Z: vf.pureCompressibilities })
    expectClose(phi[0] + phi[1], 1, { abs: 1e-15 })
  })

  it('the same φ(CO2) with real-gas Z from GERG-2008 and Peng–Robinson at the stated T, p', () => {
    for (const model of ['gerg-2008', 'peng-robinson'] as const) {
      const result = volumeFractions(model, { gasIds: vf.gasIds, x: vf.x }, vf.temperatureK, vf.pressurePa)
      expectClose(result.volumeFractions[1], vf.expectedVolumeFractionCO2, { abs: vf.tolerance.modelAbs }, { model })
      expect(result.warnings).toEqual([])
    }
  })

  it(`w(CO2) = ${vf.expectedMassFractionCO2} (ISO 6976 molar masses)`, () => {
    const w = massFractionsFromMoleFractions({ gasIds: vf.gasIds, x: vf.x })
    expectClose(w[1], vf.expectedMassFractionCO2, { abs: vf.tolerance.abs }, { x: vf.x })
  })

  it('mole → mass → mole and mole → volume → mole return the input', () => {
    const mixture = { gasIds: ['helium', 'nitrogen', 'carbon-dioxide', 'sulfur-hexafluoride'], x: [0.4, 0.3, 0.2, 0.1] }
    const back = moleFractionsFromMassFractions(mixture.gasIds, massFractionsFromMoleFractions(mixture))
    back.x.forEach((xi, i) => {
      expectClose(xi, mixture.x[i], { abs: 1e-15 }, { i })
    })
    const z = [1.01, 0.999, 0.99, 0.98]
    for (const [i, xi] of moleFractionsFromVolumeFractions(volumeFractionsFromMoleFractions(mixture.x, z), z).entries()) {
      expectClose(xi, mixture.x[i], { abs: 1e-15 }, { i })
    }
  })

  for (const c of examples.massConcentrations.cases) {
    it(`${c.ppm} ppm ${c.gasId} at ${c.temperatureK} K, 101.325 kPa = ${c.mgPerM3} mg/m³`, () => {
      const fraction = ppmToFraction(c.ppm)
      const T = c.temperatureK
      const p = examples.massConcentrations.pressurePa
      expectClose(massConcentrationMgPerM3FromFraction(c.gasId, fraction, T, p), c.mgPerM3, examples.massConcentrations.tolerance, c)
      const viaMixture = concentrations('ideal', { gasIds: [c.gasId, 'nitrogen'], x: [fraction, 1 - fraction] }, T, p)
      expectClose(viaMixture.massConcentrationsKgPerM3[0] * 1e6, c.mgPerM3, examples.massConcentrations.tolerance, { ...c, via: 'concentrations' })
      expectClose(fractionFromMassConcentrationMgPerM3(c.gasId, c.mgPerM3, T, p) * 1e6, c.ppm, { rel: 2e-4 }, { ...c, via: 'inverse' })
    })
  }

  it('the real-gas mass concentration in air differs from the ideal one by about 1 − Z(air) (Z ≈ 0.9996 at 20 °C, ISO 6976)', () => {
    const mixture = { gasIds: ['carbon-monoxide', 'air'], x: [50e-6, 1 - 50e-6] }
    const ideal = concentrations('ideal', mixture, 293.15, 101325).massConcentrationsKgPerM3[0]
    const real = concentrations('gerg-2008', mixture, 293.15, 101325)
    expectClose(real.mixtureCompressibility, 0.999645, { abs: 2e-4 }, { source: 'ISO 6976:2016 Z(air, 20 °C) via DOMAIN §10.2' })
    expectClose(real.massConcentrationsKgPerM3[0] / ideal, 1 / real.mixtureCompressibility, { rel: 1e-12 })
  })

  it('volume concentrations σ_i = x_i·Z_i/Z_mix: Σσ = Σx_i·Z_i/Z_mix, → 1 as p → 0', () => {
    const mixture = { gasIds: vf.gasIds, x: vf.x }
    const atm = volumeConcentrations('peng-robinson', mixture, 288.15, 101325)
    const pure = pureCompressibilities('peng-robinson', vf.gasIds, 288.15, 101325).compressibilities
    const zMix = concentrations('peng-robinson', mixture, 288.15, 101325).mixtureCompressibility
    expectClose(atm.volumeConcentrations[0] + atm.volumeConcentrations[1], (vf.x[0] * pure[0] + vf.x[1] * pure[1]) / zMix, { rel: 1e-14 })
    const low = volumeConcentrations('peng-robinson', mixture, 288.15, 100)
    expectClose(low.volumeConcentrations[0] + low.volumeConcentrations[1], 1, { abs: 1e-6 })
  })

  it('warns that ISO 14912 volume fractions are undefined when a pure component would be liquid', () => {
    const result = pureCompressibilities('peng-robinson', ['argon', 'carbon-dioxide'], 288.15, 200e5)
    expect(result.warnings.map((w) => w.code)).toContain('not-gaseous')
  })
})

describe('%, ppm and ppb helpers', () => {
  it('convert both ways by the SI prefixes (ppm = µmol/mol, ppb = nmol/mol)', () => {
    expect(percentToFraction(18)).toBeCloseTo(0.18, 15)
    expect(fractionToPercent(0.18)).toBeCloseTo(18, 13)
    expect(ppmToFraction(50)).toBeCloseTo(5e-5, 18)
    expect(fractionToPpm(5e-5)).toBeCloseTo(50, 10)
    expect(ppbToFraction(100)).toBeCloseTo(1e-7, 20)
    expect(fractionToPpb(1e-7)).toBeCloseTo(100, 8)
    expect(toAmountFraction({ value: 0.25, unit: 'fraction' })).toBe(0.25)
    expect(fromAmountFraction(0.25, 'ppm')).toBeCloseTo(250000, 6)
  })

  it('rejects fractions above 100 %, negative values and unknown units with a field', () => {
    expect(() => percentToFraction(120)).toThrow(PhysicsInputError)
    expect(() => ppmToFraction(-1)).toThrow(PhysicsInputError)
    try {
      toAmountFraction({ value: 1, unit: 'vpm' as 'ppm' })
    } catch (error) {
      expect((error as PhysicsInputError).field).toBe('fraction.unit')
    }
    expect(() => toAmountFraction({ value: 1, unit: 'vpm' as 'ppm' })).toThrow(PhysicsInputError)
  })
})
