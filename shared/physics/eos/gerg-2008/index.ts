/**
 * GERG-2008 equation of state for natural gases and other mixtures of its 21 components.
 *
 * Reference: O. Kunz and W. Wagner, "The GERG-2008 Wide-Range Equation of State for Natural Gases
 * and Other Mixtures: An Expansion of GERG-2004", J. Chem. Eng. Data 57 (2012) 3032–3091,
 * doi:10.1021/je300655b; ISO 20765-2:2015. Written from the published equations; parameters from
 * shared/physics/data/gerg2008-parameters.json (see PROVENANCE.md there).
 * Verified against NIST's published check point (usnistgov/AGA8, GERG2008 test program).
 *
 * Units (SI throughout): K, Pa, mol/m³, kg/mol, J/mol, J/(mol K), m/s, K/Pa.
 * Range of validity: normal range 90–450 K, p ≤ 35 MPa; extended range 60–700 K, p ≤ 70 MPa
 * (Kunz & Wagner 2012, §1; ISO 20765-2). gergValidity reports on it; the other functions do not
 * enforce it.
 *
 * Usage: prepare a mixture once (prepareGergMixture), then evaluate it many times. A prepared
 * mixture caches its temperature-dependent terms for the last temperature used.
 */
import { PhysicsInputError, type PhysicsWarning } from '../../types.ts'
import { R_GERG } from './data.ts'
import { A0, A0_T, A0_TT, idealParts } from './ideal.ts'
import type { GergMixture } from './mixture.ts'
import { AR00, AR01, AR02, AR10, AR11, AR20, AR30, residualAll, setResidualTemperature } from './residual.ts'

export { GERG_COMPONENT_IDS } from './data.ts'
export { gergCovers, prepareGergMixture, type GergMixture } from './mixture.ts'
export { gergDensity, type GergDensityResult } from './density.ts'

/** Molar gas constant used by GERG-2008, J/(mol K) (not the CODATA value; keep it for GERG). */
export const GERG_GAS_CONSTANT = R_GERG

export interface GergPressureResult {
  /** Pressure, Pa. */
  readonly pressurePa: number
  /** Compressibility factor Z = p/(ρRT). */
  readonly compressibility: number
  /** (∂p/∂ρ)_T, Pa·m³/mol. */
  readonly dPdRho: number
  /** (∂p/∂T)_ρ, Pa/K. */
  readonly dPdT: number
}

export interface GergProperties extends GergPressureResult {
  readonly temperatureK: number
  readonly molarDensityMolPerM3: number
  readonly molarMassKgPerMol: number
  /** (∂²p/∂ρ²)_T, Pa·m⁶/mol². */
  readonly d2PdRho2: number
  /** Molar internal energy, J/mol (zero of u, h, s, g, a: ideal gas at 298.15 K, 101.325 kPa, h = s = 0). */
  readonly internalEnergyJPerMol: number
  readonly enthalpyJPerMol: number
  readonly entropyJPerMolK: number
  readonly gibbsEnergyJPerMol: number
  readonly helmholtzEnergyJPerMol: number
  /** Isochoric heat capacity, J/(mol K). */
  readonly cvJPerMolK: number
  /** Isobaric heat capacity, J/(mol K). */
  readonly cpJPerMolK: number
  readonly speedOfSoundMPerS: number
  /** Joule–Thomson coefficient (∂T/∂p)_h, K/Pa. */
  readonly jouleThomsonKPerPa: number
  /** Isentropic exponent κ = (ρ/p)(∂p/∂ρ)_s. */
  readonly isentropicExponent: number
}

const residualOut = new Float64Array(7)
const idealOut = new Float64Array(3)

function checkTemperature(temperatureK: number): void {
  if (!(temperatureK > 0) || !Number.isFinite(temperatureK)) {
    throw new PhysicsInputError(`GERG-2008: temperature must be a positive number of kelvin, got ${temperatureK}`, 'temperature')
  }
}

