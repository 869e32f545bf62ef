/**
 * Composition-specific set-up of GERG-2008: reducing functions and the merged residual term
 * tables of one mixture (Kunz & Wagner 2012, eqs. 7.9 and 7.18–7.19; ISO 20765-2 §5).
 */
import { PhysicsInputError } from '../../types.ts'
import {
  BETA_T,
  BETA_V,
  F_IJ,
  GAMMA_T,
  GAMMA_V,
  GERG_COMPONENT_IDS,
  GROUP_BETA,
  GROUP_C,
  GROUP_EPS,
  GROUP_ETA,
  GROUP_GAMMA,
  GROUP_KIND,
  KEY_CELL,
  KEY_COUNT,
  KEY_GROUP,
  KEY_T,
  KEY_T_INDEX,
  CELL_COUNT,
  CELL_D,
  GROUP_COUNT,
  MOLAR_MASS,
  NC,
  PAIR_KEYED,
  PURE_KEYED,
  RHO_C,
  T_C,
  T_COUNT,
  T_C_IJ,
  V_C_IJ,
  type KeyedTerms,
} from './data.ts'

/**
 * Residual term tables of one mixture, merged across components and departure functions.
 * Σ_i x_i α^r_oi + Σ_{i<j} x_i x_j F_ij α^r_ij is rewritten as Σ_k N_k δ^d_k τ^t_k E_g(k)(δ):
 * terms with the same (E, d, t) are added up, so each is evaluated once.
 * Terms are arranged as groups (one E each) → cells (one d each) → terms (one t each).
 * Internal to the GERG-2008 module.
 */
export interface GergTermTables {
  readonly groupCount: number
  /** 0: E = 1; 1: E = exp(−δ^c); 2: E = exp(−η(δ−ε)² − β(δ−γ)) */
  readonly groupKind: Int32Array
  readonly groupC: Int32Array
  readonly groupEta: Float64Array
  readonly groupEps: Float64Array
  readonly groupBeta: Float64Array
  readonly groupGamma: Float64Array
  /** cells of group g are groupCellStart[g] .. groupCellStart[g+1]−1 */
  readonly groupCellStart: Int32Array
  readonly cellD: Int32Array
  readonly cellCount: number
  readonly termCell: Int32Array
  readonly termTIndex: Int32Array
  readonly termN: Float64Array
  readonly termT: Float64Array
  readonly termCount: number
  readonly uniqueT: Float64Array
  /** largest power of δ needed (d or c) */
  readonly maxPower: number

  // Per-temperature cache (mutable contents): τ^t, and per cell Σ N τ^t, Σ t N τ^t, Σ t(t−1) N τ^t.
  /** [0]: temperature (K) the cache holds, NaN when empty */
  readonly cachedTemperature: Float64Array
  readonly tauPow: Float64Array
  readonly cellA0: Float64Array
  readonly cellA1: Float64Array
  readonly cellA2: Float64Array
  /** scratch: powers of δ */
  readonly deltaPow: Float64Array
}

/** Ideal-gas data of the active components (Kunz & Wagner 2012, eq. 7.5). Internal. */
export interface GergIdealTables {
  /** GERG index of each active component */
  readonly index: Int32Array
  readonly x: Float64Array
  /** Σ x_i ln x_i */
  readonly mixingTerm: number
}

/** A GERG-2008 mixture prepared for repeated evaluation: only components with x > 0 are kept. */
export interface GergMixture {
  /** Fillwright gas ids of the active components, in GERG order. */
  readonly gasIds: readonly string[]
  /** Mole fractions of the active components (normalised to sum 1), in GERG order. */
  readonly x: Float64Array
  /** GERG component indices (0 = methane … 20 = argon) of the active components. */
  readonly componentIndices: Int32Array
  /** Molar mass of the mixture, kg/mol. */
  readonly molarMassKgPerMol: number
  /** Reducing temperature T_r(x), K. */
  readonly reducingTemperatureK: number
  /** Reducing density ρ_r(x), mol/m³. */
  readonly reducingDensityMolPerM3: number
  /** @internal residual term tables and their per-temperature cache */
  readonly residual: GergTermTables
  /** @internal ideal-gas tables */
  readonly ideal: GergIdealTables
}

