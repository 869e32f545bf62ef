/**
 * Binary interaction parameters k_ij for the van der Waals one-fluid mixing rule
 * a_mix = Σ_i Σ_j x_i x_j √(a_i a_j)(1 − k_ij). Symmetric, k_ii = 0, and 0 for every pair not listed.
 */

export type CubicModelId = 'van-der-waals' | 'srk' | 'peng-robinson'

export interface KijEntry {
  readonly a: string
  readonly b: string
  readonly kij: number
}

export interface KijTable {
  readonly model: CubicModelId
  readonly source: string
  readonly status: 'published' | 'unverified'
  readonly entries: readonly KijEntry[]
  /** published pairs deliberately not adopted, with the reason */
  readonly excluded: readonly { readonly a: string; readonly b: string; readonly kij: number; readonly reason: string }[]
}

const k = (a: string, b: string, kij: number): KijEntry => ({ a, b, kij })

const LARGE_FIT = '|k_ij| > 0.25 fitted to narrow low-temperature phase-equilibrium data; not adopted for gas-phase work (common practice, no source)'

/**
 * Peng–Robinson k_ij: Knapp, Döring, Oellrich, Plöcker & Prausnitz, "Vapor–liquid equilibria for mixtures of low
 * boiling substances", DECHEMA Chemistry Data Series Vol. VI (1982), as compiled in the ChemSep interaction-parameter
 * library pr.ipd (Kooijman & Taylor, 2009).
 */
export const PENG_ROBINSON_KIJ: KijTable = {
  model: 'peng-robinson',
  source:
    'Knapp et al., DECHEMA Chemistry Data Series Vol. VI (1982), Peng–Robinson k12 values as compiled in the ChemSep ' +
    'interaction-parameter library pr.ipd (Kooijman & Taylor, 2009)',
  status: 'published',
  entries: [
    k('hydrogen', 'nitrogen', 0.0711),
    k('hydrogen', 'carbon-monoxide', 0.0919),
    k('hydrogen', 'methane', -0.0044),
    k('hydrogen', 'ethylene', 0.0633),
    k('hydrogen', 'ethane', -0.0781),
    k('hydrogen', 'carbon-dioxide', -0.1622),
    k('hydrogen', 'propane', -0.1311),
    k('hydrogen', 'n-hexane', -0.03),
    k('hydrogen', 'n-heptane', -0.1167),
    k('nitrogen', 'carbon-monoxide', 0.03),
    k('nitrogen', 'argon', -0.0004),
    k('nitrogen', 'oxygen', -0.0159),
    k('nitrogen', 'methane', 0.0289),
    k('nitrogen', 'ethylene', 0.0856),
    k('nitrogen', 'ethane', 0.0533),
    k('nitrogen', 'nitrous-oxide', 0.0044),
    k('nitrogen', 'carbon-dioxide', -0.0122),
    k('nitrogen', 'hydrogen-sulfide', 0.1652),
    k('nitrogen', 'propane', 0.0878),
    k('nitrogen', 'ammonia', 0.2193),
    k('nitrogen', 'isobutane', 0.1033),
    k('nitrogen', 'sulfur-dioxide', 0.08),
    k('nitrogen', 'n-butane', 0.0711),
    k('nitrogen', 'isopentane', 0.0922),
    k('nitrogen', 'n-pentane', 0.1),
    k('nitrogen', 'n-hexane', 0.1496),
    k('nitrogen', 'n-heptane', 0.1441),
    k('nitrogen', 'n-decane', 0.1122),
    k('carbon-monoxide', 'methane', 0.03),
    k('carbon-monoxide', 'ethane', -0.0226),
    k('carbon-monoxide', 'hydrogen-sulfide', 0.0544),
    k('carbon-monoxide', 'propane', 0.0259),
    k('argon', 'oxygen', 0.0089),
    k('argon', 'methane', 0.0152),
    k('argon', 'ammonia', -0.18),
    k('oxygen', 'krypton', 0.0185),
    k('oxygen', 'nitrous-oxide', 0.0478),
    k('methane', 'ethylene', 0.0244),
    k('methane', 'ethane', -0.0059),
    k('methane', 'nitrous-oxide', 0.0256),
    k('methane', 'carbon-dioxide', 0.0978),
    k('methane', 'propane', 0.0119),
    k('methane', 'isobutane', 0.0256),
    k('methane', 'sulfur-dioxide', 0.1356),
    k('methane', 'n-butane', 0.0185),
    k('methane', 'isopentane', -0.0056),
    k('methane', 'n-pentane', 0.023),
    k('methane', 'n-hexane', 0.04),
    k('methane', 'n-heptane', 0.03),
    k('methane', 'n-octane', 0.0496),
    k('methane', 'n-nonane', 0.0474),
    k('methane', 'n-decane', 0.0411),
    k('ethylene', 'ethane', 0.0078),
    k('ethylene', 'acetylene', 0.0652),
    k('ethylene', 'carbon-dioxide', 0.0541),
    k('ethylene', 'n-butane', 0.0922),
    k('ethylene', 'n-heptane', 0.0144),
    k('ethylene', 'n-decane', 0.0253),
    k('carbon-dioxide', 'ethane', 0.13),
    k('ethane', 'hydrogen-sulfide', 0.0952),
    k('ethane', 'propane', 0.0011),
    k('ethane', 'isobutane', -0.0067),
    k('ethane', 'n-butane', 0.0089),
    k('ethane', 'n-pentane', 0.0078),
    k('ethane', 'n-hexane', -0.04),
    k('ethane', 'n-heptane', 0.0033),
    k('ethane', 'n-octane', 0.0185),
    k('ethane', 'n-decane', 0.0144),
    k('carbon-dioxide', 'nitrous-oxide', 0.0048),
    k('carbon-dioxide', 'hydrogen-sulfide', 0.0967),
    k('carbon-dioxide', 'propane', 0.1315),
    k('carbon-dioxide', 'isobutane', 0.13),
    k('carbon-dioxide', 'n-butane', 0.1352),
    k('carbon-dioxide', 'isopentane', 0.1219),
    k('carbon-dioxide', 'n-pentane', 0.1252),
    k('carbon-dioxide', 'n-hexane', 0.11),
    k('carbon-dioxide', 'n-heptane', 0.1),
    k('carbon-dioxide', 'water', 0.0952),
    k('carbon-dioxide', 'n-decane', 0.1141),
    k('hydrogen-sulfide', 'propane', 0.0878),
    k('hydrogen-sulfide', 'isobutane', 0.0474),
    k('hydrogen-sulfide', 'n-pentane', 0.063),
    k('hydrogen-sulfide', 'water', 0.0394),
    k('hydrogen-sulfide', 'n-decane', 0.0333),
    k('propane', 'isobutane', -0.0078),
    k('propane', 'n-butane', 0.0033),
    k('propane', 'isopentane', 0.0111),
    k('propane', 'n-pentane', 0.0267),
    k('propane', 'n-hexane', 0.0007),
    k('propane', 'n-heptane', 0.0056),
    k('propane', 'n-octane', 0),
    k('propane', 'n-decane', 0),
    k('isobutane', 'n-butane', -0.0004),
    k('n-butane', 'n-pentane', 0.0174),
    k('n-butane', 'n-hexane', -0.0056),
    k('n-butane', 'n-heptane', 0.0033),
    k('n-butane', 'n-octane', 0.0074),
    k('n-butane', 'n-decane', 0.0078),
    k('n-pentane', 'n-heptane', 0.0074),
    k('n-pentane', 'n-octane', 0),
    k('n-hexane', 'n-heptane', -0.0078),
  ],
  excluded: [
    { a: 'helium', b: 'carbon-monoxide', kij: 0.5463, reason: LARGE_FIT },
    { a: 'hydrogen', b: 'n-butane', kij: -0.397, reason: LARGE_FIT },
    { a: 'nitrogen', b: 'n-octane', kij: -0.4, reason: LARGE_FIT },
    { a: 'ammonia', b: 'water', kij: -0.2552, reason: LARGE_FIT },
  ],
}

