/**
 * GERG-2008 parameter tables, unpacked once at module load into typed arrays.
 *
 * Everything here is composition-independent. Source of the numbers:
 * shared/physics/data/gerg2008-parameters.json (see PROVENANCE.md beside it): Kunz & Wagner,
 * J. Chem. Eng. Data 57 (2012) 3032–3091, doi:10.1021/je300655b; ISO 20765-2:2015.
 *
 * Units inside this module are SI: mol/m³, K, kg/mol. The JSON holds mol/L and g/mol.
 */
import params from '../../data/gerg2008-parameters.json' with { type: 'json' }

/** Fillwright gas ids of the 21 GERG-2008 components, in GERG (NIST AGA 8) order. */
export const GERG_COMPONENT_IDS: readonly string[] = Object.freeze([
  'methane',
  'nitrogen',
  'carbon-dioxide',
  'ethane',
  'propane',
  'isobutane',
  'n-butane',
  'isopentane',
  'n-pentane',
  'n-hexane',
  'n-heptane',
  'n-octane',
  'n-nonane',
  'n-decane',
  'hydrogen',
  'oxygen',
  'carbon-monoxide',
  'water',
  'hydrogen-sulfide',
  'helium',
  'argon',
])

/** The JSON's own short ids (formula-like), same order; used to check the file's order at load. */
const JSON_IDS = [
  'CH4',
  'N2',
  'CO2',
  'C2H6',
  'C3H8',
  'iC4H10',
  'nC4H10',
  'iC5H12',
  'nC5H12',
  'nC6H14',
  'nC7H16',
  'nC8H18',
  'nC9H20',
  'nC10H22',
  'H2',
  'O2',
  'CO',
  'H2O',
  'H2S',
  'He',
  'Ar',
]

export const NC = 21

/** Molar gas constant of GERG-2008, J/(mol K) (Kunz & Wagner 2012; NIST AGA8 code). Not CODATA. */
export const R_GERG: number = params.constants.R
/** R_star / R: the ideal-gas part was fitted with R* = 8.314510 J/(mol K). */
export const R_STAR_OVER_R: number = params.constants.R_star / params.constants.R

function fail(message: string): never {
  throw new Error(`gerg2008-parameters.json: ${message}`)
}

if (params.components.length !== NC) fail(`expected ${NC} components`)
for (let i = 0; i < NC; i++) {
  const c = params.components[i]
  if (c.index !== i || c.id !== JSON_IDS[i]) fail(`component ${i} is ${c.id}, expected ${JSON_IDS[i]}`)
  if (params.pure_residual[i].component !== c.id) fail(`pure_residual[${i}] out of order`)
  if (params.ideal_gas[i].component !== c.id) fail(`ideal_gas[${i}] out of order`)
}

/** Molar masses, kg/mol. */
export const MOLAR_MASS = new Float64Array(NC)
/** Critical (reducing) densities, mol/m³. */
export const RHO_C = new Float64Array(NC)
/** Critical (reducing) temperatures, K. */
export const T_C = new Float64Array(NC)
for (let i = 0; i < NC; i++) {
  const c = params.components[i]
  MOLAR_MASS[i] = c.molar_mass / 1000
  RHO_C[i] = c.rho_c * 1000
  T_C[i] = c.T_c
}

// ---------------------------------------------------------------------------------------------
// Exponential "groups". Every residual term is n · δ^d · τ^t · E(δ), where E is one of a small
// set of functions of δ: 1 (polynomial terms), exp(−δ^c) (pure-fluid exponential terms) or
// exp(−η(δ−ε)² − β(δ−γ)) (departure-function exponential terms). There are only 15 distinct E
// in GERG-2008, so E and its logarithmic derivatives are computed once per δ and shared.
// ---------------------------------------------------------------------------------------------

/** 0: E = 1; 1: E = exp(−δ^c); 2: E = exp(−η(δ−ε)² − β(δ−γ)). */
export const GROUP_KIND: number[] = []
export const GROUP_C: number[] = []
export const GROUP_ETA: number[] = []
export const GROUP_EPS: number[] = []
export const GROUP_BETA: number[] = []
export const GROUP_GAMMA: number[] = []
const groupIndex = new Map<string, number>()

