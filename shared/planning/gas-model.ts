/**
 * The planning engine's only door into the physics core. Every call into shared/physics goes through
 * here, so the rest of the planner works with plain numbers and arrays and does not care how the
 * physics core names things.
 */
import {
  findIncompatibilities,
  getGas,
  iso10156Flammability,
  iso10156OxidisingPower,
  leChatelierLflPercent,
  type Mixture,
  mixtureLc50,
  prepareModel,
  vapourPressureEstimatePa,
  vapourPressurePa,
} from '../physics/index.ts'
import { type ModelId, PhysicsInputError } from '../physics/index.ts'
import { PlanningInputError } from './errors.ts'

/** Equation of state for one fixed composition. */
export interface CompositionEos {
  /** absolute pressure, Pa, at temperature K and molar density mol/m³ */
  pressurePa(temperatureK: number, densityMolPerM3: number): number
  /** molar density, mol/m³, of the gas phase at temperature K and absolute pressure Pa */
  densityMolPerM3(temperatureK: number, pressurePa: number): number
}

export interface GasFacts {
  readonly id: string
  readonly name: string
  readonly formula: string
  readonly molarMassKgPerMol: number
  readonly criticalTemperatureK: number
  readonly groups: readonly string[]
  readonly hazards: readonly string[]
  readonly lflPercent: number | null
  readonly tciPercent: number | null
  readonly kEquivalent: number | null
  readonly ci: number | null
  readonly lc50PpmV: number | null
  readonly gergCovered: boolean
  /** constituents of a pseudo-component (air); absent for a real gas */
  readonly composition: readonly { readonly gasId: string; readonly x: number }[] | null
}

const gasCache = new Map<string, GasFacts>()

/** Facts about one gas of the library; PlanningInputError (400) for an unknown id. */
export function gasFacts(gasId: string, field = 'gas'): GasFacts {
  const hit = gasCache.get(gasId)
  if (hit) return hit
  let gas: ReturnType<typeof getGas>
  try {
    gas = getGas(gasId, field)
  } catch (error) {
    if (error instanceof PhysicsInputError) throw new PlanningInputError(`unknown gas "${gasId}"`, field, 400)
    throw error
  }
  const facts: GasFacts = {
    id: gas.id,
    name: gas.name,
    formula: gas.formula,
    molarMassKgPerMol: gas.molarMassGPerMol / 1000,
    criticalTemperatureK: gas.criticalTemperatureK,
    groups: gas.groups,
    hazards: gas.hazards,
    lflPercent: gas.flammability?.lflPercent ?? null,
    tciPercent: gas.iso10156?.tciPercent ?? null,
    kEquivalent: gas.iso10156?.kEquivalent ?? null,
    ci: gas.iso10156?.ci ?? null,
    lc50PpmV: gas.toxicity?.lc50PpmV ?? null,
    gergCovered: gas.gerg2008,
    composition: gas.composition ?? null,
  }
  gasCache.set(gasId, facts)
  return facts
}

/** Vapour pressure, Pa, or null outside the correlation's range or above the critical temperature. */
export function saturationPressurePa(gasId: string, temperatureK: number): number | null {
  return vapourPressurePa(gasId, temperatureK)
}

/**
 * Vapour pressure for the condensation screen: the library correlation where it has range, else the
 * corresponding-states estimate (flagged `estimated`) below the critical temperature; null above Tc.
 */
export function saturationPressureForScreenPa(gasId: string, temperatureK: number): { pressurePa: number; estimated: boolean } | null {
  const facts = gasFacts(gasId)
  if (facts.composition || temperatureK >= facts.criticalTemperatureK) return null
  const p = vapourPressurePa(gasId, temperatureK)
  if (p !== null) return { pressurePa: p, estimated: false }
  const e = vapourPressureEstimatePa(gasId, temperatureK)
  return e === null ? null : { pressurePa: e, estimated: true }
}

