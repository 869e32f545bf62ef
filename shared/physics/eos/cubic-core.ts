/**
 * Generic two-parameter cubic equation of state
 *   p = R·T/(v − b) − a(T)/((v + δ1·b)(v + δ2·b))
 * with the van der Waals one-fluid mixing rules a_mix = ΣΣ x_i x_j √(a_i a_j)(1 − k_ij), b_mix = Σ x_i b_i.
 * van der Waals (δ1 = δ2 = 0), Soave–Redlich–Kwong (δ1 = 1, δ2 = 0) and Peng–Robinson (δ1,2 = 1 ± √2) are
 * instances (see their files). Units: SI (K, Pa, mol/m³, Pa·m⁶/mol², m³/mol).
 *
 * `prepareCubic` does all composition-dependent work once; the returned functions are the hot path
 * (a(T) is cached for the last temperature, nothing is allocated per call).
 * Reference for the generic form and the fugacity expression: Michelsen & Mollerup, Thermodynamic Models:
 * Fundamentals & Computational Aspects, 2nd ed. (2007), ch. 3.
 */
import { GAS_CONSTANT_J_PER_MOL_K as R } from '../constants.ts'
import { solveMonicCubicInto } from '../numeric/cubic-roots.ts'
import { PhysicsInputError } from '../types.ts'
import type { CubicModelId } from './kij.ts'

export interface CubicFamily {
  readonly id: CubicModelId
  readonly name: string
  /** Ω_a in a_c = Ω_a·R²·Tc²/Pc */
  readonly omegaA: number
  /** Ω_b in b = Ω_b·R·Tc/Pc */
  readonly omegaB: number
  readonly delta1: number
  readonly delta2: number
  /** critical compressibility factor of the equation (Z_c) */
  readonly criticalCompressibility: number
  /** slope m(ω) of the Soave-type alpha function √α = 1 + m·(1 − √Tr); null when a does not depend on T */
  readonly alphaSlope: ((acentricFactor: number) => number) | null
  readonly reference: string
}

export interface CubicComponent {
  readonly criticalTemperatureK: number
  readonly criticalPressurePa: number
  readonly acentricFactor: number
}

/** Result of the density solution at (T, p). */
export interface CubicDensitySolution {
  /** compressibility factor of the chosen (vapour-like, largest) root */
  readonly compressibility: number
  readonly molarDensityMolPerM3: number
  /** number of admissible real roots (Z > B): 1 or 3 */
  readonly rootCount: 1 | 3
  /** with three roots, the root of lower residual Gibbs energy; null with one root */
  readonly stableRoot: 'vapour' | 'liquid' | null
  /** liquid-like (smallest) root when three exist, else null */
  readonly liquidCompressibility: number | null
  /** packing b·ρ of the chosen root */
  readonly packing: number
}

export interface PreparedCubic {
  readonly family: CubicFamily
  /** b_mix, m³/mol */
  readonly coVolumeM3PerMol: number
  /** b·ρ at the equation's critical point (Ω_b/Z_c): above it a single root is liquid-like */
  readonly criticalPacking: number
  /** a_mix(T), Pa·m⁶/mol² */
  attractionParameter(temperatureK: number): number
  /** p(T, ρ) in Pa. @throws PhysicsInputError (field 'molarDensity') when b·ρ ≥ 1 */
  pressurePa(temperatureK: number, molarDensityMolPerM3: number): number
  /** Z of the vapour-like (largest) root at (T, p) */
  compressibility(temperatureK: number, pressurePa: number): number
  /** ρ = p/(Z·R·T) of the vapour-like root, mol/m³ */
  densityMolPerM3(temperatureK: number, pressurePa: number): number
  /** every admissible real root Z (> B), ascending */
  zRoots(temperatureK: number, pressurePa: number): number[]
  /** density with root diagnostics (allocates one small object) */
  solve(temperatureK: number, pressurePa: number): CubicDensitySolution
  /** ln φ of the mixture treated as a pseudo-pure fluid at (T, p) on root Z (residual Gibbs energy / RT) */
  lnFugacityCoefficient(temperatureK: number, pressurePa: number, compressibility: number): number
}

/**
 * Prepares a cubic equation of state for a fixed composition.
 * @param kij optional n×n row-major matrix of binary interaction parameters (symmetric, zero diagonal)
 */