function groupOf(kind: number, c: number, eta: number, eps: number, beta: number, gamma: number): number {
  const key = `${kind}:${c}:${eta}:${eps}:${beta}:${gamma}`
  let g = groupIndex.get(key)
  if (g === undefined) {
    g = GROUP_KIND.length
    groupIndex.set(key, g)
    GROUP_KIND.push(kind)
    GROUP_C.push(c)
    GROUP_ETA.push(eta)
    GROUP_EPS.push(eps)
    GROUP_BETA.push(beta)
    GROUP_GAMMA.push(gamma)
  }
  return g
}

/** A residual term before mixing: coefficient n, exponents d (integer), t, and its group. */
export interface RawTerm {
  readonly n: number
  readonly d: number
  readonly t: number
  readonly g: number
}

function checkInt(v: number, what: string): number {
  if (!Number.isInteger(v) || v < 0 || v > 12) fail(`${what} = ${v} is not a small non-negative integer`)
  return v
}

/** Pure-fluid residual terms α^r_oi, per component (Kunz & Wagner 2012, eq. 7.6 / table A3). */
export const PURE_TERMS: readonly (readonly RawTerm[])[] = params.pure_residual.map((p, i) => {
  const len = p.kpol + p.kexp
  if (p.n.length !== len || p.d.length !== len || p.t.length !== len || p.c.length !== len) {
    fail(`pure_residual[${i}] has inconsistent lengths`)
  }
  const terms: RawTerm[] = []
  for (let k = 0; k < len; k++) {
    const c = k < p.kpol ? 0 : checkInt(p.c[k], `pure_residual[${i}].c[${k}]`)
    if (k >= p.kpol && c === 0) fail(`pure_residual[${i}] exponential term ${k} has c = 0`)
    const g = c === 0 ? groupOf(0, 0, 0, 0, 0, 0) : groupOf(1, c, 0, 0, 0, 0)
    terms.push({ n: p.n[k], d: checkInt(p.d[k], `pure_residual[${i}].d[${k}]`), t: p.t[k], g })
  }
  return terms
})

/** Departure-function sets α^r_ij (Kunz & Wagner 2012, eq. 7.10 / table A8–A9), by JSON key. */
const DEPARTURE_SETS = new Map<string, readonly RawTerm[]>()
for (const [key, s] of Object.entries(params.departure_functions)) {
  const len = s.kpol + s.kexp
  const terms: RawTerm[] = []
  for (let k = 0; k < len; k++) {
    const g = k < s.kpol ? groupOf(0, 0, 0, 0, 0, 0) : groupOf(2, 0, s.eta[k], s.epsilon[k], s.beta[k], s.gamma[k])
    terms.push({ n: s.n[k], d: checkInt(s.d[k], `departure_functions.${key}.d[${k}]`), t: s.t[k], g })
  }
  DEPARTURE_SETS.set(key, terms)
}

/** Binary data, indexed i·NC + j with i < j (GERG order). */
export const BETA_V = new Float64Array(NC * NC)
export const GAMMA_V = new Float64Array(NC * NC)
export const BETA_T = new Float64Array(NC * NC)
export const GAMMA_T = new Float64Array(NC * NC)
export const F_IJ = new Float64Array(NC * NC)
/** Departure terms of each pair (empty when the pair has none). */
export const PAIR_DEPARTURE: (readonly RawTerm[])[] = new Array(NC * NC).fill([])
/** (1/8)(ρc,i^(−1/3) + ρc,j^(−1/3))³, m³/mol: the combining rule of the reducing volume. */
export const V_C_IJ = new Float64Array(NC * NC)
/** (Tc,i Tc,j)^(1/2), K. */
export const T_C_IJ = new Float64Array(NC * NC)

for (let i = 0; i < NC; i++) {
  for (let j = 0; j < NC; j++) {
    const a = Math.cbrt(1 / RHO_C[i]) + Math.cbrt(1 / RHO_C[j])
    V_C_IJ[i * NC + j] = (a * a * a) / 8
    T_C_IJ[i * NC + j] = Math.sqrt(T_C[i] * T_C[j])
  }
}
if (params.binary_parameters.length !== (NC * (NC - 1)) / 2) fail('expected 210 binary pairs')
for (const b of params.binary_parameters) {
  if (!(b.i < b.j) || b.j >= NC) fail(`binary pair ${b.pair} is not ordered i < j`)
  const k = b.i * NC + b.j
  if (BETA_V[k] !== 0) fail(`binary pair ${b.pair} appears twice`)
  BETA_V[k] = b.beta_v
  GAMMA_V[k] = b.gamma_v
  BETA_T[k] = b.beta_T
  GAMMA_T[k] = b.gamma_T
  F_IJ[k] = b.F
  if (b.departure !== null && b.F !== 0) {
    const set = DEPARTURE_SETS.get(b.departure)
    if (!set) fail(`binary pair ${b.pair} names unknown departure set ${b.departure}`)
    PAIR_DEPARTURE[k] = set
  }
}

