import { describe, expect, it } from 'vitest'
import {
  amountFromStandardVolume,
  GAS_CONSTANT_J_PER_MOL_K,
  GERG_GAS_CONSTANT,
  cylinderContents,
  gasPropertiesAtState,
  getReferenceCondition,
  idealMassDensityKgPerM3,
  M3_PER_CUBIC_FOOT,
  massDensityKgPerM3,
  molarVolumeM3PerMol,
  partialPressures,
  partialVolumes,
  PhysicsInputError,
  REFERENCE_CONDITIONS,
  standardVolume,
  stateFromTP,
} from '../../../shared/physics/index.ts'
import codata from '../../fixtures/physics/codata-2018-ideal-molar-volume.json' with { type: 'json' }
import examples from '../../fixtures/physics/domain-brief-iso-14912-examples.json' with { type: 'json' }
import sp811 from '../../fixtures/physics/nist-sp811-unit-conversions.json' with { type: 'json' }
import { expectClose } from '../../support/expect-close.ts'

const nitrogen = { gasIds: ['nitrogen'], x: [1] }
const m21 = { gasIds: ['argon', 'carbon-dioxide'], x: [0.82, 0.18] }

describe('reference conditions', () => {
  it('include the four required conditions with their temperatures and pressures', () => {
    expect(REFERENCE_CONDITIONS.map((r) => r.id)).toEqual(expect.arrayContaining(['0C-101325', '15C-101325', '20C-101325', '70F-14.696psia']))
    expect(getReferenceCondition('0C-101325')).toMatchObject({ temperatureK: 273.15, pressurePa: 101325 })
    expect(getReferenceCondition('15C-101325')).toMatchObject({ temperatureK: 288.15, pressurePa: 101325 })
    expect(getReferenceCondition('20C-101325')).toMatchObject({ temperatureK: 293.15, pressurePa: 101325 })
    const scf = getReferenceCondition('70F-14.696psia')
    // 70 °F = 294.261 K (SP 811 fixture); 14.696 psi × 6894.757 Pa/psi (SP 811) = 101325.35 Pa
    expectClose(scf.temperatureK, sp811.temperature.find((t) => t.value === 70)?.kelvin ?? Number.NaN, { abs: 1e-6 })
    expectClose(scf.pressurePa, 14.696 * (sp811.pressure.find((u) => u.unit === 'psi')?.pa ?? Number.NaN), { rel: 1e-6 })
    for (const r of REFERENCE_CONDITIONS) expect(r.label.length).toBeGreaterThan(0)
  })

  it("rejects an unknown reference id with field 'referenceCondition'", () => {
    expect(() => getReferenceCondition('STP')).toThrow(PhysicsInputError)
  })

  for (const c of examples.idealMolarVolumes.cases) {
    it(`ideal molar volume at ${c.referenceId} = ${c.litresPerMol} L/mol (${examples.source.status})`, () => {
      const v = standardVolume(1, c.referenceId as '0C-101325', 'ideal', nitrogen).volumeM3 * 1000
      expectClose(v, c.litresPerMol, examples.idealMolarVolumes.tolerance, c)
    })
  }

  it(`1 mol at 0 °C, 101.325 kPa, ideal = ${codata.cases[0].molarVolumeM3PerMol} m³ (CODATA 2018)`, () => {
    expectClose(standardVolume(1, '0C-101325', 'ideal', nitrogen).volumeM3, codata.cases[0].molarVolumeM3PerMol, codata.tolerance)
  })

  it('standard cubic feet: 1.1727 mol/scf at 70 °F, 1.1953 at 60 °F, 38.04 scf per Nm³ (domain brief §5, calc)', () => {
    const s = examples.standardCubicFoot
    expectClose(amountFromStandardVolume(M3_PER_CUBIC_FOOT, '70F-14.696psia', 'ideal', nitrogen), s.molPerScf70F, { rel: s.tolerance.rel })
    expectClose(amountFromStandardVolume(M3_PER_CUBIC_FOOT, '60F-14.696psia', 'ideal', nitrogen), s.molPerScf60F, { rel: s.tolerance.rel })
    const molPerNm3 = amountFromStandardVolume(1, '0C-101325', 'ideal', nitrogen)
    expectClose(molPerNm3 / s.molPerScf70F, s.scfPerNormalCubicMetre, { abs: s.tolerance.ratioAbs })
  })

  it('standard volumes are real-gas corrected: V = n·Z·R·T/p with Z of the chosen model', () => {
    const ideal = standardVolume(100, '15C-101325', 'ideal', m21)
    const pr = standardVolume(100, '15C-101325', 'peng-robinson', m21)
    expectClose(pr.volumeM3 / ideal.volumeM3, pr.compressibility, { rel: 1e-12 })
    // GERG-2008 keeps its own gas constant (8.314472 J/(mol·K), Kunz & Wagner 2012)
    const real = standardVolume(100, '15C-101325', 'gerg-2008', m21)
    expectClose(real.volumeM3 / ideal.volumeM3, (real.compressibility * GERG_GAS_CONSTANT) / GAS_CONSTANT_J_PER_MOL_K, { rel: 1e-12 })
    // Ar/CO2 at 15 °C, 1 atm is about 0.1 % below ideal (ISO 6976 Z: Ar 0.99925, CO2 0.99434)
    expect(real.compressibility).toBeLessThan(0.9995)
    expect(real.reference.label).toBe('15 °C, 101.325 kPa')
    expectClose(amountFromStandardVolume(real.volumeM3, '15C-101325', 'gerg-2008', m21), 100, { rel: 1e-12 })
  })
})

