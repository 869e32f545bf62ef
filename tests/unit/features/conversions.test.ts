import { describe, expect, it } from 'vitest'
import { compositionTable, toMoleFractions } from '#src/features/conversions/lib/convert.ts'

const ArCO2 = { gasIds: ['argon', 'carbon-dioxide'], x: [0.82, 0.18] }

describe('conversions page (ISO 14912)', () => {
  it('Ar + 18 % CO2 at 15 °C, 1 atm: mass fraction 0.19474, volume fraction 0.17927', () => {
    // DOMAIN §4 [calc from ISO 14912 with ISO 6976:2016 compression factors Z(CO2) = 0.99434, Z(Ar) = 0.99925]
    const t = compositionTable(ArCO2, 'gerg-2008', 288.15, 101325)
    expect(Math.abs(t.mass[1] - 0.19474)).toBeLessThan(0.000005)
    expect(t.volume).not.toBeNull()
    expect(Math.abs((t.volume as number[])[1] - 0.17927)).toBeLessThan(0.00003)
  })

  it('mass and volume fractions convert back to the same mole fractions', () => {
    const t = compositionTable(ArCO2, 'gerg-2008', 288.15, 101325)
    const fromMass = toMoleFractions(
      ArCO2.gasIds,
      t.mass.map((w) => w * 100),
      'mass',
      'percent',
      'gerg-2008',
      288.15,
      101325,
    )
    const fromVolume = toMoleFractions(
      ArCO2.gasIds,
      (t.volume as number[]).map((v) => v * 100),
      'volume',
      'percent',
      'gerg-2008',
      288.15,
      101325,
    )
    expect(Math.abs(fromMass.x[1] - 0.18)).toBeLessThan(1e-12)
    expect(Math.abs(fromVolume.x[1] - 0.18)).toBeLessThan(1e-12)
  })

  it('58.22 mg/m³ of CO at 20 °C, 101.325 kPa is 50 ppm (ideal gas)', () => {
    // DOMAIN §4: 50 ppm CO → 58.22 mg/m³ at 20 °C (ideal, R = 8.314462618 J/(mol·K), M(CO) = 28.0101 g/mol)
    const m = toMoleFractions(['carbon-monoxide', 'nitrogen'], [58.22, Number.NaN], 'mg/m3', 'ppm', 'ideal', 293.15, 101325)
    expect(Math.abs(m.x[0] * 1e6 - 50)).toBeLessThan(0.01)
    expect(Math.abs(m.x[0] + m.x[1] - 1)).toBeLessThan(1e-12)
  })
})
