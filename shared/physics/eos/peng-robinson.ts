/**
 * Peng–Robinson equation of state: p = R·T/(v − b) − a(T)/(v(v + b) + b(v − b)),
 * a = Ω_a·R²·Tc²/Pc·α(T), b = Ω_b·R·Tc/Pc, √α = 1 + m(1 − √Tr), m = 0.37464 + 1.54226ω − 0.26992ω² (1976 form,
 * used for every ω in this library).
 * Ω_b is the real root of 64Ω³ + 6Ω² + 12Ω − 1 = 0 (≈ 0.0777961), Z_c = (1 − Ω_b)/3 (≈ 0.307401) and
 * Ω_a = 3Z_c² + 3Ω_b² + 2Ω_b (≈ 0.457236): the critical-point conditions of the equation (triple root Z_c).
 * Reference: D.-Y. Peng & D. B. Robinson, Ind. Eng. Chem. Fundam. 15 (1976) 59–64.
 */
import { realCubicRoots } from '../numeric/cubic-roots.ts'
import type { CubicFamily } from './cubic-core.ts'

const OMEGA_B = realCubicRoots(6 / 64, 12 / 64, -1 / 64)[0]
const Z_C = (1 - OMEGA_B) / 3
const SQRT2 = Math.SQRT2

export const PENG_ROBINSON: CubicFamily = {
  id: 'peng-robinson',
  name: 'Peng–Robinson',
  omegaA: 3 * Z_C * Z_C + 3 * OMEGA_B * OMEGA_B + 2 * OMEGA_B,
  omegaB: OMEGA_B,
  delta1: 1 + SQRT2,
  delta2: 1 - SQRT2,
  criticalCompressibility: Z_C,
  alphaSlope: (omega) => 0.37464 + 1.54226 * omega - 0.26992 * omega * omega,
  reference: 'Peng & Robinson, Ind. Eng. Chem. Fundam. 15 (1976) 59',
}
