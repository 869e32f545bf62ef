/**
 * Fuel / oxidiser / inert view of a composition, from the gas library's groups and ISO 10156 data.
 */
import { gasFacts } from './gas-model.ts'

/** A source or state counts as fuel- or oxidiser-bearing from this amount fraction on (common practice, no source). */
export const REACTIVE_PRESENCE_FRACTION = 0.01

export function isFuel(gasId: string): boolean {
  return gasFacts(gasId).groups.includes('fuel')
}

export function isOxidiser(gasId: string): boolean {
  return gasFacts(gasId).groups.includes('oxidiser')
}

/** Σ x over fuel components. */
export function fuelFraction(components: readonly string[], x: readonly number[]): number {
  let s = 0
  for (let i = 0; i < components.length; i++) if (x[i] > 0 && isFuel(components[i])) s += x[i]
  return s
}

/** Σ x·Ci over oxidising components: oxygen-equivalent content (Ci of O2 = 1; 1 where Ci is unknown). */
export function oxygenEquivalent(components: readonly string[], x: readonly number[]): number {
  let s = 0
  for (let i = 0; i < components.length; i++) {
    if (x[i] > 0 && isOxidiser(components[i])) s += x[i] * (gasFacts(components[i]).ci ?? 1)
  }
  return s
}

export type ReactiveClass = 'fuel' | 'oxidiser' | 'inert' | 'fuel+oxidiser'

export function reactiveClass(components: readonly string[], x: readonly number[]): ReactiveClass {
  const f = fuelFraction(components, x) >= REACTIVE_PRESENCE_FRACTION
  const o = oxygenEquivalent(components, x) >= REACTIVE_PRESENCE_FRACTION
  return f && o ? 'fuel+oxidiser' : f ? 'fuel' : o ? 'oxidiser' : 'inert'
}

export { lflMixFraction } from './gas-model.ts'
