/**
 * Ideal-gas equation of state p = ρ·R·T (Z = 1). Exact in the limit p → 0; ignores real-gas effects, which are
 * several per cent at cylinder pressures (see the real-gas warnings in state.ts).
 * Reference: CODATA 2018 value of R (constants.ts).
 */
import { GAS_CONSTANT_J_PER_MOL_K as R } from '../constants.ts'

/** p = ρRT in Pa, ρ in mol/m³. @example idealGasPressurePa(273.15, 44.615) // ≈ 101325 */
export function idealGasPressurePa(temperatureK: number, molarDensityMolPerM3: number): number {
  return molarDensityMolPerM3 * R * temperatureK
}

/** ρ = p/(RT) in mol/m³. @example idealGasDensityMolPerM3(273.15, 101325) // ≈ 44.615 */
export function idealGasDensityMolPerM3(temperatureK: number, pressurePa: number): number {
  return pressurePa / (R * temperatureK)
}

/** Molar volume v = RT/p in m³/mol. @example idealGasMolarVolumeM3PerMol(273.15, 101325) // ≈ 0.0224139695 */
export function idealGasMolarVolumeM3PerMol(temperatureK: number, pressurePa: number): number {
  return (R * temperatureK) / pressurePa
}
