/**
 * Model dispatcher: one entry point for every equation of state Fillwright offers
 * ('ideal', 'van-der-waals', 'srk', 'peng-robinson', 'gerg-2008').
 *
 * prepareModel validates a mixture once and returns hot functions p(T, ρ), ρ(T, p) and Z(T, p) (no warnings, no
 * allocation for the cubic and ideal models). evaluateState / stateFromTP add the warnings a user must see:
 * range, two-phase risk, condensation screen, real-gas caveat, fallback model used.
 * Units: K, Pa (absolute), mol/m³.
 */
import { GAS_CONSTANT_J_PER_MOL_K as R } from './constants.ts'
import { type CubicFamily, type PreparedCubic, prepareCubic } from './eos/cubic-core.ts'
import { GERG_COMPONENT_IDS, gergCovers, gergDensity, gergPressure, gergValidity, type GergMixture, prepareGergMixture } from './eos/gerg-2008/index.ts'
import { type CubicModelId, interactionParameter } from './eos/kij.ts'
import { PENG_ROBINSON } from './eos/peng-robinson.ts'
import { SOAVE_REDLICH_KWONG } from './eos/soave-redlich-kwong.ts'
import { VAN_DER_WAALS } from './eos/van-der-waals.ts'
import { getGas } from './gases.ts'
import { expandPseudoComponents, mixtureMolarMassKgPerMol, validateMixture } from './mixture.ts'
import { MODEL_IDS, type Mixture, type ModelId, PhysicsInputError, type PhysicsWarning, type StateResult } from './types.ts'
import { vapourPressurePa } from './vapour-pressure.ts'

export interface PrepareModelOptions {
  /** with model 'gerg-2008': use a cubic equation for the whole mixture when a gas is outside GERG-2008 */
  readonly allowCubicFallback?: boolean
  /** the cubic used as fallback (default 'peng-robinson') */
  readonly fallbackModel?: 'peng-robinson' | 'srk'
}

export interface PreparedModel {
  /** the model actually evaluated (differs from requestedModel when a fallback was used) */
  readonly model: ModelId
  readonly requestedModel: ModelId
  /** the validated mixture, fractions rescaled to sum to 1 (pseudo-components such as air kept) */
  readonly mixture: Mixture
  /** the mixture the equation of state sees: pseudo-components expanded into their constituents */
  readonly componentMixture: Mixture
  readonly molarMassKgPerMol: number
  /** findings made while preparing (e.g. fallback used) */
  readonly warnings: readonly PhysicsWarning[]
  /** p(T, ρ) in Pa */
  pressurePa(temperatureK: number, rhoMolPerM3: number): number
  /** vapour-like (gas) root ρ(T, p) in mol/m³ */
  densityMolPerM3(temperatureK: number, pressurePa: number): number
  /** Z(T, p) of the vapour-like root */
  compressibility(temperatureK: number, pressurePa: number): number
}

/** model internals kept beside each prepared model, for evaluateState */
const cubicCache = new WeakMap<PreparedModel, PreparedCubic>()
const gergCache = new WeakMap<PreparedModel, GergMixture>()
const estimatorCache = new WeakMap<PreparedModel, PreparedCubic>()

const CUBIC_FAMILIES: Readonly<Record<CubicModelId, CubicFamily>> = {
  'van-der-waals': VAN_DER_WAALS,
  srk: SOAVE_REDLICH_KWONG,
  'peng-robinson': PENG_ROBINSON,
}

/** Temperature and pressure range over which this library's cubic models were checked against references. */
export const CUBIC_CHECKED_RANGE = Object.freeze({ minTemperatureK: 100, maxTemperatureK: 1000, maxPressurePa: 100e6 })

/** |Z − 1| above which ideal-gas results carry a real-gas caveat (0.5 %). Common practice, no source. */
export const REAL_GAS_CAVEAT_THRESHOLD = 0.005

function checkModel(model: unknown): asserts model is ModelId {
  if (typeof model !== 'string' || !(MODEL_IDS as readonly string[]).includes(model)) {
    throw new PhysicsInputError(`Unknown model "${String(model)}". Use one of: ${MODEL_IDS.join(', ')}.`, 'model')
  }
}

/** @throws PhysicsInputError (field 'temperature') unless 0 < T < ∞ */
export function checkTemperatureK(temperatureK: number): void {
  if (typeof temperatureK !== 'number' || !(temperatureK > 0) || temperatureK === Number.POSITIVE_INFINITY) {
    throw new PhysicsInputError(`Temperature must be a finite number above 0 K, got ${temperatureK}.`, 'temperature')
  }
}