/**
 * Soave–Redlich–Kwong k_ij. Only a few widely quoted natural-gas pairs, recalled from memory (the values commonly
 * tabulated with SRK, e.g. in Reid, Prausnitz & Poling, 4th ed. (1987)); unverified. All other pairs use 0.
 */
export const SRK_KIJ: KijTable = {
  model: 'srk',
  source: 'SRK k_ij commonly tabulated for natural-gas pairs (Reid, Prausnitz & Poling, 4th ed., 1987) — from memory, unverified',
  status: 'unverified',
  entries: [k('methane', 'carbon-dioxide', 0.093), k('nitrogen', 'methane', 0.028), k('carbon-dioxide', 'ethane', 0.136)],
  excluded: [],
}

/** van der Waals: no k_ij table; the geometric-mean rule is used unchanged (k_ij = 0). */
export const VAN_DER_WAALS_KIJ: KijTable = {
  model: 'van-der-waals',
  source: 'none: k_ij = 0 for every pair',
  status: 'published',
  entries: [],
  excluded: [],
}

export const KIJ_TABLES: Readonly<Record<CubicModelId, KijTable>> = {
  'van-der-waals': VAN_DER_WAALS_KIJ,
  srk: SRK_KIJ,
  'peng-robinson': PENG_ROBINSON_KIJ,
}

const pairKey = (a: string, b: string): string => (a < b ? `${a}|${b}` : `${b}|${a}`)

const LOOKUP: Readonly<Record<CubicModelId, ReadonlyMap<string, number>>> = {
  'van-der-waals': new Map(),
  srk: new Map(SRK_KIJ.entries.map((e) => [pairKey(e.a, e.b), e.kij])),
  'peng-robinson': new Map(PENG_ROBINSON_KIJ.entries.map((e) => [pairKey(e.a, e.b), e.kij])),
}

/**
 * k_ij for a pair of library gases (0 when not tabulated, and for i = j).
 * @example interactionParameter('peng-robinson', 'methane', 'carbon-dioxide') // 0.0978
 */
export function interactionParameter(model: CubicModelId, gasA: string, gasB: string): number {
  if (gasA === gasB) return 0
  return LOOKUP[model].get(pairKey(gasA, gasB)) ?? 0
}
