/**
 * Mixture validation, normalisation and pseudo-component expansion.
 * A Mixture is { gasIds, x } with amount (mole) fractions in 0..1 that sum to 1 within MIXTURE_SUM_TOLERANCE.
 */
import { getGas, isKnownGas } from './gases.ts'
import { type Mixture, PhysicsInputError } from './types.ts'

/** Allowed deviation of Σx from 1 (matches the Mixture contract in types.ts). */
export const MIXTURE_SUM_TOLERANCE = 1e-6

/**
 * Checks a mixture and returns a copy whose fractions are rescaled to sum to exactly 1.
 * @throws PhysicsInputError with field 'mixture' (shape, empty, sum), 'mixture[i].gas' (unknown or repeated id)
 *   or 'mixture[i].fraction' (not a finite number in 0..1)
 */
export function validateMixture(mixture: Mixture): Mixture {
  if (mixture === null || typeof mixture !== 'object' || !Array.isArray(mixture.gasIds) || !Array.isArray(mixture.x)) {
    throw new PhysicsInputError('A mixture needs a list of gas ids and a list of mole fractions.', 'mixture')
  }
  const { gasIds, x } = mixture
  if (gasIds.length === 0) throw new PhysicsInputError('A mixture needs at least one gas.', 'mixture')
  if (gasIds.length !== x.length) {
    throw new PhysicsInputError(`The mixture lists ${gasIds.length} gases but ${x.length} mole fractions.`, 'mixture')
  }
  const seen = new Set<string>()
  let sum = 0
  for (let i = 0; i < gasIds.length; i++) {
    const id = gasIds[i]
    if (typeof id !== 'string' || !isKnownGas(id)) {
      throw new PhysicsInputError(`Unknown gas "${String(id)}" at position ${i + 1}.`, `mixture[${i}].gas`)
    }
    if (seen.has(id)) {
      throw new PhysicsInputError(`Gas "${id}" appears more than once; combine its fractions.`, `mixture[${i}].gas`)
    }
    seen.add(id)
    const xi = x[i]
    if (typeof xi !== 'number' || !Number.isFinite(xi) || xi < 0 || xi > 1) {
      throw new PhysicsInputError(`Mole fraction of ${id} must be a number from 0 to 1 (not a percentage), got ${String(xi)}.`, `mixture[${i}].fraction`)
    }
    sum += xi
  }
  if (Math.abs(sum - 1) > MIXTURE_SUM_TOLERANCE) {
    throw new PhysicsInputError(`Mole fractions must sum to 1 (±${MIXTURE_SUM_TOLERANCE}); they sum to ${sum}.`, 'mixture')
  }
  return { gasIds: [...gasIds], x: x.map((xi) => xi / sum) }
}

/**
 * Replaces pseudo-components (air) by their constituents and merges repeated constituents, keeping the order of
 * first appearance. The input must already be valid (see validateMixture).
 * @example expandPseudoComponents({ gasIds: ['air'], x: [1] }) // { gasIds: ['nitrogen','oxygen','argon'], x: [0.7812, 0.2096, 0.0092] }
 */
export function expandPseudoComponents(mixture: Mixture): Mixture {
  const hasPseudo = mixture.gasIds.some((id) => getGas(id).composition !== undefined)
  if (!hasPseudo) return mixture
  const totals = new Map<string, number>()
  const add = (id: string, amount: number): void => {
    totals.set(id, (totals.get(id) ?? 0) + amount)
  }
  for (let i = 0; i < mixture.gasIds.length; i++) {
    const gas = getGas(mixture.gasIds[i])
    if (gas.composition === undefined) add(gas.id, mixture.x[i])
    else for (const part of gas.composition) add(part.gasId, mixture.x[i] * part.x)
  }
  return { gasIds: [...totals.keys()], x: [...totals.values()] }
}

/** Molar mass of a (valid) mixture in kg/mol: M = Σ x_i·M_i. */
export function mixtureMolarMassKgPerMol(mixture: Mixture): number {
  let m = 0
  for (let i = 0; i < mixture.gasIds.length; i++) m += mixture.x[i] * getGas(mixture.gasIds[i]).molarMassGPerMol
  return m / 1000
}

/** A one-gas mixture. */
export function pureGas(gasId: string): Mixture {
  return { gasIds: [gasId], x: [1] }
}