export function prepareCubic(
  family: CubicFamily,
  components: readonly CubicComponent[],
  x: readonly number[],
  kij: ArrayLike<number> | null = null,
): PreparedCubic {
  const n = components.length
  if (n === 0 || x.length !== n) throw new RangeError('prepareCubic needs one mole fraction per component.')
  const sqrtAc = new Float64Array(n)
  const slope = new Float64Array(n)
  const invSqrtTc = new Float64Array(n)
  const xs = new Float64Array(n)
  let b = 0
  for (let i = 0; i < n; i++) {
    const { criticalTemperatureK: tc, criticalPressurePa: pc, acentricFactor } = components[i]
    if (!(tc > 0) || !(pc > 0)) throw new RangeError('Critical temperature and pressure must be positive.')
    sqrtAc[i] = R * tc * Math.sqrt(family.omegaA / pc)
    slope[i] = family.alphaSlope === null ? 0 : family.alphaSlope(acentricFactor)
    invSqrtTc[i] = 1 / Math.sqrt(tc)
    xs[i] = x[i]
    b += x[i] * ((family.omegaB * R * tc) / pc)
  }
  // non-zero k_ij pairs (i < j)
  const pi: number[] = []
  const pj: number[] = []
  const pk: number[] = []
  if (kij !== null) {
    for (let i = 0; i < n; i++) {
      for (let j = i + 1; j < n; j++) {
        const kv = kij[i * n + j]
        if (kv !== 0 && xs[i] !== 0 && xs[j] !== 0) {
          pi.push(i)
          pj.push(j)
          pk.push(2 * kv)
        }
      }
    }
  }
  const pairI = Int32Array.from(pi)
  const pairJ = Int32Array.from(pj)
  const pairK = Float64Array.from(pk)
  const pairCount = pairK.length
  const s = new Float64Array(n)

  /** a_mix(T) by the double sum (general path, with the clamp √α ≥ 0) */
  function mixA(temperatureK: number): number {
    const sqrtT = Math.sqrt(temperatureK)
    let sum = 0
    for (let i = 0; i < n; i++) {
      let root = 1 + slope[i] * (1 - sqrtT * invSqrtTc[i])
      if (root < 0) root = 0
      const si = xs[i] * sqrtAc[i] * root
      s[i] = si
      sum += si
    }
    let a = sum * sum
    for (let p = 0; p < pairCount; p++) a -= pairK[p] * s[pairI[p]] * s[pairJ[p]]
    return a
  }

  // With s_i = α_i − β_i·√T (α_i = x_i√a_ci(1 + m_i), β_i = x_i√a_ci·m_i/√Tc_i), a_mix is a quadratic in √T:
  // a = c0 − c1·√T + c2·T, exact while every √α_i ≥ 0, i.e. below T_clamp = min over m_i > 0 of Tc_i(1 + 1/m_i)².
  const alphaC = new Float64Array(n)
  const betaC = new Float64Array(n)
  let clampT = Number.POSITIVE_INFINITY
  for (let i = 0; i < n; i++) {
    alphaC[i] = xs[i] * sqrtAc[i] * (1 + slope[i])
    betaC[i] = xs[i] * sqrtAc[i] * slope[i] * invSqrtTc[i]
    if (slope[i] > 0 && xs[i] > 0) {
      const limit = (1 + 1 / slope[i]) ** 2 / (invSqrtTc[i] * invSqrtTc[i])
      if (limit < clampT) clampT = limit
    }
  }
  let sumA = 0
  let sumB = 0
  for (let i = 0; i < n; i++) {
    sumA += alphaC[i]
    sumB += betaC[i]
  }
  let c0 = sumA * sumA
  let c1 = 2 * sumA * sumB
  let c2 = sumB * sumB
  for (let p = 0; p < pairCount; p++) {
    const i = pairI[p]
    const j = pairJ[p]
    c0 -= pairK[p] * alphaC[i] * alphaC[j]
    c1 -= pairK[p] * (alphaC[i] * betaC[j] + alphaC[j] * betaC[i])
    c2 -= pairK[p] * betaC[i] * betaC[j]
  }
  if (family.alphaSlope === null) {
    c1 = 0
    c2 = 0
  }
  return buildPrepared(family, b, { c0, c1, c2, clampT, general: mixA })
}

/** a_mix(T) = c0 − c1·√T + c2·T below clampT; `general(T)` above it */
interface AttractionTerms {
  readonly c0: number
  readonly c1: number
  readonly c2: number
  readonly clampT: number
  readonly general: (temperatureK: number) => number
}

/**
 * A cubic equation with fixed constants a (Pa·m⁶/mol²) and b (m³/mol), e.g. a worked example's rounded values.
 * The family's alpha function is ignored (a does not depend on T).
 */
export function prepareCubicFromConstants(family: CubicFamily, attractionPaM6PerMol2: number, coVolumeM3PerMol: number): PreparedCubic {
  return buildPrepared(family, coVolumeM3PerMol, {
    c0: attractionPaM6PerMol2,
    c1: 0,
    c2: 0,
    clampT: Number.POSITIVE_INFINITY,
    general: () => attractionPaM6PerMol2,
  })
}

