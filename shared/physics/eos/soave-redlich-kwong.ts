/**
 * Soave–Redlich–Kwong equation of state: p = R·T/(v − b) − a(T)/(v(v + b)),
 * a = Ω_a·R²·Tc²/Pc·α(T), b = Ω_b·R·Tc/Pc, √α = 1 + m(1 − √Tr), m = 0.480 + 1.574ω − 0.176ω².
 * Ω_b = (2^(1/3) − 1)/3 ≈ 0.08664 and Ω_a = 1/(9(2^(1/3) − 1)) ≈ 0.42748 follow exactly from the critical-point
 * conditions (Z_c = 1/3).
 * Reference: G. Soave, Chem. Eng. Sci. 27 (1972) 1197–1203.
 */
import type { CubicFamily } from './cubic-core.ts'

const CBRT2_MINUS_1 = Math.cbrt(2) - 1

export const SOAVE_REDLICH_KWONG: CubicFamily = {
  id: 'srk',
  name: 'Soave–Redlich–Kwong',
  omegaA: 1 / (9 * CBRT2_MINUS_1),
  omegaB: CBRT2_MINUS_1 / 3,
  delta1: 1,
  delta2: 0,
  criticalCompressibility: 1 / 3,
  alphaSlope: (omega) => 0.48 + 1.574 * omega - 0.176 * omega * omega,
  reference: 'Soave, Chem. Eng. Sci. 27 (1972) 1197',
}
