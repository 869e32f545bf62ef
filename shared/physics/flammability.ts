/**
 * Classification calculations from the composition:
 * - ISO 10156 flammability of a fuel + inert mixture in air: with equivalent contents
 *   A'_i = A_i / (Σ A + Σ K_k·B_k), the mixture is flammable when Σ 100·A'_i / Tci_i > 1.
 * - ISO 10156 oxidising power: OP = Σ x_i·C_i / (Σ x_i + Σ K_k·B_k) over oxidisers i and inerts k
 *   (fuels excluded); "more oxidising than air" when OP > 0.235.
 * - LC50 of a mixture (ADR 2.2.2.1.5): LC50_mix = 1 / Σ (x_i / LC50_i); toxic (Division 2.3) when ≤ 5000 ppm.
 * - Lower flammability limit of the fuel part by Le Chatelier's rule.
 *
 * The method structure and the Tci, K, Ci and LC50 values are recalled from ISO 10156:2017 / ADR P200 / ISO 10298
 * (see each gas's `sources`); they are marked unverified until checked against the purchased documents.
 * ISO 10156 works at atmospheric conditions and does not cover safe preparation under pressure; mixtures holding
 * both fuel and oxidiser need a test or an expert assessment. Results are decision support: defer to local codes
 * and licensed practice.
 */
import { ISO_10156_FLAMMABILITY_LIMIT, ISO_10156_OXIDISING_POWER_LIMIT, TOXIC_LC50_LIMIT_PPMV } from './constants.ts'
import { type DataStatus, getGas } from './gases.ts'
import { expandPseudoComponents, validateMixture } from './mixture.ts'
import type { Mixture, PhysicsWarning } from './types.ts'

function worstStatus(statuses: readonly DataStatus[]): DataStatus {
  if (statuses.includes('unverified')) return 'unverified'
  if (statuses.includes('published')) return 'published'
  return 'definition'
}

const UNVERIFIED_WARNING: PhysicsWarning = {
  code: 'unverified-coefficients',
  severity: 'caution',
  message:
    'Coefficients used here are recalled from the standard and not yet verified against its purchased text: ' +
    'confirm the classification before it drives labels, valve outlets or transport documents.',
}

export interface FlammabilityTerm {
  readonly gasId: string
  /** amount fraction in the (air-expanded) mixture */
  readonly fraction: number
  /** A'_i */
  readonly equivalentFraction: number
  /** Tci (or the LFL substituted for it), % */
  readonly tciPercent: number
  readonly tciSubstitutedByLfl: boolean
  /** 100·A'_i/Tci_i */
  readonly term: number
}

export interface FlammabilityResult {
  /** true when the ISO 10156 sum exceeds 1 (flammable in air) */
  readonly flammable: boolean
  /** Σ 100·A'_i/Tci_i (0 when there is no fuel) */
  readonly index: number
  readonly terms: readonly FlammabilityTerm[]
  /** Σ A + Σ K·B */
  readonly equivalentTotal: number
  /** false when the mixture also contains oxidisers: the calculation method does not apply */
  readonly methodApplicable: boolean
  readonly dataStatus: DataStatus
  readonly warnings: readonly PhysicsWarning[]
}

/**
 * ISO 10156 flammability of a mixture in air (calculation method for fuels in inert gases).
 * Fuels without a tabulated Tci use their LFL instead (conservative: LFL < Tci for every gas that has both).
 * Components that are neither fuel nor inert with a K value are left out of the denominator (conservative).
 * @example iso10156Flammability({ gasIds: ['hydrogen', 'nitrogen'], x: [0.05, 0.95] }).index // ≈ 0.877
 */
