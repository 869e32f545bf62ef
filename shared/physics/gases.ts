/**
 * The gas library: identity, critical constants, acentric factor, boiling point, vapour-pressure correlation,
 * flammability limits, ISO 10156 coefficients, LC50, hazard flags and reactivity groups of every gas Fillwright
 * blends. Every value names its source in `sources`; values marked "from memory" or "unverified" must be checked
 * against the cited document before they are relied on for a safety decision.
 *
 * Units: molar mass g/mol (as tabulated), temperature K, pressure Pa, limits and Tci in % by volume.
 */
import { PhysicsInputError } from './types.ts'

export type HazardFlag = 'flammable' | 'oxidiser' | 'toxic' | 'corrosive' | 'asphyxiant' | 'inert' | 'pyrophoric' | 'condensable' | 'unstable'

/** Reactivity groups used for incompatibility screening (broader than transport classes: air is an 'oxidiser' here). */
export type ReactivityGroup = 'fuel' | 'oxidiser' | 'inert' | 'acid' | 'base'

/**
 * Vapour-pressure correlation with its validity range.
 * - 'dippr-101': ln(p/Pa) = c1 + c2/T + c3·ln T + c4·T^c5 (DIPPR equation 101).
 * - 'antoine': log10(p/Pa) = a − b/(T + c), T in K.
 */
export type VapourPressureCorrelation =
  | {
      readonly kind: 'dippr-101'
      readonly c1: number
      readonly c2: number
      readonly c3: number
      readonly c4: number
      readonly c5: number
      readonly minTemperatureK: number
      readonly maxTemperatureK: number
    }
  | {
      readonly kind: 'antoine'
      readonly a: number
      readonly b: number
      readonly c: number
      readonly minTemperatureK: number
      readonly maxTemperatureK: number
    }

export interface FlammabilityLimits {
  /** lower flammability limit in air, % by volume */
  readonly lflPercent: number
  /** upper flammability limit in air, % by volume */
  readonly uflPercent: number
}

/** Whether a number is a definition, a checked published value, or unverified (from memory). */
export type DataStatus = 'definition' | 'published' | 'unverified'

/** ISO 10156 coefficients. Tci: % of the fuel in N2 at which the mixture becomes flammable in air. */
export interface Iso10156Coefficients {
  readonly tciPercent?: number
  /** nitrogen-equivalency coefficient K of an inert gas (N2 = 1) */
  readonly kEquivalent?: number
  /** oxygen-equivalency coefficient Ci of an oxidiser (O2 = 1) */
  readonly ci?: number
  readonly status: DataStatus
  readonly confidence: 'normal' | 'low'
}

export interface Toxicity {
  /** LC50, 1 h, rat, ppm by volume (basis used for transport classification) */
  readonly lc50PpmV: number
  readonly status: DataStatus
  readonly source: string
}

export type GasSourceKey =
  | 'identity'
  | 'molarMass'
  | 'criticalPoint'
  | 'acentricFactor'
  | 'normalBoilingPoint'
  | 'vapourPressure'
  | 'flammability'
  | 'iso10156'
  | 'toxicity'
  | 'hazards'

export interface Gas {
  readonly id: string
  readonly name: string
  readonly formula: string
  readonly casNumber: string
  readonly molarMassGPerMol: number
  readonly criticalTemperatureK: number
  readonly criticalPressurePa: number
  readonly acentricFactor: number
  /** normal boiling point at 101.325 kPa, or the sublimation point when `normalBoilingPointIsSublimation` */
  readonly normalBoilingPointK: number
  readonly normalBoilingPointIsSublimation: boolean
  readonly vapourPressure: VapourPressureCorrelation | null
  readonly flammability: FlammabilityLimits | null
  readonly iso10156: Iso10156Coefficients | null
  readonly toxicity: Toxicity | null
  readonly hazards: readonly HazardFlag[]
  readonly groups: readonly ReactivityGroup[]
  /** true for the 21 components of GERG-2008 */
  readonly gerg2008: boolean
  /** pseudo-components (air) are expanded into these amount fractions before any equation of state is evaluated */
  readonly composition?: readonly { readonly gasId: string; readonly x: number }[]
  readonly notes: readonly string[]
  readonly sources: Readonly<Partial<Record<GasSourceKey, string>>>
}

// ---- sources ------------------------------------------------------------------------------------------------

