/**
 * Public types of the physics core. Everything inside shared/physics works in SI:
 * temperature K, pressure Pa (absolute), molar density mol/m³, molar mass kg/mol, volume m³.
 * Conversions to display units happen only at the API and UI edges (see units.ts).
 */

/** The equations of state Fillwright offers. */
export type ModelId = 'ideal' | 'van-der-waals' | 'srk' | 'peng-robinson' | 'gerg-2008'

export const MODEL_IDS: readonly ModelId[] = ['ideal', 'van-der-waals', 'srk', 'peng-robinson', 'gerg-2008']

/** A mixture: gas ids from the gas library and their mole fractions (0..1, summing to 1 ± 1e-6). */
export interface Mixture {
  readonly gasIds: readonly string[]
  readonly x: readonly number[]
}

/** A finding the physics core attaches to a result instead of hiding it. */
export interface PhysicsWarning {
  readonly code: string
  readonly severity: 'info' | 'caution' | 'block'
  readonly message: string
}

/** Result of evaluating a state. */
export interface StateResult {
  readonly model: ModelId
  readonly temperatureK: number
  readonly pressurePa: number
  readonly molarDensityMolPerM3: number
  readonly compressibility: number
  readonly molarMassKgPerMol: number
  readonly warnings: readonly PhysicsWarning[]
  /** set when a fallback replaced the requested model (e.g. 'gerg-2008' → 'peng-robinson'); `model` is the one used */
  readonly requestedModel?: ModelId
}

/** Thrown for input the core cannot evaluate (unknown gas, bad fractions, a gas a model does not cover, …). */
export class PhysicsInputError extends RangeError {
  constructor(
    message: string,
    /** the input field the message is about, e.g. "mixture[2].gas", "temperature", "model" */
    readonly field: string,
  ) {
    super(message)
    this.name = 'PhysicsInputError'
  }
}