export function iso10156Flammability(mixture: Mixture): FlammabilityResult {
  const expanded = expandPseudoComponents(validateMixture(mixture))
  const warnings: PhysicsWarning[] = []
  const statuses: DataStatus[] = []
  let fuelTotal = 0
  let inertTotal = 0
  let oxidiserPresent = false
  const ignored: string[] = []
  const fuels: { gasId: string; fraction: number; tci: number; substituted: boolean }[] = []
  for (let i = 0; i < expanded.gasIds.length; i++) {
    const gas = getGas(expanded.gasIds[i])
    const xi = expanded.x[i]
    if (xi === 0) continue
    if (gas.hazards.includes('flammable')) {
      fuelTotal += xi
      const tci = gas.iso10156?.tciPercent
      if (tci !== undefined) {
        statuses.push(gas.iso10156?.status ?? 'unverified')
        fuels.push({ gasId: gas.id, fraction: xi, tci, substituted: false })
      } else if (gas.flammability !== null) {
        statuses.push('published')
        fuels.push({ gasId: gas.id, fraction: xi, tci: gas.flammability.lflPercent, substituted: true })
        warnings.push({
          code: 'tci-substituted-by-lfl',
          severity: 'caution',
          message: `No Tci is tabulated for ${gas.name}; its lower flammability limit (${gas.flammability.lflPercent} %) was used instead (conservative).`,
        })
      } else {
        fuels.push({ gasId: gas.id, fraction: xi, tci: 0, substituted: true })
      }
    } else if (gas.iso10156?.kEquivalent !== undefined) {
      inertTotal += gas.iso10156.kEquivalent * xi
      statuses.push(gas.iso10156.status)
    } else {
      if (gas.iso10156?.ci !== undefined || gas.groups.includes('oxidiser')) oxidiserPresent = true
      ignored.push(gas.name)
    }
  }
  const equivalentTotal = fuelTotal + inertTotal
  const terms: FlammabilityTerm[] = fuels.map((f) => {
    const equivalentFraction = f.fraction / equivalentTotal
    const term = f.tci > 0 ? (100 * equivalentFraction) / f.tci : Number.POSITIVE_INFINITY
    return {
      gasId: f.gasId,
      fraction: f.fraction,
      equivalentFraction,
      tciPercent: f.tci,
      tciSubstitutedByLfl: f.substituted,
      term,
    }
  })
  const index = terms.reduce((s, t) => s + t.term, 0)
  const methodApplicable = !(oxidiserPresent && fuels.length > 0)
  if (!methodApplicable) {
    warnings.push({
      code: 'fuel-with-oxidiser',
      severity: 'caution',
      message:
        'The mixture holds fuel and oxidiser: the ISO 10156 calculation for fuels in inert gases does not decide its ' +
        'flammability. A test or an expert assessment is needed; prepare it only under an oxidant–fuel feasibility ' +
        'study (EIGA Doc 139 / CGA P-58) and local codes.',
    })
  }
  if (ignored.length > 0 && fuels.length > 0) {
    warnings.push({
      code: 'components-without-coefficient',
      severity: 'info',
      message: `${ignored.join(', ')}: no inert coefficient K; left out of the denominator (conservative).`,
    })
  }
  const dataStatus = worstStatus(statuses)
  if (dataStatus === 'unverified' && fuels.length > 0) warnings.push(UNVERIFIED_WARNING)
  return {
    flammable: index > ISO_10156_FLAMMABILITY_LIMIT,
    index,
    terms,
    equivalentTotal,
    methodApplicable,
    dataStatus,
    warnings,
  }
}

export interface OxidisingPowerResult {
  /** OP as a fraction (air ≈ 0.21) */
  readonly oxidisingPower: number
  /** OP > 0.235: more oxidising than air */
  readonly oxidising: boolean
  readonly dataStatus: DataStatus
  readonly warnings: readonly PhysicsWarning[]
}

/**
 * ISO 10156 oxidising power OP = Σ x_i·C_i / (Σ x_i + Σ K_k·B_k) (oxidisers i, inerts k; fuels excluded; other
 * components left out of the denominator, which raises OP: conservative).
 * @example iso10156OxidisingPower({ gasIds: ['nitrous-oxide', 'oxygen'], x: [0.5, 0.5] }).oxidisingPower // 0.8
 */
