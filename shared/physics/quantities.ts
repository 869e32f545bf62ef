/**
 * Derived quantities of a gas or mixture at (T, p): molar volume, mass density, contents of a cylinder, partial
 * pressures (Dalton) and partial volumes (Amagat), and standard volumes at named reference conditions.
 * Units: K, Pa (absolute), m³, mol, kg.
 */
import { GAS_CONSTANT_J_PER_MOL_K as R, PA_PER_PSI, STANDARD_ATMOSPHERE_PA, ZERO_CELSIUS_K } from './constants.ts'
import { checkPressurePa, checkTemperatureK, evaluateState, type PrepareModelOptions, prepareModel, REAL_GAS_CAVEAT_THRESHOLD } from './state.ts'
import { type Mixture, type ModelId, PhysicsInputError, type PhysicsWarning } from './types.ts'

export type ReferenceConditionId = '0C-101325' | '15C-101325' | '20C-101325' | '70F-14.696psia' | '0C-100kPa' | '60F-14.696psia'

export interface ReferenceCondition {
  readonly id: ReferenceConditionId
  /** the text to print next to every standard volume */
  readonly label: string
  readonly temperatureK: number
  readonly pressurePa: number
  readonly source: string
}

const fahrenheitToKelvin = (degF: number): number => ((degF - 32) * 5) / 9 + ZERO_CELSIUS_K

/** Reference (standard) conditions used in the trade. Standard volumes must always be printed with the label. */
export const REFERENCE_CONDITIONS: readonly ReferenceCondition[] = Object.freeze([
  {
    id: '0C-101325',
    label: '0 °C, 101.325 kPa',
    temperatureK: ZERO_CELSIUS_K,
    pressurePa: STANDARD_ATMOSPHERE_PA,
    source: 'DIN 1343 "normal" conditions (Nm³) — from memory',
  },
  {
    id: '15C-101325',
    label: '15 °C, 101.325 kPa',
    temperatureK: ZERO_CELSIUS_K + 15,
    pressurePa: STANDARD_ATMOSPHERE_PA,
    source: 'ISO 13443:1996 standard reference conditions (used by ISO 6976)',
  },
  {
    id: '20C-101325',
    label: '20 °C, 101.325 kPa',
    temperatureK: ZERO_CELSIUS_K + 20,
    pressurePa: STANDARD_ATMOSPHERE_PA,
    source: 'US EPA standard conditions, 40 CFR 60.2 — from memory',
  },
  {
    id: '70F-14.696psia',
    label: '70 °F, 14.696 psia',
    temperatureK: fahrenheitToKelvin(70),
    pressurePa: 14.696 * PA_PER_PSI,
    source: 'US specialty-gas standard cubic foot (NIST Handbook 130 method-of-sale rule — from memory; US fire-code tables "gas at 70 °F and 1 atm")',
  },
  {
    id: '0C-100kPa',
    label: '0 °C, 100 kPa',
    temperatureK: ZERO_CELSIUS_K,
    pressurePa: 100_000,
    source: 'IUPAC standard temperature and pressure (since 1982), IUPAC Gold Book "standard conditions for gases"',
  },
  {
    id: '60F-14.696psia',
    label: '60 °F, 14.696 psia',
    temperatureK: fahrenheitToKelvin(60),
    pressurePa: 14.696 * PA_PER_PSI,
    source: 'US natural-gas / API standard cubic foot — common practice, no source',
  },
] satisfies ReferenceCondition[])

/**
 * Looks up a reference condition.
 * @throws PhysicsInputError (field 'referenceCondition') for an unknown id
 */
export function getReferenceCondition(id: string): ReferenceCondition {
  const found = REFERENCE_CONDITIONS.find((r) => r.id === id)
  if (found === undefined) {
    throw new PhysicsInputError(`Unknown reference condition "${id}". Use one of: ${REFERENCE_CONDITIONS.map((r) => r.id).join(', ')}.`, 'referenceCondition')
  }
  return found
}

/** Real-gas caveat for results that use ideal-gas mixing laws (Dalton, Amagat). */
function mixingLawCaveat(law: 'Dalton' | 'Amagat', compressibility: number): PhysicsWarning[] {
  if (Math.abs(compressibility - 1) <= REAL_GAS_CAVEAT_THRESHOLD) return []
  return [
    {
      code: 'real-gas-caveat',
      severity: 'caution',
      message:
        `${law}'s law assumes ideal-gas behaviour, but Z = ${compressibility.toFixed(4)} here ` +
        `(${(Math.abs(compressibility - 1) * 100).toFixed(1)} % from ideal): partial ${law === 'Dalton' ? 'pressures' : 'volumes'} ` +
        'are approximate. Plan fills with the equation of state of the mixture after each step.',
    },
  ]
}