describe('densities, molar volume and cylinder contents', () => {
  it('ideal mass density of dry air at 15 °C, 1 atm ≈ 1.225 kg/m³ (ISO 2533 standard atmosphere sea-level density)', () => {
    expectClose(idealMassDensityKgPerM3(0.0289644, 288.15, 101325), 1.225, { abs: 5e-4 })
  })

  it('real mass density = ideal / Z and molar volume = Z·R·T/p', () => {
    const props = gasPropertiesAtState('peng-robinson', m21, 288.15, 200e5)
    const idealRho = idealMassDensityKgPerM3(props.molarMassKgPerMol, 288.15, 200e5)
    expectClose(props.massDensityKgPerM3, idealRho / props.compressibility, { rel: 1e-12 })
    expectClose(massDensityKgPerM3('peng-robinson', m21, 288.15, 200e5), props.massDensityKgPerM3, { rel: 1e-12 })
    expectClose(molarVolumeM3PerMol('peng-robinson', m21, 288.15, 200e5), props.molarVolumeM3PerMol, { rel: 1e-12 })
  })

  it('cylinder contents scale with the water volume and match n = ρ·V', () => {
    const ten = cylinderContents('gerg-2008', m21, 0.01, 288.15, 200e5)
    const fifty = cylinderContents('gerg-2008', m21, 0.05, 288.15, 200e5)
    expectClose(fifty.amountMol / ten.amountMol, 5, { rel: 1e-12 })
    const state = stateFromTP('gerg-2008', m21, 288.15, 200e5)
    expectClose(fifty.amountMol, state.molarDensityMolPerM3 * 0.05, { rel: 1e-12 })
    expectClose(fifty.massKg, fifty.amountMol * state.molarMassKgPerMol, { rel: 1e-12 })
  })

  it("rejects a non-positive water volume with field 'waterVolume'", () => {
    expect(() => cylinderContents('ideal', m21, 0, 288.15, 1e5)).toThrow(PhysicsInputError)
  })
})

describe('Dalton and Amagat', () => {
  it('partial pressures sum to p; a real-gas caveat appears at 200 bar but not at 1 atm', () => {
    const high = partialPressures('gerg-2008', m21, 288.15, 200e5)
    expectClose(high.partialPressuresPa[0] + high.partialPressuresPa[1], 200e5, { rel: 1e-14 })
    expectClose(high.partialPressuresPa[1], 0.18 * 200e5, { rel: 1e-14 })
    expect(high.warnings.map((w) => w.code)).toContain('real-gas-caveat')
    const low = partialPressures('gerg-2008', { gasIds: ['nitrogen', 'oxygen'], x: [0.79, 0.21] }, 288.15, 101325)
    expect(low.warnings.map((w) => w.code)).not.toContain('real-gas-caveat')
  })

  it('the ideal model still carries the caveat at 200 bar (estimated with Peng–Robinson)', () => {
    const result = partialPressures('ideal', m21, 288.15, 200e5)
    expect(result.warnings.map((w) => w.code)).toContain('real-gas-caveat')
  })

  it('partial volumes are x_i·V with the caveat at cylinder pressure', () => {
    const result = partialVolumes('peng-robinson', m21, 0.05, 288.15, 200e5)
    expectClose(result.partialVolumesM3[0], 0.82 * 0.05, { rel: 1e-14 })
    expectClose(result.partialVolumesM3[1], 0.18 * 0.05, { rel: 1e-14 })
    expect(result.warnings.map((w) => w.code)).toContain('real-gas-caveat')
  })
})