const SRC = {
  identity: 'CAS Registry numbers and formulas as listed in ISO 6976:2016 Table A.2 / NIST Chemistry WebBook',
  molarMass:
    'ISO 6976:2016 Table A.2 and GERG-2008 (Kunz & Wagner, J. Chem. Eng. Data 57 (2012) 3032) molar masses, ' +
    'computed from the IUPAC 2005/2007 atomic weights (H 1.00794, C 12.0107, N 14.0067, O 15.9994, S 32.065, ' +
    'F 18.9984032, Cl 35.453)',
  heos: 'Constants of the reference Helmholtz equations of state (CoolProp basis), as tabulated in the chemicals ' + 'library file Misc/heos_constants.tsv',
  psrk:
    'Horstmann, Jabłoniec, Krafczyk, Fischer & Gmehling, PSRK group contribution EOS: revision and extension, ' +
    'Fluid Phase Equilib. 227 (2005) 157, parameter appendix, as tabulated in the chemicals library',
  perry:
    "Perry's Chemical Engineers' Handbook, 8th ed. (2008), Table 2-8 (DIPPR eq. 101 coefficients), as tabulated " +
    "in the chemicals library file 'Vapor Pressure/Table 2-8 Vapor Pressure of Inorganic and Organic Liquids.tsv'",
  polingAntoine:
    "Poling, Prausnitz & O'Connell, The Properties of Gases and Liquids, 5th ed. (2001), App. A Antoine constants, " +
    "as tabulated (converted to Pa and K) in the chemicals library file 'Vapor Pressure/Antoine Collection Poling.tsv'",
  iec: 'IEC 60079-20-1:2010 data table, as tabulated in the chemicals library file Safety/IS IEC 60079-20-1 2010.tsv',
  iso10156: 'ISO 10156:2017 Tables (Tci, K, Ci) — from memory, unverified: check against the purchased standard before ' + 'a safety decision relies on it',
  iso10156Definition: 'ISO 10156: definition (N2 is the reference inert with K = 1; O2 the reference oxidiser with Ci = 1)',
  lc50: 'ADR P200 / ISO 10298:2018 LC50 (1 h, rat) — from memory, unverified',
  hazards: 'common practice, no source (flags follow the properties in this table)',
  condensable: "'condensable' = critical temperature above 253.15 K (−20 °C): can liquefy in a cylinder — common practice, no source",
} as const

// ---- helpers to keep rows short ---------------------------------------------------------------------------

function dippr(c1: number, c2: number, c3: number, c4: number, c5: number, minTemperatureK: number, maxTemperatureK: number): VapourPressureCorrelation {
  return { kind: 'dippr-101', c1, c2, c3, c4, c5, minTemperatureK, maxTemperatureK }
}

function tci(tciPercent: number, confidence: 'normal' | 'low' = 'normal'): Iso10156Coefficients {
  return { tciPercent, status: 'unverified', confidence }
}

function inertK(kEquivalent: number, confidence: 'normal' | 'low' = 'normal'): Iso10156Coefficients {
  return { kEquivalent, status: 'unverified', confidence }
}

function oxidiserCi(ci: number, confidence: 'normal' | 'low' = 'normal'): Iso10156Coefficients {
  return { ci, status: 'unverified', confidence }
}

function lc50(lc50PpmV: number): Toxicity {
  return { lc50PpmV, status: 'unverified', source: SRC.lc50 }
}

const COMMON_SOURCES = {
  identity: SRC.identity,
  molarMass: SRC.molarMass,
  criticalPoint: SRC.heos,
  acentricFactor: SRC.heos,
  normalBoilingPoint: SRC.heos,
  vapourPressure: SRC.perry,
  hazards: SRC.hazards,
} as const

// ---- the table --------------------------------------------------------------------------------------------

