/**
 * Conversions between composition quantities (ISO 14912:2003 "Gas analysis — Conversion of gas mixture
 * composition data"): amount (mole) fraction x, mass fraction w, volume fraction φ, molar, mass and volume
 * concentrations at stated conditions, and the %, ppm, ppb helpers.
 *
 *   w_i = x_i·M_i / Σ x_j·M_j              x_i = (w_i/M_i) / Σ (w_j/M_j)
 *   φ_i = x_i·Z_i / Σ x_j·Z_j              x_i = (φ_i/Z_i) / Σ (φ_j/Z_j)
 *   c_i = x_i·p/(Z_mix·R·T)    γ_i = x_i·M_i·p/(Z_mix·R·T)    σ_i = x_i·Z_i/Z_mix
 * Z_i: compression factor of pure i at the mixture's p and T (volumes before mixing); every component must be
 * completely gaseous there. References: ISO 14912 definitions; Dutch Accreditation Council RvA-I6 (2004),
 * "Conversion between mole fractions and volume fractions in gas analysis" (all components, balance included).
 * Units: fractions 0..1, K, Pa, kg/mol, mol/m³, kg/m³.
 */
import { GAS_CONSTANT_J_PER_MOL_K as R } from './constants.ts'
import { getGas } from './gases.ts'
import { validateMixture } from './mixture.ts'
import { evaluateState, type PrepareModelOptions, prepareModel } from './state.ts'
import { type Mixture, type ModelId, PhysicsInputError, type PhysicsWarning } from './types.ts'

// ---- %, ppm, ppb ------------------------------------------------------------------------------------------

export type AmountFractionUnit = 'fraction' | 'percent' | 'ppm' | 'ppb'

const FRACTION_SCALE: Readonly<Record<AmountFractionUnit, number>> = {
  fraction: 1,
  percent: 1e-2,
  ppm: 1e-6,
  ppb: 1e-9,
}

function checkFractionUnit(unit: string, field: string): asserts unit is AmountFractionUnit {
  if (!Object.hasOwn(FRACTION_SCALE, unit)) {
    throw new PhysicsInputError(`Unknown fraction unit "${unit}". Use one of: ${Object.keys(FRACTION_SCALE).join(', ')}.`, `${field}.unit`)
  }
}

/**
 * A fraction written in %, ppm (µmol/mol), ppb (nmol/mol) or as a plain fraction, returned as a fraction 0..1.
 * @throws PhysicsInputError ('<field>.unit' for an unknown unit, '<field>' outside 0..1 after conversion)
 * @example toAmountFraction({ value: 50, unit: 'ppm' }) // 5e-5
 */
export function toAmountFraction(quantity: { readonly value: number; readonly unit: AmountFractionUnit }, field = 'fraction'): number {
  checkFractionUnit(quantity.unit, field)
  const x = quantity.value * FRACTION_SCALE[quantity.unit]
  if (typeof quantity.value !== 'number' || !Number.isFinite(x) || x < 0 || x > 1) {
    throw new PhysicsInputError(`A fraction must lie between 0 and 1 (100 %), got ${quantity.value} ${quantity.unit}.`, field)
  }
  return x
}

/** A fraction 0..1 expressed in the given unit. @example fromAmountFraction(0.18, 'percent') // 18 */
export function fromAmountFraction(fraction: number, unit: AmountFractionUnit): number {
  checkFractionUnit(unit, 'fraction')
  return fraction / FRACTION_SCALE[unit]
}

/** @example percentToFraction(18) // 0.18 */
export const percentToFraction = (percent: number): number => toAmountFraction({ value: percent, unit: 'percent' })
/** @example fractionToPercent(0.18) // 18 */
export const fractionToPercent = (fraction: number): number => fromAmountFraction(fraction, 'percent')
/** @example ppmToFraction(50) // 5e-5 */
export const ppmToFraction = (ppm: number): number => toAmountFraction({ value: ppm, unit: 'ppm' })
/** @example fractionToPpm(5e-5) // 50 */
export const fractionToPpm = (fraction: number): number => fromAmountFraction(fraction, 'ppm')
/** @example ppbToFraction(100) // 1e-7 */
export const ppbToFraction = (ppb: number): number => toAmountFraction({ value: ppb, unit: 'ppb' })
/** @example fractionToPpb(1e-7) // 100 */
export const fractionToPpb = (fraction: number): number => fromAmountFraction(fraction, 'ppb')

// ---- mole ↔ mass ------------------------------------------------------------------------------------------

/**
 * Mass fractions w_i = x_i·M_i / Σ x_j·M_j, in the mixture's order (molar masses from the gas library).
 * @example massFractionsFromMoleFractions({ gasIds: ['argon', 'carbon-dioxide'], x: [0.82, 0.18] })[1] // ≈ 0.19474
 */