const INDEX_OF_ID = new Map<string, number>(GERG_COMPONENT_IDS.map((id, i) => [id, i]))

/** True when every gas id is one of the 21 GERG-2008 components. */
export function gergCovers(gasIds: readonly string[]): boolean {
  for (const id of gasIds) if (!INDEX_OF_ID.has(id)) return false
  return true
}

/** Tolerance on Σx = 1, as documented for Mixture in shared/physics/types.ts. */
const SUM_TOLERANCE = 1e-6

/**
 * Validate a composition and precompute everything that depends on it: reducing functions,
 * molar mass, and the merged residual term tables. Components with x = 0 are dropped
 * (their terms would be 0, and the reducing-function pair terms 0/0). Fractions are normalised.
 * Throws PhysicsInputError (field 'mixture') for an unknown or repeated gas, a bad fraction,
 * or fractions that do not sum to 1 ± 1e-6.
 * @example prepareGergMixture(['nitrogen', 'argon'], [0.5, 0.5]).reducingTemperatureK // ≈ 137.48 K
 */
export function prepareGergMixture(gasIds: readonly string[], x: readonly number[]): GergMixture {
  if (!Array.isArray(gasIds) || !Array.isArray(x) || gasIds.length !== x.length || gasIds.length === 0) {
    throw new PhysicsInputError('GERG-2008: a mixture needs one mole fraction per gas, and at least one gas', 'mixture')
  }
  const xFull = SCRATCH_X.fill(0)
  const seen = SCRATCH_SEEN.fill(0)
  let sum = 0
  for (let k = 0; k < gasIds.length; k++) {
    const id = gasIds[k]
    const i = INDEX_OF_ID.get(id)
    if (i === undefined) {
      throw new PhysicsInputError(`GERG-2008 does not cover the gas "${id}"; it covers only its 21 components (${GERG_COMPONENT_IDS.join(', ')})`, 'mixture')
    }
    if (seen[i]) throw new PhysicsInputError(`GERG-2008: the gas "${id}" is listed twice`, 'mixture')
    seen[i] = 1
    const xi = x[k]
    if (typeof xi !== 'number' || !Number.isFinite(xi) || xi < 0 || xi > 1) {
      throw new PhysicsInputError(`GERG-2008: mole fraction of "${id}" must be in 0..1, got ${xi}`, 'mixture')
    }
    xFull[i] = xi
    sum += xi
  }
  if (!(Math.abs(sum - 1) <= SUM_TOLERANCE)) {
    throw new PhysicsInputError(`GERG-2008: mole fractions must sum to 1 (±${SUM_TOLERANCE}), got ${sum}`, 'mixture')
  }

  const idx: number[] = []
  const xa: number[] = []
  for (let i = 0; i < NC; i++) {
    if (xFull[i] > 0) {
      idx.push(i)
      xa.push(xFull[i] / sum)
    }
  }
  const n = idx.length

  // Reducing functions (Kunz & Wagner 2012, eqs. 7.18, 7.19), only over active components,
  // so no pair term has x_i = x_j = 0. Pairs are always taken as (i, j) with i < j in GERG order,
  // the orientation in which β is stored.
  let vr = 0
  let tr = 0
  let molarMass = 0
  let mixingTerm = 0
  for (let a = 0; a < n; a++) {
    const i = idx[a]
    const xi = xa[a]
    vr += (xi * xi) / RHO_C[i]
    tr += xi * xi * T_C[i]
    molarMass += xi * MOLAR_MASS[i]
    mixingTerm += xi * Math.log(xi)
    for (let b = a + 1; b < n; b++) {
      const j = idx[b]
      const xj = xa[b]
      const k = i * NC + j
      const bv = BETA_V[k]
      const bt = BETA_T[k]
      vr += (2 * xi * xj * bv * GAMMA_V[k] * (xi + xj) * V_C_IJ[k]) / (bv * bv * xi + xj)
      tr += (2 * xi * xj * bt * GAMMA_T[k] * (xi + xj) * T_C_IJ[k]) / (bt * bt * xi + xj)
    }
  }

  // Residual terms: x_i n_oi,k for the pure parts, x_i x_j F_ij n_ij,k for the departure parts,
  // added up per term key (group, d, t).
  const coefficient = SCRATCH_COEFFICIENT.fill(0)
  const used = SCRATCH_USED.fill(0)
  for (let a = 0; a < n; a++) {
    addTerms(coefficient, used, xa[a], PURE_KEYED[idx[a]])
    for (let b = a + 1; b < n; b++) {
      const k = idx[a] * NC + idx[b]
      const dep = PAIR_KEYED[k]
      if (dep !== null) addTerms(coefficient, used, xa[a] * xa[b] * F_IJ[k], dep)
    }
  }

  const tables = buildTermTables(coefficient, used, n)
  for (let a = 0; a < n; a++) {
    tables.x[a] = xa[a]
    tables.index[a] = idx[a]
  }
  return {
    gasIds: Object.freeze(idx.map((i) => GERG_COMPONENT_IDS[i])),
    x: tables.x,
    componentIndices: tables.index,
    molarMassKgPerMol: molarMass,
    reducingTemperatureK: tr,
    reducingDensityMolPerM3: 1 / vr,
    residual: tables.residual,
    ideal: { index: tables.index, x: tables.x, mixingTerm },
  }
}