/** @throws PhysicsInputError (field 'pressure') unless 0 < p < ∞ (absolute pressure) */
export function checkPressurePa(pressurePa: number): void {
  if (typeof pressurePa !== 'number' || !(pressurePa > 0) || pressurePa === Number.POSITIVE_INFINITY) {
    throw new PhysicsInputError(`Absolute pressure must be a finite number above 0 Pa, got ${pressurePa}.`, 'pressure')
  }
}

/** @throws PhysicsInputError (field 'molarDensity') unless 0 < ρ < ∞ */
function checkDensity(rho: number): void {
  if (typeof rho !== 'number' || !(rho > 0) || rho === Number.POSITIVE_INFINITY) {
    throw new PhysicsInputError(`Molar density must be a finite number above 0 mol/m³, got ${rho}.`, 'molarDensity')
  }
}

/** Prepares a cubic model for a validated, expanded mixture (k_ij from eos/kij.ts). */
export function prepareCubicModel(model: CubicModelId, componentMixture: Mixture): PreparedCubic {
  const { gasIds, x } = componentMixture
  const n = gasIds.length
  const kij = new Float64Array(n * n)
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) kij[i * n + j] = interactionParameter(model, gasIds[i], gasIds[j])
  }
  return prepareCubic(
    CUBIC_FAMILIES[model],
    gasIds.map((id) => getGas(id)),
    x,
    kij,
  )
}

function modelLabel(model: ModelId): string {
  switch (model) {
    case 'ideal':
      return 'ideal gas'
    case 'gerg-2008':
      return 'GERG-2008'
    default:
      return CUBIC_FAMILIES[model].name
  }
}

/**
 * Validates the mixture and prepares the model once.
 * @throws PhysicsInputError: 'model' (unknown model, or gases outside GERG-2008 without allowCubicFallback),
 *   'mixture' / 'mixture[i].gas' / 'mixture[i].fraction' (see validateMixture)
 */
export function prepareModel(model: ModelId, mixture: Mixture, options: PrepareModelOptions = {}): PreparedModel {
  checkModel(model)
  const valid = validateMixture(mixture)
  const components = expandPseudoComponents(valid)
  const molarMassKgPerMol = mixtureMolarMassKgPerMol(components)
  const warnings: PhysicsWarning[] = []
  let used: ModelId = model

  if (model === 'gerg-2008' && !gergCovers(components.gasIds)) {
    const outside = components.gasIds.filter((id) => !GERG_COMPONENT_IDS.includes(id))
    if (!options.allowCubicFallback) {
      throw new PhysicsInputError(`GERG-2008 does not cover ${outside.join(', ')}. Choose a cubic model or allow the cubic fallback.`, 'model')
    }
    const fallback = options.fallbackModel ?? 'peng-robinson'
    if (fallback !== 'peng-robinson' && fallback !== 'srk') {
      throw new PhysicsInputError(`Fallback model must be 'peng-robinson' or 'srk', got "${String(fallback)}".`, 'model')
    }
    used = fallback
    warnings.push({
      code: 'fallback-model',
      severity: 'caution',
      message:
        `GERG-2008 does not cover ${outside.join(', ')}; the ${modelLabel(fallback)} equation was used for the whole ` +
        'mixture. Cubic equations are typically 2–4 % off in Z at 200 bar for N2, Ar, He and CH4 (comparison with ' +
        'GERG-2008 in the Fillwright domain brief, §8).',
    })
  }

  const base = { model: used, requestedModel: model, mixture: valid, componentMixture: components, molarMassKgPerMol, warnings }

  if (used === 'ideal') {
    return {
      ...base,
      pressurePa(temperatureK, rho) {
        checkTemperatureK(temperatureK)
        checkDensity(rho)
        return rho * R * temperatureK
      },
      densityMolPerM3(temperatureK, pressurePa) {
        checkTemperatureK(temperatureK)
        checkPressurePa(pressurePa)
        return pressurePa / (R * temperatureK)
      },
      compressibility(temperatureK, pressurePa) {
        checkTemperatureK(temperatureK)
        checkPressurePa(pressurePa)
        return 1
      },
    }
  }

  if (used === 'gerg-2008') {
    const m = prepareGergMixture(components.gasIds, components.x)
    const prepared: PreparedModel = {
      ...base,
      pressurePa(temperatureK, rho) {
        checkTemperatureK(temperatureK)
        checkDensity(rho)
        return gergPressure(m, temperatureK, rho).pressurePa
      },
      densityMolPerM3(temperatureK, pressurePa) {
        return gergDensity(m, temperatureK, pressurePa).molarDensityMolPerM3
      },
      compressibility(temperatureK, pressurePa) {
        return gergDensity(m, temperatureK, pressurePa).compressibility
      },
    }
    gergCache.set(prepared, m)
    return prepared
  }

  const cubic = prepareCubicModel(used, components)
  const prepared: PreparedModel = {
    ...base,
    pressurePa(temperatureK, rho) {
      checkTemperatureK(temperatureK)
      checkDensity(rho)
      return cubic.pressurePa(temperatureK, rho)
    },
    densityMolPerM3(temperatureK, pressurePa) {
      checkTemperatureK(temperatureK)
      checkPressurePa(pressurePa)
      return cubic.densityMolPerM3(temperatureK, pressurePa)
    },
    compressibility(temperatureK, pressurePa) {
      checkTemperatureK(temperatureK)
      checkPressurePa(pressurePa)
      return cubic.compressibility(temperatureK, pressurePa)
    },
  }
  cubicCache.set(prepared, cubic)
  return prepared
}

