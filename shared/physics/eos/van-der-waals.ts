/**
 * van der Waals equation of state: p = R·T/(v − b) − a/v², with a = 27·R²·Tc²/(64·Pc), b = R·Tc/(8·Pc)
 * (from the critical-point conditions; Z_c = 3/8). No temperature dependence of a.
 * Reference: J. D. van der Waals, Over de continuïteit van den gas- en vloeistoftoestand (1873); critical-point
 * constants as derived in any thermodynamics text, e.g. Smith, Van Ness & Abbott, 7th ed., Table 3.1.
 * Mixtures: van der Waals one-fluid rules, k_ij = 0.
 */
import type { CubicFamily } from './cubic-core.ts'

export const VAN_DER_WAALS: CubicFamily = {
  id: 'van-der-waals',
  name: 'van der Waals',
  omegaA: 27 / 64,
  omegaB: 1 / 8,
  delta1: 0,
  delta2: 0,
  criticalCompressibility: 3 / 8,
  alphaSlope: null,
  reference: 'van der Waals (1873); a = 27R²Tc²/(64Pc), b = RTc/(8Pc)',
}