export function iso10156OxidisingPower(mixture: Mixture): OxidisingPowerResult {
  const expanded = expandPseudoComponents(validateMixture(mixture))
  const statuses: DataStatus[] = []
  let numerator = 0
  let oxidiserTotal = 0
  let inertTotal = 0
  for (let i = 0; i < expanded.gasIds.length; i++) {
    const gas = getGas(expanded.gasIds[i])
    const xi = expanded.x[i]
    if (xi === 0 || gas.hazards.includes('flammable')) continue
    const coefficients = gas.iso10156
    if (coefficients?.ci !== undefined) {
      numerator += xi * coefficients.ci
      oxidiserTotal += xi
      statuses.push(coefficients.status)
    } else if (coefficients?.kEquivalent !== undefined) {
      inertTotal += xi * coefficients.kEquivalent
      statuses.push(coefficients.status)
    }
  }
  const denominator = oxidiserTotal + inertTotal
  const oxidisingPower = numerator === 0 ? 0 : numerator / denominator
  const dataStatus = worstStatus(statuses)
  return {
    oxidisingPower,
    oxidising: oxidisingPower > ISO_10156_OXIDISING_POWER_LIMIT,
    dataStatus,
    warnings: dataStatus === 'unverified' && numerator > 0 ? [UNVERIFIED_WARNING] : [],
  }
}

export interface ToxicityResult {
  /** LC50 of the mixture, ppm by volume; null when no component has an LC50 (not toxic by this rule) */
  readonly lc50PpmV: number | null
  /** LC50_mix ≤ 5000 ppm: toxic gas (Division 2.3) */
  readonly toxic: boolean
  readonly dataStatus: DataStatus
  readonly warnings: readonly PhysicsWarning[]
}

/**
 * LC50 of a mixture by additivity, LC50_mix = 1 / Σ (x_i / LC50_i) (ADR 2.2.2.1.5), components without an LC50
 * counted as non-toxic.
 * @example mixtureLc50({ gasIds: ['nitric-oxide', 'nitrogen'], x: [0.023, 0.977] }).lc50PpmV // ≈ 5000
 */
export function mixtureLc50(mixture: Mixture): ToxicityResult {
  const expanded = expandPseudoComponents(validateMixture(mixture))
  let sum = 0
  const statuses: DataStatus[] = []
  for (let i = 0; i < expanded.gasIds.length; i++) {
    const tox = getGas(expanded.gasIds[i]).toxicity
    if (tox === null || expanded.x[i] === 0) continue
    sum += expanded.x[i] / tox.lc50PpmV
    statuses.push(tox.status)
  }
  const lc50PpmV = sum === 0 ? null : 1 / sum
  const dataStatus = worstStatus(statuses)
  return {
    lc50PpmV,
    toxic: lc50PpmV !== null && lc50PpmV <= TOXIC_LC50_LIMIT_PPMV,
    dataStatus,
    warnings: dataStatus === 'unverified' && lc50PpmV !== null ? [UNVERIFIED_WARNING] : [],
  }
}

/**
 * Lower flammability limit (% in air) of the fuel part of a mixture by Le Chatelier's rule,
 * LFL = 1 / Σ (y_i / LFL_i) with y_i the fraction of fuel i among the fuels only
 * (Zabetakis, US Bureau of Mines Bulletin 627 (1965) — from memory). Null when the mixture holds no fuel.
 * @example leChatelierLflPercent({ gasIds: ['methane', 'propane', 'nitrogen'], x: [0.02, 0.02, 0.96] }) // ≈ 2.45
 */
export function leChatelierLflPercent(mixture: Mixture): number | null {
  const expanded = expandPseudoComponents(validateMixture(mixture))
  let fuelTotal = 0
  let sum = 0
  for (let i = 0; i < expanded.gasIds.length; i++) {
    const gas = getGas(expanded.gasIds[i])
    if (gas.flammability === null || expanded.x[i] === 0) continue
    fuelTotal += expanded.x[i]
    sum += expanded.x[i] / gas.flammability.lflPercent
  }
  if (fuelTotal === 0) return null
  return fuelTotal / sum
}