export const GASES: readonly Gas[] = Object.freeze([
  {
    id: 'nitrogen',
    name: 'Nitrogen',
    formula: 'N2',
    casNumber: '7727-37-9',
    molarMassGPerMol: 28.0134,
    criticalTemperatureK: 126.192,
    criticalPressurePa: 3_395_800,
    acentricFactor: 0.0372,
    normalBoilingPointK: 77.355,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(58.282, -1084.1, -8.3144, 0.044127, 1, 63.15, 126.2),
    flammability: null,
    iso10156: { kEquivalent: 1, status: 'definition', confidence: 'normal' },
    toxicity: null,
    hazards: ['inert', 'asphyxiant'],
    groups: ['inert'],
    gerg2008: true,
    notes: [],
    sources: { ...COMMON_SOURCES, iso10156: SRC.iso10156Definition },
  },
  {
    id: 'oxygen',
    name: 'Oxygen',
    formula: 'O2',
    casNumber: '7782-44-7',
    molarMassGPerMol: 31.9988,
    criticalTemperatureK: 154.581,
    criticalPressurePa: 5_043_000,
    acentricFactor: 0.0222,
    normalBoilingPointK: 90.188,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(51.245, -1200.2, -6.4361, 0.028405, 1, 54.36, 154.58),
    flammability: null,
    iso10156: { ci: 1, status: 'definition', confidence: 'normal' },
    toxicity: null,
    hazards: ['oxidiser'],
    groups: ['oxidiser'],
    gerg2008: true,
    notes: [],
    sources: { ...COMMON_SOURCES, iso10156: SRC.iso10156Definition },
  },
  {
    id: 'argon',
    name: 'Argon',
    formula: 'Ar',
    casNumber: '7440-37-1',
    molarMassGPerMol: 39.948,
    criticalTemperatureK: 150.687,
    criticalPressurePa: 4_863_000,
    acentricFactor: -0.00219,
    normalBoilingPointK: 87.302,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(42.127, -1093.1, -4.1425, 5.7254e-5, 2, 83.78, 150.86),
    flammability: null,
    iso10156: inertK(0.55),
    toxicity: null,
    hazards: ['inert', 'asphyxiant'],
    groups: ['inert'],
    gerg2008: true,
    notes: [],
    sources: { ...COMMON_SOURCES, iso10156: SRC.iso10156 },
  },
  {
    id: 'helium',
    name: 'Helium',
    formula: 'He',
    casNumber: '7440-59-7',
    molarMassGPerMol: 4.002602,
    criticalTemperatureK: 5.1953,
    criticalPressurePa: 228_320,
    acentricFactor: -0.3836,
    normalBoilingPointK: 4.2238,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(11.533, -8.99, 0.6724, 0.2743, 1, 1.76, 5.2),
    flammability: null,
    iso10156: inertK(0.9),
    toxicity: null,
    hazards: ['inert', 'asphyxiant'],
    groups: ['inert'],
    gerg2008: true,
    notes: ['quantum gas: cubic-EOS alpha functions are poor for helium; prefer GERG-2008'],
    sources: { ...COMMON_SOURCES, iso10156: SRC.iso10156 },
  },
  {
    id: 'hydrogen',
    name: 'Hydrogen (normal)',
    formula: 'H2',
    casNumber: '1333-74-0',
    molarMassGPerMol: 2.01588,
    criticalTemperatureK: 33.145,
    criticalPressurePa: 1_296_400,
    acentricFactor: -0.219,
    normalBoilingPointK: 20.369,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(12.69, -94.896, 1.1125, 3.2915e-4, 2, 13.95, 33.19),
    flammability: { lflPercent: 4.0, uflPercent: 77 },
    iso10156: tci(5.7),
    toxicity: null,
    hazards: ['flammable', 'asphyxiant'],
    groups: ['fuel'],
    gerg2008: true,
    notes: ['ISO 10156:1996 gave Tci = 5.5 %; 5.7 % is the value recalled for the 2010/2017 editions (unverified)'],
    sources: { ...COMMON_SOURCES, flammability: SRC.iec, iso10156: SRC.iso10156 },
  },
  {
    id: 'carbon-dioxide',
    name: 'Carbon dioxide',
    formula: 'CO2',
    casNumber: '124-38-9',
    molarMassGPerMol: 44.0095,
    criticalTemperatureK: 304.1282,
    criticalPressurePa: 7_377_300,
    acentricFactor: 0.22394,
    normalBoilingPointK: 194.69,
    normalBoilingPointIsSublimation: true,
    vapourPressure: dippr(140.54, -4735, -21.268, 0.040909, 1, 216.58, 304.21),
    flammability: null,
    iso10156: inertK(1.5),
    toxicity: null,
    hazards: ['inert', 'asphyxiant', 'condensable'],
    groups: ['inert', 'acid'],
    gerg2008: true,
    notes: ['sublimes at 101.325 kPa; triple point 216.59 K / 0.518 MPa'],
    sources: {
      ...COMMON_SOURCES,
      normalBoilingPoint: 'sublimation temperature at 101.325 kPa, 194.69 K — from memory',
      iso10156: SRC.iso10156,
      hazards: `${SRC.hazards}; ${SRC.condensable}`,
    },
  },
  {
    id: 'carbon-monoxide',
    name: 'Carbon monoxide',
    formula: 'CO',
    casNumber: '630-08-0',
    molarMassGPerMol: 28.0101,
    criticalTemperatureK: 132.86,
    criticalPressurePa: 3_494_000,
    acentricFactor: 0.0497,
    normalBoilingPointK: 81.638,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(45.698, -1076.6, -4.8814, 7.5673e-5, 2, 68.15, 132.92),
    flammability: { lflPercent: 10.9, uflPercent: 74 },
    iso10156: tci(20),
    toxicity: lc50(3760),
    hazards: ['flammable', 'toxic'],
    groups: ['fuel'],
    gerg2008: true,
    notes: ['forms iron carbonyl with steel at high pressure (common practice, no source)'],
    sources: { ...COMMON_SOURCES, flammability: SRC.iec, iso10156: SRC.iso10156, toxicity: SRC.lc50 },
  },
  {
    id: 'methane',
    name: 'Methane',
    formula: 'CH4',
    casNumber: '74-82-8',
    molarMassGPerMol: 16.04246,
    criticalTemperatureK: 190.564,
    criticalPressurePa: 4_599_200,
    acentricFactor: 0.01142,
    normalBoilingPointK: 111.667,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(39.205, -1324.4, -3.4366, 3.1019e-5, 2, 90.69, 190.56),
    flammability: { lflPercent: 4.4, uflPercent: 17 },
    iso10156: tci(14.3),
    toxicity: null,
    hazards: ['flammable', 'asphyxiant'],
    groups: ['fuel'],
    gerg2008: true,
    notes: ['US practice (NFPA) often uses LFL 5.0 %; state the LEL basis on certificates'],
    sources: { ...COMMON_SOURCES, flammability: SRC.iec, iso10156: SRC.iso10156 },
  },
  {
    id: 'ethane',
    name: 'Ethane',
    formula: 'C2H6',
    casNumber: '74-84-0',
    molarMassGPerMol: 30.06904,
    criticalTemperatureK: 305.322,
    criticalPressurePa: 4_872_200,
    acentricFactor: 0.0995,
    normalBoilingPointK: 184.569,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(51.857, -2598.7, -5.1283, 1.4913e-5, 2, 90.35, 305.32),
    flammability: { lflPercent: 2.4, uflPercent: 15.5 },
    iso10156: tci(7.6),
    toxicity: null,
    hazards: ['flammable', 'asphyxiant', 'condensable'],
    groups: ['fuel'],
    gerg2008: true,
    notes: [],
    sources: { ...COMMON_SOURCES, flammability: SRC.iec, iso10156: SRC.iso10156, hazards: `${SRC.hazards}; ${SRC.condensable}` },
  },
  {
    id: 'propane',
    name: 'Propane',
    formula: 'C3H8',
    casNumber: '74-98-6',
    molarMassGPerMol: 44.09562,
    criticalTemperatureK: 369.89,
    criticalPressurePa: 4_251_200,
    acentricFactor: 0.1521,
    normalBoilingPointK: 231.036,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(59.078, -3492.6, -6.0669, 1.0919e-5, 2, 85.47, 369.83),
    flammability: { lflPercent: 1.7, uflPercent: 10.9 },
    iso10156: tci(6.0),
    toxicity: null,
    hazards: ['flammable', 'asphyxiant', 'condensable'],
    groups: ['fuel'],
    gerg2008: true,
    notes: [],
    sources: { ...COMMON_SOURCES, flammability: SRC.iec, iso10156: SRC.iso10156, hazards: `${SRC.hazards}; ${SRC.condensable}` },
  },
  {
    id: 'n-butane',
    name: 'n-Butane',
    formula: 'C4H10',
    casNumber: '106-97-8',
    molarMassGPerMol: 58.1222,
    criticalTemperatureK: 425.125,
    criticalPressurePa: 3_796_000,
    acentricFactor: 0.201,
    normalBoilingPointK: 272.66,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(66.343, -4363.2, -7.046, 9.4509e-6, 2, 134.86, 425.12),
    flammability: { lflPercent: 1.4, uflPercent: 9.3 },
    iso10156: tci(5.7),
    toxicity: null,
    hazards: ['flammable', 'condensable'],
    groups: ['fuel'],
    gerg2008: true,
    notes: [],
    sources: { ...COMMON_SOURCES, flammability: SRC.iec, iso10156: SRC.iso10156, hazards: `${SRC.hazards}; ${SRC.condensable}` },
  },
  {
    id: 'isobutane',
    name: 'Isobutane (2-methylpropane)',
    formula: 'C4H10',
    casNumber: '75-28-5',
    molarMassGPerMol: 58.1222,
    criticalTemperatureK: 407.81,
    criticalPressurePa: 3_629_000,
    acentricFactor: 0.184,
    normalBoilingPointK: 261.401,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(108.43, -5039.9, -15.012, 0.022725, 1, 113.54, 407.8),
    flammability: { lflPercent: 1.3, uflPercent: 9.8 },
    iso10156: tci(5.7, 'low'),
    toxicity: null,
    hazards: ['flammable', 'condensable'],
    groups: ['fuel'],
    gerg2008: true,
    notes: [],
    sources: { ...COMMON_SOURCES, flammability: SRC.iec, iso10156: SRC.iso10156, hazards: `${SRC.hazards}; ${SRC.condensable}` },
  },
  {
    id: 'n-pentane',
    name: 'n-Pentane',
    formula: 'C5H12',
    casNumber: '109-66-0',
    molarMassGPerMol: 72.14878,
    criticalTemperatureK: 469.7,
    criticalPressurePa: 3_367_500,
    acentricFactor: 0.251,
    normalBoilingPointK: 309.209,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(78.741, -5420.3, -8.8253, 9.6171e-6, 2, 143.42, 469.7),
    flammability: { lflPercent: 1.1, uflPercent: 8.7 },
    iso10156: null,
    toxicity: null,
    hazards: ['flammable', 'condensable'],
    groups: ['fuel'],
    gerg2008: true,
    notes: [],
    sources: { ...COMMON_SOURCES, flammability: SRC.iec, hazards: `${SRC.hazards}; ${SRC.condensable}` },
  },
  {
    id: 'isopentane',
    name: 'Isopentane (2-methylbutane)',
    formula: 'C5H12',
    casNumber: '78-78-4',
    molarMassGPerMol: 72.14878,
    criticalTemperatureK: 460.35,
    criticalPressurePa: 3_378_000,
    acentricFactor: 0.2274,
    normalBoilingPointK: 300.976,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(71.308, -4976, -7.7169, 8.7271e-6, 2, 113.25, 460.4),
    flammability: { lflPercent: 1.3, uflPercent: 8.3 },
    iso10156: null,
    toxicity: null,
    hazards: ['flammable', 'condensable'],
    groups: ['fuel'],
    gerg2008: true,
    notes: [],
    sources: { ...COMMON_SOURCES, flammability: SRC.iec, hazards: `${SRC.hazards}; ${SRC.condensable}` },
  },
  {
    id: 'n-hexane',
    name: 'n-Hexane',
    formula: 'C6H14',
    casNumber: '110-54-3',
    molarMassGPerMol: 86.17536,
    criticalTemperatureK: 507.82,
    criticalPressurePa: 3_044_100,
    acentricFactor: 0.3,
    normalBoilingPointK: 341.866,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(104.65, -6995.5, -12.702, 1.2381e-5, 2, 177.83, 507.6),
    flammability: { lflPercent: 1.0, uflPercent: 8.9 },
    iso10156: null,
    toxicity: null,
    hazards: ['flammable', 'condensable'],
    groups: ['fuel'],
    gerg2008: true,
    notes: [],
    sources: { ...COMMON_SOURCES, flammability: SRC.iec, hazards: `${SRC.hazards}; ${SRC.condensable}` },
  },
  {
    id: 'n-heptane',
    name: 'n-Heptane',
    formula: 'C7H16',
    casNumber: '142-82-5',
    molarMassGPerMol: 100.20194,
    criticalTemperatureK: 540.2,
    criticalPressurePa: 2_735_730,
    acentricFactor: 0.349,
    normalBoilingPointK: 371.55,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(87.829, -6996.4, -9.8802, 7.2099e-6, 2, 182.57, 540.2),
    flammability: { lflPercent: 0.85, uflPercent: 6.7 },
    iso10156: null,
    toxicity: null,
    hazards: ['flammable', 'condensable'],
    groups: ['fuel'],
    gerg2008: true,
    notes: [],
    sources: { ...COMMON_SOURCES, flammability: SRC.iec, hazards: `${SRC.hazards}; ${SRC.condensable}` },
  },
  {
    id: 'n-octane',
    name: 'n-Octane',
    formula: 'C8H18',
    casNumber: '111-65-9',
    molarMassGPerMol: 114.22852,
    criticalTemperatureK: 568.74,
    criticalPressurePa: 2_483_590,
    acentricFactor: 0.398,
    normalBoilingPointK: 398.794,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(96.084, -7900.2, -11.003, 7.1802e-6, 2, 216.38, 568.7),
    flammability: { lflPercent: 0.8, uflPercent: 6.5 },
    iso10156: null,
    toxicity: null,
    hazards: ['flammable', 'condensable'],
    groups: ['fuel'],
    gerg2008: true,
    notes: [],
    sources: { ...COMMON_SOURCES, flammability: SRC.iec, hazards: `${SRC.hazards}; ${SRC.condensable}` },
  },
  {
    id: 'n-nonane',
    name: 'n-Nonane',
    formula: 'C9H20',
    casNumber: '111-84-2',
    molarMassGPerMol: 128.2551,
    criticalTemperatureK: 594.55,
    criticalPressurePa: 2_281_000,
    acentricFactor: 0.4433,
    normalBoilingPointK: 423.913,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(109.35, -9030.4, -12.882, 7.8544e-6, 2, 219.66, 594.6),
    flammability: { lflPercent: 0.7, uflPercent: 5.6 },
    iso10156: null,
    toxicity: null,
    hazards: ['flammable', 'condensable'],
    groups: ['fuel'],
    gerg2008: true,
    notes: [],
    sources: { ...COMMON_SOURCES, flammability: SRC.iec, hazards: `${SRC.hazards}; ${SRC.condensable}` },
  },
  {
    id: 'n-decane',
    name: 'n-Decane',
    formula: 'C10H22',
    casNumber: '124-18-5',
    molarMassGPerMol: 142.28168,
    criticalTemperatureK: 617.7,
    criticalPressurePa: 2_103_000,
    acentricFactor: 0.4884,
    normalBoilingPointK: 447.27,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(112.73, -9749.6, -13.245, 7.1266e-6, 2, 243.51, 617.7),
    flammability: { lflPercent: 0.7, uflPercent: 5.6 },
    iso10156: null,
    toxicity: null,
    hazards: ['flammable', 'condensable'],
    groups: ['fuel'],
    gerg2008: true,
    notes: [],
    sources: { ...COMMON_SOURCES, flammability: SRC.iec, hazards: `${SRC.hazards}; ${SRC.condensable}` },
  },
  {
    id: 'ethylene',
    name: 'Ethylene (ethene)',
    formula: 'C2H4',
    casNumber: '74-85-1',
    molarMassGPerMol: 28.05316,
    criticalTemperatureK: 282.35,
    criticalPressurePa: 5_041_800,
    acentricFactor: 0.0866,
    normalBoilingPointK: 169.379,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(53.963, -2443, -5.5643, 1.9079e-5, 2, 104, 282.34),
    flammability: { lflPercent: 2.3, uflPercent: 36 },
    iso10156: tci(6.0),
    toxicity: null,
    hazards: ['flammable', 'asphyxiant', 'condensable'],
    groups: ['fuel'],
    gerg2008: false,
    notes: [],
    sources: { ...COMMON_SOURCES, flammability: SRC.iec, iso10156: SRC.iso10156, hazards: `${SRC.hazards}; ${SRC.condensable}` },
  },
  {
    id: 'acetylene',
    name: 'Acetylene (ethyne)',
    formula: 'C2H2',
    casNumber: '74-86-2',
    molarMassGPerMol: 26.03728,
    criticalTemperatureK: 308.3,
    criticalPressurePa: 5_988_200,
    acentricFactor: 0.178,
    normalBoilingPointK: 189.0,
    normalBoilingPointIsSublimation: true,
    vapourPressure: dippr(39.63, -2552.2, -2.78, 2.393e-16, 6, 192.4, 308.3),
    flammability: { lflPercent: 2.3, uflPercent: 100 },
    iso10156: tci(4, 'low'),
    toxicity: null,
    hazards: ['flammable', 'unstable', 'condensable'],
    groups: ['fuel'],
    gerg2008: false,
    notes: [
      'never compress pure acetylene above 15 psig (1.03 bar g) — 29 CFR 1910.253(a)(2)',
      'forms explosive acetylides with copper, silver and mercury fittings (common practice, no source)',
    ],
    sources: {
      ...COMMON_SOURCES,
      normalBoilingPoint: 'sublimation at 101.325 kPa, about 189 K (triple point 192.4 K) — from memory, approximate',
      flammability: SRC.iec,
      iso10156: SRC.iso10156,
      hazards: `${SRC.hazards}; ${SRC.condensable}`,
    },
  },
  {
    id: 'nitrous-oxide',
    name: 'Nitrous oxide',
    formula: 'N2O',
    casNumber: '10024-97-2',
    molarMassGPerMol: 44.0128,
    criticalTemperatureK: 309.52,
    criticalPressurePa: 7_245_000,
    acentricFactor: 0.162,
    normalBoilingPointK: 184.684,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(96.512, -4045, -12.277, 2.886e-5, 2, 182.3, 309.57),
    flammability: null,
    iso10156: oxidiserCi(0.6),
    toxicity: null,
    hazards: ['oxidiser', 'condensable'],
    groups: ['oxidiser'],
    gerg2008: false,
    notes: [],
    sources: { ...COMMON_SOURCES, iso10156: SRC.iso10156, hazards: `${SRC.hazards}; ${SRC.condensable}` },
  },
  {
    id: 'nitric-oxide',
    name: 'Nitric oxide (nitrogen monoxide)',
    formula: 'NO',
    casNumber: '10102-43-9',
    molarMassGPerMol: 30.0061,
    criticalTemperatureK: 180.0,
    criticalPressurePa: 6_480_000,
    acentricFactor: 0.588,
    normalBoilingPointK: 121.4,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(72.974, -2650, -8.261, 9.7e-15, 6, 109.5, 180.15),
    flammability: null,
    iso10156: oxidiserCi(0.3),
    toxicity: lc50(115),
    hazards: ['toxic', 'oxidiser', 'corrosive'],
    groups: ['oxidiser'],
    gerg2008: false,
    notes: ['oxidises to NO2 with any oxygen: never blend with O2 or air', 'Poling lists Tc 180.15 K / ω 0.582 (from memory)'],
    sources: {
      ...COMMON_SOURCES,
      criticalPoint: SRC.psrk,
      acentricFactor: SRC.psrk,
      normalBoilingPoint: 'normal boiling point 121.4 K — from memory',
      iso10156: SRC.iso10156,
      toxicity: SRC.lc50,
    },
  },
  {
    id: 'nitrogen-dioxide',
    name: 'Nitrogen dioxide (NO2/N2O4)',
    formula: 'NO2',
    casNumber: '10102-44-0',
    molarMassGPerMol: 46.0055,
    criticalTemperatureK: 431.0,
    criticalPressurePa: 10_132_500,
    acentricFactor: 0.8555,
    normalBoilingPointK: 294.3,
    normalBoilingPointIsSublimation: false,
    vapourPressure: null,
    flammability: null,
    iso10156: oxidiserCi(1, 'low'),
    toxicity: lc50(115),
    hazards: ['toxic', 'oxidiser', 'corrosive', 'condensable'],
    groups: ['oxidiser', 'acid'],
    gerg2008: false,
    notes: [
      'associates to N2O4; critical constants and ω describe the equilibrium mixture only roughly — treat with care',
      'no verified vapour-pressure correlation in this library (about 0.96 bar at 20 °C, from memory)',
    ],
    sources: {
      ...COMMON_SOURCES,
      criticalPoint: SRC.psrk,
      acentricFactor: SRC.psrk,
      normalBoilingPoint: 'normal boiling point 294.3 K (21.15 °C) — from memory',
      vapourPressure: 'none adopted: the Poling Antoine entry for N2O4 gives 0.73 bar at the normal boiling point and was rejected',
      iso10156: SRC.iso10156,
      toxicity: SRC.lc50,
      hazards: `${SRC.hazards}; ${SRC.condensable}`,
    },
  },
  {
    id: 'sulfur-dioxide',
    name: 'Sulfur dioxide',
    formula: 'SO2',
    casNumber: '7446-09-5',
    molarMassGPerMol: 64.0638,
    criticalTemperatureK: 430.64,
    criticalPressurePa: 7_886_600,
    acentricFactor: 0.256,
    normalBoilingPointK: 263.137,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(47.365, -4084.5, -3.6469, 1.799e-17, 6, 197.67, 430.75),
    flammability: null,
    iso10156: inertK(1.5),
    toxicity: lc50(2520),
    hazards: ['toxic', 'corrosive', 'condensable'],
    groups: ['acid'],
    gerg2008: false,
    notes: [],
    sources: { ...COMMON_SOURCES, iso10156: SRC.iso10156, toxicity: SRC.lc50, hazards: `${SRC.hazards}; ${SRC.condensable}` },
  },
  {
    id: 'hydrogen-sulfide',
    name: 'Hydrogen sulfide',
    formula: 'H2S',
    casNumber: '7783-06-4',
    molarMassGPerMol: 34.08088,
    criticalTemperatureK: 373.1,
    criticalPressurePa: 9_000_000,
    acentricFactor: 0.1005,
    normalBoilingPointK: 212.855,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(85.584, -3839.9, -11.199, 0.018848, 1, 187.68, 373.53),
    flammability: { lflPercent: 4.0, uflPercent: 45.5 },
    iso10156: tci(7.5, 'low'),
    toxicity: lc50(712),
    hazards: ['flammable', 'toxic', 'condensable'],
    groups: ['fuel', 'acid'],
    gerg2008: true,
    notes: ['sulfide stress cracking of high-strength steel (common practice, no source)'],
    sources: {
      ...COMMON_SOURCES,
      flammability: SRC.iec,
      iso10156: SRC.iso10156,
      toxicity: SRC.lc50,
      hazards: `${SRC.hazards}; ${SRC.condensable}`,
    },
  },
  {
    id: 'ammonia',
    name: 'Ammonia',
    formula: 'NH3',
    casNumber: '7664-41-7',
    molarMassGPerMol: 17.03052,
    criticalTemperatureK: 405.56,
    criticalPressurePa: 11_363_400,
    acentricFactor: 0.256,
    normalBoilingPointK: 239.834,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(90.483, -4669.7, -11.607, 0.017194, 1, 195.41, 405.65),
    flammability: { lflPercent: 15, uflPercent: 33.6 },
    iso10156: tci(35, 'low'),
    toxicity: lc50(4000),
    hazards: ['flammable', 'toxic', 'corrosive', 'condensable'],
    groups: ['fuel', 'base'],
    gerg2008: false,
    notes: ['attacks copper and brass (common practice, no source)'],
    sources: {
      ...COMMON_SOURCES,
      flammability: SRC.iec,
      iso10156: SRC.iso10156,
      toxicity: SRC.lc50,
      hazards: `${SRC.hazards}; ${SRC.condensable}`,
    },
  },
  {
    id: 'sulfur-hexafluoride',
    name: 'Sulfur hexafluoride',
    formula: 'SF6',
    casNumber: '2551-62-4',
    molarMassGPerMol: 146.0554,
    criticalTemperatureK: 318.7232,
    criticalPressurePa: 3_754_983,
    acentricFactor: 0.218,
    normalBoilingPointK: 209.3,
    normalBoilingPointIsSublimation: true,
    vapourPressure: dippr(29.16, -2383.6, -1.1342, 0, 0, 223.15, 318.69),
    flammability: null,
    iso10156: inertK(4, 'low'),
    toxicity: null,
    hazards: ['inert', 'asphyxiant', 'condensable'],
    groups: ['inert'],
    gerg2008: false,
    notes: ['sublimes at 101.325 kPa; triple point 223.56 K'],
    sources: {
      ...COMMON_SOURCES,
      normalBoilingPoint: 'sublimation at 101.325 kPa, about 209.3 K — from memory',
      iso10156: SRC.iso10156,
      hazards: `${SRC.hazards}; ${SRC.condensable}`,
    },
  },
  {
    id: 'neon',
    name: 'Neon',
    formula: 'Ne',
    casNumber: '7440-01-9',
    molarMassGPerMol: 20.1797,
    criticalTemperatureK: 44.4,
    criticalPressurePa: 2_661_630,
    acentricFactor: -0.0355,
    normalBoilingPointK: 27.1,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(29.755, -271.06, -2.6081, 5.27e-4, 2, 24.56, 44.4),
    flammability: null,
    iso10156: inertK(0.7),
    toxicity: null,
    hazards: ['inert', 'asphyxiant'],
    groups: ['inert'],
    gerg2008: false,
    notes: ['other tables give Pc = 2.756 MPa (Mathews 1972; PSRK); unresolved'],
    sources: { ...COMMON_SOURCES, iso10156: SRC.iso10156 },
  },
  {
    id: 'krypton',
    name: 'Krypton',
    formula: 'Kr',
    casNumber: '7439-90-9',
    molarMassGPerMol: 83.798,
    criticalTemperatureK: 209.48,
    criticalPressurePa: 5_525_000,
    acentricFactor: -0.000894,
    normalBoilingPointK: 119.735,
    normalBoilingPointIsSublimation: false,
    vapourPressure: { kind: 'antoine', a: 8.7556, b: 416.38, c: -8.7, minTemperatureK: 111.34, maxTemperatureK: 129.23 },
    flammability: null,
    iso10156: inertK(0.5),
    toxicity: null,
    hazards: ['inert', 'asphyxiant'],
    groups: ['inert'],
    gerg2008: false,
    notes: [],
    sources: { ...COMMON_SOURCES, vapourPressure: SRC.polingAntoine, iso10156: SRC.iso10156 },
  },
  {
    id: 'xenon',
    name: 'Xenon',
    formula: 'Xe',
    casNumber: '7440-63-3',
    molarMassGPerMol: 131.293,
    criticalTemperatureK: 289.733,
    criticalPressurePa: 5_842_000,
    acentricFactor: 0.00363,
    normalBoilingPointK: 165.051,
    normalBoilingPointIsSublimation: false,
    vapourPressure: { kind: 'antoine', a: 8.76779, b: 566.282, c: -14.49, minTemperatureK: 156.43, maxTemperatureK: 177.84 },
    flammability: null,
    iso10156: inertK(0.5),
    toxicity: null,
    hazards: ['inert', 'asphyxiant', 'condensable'],
    groups: ['inert'],
    gerg2008: false,
    notes: ['critical temperature 16.6 °C: condensable in a cold shop; the correlation covers only 156–178 K'],
    sources: {
      ...COMMON_SOURCES,
      vapourPressure: SRC.polingAntoine,
      iso10156: SRC.iso10156,
      hazards: `${SRC.hazards}; ${SRC.condensable}`,
    },
  },
  {
    id: 'hydrogen-chloride',
    name: 'Hydrogen chloride',
    formula: 'HCl',
    casNumber: '7647-01-0',
    molarMassGPerMol: 36.46094,
    criticalTemperatureK: 324.68,
    criticalPressurePa: 8_313_500,
    acentricFactor: 0.129,
    normalBoilingPointK: 188.173,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(104.27, -3731.2, -15.047, 0.03134, 1, 158.97, 324.65),
    flammability: null,
    iso10156: null,
    toxicity: lc50(2810),
    hazards: ['toxic', 'corrosive', 'condensable'],
    groups: ['acid'],
    gerg2008: false,
    notes: ['needs dry systems (common practice, no source)'],
    sources: { ...COMMON_SOURCES, toxicity: SRC.lc50, hazards: `${SRC.hazards}; ${SRC.condensable}` },
  },
  {
    id: 'chlorine',
    name: 'Chlorine',
    formula: 'Cl2',
    casNumber: '7782-50-5',
    molarMassGPerMol: 70.906,
    criticalTemperatureK: 416.8654,
    criticalPressurePa: 7_642_400,
    acentricFactor: 0.07,
    normalBoilingPointK: 239.198,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(71.334, -3855, -8.5171, 0.012378, 1, 172.12, 417.15),
    flammability: null,
    iso10156: oxidiserCi(0.7),
    toxicity: lc50(293),
    hazards: ['toxic', 'oxidiser', 'corrosive', 'condensable'],
    groups: ['oxidiser', 'acid'],
    gerg2008: false,
    notes: ['needs dry systems (common practice, no source)'],
    sources: {
      ...COMMON_SOURCES,
      iso10156: SRC.iso10156,
      toxicity: SRC.lc50,
      hazards: `${SRC.hazards}; ${SRC.condensable}`,
    },
  },
  {
    id: 'water',
    name: 'Water',
    formula: 'H2O',
    casNumber: '7732-18-5',
    molarMassGPerMol: 18.01528,
    criticalTemperatureK: 647.096,
    criticalPressurePa: 22_064_000,
    acentricFactor: 0.3443,
    normalBoilingPointK: 373.124,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(73.649, -7258.2, -7.3037, 4.1653e-6, 2, 273.16, 647.096),
    flammability: null,
    iso10156: null,
    toxicity: null,
    hazards: ['condensable'],
    groups: [],
    gerg2008: true,
    notes: [],
    sources: { ...COMMON_SOURCES, hazards: `${SRC.hazards}; ${SRC.condensable}` },
  },
  {
    id: 'air',
    name: 'Air (dry, synthetic-air pseudo-component)',
    formula: 'N2/O2/Ar',
    casNumber: '132259-10-0',
    molarMassGPerMol: 28.9586,
    criticalTemperatureK: 132.6312,
    criticalPressurePa: 3_786_000,
    acentricFactor: 0.0335,
    normalBoilingPointK: 78.9,
    normalBoilingPointIsSublimation: false,
    vapourPressure: dippr(21.662, -692.39, -0.392, 0.0047574, 1, 59.15, 132.45),
    flammability: null,
    iso10156: null,
    toxicity: null,
    hazards: [],
    groups: ['oxidiser'],
    gerg2008: false,
    composition: [
      { gasId: 'nitrogen', x: 0.7812 },
      { gasId: 'oxygen', x: 0.2096 },
      { gasId: 'argon', x: 0.0092 },
    ],
    notes: [
      'pseudo-component: expanded into N2 0.7812 / O2 0.2096 / Ar 0.0092 before any equation of state or ISO 10156 calculation',
      'critical constants are the maxcondentherm point of air and are informational only',
      'supports combustion: grouped as an oxidiser for incompatibility screening, although not "oxidising" by ISO 10156',
    ],
    sources: {
      identity: 'CAS number of air as listed by NIST; composition of dry air N2/O2/Ar 78.12/20.96/0.92 mol % — common practice, no source',
      molarMass: 'Lemmon, Jacobsen, Penoncello & Friend, J. Phys. Chem. Ref. Data 29 (2000) 331 (28.9586 g/mol) — from memory',
      criticalPoint: 'Lemmon et al. (2000) maxcondentherm 132.6312 K / 3.786 MPa — from memory',
      acentricFactor: 'Lemmon et al. (2000) — from memory',
      normalBoilingPoint: 'bubble point of air at 101.325 kPa, about 78.9 K — from memory',
      vapourPressure: SRC.perry,
      hazards: SRC.hazards,
    },
  },
] satisfies Gas[])

const GAS_BY_ID: ReadonlyMap<string, Gas> = new Map(GASES.map((gas) => [gas.id, gas]))

/** Ids of all gases in the library, in table order. */
export const GAS_IDS: readonly string[] = Object.freeze(GASES.map((gas) => gas.id))

/** True if `id` names a gas in the library. */
export function isKnownGas(id: string): boolean {
  return GAS_BY_ID.has(id)
}

/**
 * The library entry for a gas id.
 * @throws PhysicsInputError (field 'gas') for an unknown id
 * @example getGas('argon').molarMassGPerMol // 39.948
 */
export function getGas(id: string, field = 'gas'): Gas {
  const gas = GAS_BY_ID.get(id)
  if (gas === undefined) {
    throw new PhysicsInputError(`Unknown gas "${id}". Known gases: ${GAS_IDS.join(', ')}.`, field)
  }
  return gas
}
