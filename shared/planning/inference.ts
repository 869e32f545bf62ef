/**
 * What went into the cylinder, inferred from the readings actually taken: a cumulative pressure with
 * its gas temperature (amount from the equation of state on the composition after the step, solved
 * by fixed-point iteration because that composition depends on the amount), or a cumulative scale
 * reading (amount = added mass / molar mass of the source). DOMAIN §2.2 and §2.1.
 */
import { PlanningInputError } from './errors.ts'
import type { CompositionEos } from './gas-model.ts'

export type Reading =
  | { readonly kind: 'pressure'; readonly pressurePa: number; readonly temperatureK: number }
  | { readonly kind: 'scale'; readonly cumulativeMassKg: number }

export interface InferenceSource {
  readonly a: readonly number[]
  readonly molarMassKgPerMol: number
}

export interface InferredStep {
  readonly molesAdded: number
  readonly cumulativeMoles: number
  readonly cumulativeMassKg: number
  readonly x: number[]
}

/**
 * Amount in volume V of the cylinder contents after adding source `a` to `before` (component amounts,
 * mol), given the absolute pressure and temperature read after the addition.
 */
export function amountFromPressure(
  eosOf: (x: readonly number[]) => CompositionEos,
  volumeM3: number,
  before: readonly number[],
  a: readonly number[],
  pressurePa: number,
  temperatureK: number,
  guessX: readonly number[],
): number {
  const Nbefore = before.reduce((s, v) => s + v, 0)
  let x = [...guessX]
  let N = eosOf(x).densityMolPerM3(temperatureK, pressurePa) * volumeM3
  for (let it = 0; it < 30; it++) {
    const added = N - Nbefore
    x = before.map((v, i) => (v + a[i] * added) / N)
    const next = eosOf(x).densityMolPerM3(temperatureK, pressurePa) * volumeM3
    const done = Math.abs(next - N) <= 1e-13 * next
    N = next
    if (done) break
  }
  return N
}

/** Infer every step that has a reading; steps without one are taken as planned (`plannedMoles`). */
export function inferSteps(
  eosOf: (x: readonly number[]) => CompositionEos,
  volumeM3: number,
  start: readonly number[],
  sources: readonly InferenceSource[],
  readings: readonly (Reading | undefined)[],
  plannedMoles: readonly number[],
  field = 'actuals',
): InferredStep[] {
  const c = [...start]
  let massCum = 0
  const out: InferredStep[] = []
  readings.forEach((reading, k) => {
    const src = sources[k]
    const Nbefore = c.reduce((s, v) => s + v, 0)
    let added: number
    if (!reading) added = plannedMoles[k]
    else if (reading.kind === 'pressure') {
      const guess = c.map((v, i) => (v + src.a[i] * plannedMoles[k]) / (Nbefore + plannedMoles[k]))
      const N = amountFromPressure(eosOf, volumeM3, c, src.a, reading.pressurePa, reading.temperatureK, guess)
      added = N - Nbefore
    } else {
      added = (reading.cumulativeMassKg - massCum) / src.molarMassKgPerMol
    }
    if (!Number.isFinite(added) || added < 0) {
      throw new PlanningInputError(
        `the reading for step ${k + 1} implies gas was taken out (${added.toPrecision(3)} mol); check the reading and its temperature`,
        `${field}[${k}]`,
        422,
      )
    }
    for (let i = 0; i < c.length; i++) c[i] += src.a[i] * added
    massCum += added * src.molarMassKgPerMol
    const N = Nbefore + added
    out.push({ molesAdded: added, cumulativeMoles: N, cumulativeMassKg: massCum, x: c.map((v) => v / N) })
  })
  return out
}
