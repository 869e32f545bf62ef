import { describe, expect, it } from 'vitest'
import {
  fromCubicMetres,
  fromKelvin,
  fromKilograms,
  fromPa,
  PA_PER_PSI,
  PhysicsInputError,
  type PressureUnit,
  toCubicMetres,
  toKelvin,
  toKilograms,
  toPa,
  type VolumeUnit,
  type MassUnit,
  type TemperatureUnit,
  M3_PER_CUBIC_FOOT,
  KG_PER_POUND,
} from '../../../shared/physics/index.ts'
import sp811 from '../../fixtures/physics/nist-sp811-unit-conversions.json' with { type: 'json' }
import { expectClose } from '../../support/expect-close.ts'

function fieldOf(fn: () => unknown): string {
  try {
    fn()
  } catch (error) {
    if (error instanceof PhysicsInputError) return error.field
    throw error
  }
  throw new Error('expected a PhysicsInputError')
}

describe(`conversion factors — ${sp811.source.citation}`, () => {
  for (const c of sp811.pressure) {
    it(`1 ${c.unit} = ${c.pa} Pa`, () => {
      expectClose(toPa({ value: 1, unit: c.unit as PressureUnit, reference: 'absolute' }), c.pa, sp811.tolerance, c)
      expectClose(fromPa(c.pa, c.unit as PressureUnit, 'absolute'), 1, sp811.tolerance, c)
    })
  }
  for (const c of sp811.volume) {
    it(`1 ${c.unit} = ${c.m3} m³`, () => {
      expectClose(toCubicMetres({ value: 1, unit: c.unit as VolumeUnit }), c.m3, sp811.tolerance, c)
      expectClose(fromCubicMetres(c.m3, c.unit as VolumeUnit), 1, sp811.tolerance, c)
    })
  }
  for (const c of sp811.mass) {
    it(`1 ${c.unit} = ${c.kg} kg`, () => {
      expectClose(toKilograms({ value: 1, unit: c.unit as MassUnit }), c.kg, sp811.tolerance, c)
      expectClose(fromKilograms(c.kg, c.unit as MassUnit), 1, sp811.tolerance, c)
    })
  }
  for (const c of sp811.temperature) {
    it(`${c.value} ${c.unit} = ${c.kelvin} K`, () => {
      expectClose(toKelvin({ value: c.value, unit: c.unit as TemperatureUnit }), c.kelvin, sp811.tolerance, c)
      expectClose(fromKelvin(c.kelvin, c.unit as TemperatureUnit), c.value, { abs: 1e-5 }, c)
    })
  }

  it('the exact constants agree with mathjs within 1e-9', () => {
    expectClose(toPa({ value: 1, unit: 'psi', reference: 'absolute' }), PA_PER_PSI, { rel: 1e-9 })
    expectClose(toCubicMetres({ value: 1, unit: 'ft3' }), M3_PER_CUBIC_FOOT, { rel: 1e-12 })
    expectClose(toKilograms({ value: 1, unit: 'lb' }), KG_PER_POUND, { rel: 1e-12 })
  })
})

describe('gauge and absolute pressure', () => {
  it('adds the atmospheric pressure to gauge readings (default standard atmosphere, or the one given)', () => {
    expect(toPa({ value: 200, unit: 'bar', reference: 'gauge' })).toBe(20_101_325)
    expect(toPa({ value: 0, unit: 'psi', reference: 'gauge' }, 95_000)).toBe(95_000)
    expectClose(fromPa(20_101_325, 'bar', 'gauge'), 200, { abs: 1e-9 })
    expectClose(fromPa(95_000, 'kPa', 'gauge'), -6.325, { abs: 1e-9 })
  })

  it('round-trips every unit and reference', () => {
    for (const u of ['Pa', 'kPa', 'MPa', 'bar', 'psi', 'atm'] as const) {
      for (const reference of ['absolute', 'gauge'] as const) {
        const pa = toPa({ value: 150, unit: u, reference }, 98_000)
        expectClose(fromPa(pa, u, reference, 98_000), 150, { rel: 1e-12 }, { unit: u, reference })
      }
    }
  })

  it.each([
    ['unknown unit', () => toPa({ value: 1, unit: 'torr' as PressureUnit, reference: 'absolute' }), 'pressure.unit'],
    ['unknown reference', () => toPa({ value: 1, unit: 'bar', reference: 'relative' as 'gauge' }), 'pressure.reference'],
    ['absolute 0', () => toPa({ value: 0, unit: 'bar', reference: 'absolute' }), 'pressure'],
    ['gauge below vacuum', () => toPa({ value: -1.5, unit: 'bar', reference: 'gauge' }), 'pressure'],
    ['NaN', () => toPa({ value: Number.NaN, unit: 'bar', reference: 'absolute' }), 'pressure'],
    ['bad atmosphere', () => toPa({ value: 1, unit: 'bar', reference: 'gauge' }, 0), 'atmosphericPressure'],
    ['fromPa absolute ≤ 0', () => fromPa(0, 'bar', 'absolute'), 'pressure'],
    ['0 K', () => toKelvin({ value: -273.15, unit: 'degC' }), 'temperature'],
    ['below 0 K in °F', () => toKelvin({ value: -500, unit: 'degF' }), 'temperature'],
    ['unknown temperature unit', () => toKelvin({ value: 1, unit: 'degR' as TemperatureUnit }), 'temperature.unit'],
    ['negative volume', () => toCubicMetres({ value: -1, unit: 'L' }), 'volume'],
    ['unknown volume unit', () => toCubicMetres({ value: 1, unit: 'gal' as VolumeUnit }), 'volume.unit'],
    ['unknown mass unit', () => toKilograms({ value: 1, unit: 'oz' as MassUnit }), 'mass.unit'],
  ])('%s → field %s', (_label, fn, field) => {
    expect(fieldOf(fn)).toBe(field)
  })

  it('reports the caller’s field name', () => {
    expect(fieldOf(() => toPa({ value: -5, unit: 'bar', reference: 'gauge' }, undefined, 'steps[2].targetPressure'))).toBe('steps[2].targetPressure')
  })
})