export interface PreparedComposition {
  readonly eos: CompositionEos
  /** notes from the physics core, e.g. that a cubic fallback replaced GERG-2008 for an uncovered gas */
  readonly notes: readonly string[]
}

/**
 * Prepare the model for a composition (zero fractions dropped). GERG-2008 falls back to a cubic model
 * for gases it does not cover only when `allowCubicFallback` is true; otherwise a PlanningInputError
 * (422) names the gas.
 */
export function prepareComposition(model: ModelId, gasIds: readonly string[], x: readonly number[], allowCubicFallback = true): PreparedComposition {
  const ids: string[] = []
  const xs: number[] = []
  let sum = 0
  for (let i = 0; i < gasIds.length; i++) {
    if (x[i] > 0) {
      ids.push(gasIds[i])
      xs.push(x[i])
      sum += x[i]
    }
  }
  for (let i = 0; i < xs.length; i++) xs[i] /= sum
  const notes: string[] = []
  try {
    const prepared = prepareModel(model, { gasIds: ids, x: xs }, { allowCubicFallback })
    if (prepared.model !== prepared.requestedModel) {
      for (const w of prepared.warnings) notes.push(w.message)
      if (prepared.warnings.length === 0) notes.push(`${prepared.requestedModel} replaced by ${prepared.model}`)
    }
    return { eos: prepared, notes }
  } catch (error) {
    if (error instanceof PhysicsInputError) {
      throw new PlanningInputError(`${model}: ${error.message}`, 'model', 422)
    }
    throw error
  }
}

/** The non-zero part of a composition as a physics-core Mixture, renormalised. */
function asMixture(components: readonly string[], x: readonly number[]): Mixture {
  const gasIds: string[] = []
  const xs: number[] = []
  let sum = 0
  for (let i = 0; i < components.length; i++) {
    if (x[i] > 0) {
      gasIds.push(components[i])
      xs.push(x[i])
      sum += x[i]
    }
  }
  return { gasIds, x: xs.map((v) => v / sum) }
}

/**
 * ISO 10156 flammability sum Σ 100·A'ᵢ/Tciᵢ of a composition (physics core, fuel + inert method;
 * oxidisers left out). Above 1: flammable in air. Null for an empty composition.
 */
export function iso10156FlammabilityIndex(components: readonly string[], x: readonly number[]): number | null {
  const m = asMixture(components, x)
  if (m.gasIds.length === 0) return null
  const index = iso10156Flammability(m).index
  return Number.isFinite(index) ? index : null
}

/** ISO 10156 oxidising power (fraction; air ≈ 0.21) of a composition. */
export function oxidisingPower(components: readonly string[], x: readonly number[]): number {
  const m = asMixture(components, x)
  return m.gasIds.length === 0 ? 0 : iso10156OxidisingPower(m).oxidisingPower
}

/** LC50 of a composition by additivity, ppm V (ADR 2.2.2.1.5); null without a toxic component. */
export function lc50MixPpm(components: readonly string[], x: readonly number[]): number | null {
  const m = asMixture(components, x)
  return m.gasIds.length === 0 ? null : mixtureLc50(m).lc50PpmV
}

/** Le Chatelier lower flammability limit in air of the fuel part, amount fraction; null without fuel. */
export function lflMixFraction(components: readonly string[], x: readonly number[]): number | null {
  const m = asMixture(components, x)
  if (m.gasIds.length === 0) return null
  const lfl = leChatelierLflPercent(m)
  return lfl === null ? null : lfl / 100
}

/**
 * Pairs of gases that react with each other and must not share a cylinder (the physics core's list,
 * severity 'block'). Fuel–oxidiser pairs are judged by the planner's state and sequence checks instead.
 */
export function incompatibilities(gasIds: readonly string[]): { gasA: string; gasB: string; reason: string; source: string }[] {
  return findIncompatibilities(gasIds)
    .filter((f) => f.severity === 'block')
    .map((f) => ({ gasA: f.a, gasB: f.b, reason: f.reason, source: f.source }))
}