// ---- warnings ---------------------------------------------------------------------------------------------

function cubicOf(prepared: PreparedModel): PreparedCubic {
  let cubic = cubicCache.get(prepared)
  if (cubic === undefined) {
    cubic = prepareCubicModel(prepared.model as CubicModelId, prepared.componentMixture)
    cubicCache.set(prepared, cubic)
  }
  return cubic
}

function gergOf(prepared: PreparedModel): GergMixture {
  let m = gergCache.get(prepared)
  if (m === undefined) {
    m = prepareGergMixture(prepared.componentMixture.gasIds, prepared.componentMixture.x)
    gergCache.set(prepared, m)
  }
  return m
}

function realGasEstimator(prepared: PreparedModel): PreparedCubic {
  let cubic = estimatorCache.get(prepared)
  if (cubic === undefined) {
    cubic = prepareCubicModel('peng-robinson', prepared.componentMixture)
    estimatorCache.set(prepared, cubic)
  }
  return cubic
}

function formatBar(pressurePa: number): string {
  return `${(pressurePa / 1e5).toPrecision(4)} bar`
}

/**
 * Raoult-type condensation screen: a component whose partial pressure x_i·p exceeds its vapour pressure at T may
 * condense (common practice for fill planning; a true dew point needs a phase-equilibrium calculation).
 */
export function condensationWarnings(componentMixture: Mixture, temperatureK: number, pressurePa: number): PhysicsWarning[] {
  const warnings: PhysicsWarning[] = []
  for (let i = 0; i < componentMixture.gasIds.length; i++) {
    const xi = componentMixture.x[i]
    if (xi === 0) continue
    const gas = getGas(componentMixture.gasIds[i])
    const partial = xi * pressurePa
    if (temperatureK >= gas.criticalTemperatureK) continue
    const saturation = vapourPressurePa(gas.id, temperatureK)
    if (saturation === null) {
      if (gas.hazards.includes('condensable')) {
        warnings.push({
          code: 'condensation-unchecked',
          severity: 'caution',
          message:
            `${gas.name} is below its critical temperature at ${temperatureK} K and the library has no vapour-pressure ` +
            'correlation for this temperature: condensation was not checked.',
        })
      }
      continue
    }
    if (partial > saturation) {
      warnings.push({
        code: 'condensation-risk',
        severity: 'caution',
        message:
          `Partial pressure of ${gas.name} (${formatBar(partial)}) exceeds its vapour pressure at ${temperatureK} K ` +
          `(${formatBar(saturation)}): it may condense. Results for a single gas phase are then not valid.`,
      })
    }
  }
  return warnings
}

/**
 * Evaluates a prepared model at (T, p) and collects the warnings a user must see.
 * @throws PhysicsInputError for T ≤ 0 ('temperature'), p ≤ 0 ('pressure'), or a GERG-2008 state outside its
 *   extended range
 */