export function massFractionsFromMoleFractions(mixture: Mixture): number[] {
  const { gasIds, x } = validateMixture(mixture)
  const masses = gasIds.map((id, i) => x[i] * getGas(id).molarMassGPerMol)
  const total = masses.reduce((s, m) => s + m, 0)
  return masses.map((m) => m / total)
}

/**
 * Mole fractions from mass fractions: x_i = (w_i/M_i) / Σ (w_j/M_j).
 * @throws PhysicsInputError like validateMixture (the mass fractions must sum to 1 ± 1e-6)
 */
export function moleFractionsFromMassFractions(gasIds: readonly string[], massFractions: readonly number[]): Mixture {
  const { x: w } = validateMixture({ gasIds, x: massFractions })
  const moles = gasIds.map((id, i) => w[i] / getGas(id).molarMassGPerMol)
  const total = moles.reduce((s, n) => s + n, 0)
  return { gasIds: [...gasIds], x: moles.map((n) => n / total) }
}

// ---- mole ↔ volume ----------------------------------------------------------------------------------------

function checkCompressibilities(values: readonly number[], count: number): void {
  if (values.length !== count) {
    throw new PhysicsInputError(`Expected ${count} compression factors, got ${values.length}.`, 'compressibilities')
  }
  values.forEach((z, i) => {
    if (typeof z !== 'number' || !(z > 0) || !Number.isFinite(z)) {
      throw new PhysicsInputError(`Compression factor ${i + 1} must be a positive number, got ${z}.`, `compressibilities[${i}]`)
    }
  })
}

/**
 * Volume fractions φ_i = x_i·Z_i / Σ x_j·Z_j from mole fractions and pure-component compression factors at the
 * stated p and T (ISO 14912; RvA-I6). Sum over all components, balance gas included.
 * @example volumeFractionsFromMoleFractions([0.82, 0.18], [0.99925, 0.99434])[1] // ≈ 0.17927
 */
export function volumeFractionsFromMoleFractions(moleFractions: readonly number[], pureCompressibilities: readonly number[]): number[] {
  checkCompressibilities(pureCompressibilities, moleFractions.length)
  const weighted = moleFractions.map((xi, i) => xi * pureCompressibilities[i])
  const total = weighted.reduce((s, v) => s + v, 0)
  return weighted.map((v) => v / total)
}

/** Mole fractions x_i = (φ_i/Z_i) / Σ (φ_j/Z_j) from volume fractions and pure-component compression factors. */
export function moleFractionsFromVolumeFractions(volumeFractions: readonly number[], pureCompressibilities: readonly number[]): number[] {
  checkCompressibilities(pureCompressibilities, volumeFractions.length)
  const weighted = volumeFractions.map((phi, i) => phi / pureCompressibilities[i])
  const total = weighted.reduce((s, v) => s + v, 0)
  return weighted.map((v) => v / total)
}

export interface PureCompressibilities {
  /** Z of each pure gas at (T, p), in the given order */
  readonly compressibilities: readonly number[]
  readonly warnings: readonly PhysicsWarning[]
}

/**
 * Compression factor of each pure gas at (T, p) with the chosen model. Adds a 'not-gaseous' caution when a pure
 * component would condense at (T, p): ISO 14912 volume fractions then do not exist.
 */
export function pureCompressibilities(
  model: ModelId,
  gasIds: readonly string[],
  temperatureK: number,
  pressurePa: number,
  options?: PrepareModelOptions,
): PureCompressibilities {
  const warnings: PhysicsWarning[] = []
  const compressibilities = gasIds.map((id, i) => {
    getGas(id, `gasIds[${i}]`)
    const state = evaluateState(prepareModel(model, { gasIds: [id], x: [1] }, options), temperatureK, pressurePa)
    for (const w of state.warnings) {
      if (w.code === 'condensation-risk' || w.code === 'two-phase-risk' || w.code === 'liquid-like-state') {
        warnings.push({
          code: 'not-gaseous',
          severity: 'caution',
          message: `Pure ${getGas(id).name} is not completely gaseous at this state: ISO 14912 volume fractions are not defined. ${w.message}`,
        })
      } else if (w.code === 'fallback-model') {
        warnings.push(w)
      }
    }
    return state.compressibility
  })
  return { compressibilities, warnings }
}

export interface VolumeFractions {
  readonly volumeFractions: readonly number[]
  readonly pureCompressibilities: readonly number[]
  readonly warnings: readonly PhysicsWarning[]
}

/**
 * Volume fractions of a mixture at (T, p), with pure-component Z_i from the chosen model (real gas).
 * The result depends on T and p; state them next to it.
 */