function checkDensity(molarDensity: number, allowZero: boolean): void {
  if (!Number.isFinite(molarDensity) || molarDensity < 0 || (!allowZero && molarDensity === 0)) {
    throw new PhysicsInputError(
      `GERG-2008: molar density must be a ${allowZero ? 'non-negative' : 'positive'} number of mol/m³, got ${molarDensity}`,
      'density',
    )
  }
}

/**
 * Pressure (Pa), Z, (∂p/∂ρ)_T (Pa·m³/mol) and (∂p/∂T)_ρ (Pa/K) from T (K) and molar density (mol/m³):
 * p = ρRT(1 + δα^r_δ). Throws PhysicsInputError for T ≤ 0 ('temperature') or ρ < 0 ('density').
 * @example gergPressure(prepareGergMixture(['nitrogen'], [1]), 300, 3988.429499330737).pressurePa // ≈ 1.0e7
 */
export function gergPressure(m: GergMixture, temperatureK: number, molarDensityMolPerM3: number): GergPressureResult {
  checkTemperature(temperatureK)
  checkDensity(molarDensityMolPerM3, true)
  setResidualTemperature(m, temperatureK)
  residualAll(m.residual, molarDensityMolPerM3 / m.reducingDensityMolPerM3, residualOut)
  const ar10 = residualOut[AR10]
  const rt = R_GERG * temperatureK
  const z = 1 + ar10
  return {
    pressurePa: molarDensityMolPerM3 * rt * z,
    compressibility: z,
    dPdRho: rt * (1 + 2 * ar10 + residualOut[AR20]),
    dPdT: molarDensityMolPerM3 * R_GERG * (1 + ar10 - residualOut[AR11]),
  }
}

/**
 * Full property set at T (K) and molar density (mol/m³), from the Helmholtz energy
 * a/(RT) = α°(ρ, T, x) + α^r(δ, τ, x) (Kunz & Wagner 2012, table 3 relations).
 * Throws PhysicsInputError for T ≤ 0 ('temperature') or ρ ≤ 0 ('density').
 */
export function gergProperties(m: GergMixture, temperatureK: number, molarDensityMolPerM3: number): GergProperties {
  checkTemperature(temperatureK)
  checkDensity(molarDensityMolPerM3, false)
  const rho = molarDensityMolPerM3
  setResidualTemperature(m, temperatureK)
  residualAll(m.residual, rho / m.reducingDensityMolPerM3, residualOut)
  idealParts(m, temperatureK, rho, idealOut)
  const ar00 = residualOut[AR00]
  const ar01 = residualOut[AR01]
  const ar02 = residualOut[AR02]
  const ar10 = residualOut[AR10]
  const ar11 = residualOut[AR11]
  const ar20 = residualOut[AR20]
  const ar30 = residualOut[AR30]
  const a0 = idealOut[A0]
  const a0t = idealOut[A0_T]
  const a0tt = idealOut[A0_TT]

  const R = R_GERG
  const rt = R * temperatureK
  const z = 1 + ar10
  const p = rho * rt * z
  const dPdRho = rt * (1 + 2 * ar10 + ar20)
  const dPdT = rho * R * (1 + ar10 - ar11)
  const d2PdRho2 = (rt * (2 * ar10 + 4 * ar20 + ar30)) / rho
  const u = rt * (a0t + ar01)
  const h = rt * (a0t + ar01 + z)
  const s = R * (a0t + ar01 - a0 - ar00)
  const a = rt * (a0 + ar00)
  const g = rt * (a0 + ar00 + z)
  const cv = -R * (a0tt + ar02)
  const dp = 1 + ar10 - ar11
  const cp = cv + (R * dp * dp) / (1 + 2 * ar10 + ar20)
  const molarMass = m.molarMassKgPerMol
  const w2 = ((cp / cv) * dPdRho) / molarMass
  const jouleThomson = ((temperatureK * dPdT) / (rho * dPdRho) - 1) / (rho * cp)
  return {
    temperatureK,
    molarDensityMolPerM3: rho,
    molarMassKgPerMol: molarMass,
    pressurePa: p,
    compressibility: z,
    dPdRho,
    dPdT,
    d2PdRho2,
    internalEnergyJPerMol: u,
    enthalpyJPerMol: h,
    entropyJPerMolK: s,
    gibbsEnergyJPerMol: g,
    helmholtzEnergyJPerMol: a,
    cvJPerMolK: cv,
    cpJPerMolK: cp,
    speedOfSoundMPerS: Math.sqrt(w2),
    jouleThomsonKPerPa: jouleThomson,
    isentropicExponent: (w2 * molarMass * rho) / p,
  }
}

