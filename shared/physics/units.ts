/**
 * Unit conversions at the edges of the physics core (everything inside is SI: Pa absolute, K, m³, kg).
 * Conversion factors come from mathjs 15 (`unit`), whose definitions follow NIST SP 811 (psi = 6894.757 Pa,
 * atm = 101325 Pa, ft = 0.3048 m, lb = 0.45359237 kg, °F/°C offsets per the SI Brochure).
 * Pressures carry an explicit reference: 'absolute', or 'gauge' relative to a stated atmospheric pressure.
 */
import { unit } from 'mathjs'
import { STANDARD_ATMOSPHERE_PA } from './constants.ts'
import { PhysicsInputError } from './types.ts'

export type PressureUnit = 'Pa' | 'kPa' | 'MPa' | 'bar' | 'psi' | 'atm'
export type PressureReference = 'absolute' | 'gauge'
export type TemperatureUnit = 'K' | 'degC' | 'degF'
export type VolumeUnit = 'L' | 'm3' | 'ft3'
export type MassUnit = 'g' | 'kg' | 'lb'

export const PRESSURE_UNITS: readonly PressureUnit[] = ['Pa', 'kPa', 'MPa', 'bar', 'psi', 'atm']
export const TEMPERATURE_UNITS: readonly TemperatureUnit[] = ['K', 'degC', 'degF']
export const VOLUME_UNITS: readonly VolumeUnit[] = ['L', 'm3', 'ft3']
export const MASS_UNITS: readonly MassUnit[] = ['g', 'kg', 'lb']

/** our unit id → mathjs unit name */
const MATHJS_NAME: Readonly<Record<string, string>> = {
  Pa: 'Pa',
  kPa: 'kPa',
  MPa: 'MPa',
  bar: 'bar',
  psi: 'psi',
  atm: 'atm',
  K: 'K',
  degC: 'degC',
  degF: 'degF',
  L: 'L',
  m3: 'm3',
  ft3: 'cuft',
  g: 'g',
  kg: 'kg',
  lb: 'lbm',
}

export interface PressureQuantity {
  readonly value: number
  readonly unit: PressureUnit
  readonly reference: PressureReference
}

export interface TemperatureQuantity {
  readonly value: number
  readonly unit: TemperatureUnit
}

export interface VolumeQuantity {
  readonly value: number
  readonly unit: VolumeUnit
}

export interface MassQuantity {
  readonly value: number
  readonly unit: MassUnit
}

function checkUnit<U extends string>(value: string, allowed: readonly U[], field: string): asserts value is U {
  if (!(allowed as readonly string[]).includes(value)) {
    throw new PhysicsInputError(`Unknown unit "${value}". Use one of: ${allowed.join(', ')}.`, `${field}.unit`)
  }
}

function checkFinite(value: number, field: string): void {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new PhysicsInputError(`Value must be a finite number, got ${value}.`, field)
  }
}

function checkAtmosphere(atmosphericPressurePa: number): void {
  if (typeof atmosphericPressurePa !== 'number' || !(atmosphericPressurePa > 0) || !Number.isFinite(atmosphericPressurePa)) {
    throw new PhysicsInputError(`Atmospheric pressure must be a positive number of Pa, got ${atmosphericPressurePa}.`, 'atmosphericPressure')
  }
}

function convert(value: number, from: string, to: string): number {
  return unit(value, MATHJS_NAME[from]).toNumber(MATHJS_NAME[to])
}

/**
 * Absolute pressure in Pa from a value, unit and reference. Gauge readings add the atmospheric pressure
 * (default: standard atmosphere 101325 Pa; pass the local barometric pressure where it matters).
 * @throws PhysicsInputError: '<field>.unit' unknown unit or reference, '<field>' non-finite or absolute ≤ 0,
 *   'atmosphericPressure' ≤ 0
 * @example toPa({ value: 200, unit: 'bar', reference: 'gauge' }) // 20_101_325
 */
export function toPa(quantity: PressureQuantity, atmosphericPressurePa: number = STANDARD_ATMOSPHERE_PA, field = 'pressure'): number {
  checkUnit(quantity.unit, PRESSURE_UNITS, field)
  if (quantity.reference !== 'absolute' && quantity.reference !== 'gauge') {
    throw new PhysicsInputError(`Pressure reference must be 'absolute' or 'gauge', got "${String(quantity.reference)}".`, `${field}.reference`)
  }
  checkFinite(quantity.value, field)
  checkAtmosphere(atmosphericPressurePa)
  const pa = convert(quantity.value, quantity.unit, 'Pa')
  const absolute = quantity.reference === 'gauge' ? pa + atmosphericPressurePa : pa
  if (!(absolute > 0)) {
    throw new PhysicsInputError(`Absolute pressure must be above 0 Pa; ${quantity.value} ${quantity.unit} (${quantity.reference}) is ${absolute} Pa.`, field)
  }
  return absolute
}