function buildPrepared(family: CubicFamily, b: number, terms: AttractionTerms): PreparedCubic {
  const { c0: a0, c1: a1, c2: a2, clampT, general } = terms
  function attraction(temperatureK: number): number {
    return temperatureK < clampT ? a0 - a1 * Math.sqrt(temperatureK) + a2 * temperatureK : general(temperatureK)
  }
  const d1 = family.delta1
  const d2 = family.delta2
  const u = d1 + d2
  const w = d1 * d2
  const dd = d1 - d2
  const roots = new Float64Array(3)

  function lnPhi(A: number, B: number, z: number): number {
    const attractive = dd === 0 ? A / z : (A / (B * dd)) * Math.log((z + d1 * B) / (z + d2 * B))
    return z - 1 - Math.log(z - B) - attractive
  }

  /** fills `roots` with admissible roots (ascending) and returns their count; also returns A and B via closure */
  let lastA = 0
  let lastB = 0
  function solveRoots(temperatureK: number, pressurePa: number): number {
    const rt = R * temperatureK
    const A = (attraction(temperatureK) * pressurePa) / (rt * rt)
    const B = (b * pressurePa) / rt
    lastA = A
    lastB = B
    const c2 = -(1 + B - u * B)
    const c1 = A + w * B * B - u * B - u * B * B
    const c0 = -(A * B + w * B * B + w * B * B * B)
    const count = solveMonicCubicInto(c2, c1, c0, roots)
    // keep roots with z > B (v > b), ascending
    let k = 0
    for (let r = 0; r < count; r++) if (roots[r] > B) roots[k++] = roots[r]
    return k
  }

  function largestRoot(temperatureK: number, pressurePa: number): number {
    const k = solveRoots(temperatureK, pressurePa)
    if (k === 0) {
      throw new PhysicsInputError(`The ${family.name} equation has no physical root at T = ${temperatureK} K, p = ${pressurePa} Pa.`, 'pressure')
    }
    return roots[k - 1]
  }

  const criticalPacking = family.omegaB / family.criticalCompressibility

  return {
    family,
    coVolumeM3PerMol: b,
    criticalPacking,
    attractionParameter: attraction,
    pressurePa(temperatureK, rho) {
      const brho = b * rho
      if (!(brho < 1)) {
        throw new PhysicsInputError(`Molar density ${rho} mol/m³ is at or beyond the ${family.name} co-volume limit (${1 / b} mol/m³).`, 'molarDensity')
      }
      const a = attraction(temperatureK)
      return (rho * R * temperatureK) / (1 - brho) - (a * rho * rho) / ((1 + d1 * brho) * (1 + d2 * brho))
    },
    compressibility(temperatureK, pressurePa) {
      return largestRoot(temperatureK, pressurePa)
    },
    densityMolPerM3(temperatureK, pressurePa) {
      return pressurePa / (largestRoot(temperatureK, pressurePa) * R * temperatureK)
    },
    zRoots(temperatureK, pressurePa) {
      const k = solveRoots(temperatureK, pressurePa)
      return Array.from(roots.subarray(0, k))
    },
    solve(temperatureK, pressurePa) {
      const k = solveRoots(temperatureK, pressurePa)
      if (k === 0) {
        throw new PhysicsInputError(`The ${family.name} equation has no physical root at T = ${temperatureK} K, p = ${pressurePa} Pa.`, 'pressure')
      }
      const z = roots[k - 1]
      const rho = pressurePa / (z * R * temperatureK)
      let stableRoot: 'vapour' | 'liquid' | null = null
      let liquid: number | null = null
      if (k === 3 && roots[0] < z) {
        liquid = roots[0]
        stableRoot = lnPhi(lastA, lastB, liquid) < lnPhi(lastA, lastB, z) ? 'liquid' : 'vapour'
      }
      return {
        compressibility: z,
        molarDensityMolPerM3: rho,
        rootCount: k === 3 ? 3 : 1,
        stableRoot,
        liquidCompressibility: liquid,
        packing: b * rho,
      }
    },
    lnFugacityCoefficient(temperatureK, pressurePa, z) {
      const rt = R * temperatureK
      const A = (attraction(temperatureK) * pressurePa) / (rt * rt)
      const B = (b * pressurePa) / rt
      return lnPhi(A, B, z)
    },
  }
}

/**
 * Saturation pressure (Pa) of a pure component predicted by a cubic equation, from equal fugacities of the
 * liquid-like and vapour-like roots (successive substitution p ← p·φ_L/φ_V). Returns null at or above Tc or if
 * the iteration does not converge within `maxIterations`.
 */
export function cubicSaturationPressurePa(family: CubicFamily, component: CubicComponent, temperatureK: number, maxIterations = 200): number | null {
  const { criticalTemperatureK: tc, criticalPressurePa: pc, acentricFactor } = component
  if (!(temperatureK > 0) || temperatureK >= tc) return null
  const eos = prepareCubic(family, [component], [1])
  // start from Wilson's correlation (common practice for initial estimates)
  let p = pc * Math.exp(5.373 * (1 + acentricFactor) * (1 - tc / temperatureK))
  for (let it = 0; it < maxIterations; it++) {
    const zs = eos.zRoots(temperatureK, p)
    if (zs.length < 3) {
      // a single root: vapour-like (large Z) means p is below the liquid spinodal → raise p; else lower it
      const z = zs[zs.length - 1]
      p *= z > family.criticalCompressibility ? 1.3 : 0.7
      continue
    }
    const lnL = eos.lnFugacityCoefficient(temperatureK, p, zs[0])
    const lnV = eos.lnFugacityCoefficient(temperatureK, p, zs[2])
    const step = lnL - lnV
    p *= Math.exp(step)
    if (Math.abs(step) < 1e-12) return p
  }
  return null
}