/**
 * Ideal-gas mass density ρ = p·M/(R·T) in kg/m³ (M in kg/mol).
 * @example idealMassDensityKgPerM3(0.028965, 288.15, 101325) // ≈ 1.225 (air at ISO standard conditions)
 */
export function idealMassDensityKgPerM3(molarMassKgPerMol: number, temperatureK: number, pressurePa: number): number {
  checkTemperatureK(temperatureK)
  checkPressurePa(pressurePa)
  if (!(molarMassKgPerMol > 0) || !Number.isFinite(molarMassKgPerMol)) {
    throw new PhysicsInputError(`Molar mass must be a positive number, got ${molarMassKgPerMol}.`, 'molarMass')
  }
  return (pressurePa * molarMassKgPerMol) / (R * temperatureK)
}

export interface GasPropertiesAtState {
  readonly compressibility: number
  /** m³/mol */
  readonly molarVolumeM3PerMol: number
  readonly molarDensityMolPerM3: number
  /** real-gas mass density p·M/(Z·R·T), kg/m³ */
  readonly massDensityKgPerM3: number
  readonly molarMassKgPerMol: number
  readonly warnings: readonly PhysicsWarning[]
}

/**
 * Molar volume, molar and mass density of a mixture at (T, p) with the chosen model.
 * @example gasPropertiesAtState('ideal', { gasIds: ['nitrogen'], x: [1] }, 273.15, 101325).molarVolumeM3PerMol // ≈ 0.0224140
 */
export function gasPropertiesAtState(
  model: ModelId,
  mixture: Mixture,
  temperatureK: number,
  pressurePa: number,
  options?: PrepareModelOptions,
): GasPropertiesAtState {
  const state = evaluateState(prepareModel(model, mixture, options), temperatureK, pressurePa)
  return {
    compressibility: state.compressibility,
    molarVolumeM3PerMol: 1 / state.molarDensityMolPerM3,
    molarDensityMolPerM3: state.molarDensityMolPerM3,
    massDensityKgPerM3: state.molarDensityMolPerM3 * state.molarMassKgPerMol,
    molarMassKgPerMol: state.molarMassKgPerMol,
    warnings: state.warnings,
  }
}

/** Molar volume v = Z·R·T/p in m³/mol. */
export function molarVolumeM3PerMol(model: ModelId, mixture: Mixture, temperatureK: number, pressurePa: number, options?: PrepareModelOptions): number {
  return 1 / prepareModel(model, mixture, options).densityMolPerM3(temperatureK, pressurePa)
}

/** Real-gas mass density p·M/(Z·R·T) in kg/m³. */
export function massDensityKgPerM3(model: ModelId, mixture: Mixture, temperatureK: number, pressurePa: number, options?: PrepareModelOptions): number {
  const prepared = prepareModel(model, mixture, options)
  return prepared.densityMolPerM3(temperatureK, pressurePa) * prepared.molarMassKgPerMol
}

export interface CylinderContents {
  readonly amountMol: number
  readonly massKg: number
  readonly compressibility: number
  readonly molarDensityMolPerM3: number
  readonly warnings: readonly PhysicsWarning[]
}

/**
 * Amount and mass of gas in a cylinder of internal (water) volume V at (T, p): n = ρ(T, p)·V, m = n·M.
 * @throws PhysicsInputError (field 'waterVolume') unless 0 < V < ∞
 * @example cylinderContents('ideal', { gasIds: ['argon'], x: [1] }, 0.05, 288.15, 200e5).amountMol // ≈ 417.4
 */
export function cylinderContents(
  model: ModelId,
  mixture: Mixture,
  waterVolumeM3: number,
  temperatureK: number,
  pressurePa: number,
  options?: PrepareModelOptions,
): CylinderContents {
  if (typeof waterVolumeM3 !== 'number' || !(waterVolumeM3 > 0) || waterVolumeM3 === Number.POSITIVE_INFINITY) {
    throw new PhysicsInputError(`Cylinder water volume must be a positive number of m³, got ${waterVolumeM3}.`, 'waterVolume')
  }
  const state = evaluateState(prepareModel(model, mixture, options), temperatureK, pressurePa)
  const amountMol = state.molarDensityMolPerM3 * waterVolumeM3
  return {
    amountMol,
    massKg: amountMol * state.molarMassKgPerMol,
    compressibility: state.compressibility,
    molarDensityMolPerM3: state.molarDensityMolPerM3,
    warnings: state.warnings,
  }
}

export interface PartialPressures {
  /** x_i·p for each gas of the mixture, in the mixture's order, Pa */
  readonly partialPressuresPa: readonly number[]
  readonly compressibility: number
  readonly warnings: readonly PhysicsWarning[]
}