/**
 * Ideal-gas part, per component (Kunz & Wagner 2012, eq. 7.5 / table A1), with 7 slots per
 * component: n0_1..n0_7 and θ0_4..θ0_7 (slots 0..2 of θ unused). θ0 is reduced by T_c,i.
 */
export const IG_N0 = new Float64Array(NC * 7)
export const IG_THETA = new Float64Array(NC * 7)
for (let i = 0; i < NC; i++) {
  const g = params.ideal_gas[i]
  if (g.n0.length !== 7 || g.theta0.length !== 7) fail(`ideal_gas[${i}] needs 7 n0 and 7 theta0`)
  for (let k = 0; k < 7; k++) {
    IG_N0[i * 7 + k] = g.n0[k]
    IG_THETA[i * 7 + k] = g.theta0[k]
  }
}

// ---------------------------------------------------------------------------------------------
// Term keys: every distinct (group, d, t) of all pure and departure terms gets an id, in
// (group, d, t) order, so that a mixture can add up its coefficients per key in a flat array.
// Keys with the same (group, d) share a cell; cells of a group are contiguous.
// ---------------------------------------------------------------------------------------------

/** Terms of one pure fluid or departure set as key ids and coefficients. */
export interface KeyedTerms {
  readonly key: Int32Array
  readonly n: Float64Array
}

const allRaw: RawTerm[] = [...PURE_TERMS.flat(), ...[...DEPARTURE_SETS.values()].flat()]
const keyList = [...new Map(allRaw.map((r) => [`${r.g}|${r.d}|${r.t}`, r])).values()].sort((p, q) => p.g - q.g || p.d - q.d || p.t - q.t)
const keyId = new Map<string, number>(keyList.map((r, k) => [`${r.g}|${r.d}|${r.t}`, k]))

export const KEY_COUNT = keyList.length
export const KEY_GROUP = Int32Array.from(keyList.map((r) => r.g))
export const KEY_T = Float64Array.from(keyList.map((r) => r.t))
/** global cell of each key */
export const KEY_CELL = new Int32Array(KEY_COUNT)
/** global distinct-t index of each key */
export const KEY_T_INDEX = new Int32Array(KEY_COUNT)
const cellIds = new Map<string, number>()
const tIds = new Map<number, number>()
const cellD: number[] = []
keyList.forEach((r, k) => {
  const ck = `${r.g}|${r.d}`
  let c = cellIds.get(ck)
  if (c === undefined) {
    c = cellD.length
    cellIds.set(ck, c)
    cellD.push(r.d)
  }
  KEY_CELL[k] = c
  let ti = tIds.get(r.t)
  if (ti === undefined) {
    ti = tIds.size
    tIds.set(r.t, ti)
  }
  KEY_T_INDEX[k] = ti
})
export const CELL_COUNT = cellD.length
export const CELL_D = Int32Array.from(cellD)
export const T_COUNT = tIds.size
export const GROUP_COUNT = GROUP_KIND.length

function keyed(terms: readonly RawTerm[]): KeyedTerms {
  return {
    key: Int32Array.from(terms.map((r) => keyId.get(`${r.g}|${r.d}|${r.t}`) as number)),
    n: Float64Array.from(terms.map((r) => r.n)),
  }
}

/** Pure-fluid terms of each component, keyed. */
export const PURE_KEYED: readonly KeyedTerms[] = PURE_TERMS.map(keyed)
/** Departure terms of each pair i·NC + j (i < j), keyed; null where the pair has none or F = 0. */
export const PAIR_KEYED: readonly (KeyedTerms | null)[] = PAIR_DEPARTURE.map((t) => (t.length > 0 ? keyed(t) : null))