export function volumeFractions(model: ModelId, mixture: Mixture, temperatureK: number, pressurePa: number, options?: PrepareModelOptions): VolumeFractions {
  const valid = validateMixture(mixture)
  const pure = pureCompressibilities(model, valid.gasIds, temperatureK, pressurePa, options)
  return {
    volumeFractions: volumeFractionsFromMoleFractions(valid.x, pure.compressibilities),
    pureCompressibilities: pure.compressibilities,
    warnings: pure.warnings,
  }
}

// ---- concentrations ---------------------------------------------------------------------------------------

export interface Concentrations {
  /** c_i = x_i·p/(Z_mix·R·T), mol/m³ */
  readonly molarConcentrationsMolPerM3: readonly number[]
  /** γ_i = x_i·M_i·p/(Z_mix·R·T), kg/m³ (× 1e6 for mg/m³) */
  readonly massConcentrationsKgPerM3: readonly number[]
  readonly mixtureCompressibility: number
  readonly warnings: readonly PhysicsWarning[]
}

/**
 * Molar and mass concentrations of every component at (T, p) (ISO 14912), with Z of the mixture from the model.
 * @example concentrations('ideal', { gasIds: ['carbon-monoxide', 'nitrogen'], x: [50e-6, 1 - 50e-6] }, 293.15, 101325)
 *   .massConcentrationsKgPerM3[0] * 1e6 // ≈ 58.22 mg/m³
 */
export function concentrations(model: ModelId, mixture: Mixture, temperatureK: number, pressurePa: number, options?: PrepareModelOptions): Concentrations {
  const prepared = prepareModel(model, mixture, options)
  const state = evaluateState(prepared, temperatureK, pressurePa)
  const total = pressurePa / (state.compressibility * R * temperatureK)
  const molar = prepared.mixture.x.map((xi) => xi * total)
  return {
    molarConcentrationsMolPerM3: molar,
    massConcentrationsKgPerM3: molar.map((c, i) => (c * getGas(prepared.mixture.gasIds[i]).molarMassGPerMol) / 1000),
    mixtureCompressibility: state.compressibility,
    warnings: state.warnings,
  }
}

/**
 * Mass concentration (mg/m³) of one component from its amount fraction at (T, p), ideal gas:
 * γ = x·M·p/(R·T). The usual "ppm → mg/m³" conversion; for the real-gas value use `concentrations`.
 * @example massConcentrationMgPerM3FromFraction('carbon-monoxide', 50e-6, 293.15, 101325) // ≈ 58.22
 */
export function massConcentrationMgPerM3FromFraction(gasId: string, fraction: number, temperatureK: number, pressurePa: number): number {
  const gas = getGas(gasId)
  if (typeof fraction !== 'number' || !(fraction >= 0 && fraction <= 1)) {
    throw new PhysicsInputError(`A fraction must lie between 0 and 1, got ${fraction}.`, 'fraction')
  }
  const rho = prepareModel('ideal', { gasIds: [gasId], x: [1] }).densityMolPerM3(temperatureK, pressurePa)
  return fraction * rho * gas.molarMassGPerMol * 1000
}

/**
 * Amount fraction of one component from its mass concentration (mg/m³) at (T, p), ideal gas (inverse of
 * massConcentrationMgPerM3FromFraction).
 * @example fractionFromMassConcentrationMgPerM3('carbon-monoxide', 58.22, 293.15, 101325) // ≈ 5.0e-5
 */
export function fractionFromMassConcentrationMgPerM3(gasId: string, massConcentrationMgPerM3: number, temperatureK: number, pressurePa: number): number {
  if (typeof massConcentrationMgPerM3 !== 'number' || !(massConcentrationMgPerM3 >= 0) || !Number.isFinite(massConcentrationMgPerM3)) {
    throw new PhysicsInputError(`Mass concentration must be a finite number ≥ 0, got ${massConcentrationMgPerM3}.`, 'massConcentration')
  }
  return massConcentrationMgPerM3 / massConcentrationMgPerM3FromFraction(gasId, 1, temperatureK, pressurePa)
}

/**
 * Volume concentrations σ_i = x_i·Z_i/Z_mix (volume of pure i before mixing per volume of mixture) at (T, p).
 */
export function volumeConcentrations(
  model: ModelId,
  mixture: Mixture,
  temperatureK: number,
  pressurePa: number,
  options?: PrepareModelOptions,
): { readonly volumeConcentrations: readonly number[]; readonly warnings: readonly PhysicsWarning[] } {
  const prepared = prepareModel(model, mixture, options)
  const mixState = evaluateState(prepared, temperatureK, pressurePa)
  const pure = pureCompressibilities(model, prepared.mixture.gasIds, temperatureK, pressurePa, options)
  return {
    volumeConcentrations: prepared.mixture.x.map((xi, i) => (xi * pure.compressibilities[i]) / mixState.compressibility),
    warnings: [...mixState.warnings, ...pure.warnings],
  }
}