/**
 * Dalton partial pressures p_i = x_i·p, with a real-gas caveat when Z of the mixture (chosen model) differs from 1
 * by more than 0.5 %.
 */
export function partialPressures(model: ModelId, mixture: Mixture, temperatureK: number, pressurePa: number, options?: PrepareModelOptions): PartialPressures {
  const prepared = prepareModel(model, mixture, options)
  const state = evaluateState(prepared, temperatureK, pressurePa)
  const zForCaveat = model === 'ideal' ? prepareModel('peng-robinson', mixture).compressibility(temperatureK, pressurePa) : state.compressibility
  return {
    partialPressuresPa: prepared.mixture.x.map((xi) => xi * pressurePa),
    compressibility: state.compressibility,
    warnings: [...state.warnings, ...mixingLawCaveat('Dalton', zForCaveat)],
  }
}

export interface PartialVolumes {
  /** x_i·V for each gas of the mixture, in the mixture's order, m³ */
  readonly partialVolumesM3: readonly number[]
  readonly compressibility: number
  readonly warnings: readonly PhysicsWarning[]
}

/**
 * Amagat partial volumes V_i = x_i·V (volume each gas would fill alone at the mixture's T and p, ideal-gas law),
 * with a real-gas caveat when Z differs from 1 by more than 0.5 %.
 */
export function partialVolumes(
  model: ModelId,
  mixture: Mixture,
  totalVolumeM3: number,
  temperatureK: number,
  pressurePa: number,
  options?: PrepareModelOptions,
): PartialVolumes {
  if (typeof totalVolumeM3 !== 'number' || !(totalVolumeM3 >= 0) || totalVolumeM3 === Number.POSITIVE_INFINITY) {
    throw new PhysicsInputError(`Volume must be a finite number of m³ ≥ 0, got ${totalVolumeM3}.`, 'volume')
  }
  const prepared = prepareModel(model, mixture, options)
  const state = evaluateState(prepared, temperatureK, pressurePa)
  const zForCaveat = model === 'ideal' ? prepareModel('peng-robinson', mixture).compressibility(temperatureK, pressurePa) : state.compressibility
  return {
    partialVolumesM3: prepared.mixture.x.map((xi) => xi * totalVolumeM3),
    compressibility: state.compressibility,
    warnings: [...state.warnings, ...mixingLawCaveat('Amagat', zForCaveat)],
  }
}

export interface StandardVolume {
  readonly volumeM3: number
  readonly reference: ReferenceCondition
  /** Z of the mixture at the reference condition (real-gas correction applied) */
  readonly compressibility: number
  readonly warnings: readonly PhysicsWarning[]
}

/**
 * Standard volume of an amount of gas at a named reference condition, real-gas corrected:
 * V = n·Z(T_ref, p_ref)·R·T_ref/p_ref. Print it with `reference.label`.
 * @throws PhysicsInputError: 'amount' unless 0 ≤ n < ∞; 'referenceCondition' for an unknown id
 * @example standardVolume(1, '0C-101325', 'ideal', { gasIds: ['nitrogen'], x: [1] }).volumeM3 // ≈ 0.0224140
 */
export function standardVolume(
  amountMol: number,
  referenceId: ReferenceConditionId,
  model: ModelId,
  mixture: Mixture,
  options?: PrepareModelOptions,
): StandardVolume {
  if (typeof amountMol !== 'number' || !(amountMol >= 0) || amountMol === Number.POSITIVE_INFINITY) {
    throw new PhysicsInputError(`Amount must be a finite number of mol ≥ 0, got ${amountMol}.`, 'amount')
  }
  const reference = getReferenceCondition(referenceId)
  const state = evaluateState(prepareModel(model, mixture, options), reference.temperatureK, reference.pressurePa)
  return {
    volumeM3: amountMol / state.molarDensityMolPerM3,
    reference,
    compressibility: state.compressibility,
    warnings: state.warnings,
  }
}

/**
 * Amount of gas (mol) in a standard volume at a named reference condition, real-gas corrected (inverse of
 * standardVolume).
 */
export function amountFromStandardVolume(
  volumeM3: number,
  referenceId: ReferenceConditionId,
  model: ModelId,
  mixture: Mixture,
  options?: PrepareModelOptions,
): number {
  if (typeof volumeM3 !== 'number' || !(volumeM3 >= 0) || volumeM3 === Number.POSITIVE_INFINITY) {
    throw new PhysicsInputError(`Volume must be a finite number of m³ ≥ 0, got ${volumeM3}.`, 'volume')
  }
  const reference = getReferenceCondition(referenceId)
  return volumeM3 * prepareModel(model, mixture, options).densityMolPerM3(reference.temperatureK, reference.pressurePa)
}
