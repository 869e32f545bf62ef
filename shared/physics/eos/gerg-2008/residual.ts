/**
 * Residual Helmholtz energy α^r(δ, τ, x) of GERG-2008 and its derivatives
 * (Kunz & Wagner 2012, eqs. 7.7–7.10 and table B4), evaluated on the merged term tables of a
 * prepared mixture. Notation: ar_mn = δ^m τ^n ∂^(m+n) α^r / ∂δ^m ∂τ^n.
 *
 * For one term v = N δ^d τ^t E(δ) with D = d − X1:
 *   δ ∂v/∂δ = v D,   δ² ∂²v/∂δ² = v (D² − d − X2),   δ³ ∂³v/∂δ³ = v (D³ − 3 D (d + X2) + 2d − X3),
 * where for E = exp(−δ^c): X1 = c δ^c, X2 = c(c−1) δ^c, X3 = c(c−1)(c−2) δ^c,
 * and for E = exp(−η(δ−ε)² − β(δ−γ)): X1 = 2ηδ(δ−ε) + βδ, X2 = 2ηδ², X3 = 0.
 * X1..X3 depend only on E, so terms are summed per E first (as Σ v, Σ d v, Σ d² v, …).
 */
import type { GergMixture, GergTermTables } from './mixture.ts'

/**
 * Make sure the per-temperature cache of the mixture holds T: τ^t for every distinct t, and per
 * cell the sums A0 = Σ N τ^t, A1 = Σ t N τ^t, A2 = Σ t(t−1) N τ^t.
 */
export function setResidualTemperature(m: GergMixture, temperatureK: number): void {
  const r = m.residual
  if (r.cachedTemperature[0] === temperatureK) return
  const lnTau = Math.log(m.reducingTemperatureK / temperatureK)
  const uniqueT = r.uniqueT
  const tauPow = r.tauPow
  for (let u = 0; u < uniqueT.length; u++) {
    const t = uniqueT[u]
    tauPow[u] = t === 0 ? 1 : Math.exp(t * lnTau)
  }
  const a0 = r.cellA0
  const a1 = r.cellA1
  const a2 = r.cellA2
  a0.fill(0)
  a1.fill(0)
  a2.fill(0)
  const termCell = r.termCell
  const termTIndex = r.termTIndex
  const termN = r.termN
  const termT = r.termT
  for (let k = 0; k < r.termCount; k++) {
    const c = termCell[k]
    const t = termT[k]
    const p = termN[k] * tauPow[termTIndex[k]]
    a0[c] += p
    a1[c] += t * p
    a2[c] += t * (t - 1) * p
  }
  r.cachedTemperature[0] = temperatureK
}

function fillDeltaPowers(r: GergTermTables, delta: number): Float64Array {
  const dp = r.deltaPow
  dp[0] = 1
  for (let k = 1; k <= r.maxPower; k++) dp[k] = dp[k - 1] * delta
  return dp
}

/**
 * ar10 and ar20 at δ (the temperature cache must hold the current T; see setResidualTemperature).
 * Writes out[0] = ar10, out[1] = ar20. No allocation: this is the density solver's inner loop.
 */
export function residualDensityDerivatives(r: GergTermTables, delta: number, out: Float64Array): void {
  const dp = fillDeltaPowers(r, delta)
  const a0 = r.cellA0
  const cellD = r.cellD
  const start = r.groupCellStart
  let ar10 = 0
  let ar20 = 0
  for (let g = 0; g < r.groupCount; g++) {
    let s0 = 0
    let s1 = 0
    let s2 = 0
    const end = start[g + 1]
    for (let c = start[g]; c < end; c++) {
      const d = cellD[c]
      const v = a0[c] * dp[d]
      const dv = d * v
      s0 += v
      s1 += dv
      s2 += d * dv
    }
    const kind = r.groupKind[g]
    if (kind === 0) {
      ar10 += s1
      ar20 += s2 - s1
      continue
    }
    let e: number
    let x1: number
    let x2: number
    if (kind === 1) {
      const c = r.groupC[g]
      const dc = dp[c]
      e = Math.exp(-dc)
      x1 = c * dc
      x2 = c * (c - 1) * dc
    } else {
      const eta = r.groupEta[g]
      const beta = r.groupBeta[g]
      const de = delta - r.groupEps[g]
      e = Math.exp(-eta * de * de - beta * (delta - r.groupGamma[g]))
      x1 = 2 * eta * delta * de + beta * delta
      x2 = 2 * eta * delta * delta
    }
    ar10 += e * (s1 - x1 * s0)
    ar20 += e * (s2 - (2 * x1 + 1) * s1 + (x1 * x1 - x2) * s0)
  }
  out[0] = ar10
  out[1] = ar20
}

/** All residual derivatives needed for properties, in the order of ResidualIndex. */
export const AR00 = 0
export const AR01 = 1
export const AR02 = 2
export const AR10 = 3
export const AR11 = 4
export const AR20 = 5
export const AR30 = 6

/**
 * α^r and its derivatives at δ (temperature cache must hold the current T).
 * Writes out[AR00..AR30] (out needs length ≥ 7).
 */
export function residualAll(r: GergTermTables, delta: number, out: Float64Array): void {
  const dp = fillDeltaPowers(r, delta)
  const a0 = r.cellA0
  const a1 = r.cellA1
  const a2 = r.cellA2
  const cellD = r.cellD
  const start = r.groupCellStart
  let ar00 = 0
  let ar01 = 0
  let ar02 = 0
  let ar10 = 0
  let ar11 = 0
  let ar20 = 0
  let ar30 = 0
  for (let g = 0; g < r.groupCount; g++) {
    let s0 = 0
    let s1 = 0
    let s2 = 0
    let s3 = 0
    let t0 = 0
    let t1 = 0
    let u0 = 0
    const end = start[g + 1]
    for (let c = start[g]; c < end; c++) {
      const d = cellD[c]
      const pw = dp[d]
      const v = a0[c] * pw
      s0 += v
      s1 += d * v
      s2 += d * d * v
      s3 += d * d * d * v
      const w = a1[c] * pw
      t0 += w
      t1 += d * w
      u0 += a2[c] * pw
    }
    let e = 1
    let x1 = 0
    let x2 = 0
    let x3 = 0
    const kind = r.groupKind[g]
    if (kind === 1) {
      const c = r.groupC[g]
      const dc = dp[c]
      e = Math.exp(-dc)
      x1 = c * dc
      x2 = c * (c - 1) * dc
      x3 = c * (c - 1) * (c - 2) * dc
    } else if (kind === 2) {
      const eta = r.groupEta[g]
      const beta = r.groupBeta[g]
      const de = delta - r.groupEps[g]
      e = Math.exp(-eta * de * de - beta * (delta - r.groupGamma[g]))
      x1 = 2 * eta * delta * de + beta * delta
      x2 = 2 * eta * delta * delta
    }
    ar00 += e * s0
    ar01 += e * t0
    ar02 += e * u0
    ar10 += e * (s1 - x1 * s0)
    ar11 += e * (t1 - x1 * t0)
    ar20 += e * (s2 - (2 * x1 + 1) * s1 + (x1 * x1 - x2) * s0)
    ar30 += e * (s3 - 3 * (x1 + 1) * s2 + (3 * x1 * x1 - 3 * x2 + 3 * x1 + 2) * s1 + (-x1 * x1 * x1 + 3 * x1 * x2 - x3) * s0)
  }
  out[AR00] = ar00
  out[AR01] = ar01
  out[AR02] = ar02
  out[AR10] = ar10
  out[AR11] = ar11
  out[AR20] = ar20
  out[AR30] = ar30
}
