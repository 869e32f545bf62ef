/**
 * Ideal-gas part of GERG-2008 (Kunz & Wagner 2012, eqs. 7.5 and 7.6; ISO 20765-2 §5):
 *   α°(ρ, T, x) = Σ_i x_i [α°_oi(ρ, T) + ln x_i],
 *   α°_oi = ln(ρ/ρc,i) + (R_star / R) [n1 + n2 τi + n3 ln τi + n4 ln|sinh(θ4 τi)| − n5 ln cosh(θ5 τi)
 *                                 + n6 ln|sinh(θ6 τi)| − n7 ln cosh(θ7 τi)],   τi = Tc,i / T.
 * Hyperbolic terms with θ = 0 are absent and skipped.
 */
import { IG_N0, IG_THETA, R_STAR_OVER_R, RHO_C, T_C } from './data.ts'
import type { GergMixture } from './mixture.ts'

const LN2 = Math.LN2

/** ln sinh(x), x > 0, without overflow. */
function lnSinh(x: number): number {
  return x + Math.log1p(-Math.exp(-2 * x)) - LN2
}
/** ln cosh(x), x ≥ 0, without overflow. */
function lnCosh(x: number): number {
  return x + Math.log1p(Math.exp(-2 * x)) - LN2
}

export const A0 = 0
/** τ ∂α°/∂τ summed over components (each with its own τi; equals −T ∂α°/∂T at constant ρ) */
export const A0_T = 1
/** τ² ∂²α°/∂τ² summed over components (equals T²∂²α°/∂T² + 2T∂α°/∂T at constant ρ) */
export const A0_TT = 2

/** Writes α° (A0), τα°_τ (A0_T) and τ²α°_ττ (A0_TT) into out. ρ in mol/m³ (> 0), T in K. */
export function idealParts(m: GergMixture, temperatureK: number, molarDensity: number, out: Float64Array): void {
  const { index, x, mixingTerm } = m.ideal
  const lnRho = Math.log(molarDensity)
  let a = mixingTerm
  let aT = 0
  let aTT = 0
  for (let k = 0; k < index.length; k++) {
    const i = index[k]
    const o = i * 7
    const tau = T_C[i] / temperatureK
    const n2 = IG_N0[o + 2]
    let sum = IG_N0[o] + IG_N0[o + 1] * tau + n2 * Math.log(tau)
    let s1 = IG_N0[o + 1] * tau + n2
    let s2 = -n2
    for (let h = 3; h < 7; h++) {
      const theta = IG_THETA[o + h]
      if (theta === 0) continue
      const n = IG_N0[o + h]
      const z = Math.abs(theta * tau)
      const em2 = Math.exp(-2 * z)
      if (h === 3 || h === 5) {
        // + n ln|sinh z|
        sum += n * lnSinh(z)
        s1 += (n * z * (1 + em2)) / (1 - em2) // z coth z
        const r = (2 * z * Math.exp(-z)) / (1 - em2) // z / sinh z
        s2 -= n * r * r
      } else {
        // − n ln cosh z
        sum -= n * lnCosh(z)
        s1 -= (n * z * (1 - em2)) / (1 + em2) // z tanh z
        const r = (2 * z * Math.exp(-z)) / (1 + em2) // z / cosh z
        s2 -= n * r * r
      }
    }
    a += x[k] * (lnRho - Math.log(RHO_C[i]) + R_STAR_OVER_R * sum)
    aT += x[k] * R_STAR_OVER_R * s1
    aTT += x[k] * R_STAR_OVER_R * s2
  }
  out[A0] = a
  out[A0_T] = aT
  out[A0_TT] = aTT
}