// Scratch space of prepareGergMixture, reused between calls (cleared at the start of each):
// allocating typed arrays larger than 64 bytes costs about 1 µs each in V8.
const SCRATCH_X = new Float64Array(NC)
const SCRATCH_SEEN = new Uint8Array(NC)
const SCRATCH_COEFFICIENT = new Float64Array(KEY_COUNT)
const SCRATCH_USED = new Uint8Array(KEY_COUNT)
const SCRATCH_LOCAL_GROUP = new Int32Array(GROUP_COUNT)
const SCRATCH_LOCAL_CELL = new Int32Array(CELL_COUNT)
const SCRATCH_LOCAL_T = new Int32Array(T_COUNT)
/** δ^k is needed for k up to the largest d or c. */
const MAX_POWER = Math.max(...CELL_D, ...GROUP_C)

function addTerms(coefficient: Float64Array, used: Uint8Array, w: number, terms: KeyedTerms): void {
  const key = terms.key
  const nk = terms.n
  for (let k = 0; k < key.length; k++) {
    coefficient[key[k]] += w * nk[k]
    used[key[k]] = 1
  }
}

/**
 * Build the merged term tables of a mixture from the per-key coefficients; all typed arrays of
 * the mixture are views into one ArrayBuffer.
 */
function buildTermTables(
  coefficient: Float64Array,
  used: Uint8Array,
  componentCount: number,
): { residual: GergTermTables; x: Float64Array; index: Int32Array } {
  // Keys are ordered by (group, d, t): walking them in order gives contiguous groups and cells.
  const localGroup = SCRATCH_LOCAL_GROUP.fill(-1)
  const localCell = SCRATCH_LOCAL_CELL.fill(-1)
  const localT = SCRATCH_LOCAL_T.fill(-1)
  let groupCount = 0
  let cellCount = 0
  let tCount = 0
  let termCount = 0
  for (let key = 0; key < KEY_COUNT; key++) {
    if (!used[key] || coefficient[key] === 0) continue
    termCount++
    if (localGroup[KEY_GROUP[key]] < 0) localGroup[KEY_GROUP[key]] = groupCount++
    if (localCell[KEY_CELL[key]] < 0) localCell[KEY_CELL[key]] = cellCount++
    if (localT[KEY_T_INDEX[key]] < 0) localT[KEY_T_INDEX[key]] = tCount++
  }

  const f64Count = componentCount + 4 * groupCount + 2 * termCount + 2 * tCount + 3 * cellCount + 1 + (MAX_POWER + 1)
  const i32Count = componentCount + 3 * groupCount + 1 + cellCount + 2 * termCount
  const buffer = new ArrayBuffer(8 * f64Count + 4 * i32Count)
  // Views in a fixed order: Float64 data first, then Int32 data (no closures: this runs per mixture).
  let o = 0
  const x = new Float64Array(buffer, o, componentCount)
  o += 8 * componentCount
  const groupEta = new Float64Array(buffer, o, groupCount)
  o += 8 * groupCount
  const groupEps = new Float64Array(buffer, o, groupCount)
  o += 8 * groupCount
  const groupBeta = new Float64Array(buffer, o, groupCount)
  o += 8 * groupCount
  const groupGamma = new Float64Array(buffer, o, groupCount)
  o += 8 * groupCount
  const uniqueT = new Float64Array(buffer, o, tCount)
  o += 8 * tCount
  const tauPow = new Float64Array(buffer, o, tCount)
  o += 8 * tCount
  const termN = new Float64Array(buffer, o, termCount)
  o += 8 * termCount
  const termT = new Float64Array(buffer, o, termCount)
  o += 8 * termCount
  const cellA0 = new Float64Array(buffer, o, cellCount)
  o += 8 * cellCount
  const cellA1 = new Float64Array(buffer, o, cellCount)
  o += 8 * cellCount
  const cellA2 = new Float64Array(buffer, o, cellCount)
  o += 8 * cellCount
  const cachedTemperature = new Float64Array(buffer, o, 1)
  o += 8
  const deltaPow = new Float64Array(buffer, o, MAX_POWER + 1)
  o += 8 * (MAX_POWER + 1)
  const index = new Int32Array(buffer, o, componentCount)
  o += 4 * componentCount
  const groupKind = new Int32Array(buffer, o, groupCount)
  o += 4 * groupCount
  const groupC = new Int32Array(buffer, o, groupCount)
  o += 4 * groupCount
  const groupCellStart = new Int32Array(buffer, o, groupCount + 1)
  o += 4 * (groupCount + 1)
  const cellD = new Int32Array(buffer, o, cellCount)
  o += 4 * cellCount
  const termCell = new Int32Array(buffer, o, termCount)
  o += 4 * termCount
  const termTIndex = new Int32Array(buffer, o, termCount)
  let maxPower = 1
  let k = 0
  for (let key = 0; key < KEY_COUNT; key++) {
    if (!used[key] || coefficient[key] === 0) continue
    const gg = KEY_GROUP[key]
    const g = localGroup[gg]
    groupKind[g] = GROUP_KIND[gg]
    groupC[g] = GROUP_C[gg]
    groupEta[g] = GROUP_ETA[gg]
    groupEps[g] = GROUP_EPS[gg]
    groupBeta[g] = GROUP_BETA[gg]
    groupGamma[g] = GROUP_GAMMA[gg]
    if (GROUP_C[gg] > maxPower) maxPower = GROUP_C[gg]
    const c = localCell[KEY_CELL[key]]
    cellD[c] = CELL_D[KEY_CELL[key]]
    if (cellD[c] > maxPower) maxPower = cellD[c]
    groupCellStart[g + 1] = c + 1
    const ti = localT[KEY_T_INDEX[key]]
    uniqueT[ti] = KEY_T[key]
    termCell[k] = c
    termTIndex[k] = ti
    termN[k] = coefficient[key]
    termT[k] = KEY_T[key]
    k++
  }
  cachedTemperature[0] = Number.NaN

  return {
    x,
    index,
    residual: {
      groupCount,
      groupKind,
      groupC,
      groupEta,
      groupEps,
      groupBeta,
      groupGamma,
      groupCellStart,
      cellD,
      cellCount,
      termCell,
      termTIndex,
      termN,
      termT,
      termCount,
      uniqueT,
      maxPower,
      cachedTemperature,
      tauPow,
      cellA0,
      cellA1,
      cellA2,
      deltaPow,
    },
  }
}