/**
 * Expresses an absolute pressure (Pa) in a unit, as absolute or gauge (gauge may be negative: vacuum).
 * @example fromPa(20_101_325, 'bar', 'gauge') // 200
 */
export function fromPa(
  absolutePressurePa: number,
  unitName: PressureUnit,
  reference: PressureReference,
  atmosphericPressurePa: number = STANDARD_ATMOSPHERE_PA,
  field = 'pressure',
): number {
  checkUnit(unitName, PRESSURE_UNITS, field)
  if (reference !== 'absolute' && reference !== 'gauge') {
    throw new PhysicsInputError(`Pressure reference must be 'absolute' or 'gauge', got "${String(reference)}".`, `${field}.reference`)
  }
  checkFinite(absolutePressurePa, field)
  checkAtmosphere(atmosphericPressurePa)
  if (!(absolutePressurePa > 0)) {
    throw new PhysicsInputError(`Absolute pressure must be above 0 Pa, got ${absolutePressurePa}.`, field)
  }
  const pa = reference === 'gauge' ? absolutePressurePa - atmosphericPressurePa : absolutePressurePa
  return convert(pa, 'Pa', unitName)
}

/**
 * Temperature in K.
 * @throws PhysicsInputError: '<field>.unit' unknown unit, '<field>' non-finite or at/below 0 K
 * @example toKelvin({ value: 15, unit: 'degC' }) // 288.15
 */
export function toKelvin(quantity: TemperatureQuantity, field = 'temperature'): number {
  checkUnit(quantity.unit, TEMPERATURE_UNITS, field)
  checkFinite(quantity.value, field)
  const k = convert(quantity.value, quantity.unit, 'K')
  if (!(k > 0)) {
    throw new PhysicsInputError(`Temperature must be above absolute zero; ${quantity.value} ${quantity.unit} is ${k} K.`, field)
  }
  return k
}

/** @example fromKelvin(294.2611111, 'degF') // ≈ 70 */
export function fromKelvin(temperatureK: number, unitName: TemperatureUnit, field = 'temperature'): number {
  checkUnit(unitName, TEMPERATURE_UNITS, field)
  checkFinite(temperatureK, field)
  if (!(temperatureK > 0)) throw new PhysicsInputError(`Temperature must be above 0 K, got ${temperatureK}.`, field)
  return convert(temperatureK, 'K', unitName)
}

/**
 * Volume in m³ (≥ 0).
 * @example toCubicMetres({ value: 50, unit: 'L' }) // 0.05
 */
export function toCubicMetres(quantity: VolumeQuantity, field = 'volume'): number {
  checkUnit(quantity.unit, VOLUME_UNITS, field)
  checkFinite(quantity.value, field)
  if (quantity.value < 0) throw new PhysicsInputError(`Volume must not be negative, got ${quantity.value}.`, field)
  return convert(quantity.value, quantity.unit, 'm3')
}

/** @example fromCubicMetres(0.028316846592, 'ft3') // 1 */
export function fromCubicMetres(volumeM3: number, unitName: VolumeUnit, field = 'volume'): number {
  checkUnit(unitName, VOLUME_UNITS, field)
  checkFinite(volumeM3, field)
  if (volumeM3 < 0) throw new PhysicsInputError(`Volume must not be negative, got ${volumeM3}.`, field)
  return convert(volumeM3, 'm3', unitName)
}

/**
 * Mass in kg (may be negative: weighing differences).
 * @example toKilograms({ value: 1, unit: 'lb' }) // 0.45359237
 */
export function toKilograms(quantity: MassQuantity, field = 'mass'): number {
  checkUnit(quantity.unit, MASS_UNITS, field)
  checkFinite(quantity.value, field)
  return convert(quantity.value, quantity.unit, 'kg')
}

/** @example fromKilograms(0.45359237, 'lb') // 1 */
export function fromKilograms(massKg: number, unitName: MassUnit, field = 'mass'): number {
  checkUnit(unitName, MASS_UNITS, field)
  checkFinite(massKg, field)
  return convert(massKg, 'kg', unitName)
}