/** GERG-2008 ranges of validity (Kunz & Wagner 2012, §1 and fig. 1; ISO 20765-2). */
export const GERG_NORMAL_RANGE = Object.freeze({ minTemperatureK: 90, maxTemperatureK: 450, maxPressurePa: 35e6 })
export const GERG_EXTENDED_RANGE = Object.freeze({ minTemperatureK: 60, maxTemperatureK: 700, maxPressurePa: 70e6 })

/**
 * Range check for a GERG-2008 state. Returns 'caution' warnings when T or p is outside the normal
 * range (90–450 K, p ≤ 35 MPa) but inside the extended range (60–700 K, p ≤ 70 MPa), where the
 * published uncertainties are larger; throws PhysicsInputError ('temperature' or 'pressure')
 * outside the extended range or for non-positive / non-finite input.
 * Composition limits of the normal range (Kunz & Wagner 2012, table 6) are not checked here.
 * @example gergValidity(288.15, 20e6) // []
 */
export function gergValidity(temperatureK: number, pressurePa: number): PhysicsWarning[] {
  checkTemperature(temperatureK)
  if (!(pressurePa > 0) || !Number.isFinite(pressurePa)) {
    throw new PhysicsInputError(`GERG-2008: pressure must be a positive number of pascals, got ${pressurePa}`, 'pressure')
  }
  const ext = GERG_EXTENDED_RANGE
  const normal = GERG_NORMAL_RANGE
  if (temperatureK < ext.minTemperatureK || temperatureK > ext.maxTemperatureK) {
    throw new PhysicsInputError(
      `GERG-2008 is not valid at ${temperatureK} K: its extended range is ${ext.minTemperatureK}–${ext.maxTemperatureK} K`,
      'temperature',
    )
  }
  if (pressurePa > ext.maxPressurePa) {
    throw new PhysicsInputError(`GERG-2008 is not valid at ${pressurePa / 1e6} MPa: its extended range ends at ${ext.maxPressurePa / 1e6} MPa`, 'pressure')
  }
  const warnings: PhysicsWarning[] = []
  if (temperatureK < normal.minTemperatureK || temperatureK > normal.maxTemperatureK) {
    warnings.push({
      code: 'gerg-2008-temperature-extended-range',
      severity: 'caution',
      message:
        `${temperatureK} K is outside the GERG-2008 normal range (${normal.minTemperatureK}–${normal.maxTemperatureK} K), ` +
        `in its extended range (${ext.minTemperatureK}–${ext.maxTemperatureK} K), where its uncertainty is larger`,
    })
  }
  if (pressurePa > normal.maxPressurePa) {
    warnings.push({
      code: 'gerg-2008-pressure-extended-range',
      severity: 'caution',
      message:
        `${pressurePa / 1e6} MPa is above the GERG-2008 normal range (≤ ${normal.maxPressurePa / 1e6} MPa), ` +
        `in its extended range (≤ ${ext.maxPressurePa / 1e6} MPa), where its uncertainty is larger`,
    })
  }
  return warnings
}