export function evaluateState(prepared: PreparedModel, temperatureK: number, pressurePa: number): StateResult {
  checkTemperatureK(temperatureK)
  checkPressurePa(pressurePa)
  const warnings: PhysicsWarning[] = [...prepared.warnings]
  const model = prepared.model
  const components = prepared.componentMixture
  let compressibility: number
  let rho: number

  if (model === 'ideal') {
    compressibility = 1
    rho = pressurePa / (R * temperatureK)
    const estimate = realGasEstimator(prepared).compressibility(temperatureK, pressurePa)
    if (Math.abs(estimate - 1) > REAL_GAS_CAVEAT_THRESHOLD) {
      warnings.push({
        code: 'ideal-gas-deviation',
        severity: 'caution',
        message:
          `The ideal-gas model ignores a real-gas deviation of about ${(Math.abs(estimate - 1) * 100).toFixed(1)} % ` +
          'at this state (Peng–Robinson estimate of Z). Use a real-gas model for fill targets.',
      })
    }
  } else if (model === 'gerg-2008') {
    warnings.push(...gergValidity(temperatureK, pressurePa))
    const solution = gergDensity(gergOf(prepared), temperatureK, pressurePa)
    compressibility = solution.compressibility
    rho = solution.molarDensityMolPerM3
    if (solution.root === 'dense') {
      warnings.push({
        code: 'liquid-like-state',
        severity: 'caution',
        message: 'No gas root exists at this state: GERG-2008 returned a dense (liquid-like) root.',
      })
    }
  } else {
    const cubic = cubicOf(prepared)
    const solution = cubic.solve(temperatureK, pressurePa)
    compressibility = solution.compressibility
    rho = solution.molarDensityMolPerM3
    if (solution.rootCount === 3) {
      if (solution.stableRoot === 'liquid') {
        warnings.push({
          code: 'two-phase-risk',
          severity: 'caution',
          message:
            `The ${modelLabel(model)} equation has a liquid-like root of lower Gibbs energy at this state: the fluid ` +
            'may be liquid or two-phase. The vapour-like root was reported.',
        })
      } else {
        warnings.push({
          code: 'near-saturation',
          severity: 'info',
          message: `The ${modelLabel(model)} equation also has a liquid-like root here: the state is close to saturation.`,
        })
      }
    } else {
      let pseudoCriticalK = 0
      for (let i = 0; i < components.gasIds.length; i++) {
        pseudoCriticalK += components.x[i] * getGas(components.gasIds[i]).criticalTemperatureK
      }
      if (solution.packing > cubic.criticalPacking && temperatureK < pseudoCriticalK) {
        warnings.push({
          code: 'liquid-like-state',
          severity: 'caution',
          message:
            `The only root of the ${modelLabel(model)} equation is liquid-like (denser than the critical density, ` +
            'below the pseudo-critical temperature): the fluid is probably liquid.',
        })
      }
    }
    const range = CUBIC_CHECKED_RANGE
    if (temperatureK < range.minTemperatureK || temperatureK > range.maxTemperatureK || pressurePa > range.maxPressurePa) {
      warnings.push({
        code: 'outside-checked-range',
        severity: 'caution',
        message:
          `T = ${temperatureK} K, p = ${formatBar(pressurePa)} is outside the range in which Fillwright checks its cubic ` +
          `models (${range.minTemperatureK}–${range.maxTemperatureK} K, ≤ ${formatBar(range.maxPressurePa)}).`,
      })
    }
    if (pressurePa > 1e6) {
      warnings.push({
        code: 'cubic-accuracy',
        severity: 'info',
        message:
          `${modelLabel(model)} is a cubic equation without volume translation: expect Z errors of a few per cent at ` +
          'cylinder pressures (more for He and H2); GERG-2008 is the reference where it covers the mixture.',
      })
    }
  }
  warnings.push(...condensationWarnings(components, temperatureK, pressurePa))

  const result: StateResult = {
    model,
    temperatureK,
    pressurePa,
    molarDensityMolPerM3: rho,
    compressibility,
    molarMassKgPerMol: prepared.molarMassKgPerMol,
    warnings,
    ...(prepared.requestedModel !== model ? { requestedModel: prepared.requestedModel } : {}),
  }
  return result
}

/**
 * State of a mixture at temperature (K) and absolute pressure (Pa): density, Z, molar mass and warnings.
 * @example stateFromTP('peng-robinson', { gasIds: ['nitrogen'], x: [1] }, 300, 1e5).compressibility // ≈ 1.000 (ideal-gas limit)
 */
export function stateFromTP(model: ModelId, mixture: Mixture, temperatureK: number, pressurePa: number, options?: PrepareModelOptions): StateResult {
  return evaluateState(prepareModel(model, mixture, options), temperatureK, pressurePa)
}

/**
 * Absolute pressure (Pa) of a mixture at temperature (K) and molar density (mol/m³).
 * Cubic models can return a negative pressure inside their two-phase loop; callers planning gas fills should
 * check the state with stateFromTP.
 * @example pressureFromTRho('ideal', { gasIds: ['argon'], x: [1] }, 273.15, 44.615) // ≈ 101325
 */
export function pressureFromTRho(model: ModelId, mixture: Mixture, temperatureK: number, molarDensityMolPerM3: number, options?: PrepareModelOptions): number {
  return prepareModel(model, mixture, options).pressurePa(temperatureK, molarDensityMolPerM3)
}
