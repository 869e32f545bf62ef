/**
 * Standard uncertainty of the predicted composition, by the GUM law of propagation of uncertainty
 * (JCGM 100:2008, eq. 10, uncorrelated inputs except the atmospheric pressure, which enters every
 * gauge reading alike). Sensitivity coefficients: the equation-of-state derivatives (∂p/∂ρ)_T and
 * (∂p/∂T)_ρ by forward differences of the model, the rest by the chain rule through
 *   N_k = ρ(T_k, p_k; x^(k))·V,  n_k = N_k − N_(k−1),  x_i = Σ_k a_ik·n_k / N_K      (partial pressure)
 *   n_k = m_k / M_k,             x_i = Σ_k a_ik·n_k / N_K                          (gravimetric)
 * with the composition dependence of ρ through x^(k) neglected (second order).
 * Gauge: u = a/√3 for an EN 837-1 class limit a = class·span, and u = r/√12 for a resolution r
 * (rectangular distributions, JCGM 100:2008 §4.3.7); readings treated as independent.
 */
import type { CompositionEos } from './gas-model.ts'
import type { GaugeInput, PlanMethod, ScaleInput, UncertaintyContribution } from './types.ts'

export interface UncertaintyStep {
  readonly label: string
  readonly a: readonly number[]
  readonly u: readonly number[]
  readonly mainIndex: number
  readonly moles: number
  readonly cumulativeMoles: number
  readonly molarMassKgPerMol: number
  readonly eos: CompositionEos
  /** cumulative absolute pressure at fill temperature after the step (saves one evaluation) */
  readonly pressurePa?: number
}

export interface UncertaintyResidual {
  readonly moles: number
  readonly a: readonly number[]
  readonly u: readonly number[]
  readonly temperatureK: number
  readonly eos: CompositionEos
}

export interface UncertaintyInput {
  readonly method: PlanMethod
  readonly components: readonly string[]
  readonly volumeM3: number
  readonly fillTemperatureK: number
  readonly residual: UncertaintyResidual | null
  readonly steps: readonly UncertaintyStep[]
  readonly predicted: readonly number[]
  readonly gauge: GaugeInput
  readonly scale: Required<ScaleInput>
  readonly temperatureUncertaintyK: number
  readonly atmosphericUncertaintyPa: number
  /** equation of state for any composition; absent (or the ideal model) when ρ does not depend on composition */
  readonly eosOf?: (x: readonly number[]) => CompositionEos
}

export interface UncertaintyResult {
  readonly u: number[]
  readonly contributions: UncertaintyContribution[]
  readonly method: string
}

export const UNCERTAINTY_METHOD = {
  'partial-pressure':
    'GUM (JCGM 100:2008) law of propagation, independent inputs: each cumulative pressure reading (gauge class limit a = class × span, u = a/√3; resolution r, u = r/√12), each gas temperature reading, the atmospheric pressure (common to all gauge readings), the purity and certificate uncertainties of the parent gases. Sensitivity coefficients from numerical (forward-difference) derivatives of the equation of state at each step; model (equation-of-state) error not included — see the model comparison.',
  gravimetric:
    'GUM (JCGM 100:2008) law of propagation, independent inputs: each added mass as the difference of two scale readings (u² = 2·(r²/12 + u_scale²)), the purity and certificate uncertainties of the parent gases, and for a residual the pressure and temperature reading. Buoyancy and cylinder expansion not modelled.',
} as const

/** Standard uncertainty of one gauge reading, Pa. */
export function gaugeReadingUncertaintyPa(gauge: GaugeInput): number {
  const a = (gauge.accuracyClassPercent / 100) * gauge.spanPa
  return Math.sqrt((a / Math.sqrt(3)) ** 2 + gauge.resolutionPa ** 2 / 12)
}

/** Standard uncertainty of one scale reading, kg. */
export function scaleReadingUncertaintyKg(scale: Required<ScaleInput>): number {
  return Math.sqrt(scale.resolutionKg ** 2 / 12 + scale.standardUncertaintyKg ** 2)
}

/**
 * (∂N/∂p)_T and (∂N/∂T)_p of the amount in volume V at (T, ρ), by forward differences of p(T, ρ)
 * (steps 1e-6·ρ and 1 mK; truncation error far below the input uncertainties).
 */
export function amountSensitivities(
  eos: CompositionEos,
  temperatureK: number,
  densityMolPerM3: number,
  volumeM3: number,
  pressurePa?: number,
): { dNdP: number; dNdT: number } {
  const hr = densityMolPerM3 * 1e-6
  const ht = 1e-3
  const p0 = pressurePa ?? eos.pressurePa(temperatureK, densityMolPerM3)
  const dpdrho = (eos.pressurePa(temperatureK, densityMolPerM3 + hr) - p0) / hr
  const dpdT = (eos.pressurePa(temperatureK + ht, densityMolPerM3) - p0) / ht
  return { dNdP: volumeM3 / dpdrho, dNdT: (-volumeM3 * dpdT) / dpdrho }
}

export function propagateUncertainty(input: UncertaintyInput): UncertaintyResult {
  const { components, steps, residual, predicted, volumeM3 } = input
  const C = components.length
  const K = steps.length
  const N = steps.length > 0 ? steps[K - 1].cumulativeMoles : (residual?.moles ?? 0)
  const variance = new Array<number>(C).fill(0)
  const contributions: UncertaintyContribution[] = []
  const record = (label: string, sens: readonly number[], u: number): void => {
    if (!(u > 0)) return
    for (let i = 0; i < C; i++) {
      const c = sens[i] * u
      if (c === 0 || !Number.isFinite(c)) continue
      variance[i] += c * c
      contributions.push({ input: label, gasId: components[i], contribution: Math.abs(c) })
    }
  }
  const amounts = new Array<number>(C).fill(0)
  if (residual) for (let i = 0; i < C; i++) amounts[i] += residual.a[i] * residual.moles
  for (const s of steps) for (let i = 0; i < C; i++) amounts[i] += s.a[i] * s.moles

  const uP = gaugeReadingUncertaintyPa(input.gauge)
  // ∂x_i/∂N_k for the cumulative amounts N_0 (residual), N_1 … N_K (partial pressure)
  const dxdNk = (k: number): number[] => {
    const out = new Array<number>(C)
    for (let i = 0; i < C; i++) {
      const aHere = k === 0 ? (residual ? residual.a[i] : 0) : steps[k - 1].a[i]
      const aNext = k < K ? steps[k].a[i] : 0
      let d = (aHere - aNext) / N
      if (k === K) d -= amounts[i] / (N * N)
      out[i] = d
    }
    return out
  }

  if (input.method === 'partial-pressure') {
    const readings: { label: string; k: number; eos: CompositionEos; T: number; rho: number; p?: number }[] = []
    if (residual) readings.push({ label: 'residual pressure reading', k: 0, eos: residual.eos, T: residual.temperatureK, rho: residual.moles / volumeM3 })
    steps.forEach((s, j) => {
      readings.push({
        label: `step ${j + 1} (${s.label}) reading`,
        k: j + 1,
        eos: s.eos,
        T: input.fillTemperatureK,
        rho: s.cumulativeMoles / volumeM3,
        p: s.pressurePa,
      })
    })
    const L = couplingMatrix(input)
    // column j of L⁻¹: how every cumulative amount N_k moves when N_j is pushed by one unit at its reading
    const response = (j: number): number[] => {
      const d = new Array<number>(K + 1).fill(0)
      for (let k = j; k <= K; k++) {
        let s2 = k === j ? 1 : 0
        for (let m = j; m < k; m++) s2 -= L[k][m] * d[m]
        d[k] = s2 / L[k][k]
      }
      return d
    }
    const dx = Array.from({ length: K + 1 }, (_, k) => dxdNk(k))
    let atmSens = new Array<number>(C).fill(0)
    for (const r of readings) {
      const { dNdP, dNdT } = amountSensitivities(r.eos, r.T, r.rho, volumeM3, r.p)
      const d = response(r.k)
      const base = new Array<number>(C).fill(0)
      for (let k = r.k; k <= K; k++) for (let i = 0; i < C; i++) base[i] += dx[k][i] * d[k]
      const sp = base.map((v) => v * dNdP)
      record(`${r.label}: pressure`, sp, uP)
      record(
        `${r.label}: temperature`,
        base.map((v) => v * dNdT),
        input.temperatureUncertaintyK,
      )
      atmSens = atmSens.map((v, i) => v + sp[i])
    }
    record('atmospheric pressure', atmSens, input.atmosphericUncertaintyPa)
  } else {
    if (residual) {
      const { dNdP, dNdT } = amountSensitivities(residual.eos, residual.temperatureK, residual.moles / volumeM3, volumeM3)
      const base = residual.a.map((ai, i) => (ai - predicted[i]) / N)
      record(
        'residual pressure reading: pressure',
        base.map((d) => d * dNdP),
        uP,
      )
      record(
        'residual pressure reading: temperature',
        base.map((d) => d * dNdT),
        input.temperatureUncertaintyK,
      )
    }
    const uM = Math.SQRT2 * scaleReadingUncertaintyKg(input.scale)
    steps.forEach((s, j) => {
      const sens = s.a.map((ai, i) => (ai - predicted[i]) / (s.molarMassKgPerMol * N))
      record(`step ${j + 1} (${s.label}) mass`, sens, uM)
    })
  }
  // parent-gas composition: a change in component j is made up by the main component
  const composition = (label: string, u: readonly number[], mainIndex: number, moles: number): void => {
    for (let j = 0; j < C; j++) {
      if (!(u[j] > 0)) continue
      const sens = new Array<number>(C).fill(0)
      sens[j] += moles / N
      if (j !== mainIndex) sens[mainIndex] -= moles / N
      record(`${label}: ${components[j]} content`, sens, u[j])
    }
  }
  if (residual) composition('residual', residual.u, residual.a.indexOf(Math.max(...residual.a)), residual.moles)
  steps.forEach((s, j) => {
    composition(`step ${j + 1} (${s.label}) parent gas`, s.u, s.mainIndex, s.moles)
  })

  return { u: variance.map(Math.sqrt), contributions, method: UNCERTAINTY_METHOD[input.method] }
}

/**
 * Implicit coupling of the cumulative amounts through composition: N_k = V·ρ(T_k, p_k; x^(k)) with
 * x^(k) = c^(k)/N_k depending on N_0 … N_k. Linearised, dN_k − Σ_{j≤k} G_kj·dN_j = V·(ρ_p dp_k + ρ_T dT_k),
 * G_kj = V·∇_x ρ_k · ∂x^(k)/∂N_j. Returns the lower-triangular L = I − G (index 0: residual, 1…K: steps).
 * ∇_x ρ_k is taken along the directions a_m − a_k spanned by the gases in the cylinder (forward differences
 * of p at constant T and ρ, ∂ρ = −∂p/(∂p/∂ρ)).
 */
function couplingMatrix(input: UncertaintyInput): number[][] {
  const { steps, residual, volumeM3: V, components } = input
  const K = steps.length
  const C = components.length
  const L = Array.from({ length: K + 1 }, (_, k) => Array.from({ length: K + 1 }, (_, j) => (j === k ? 1 : 0)))
  if (!input.eosOf) return L
  // parent compositions and amounts by index: 0 = residual (may be absent), k = step k
  const a: (readonly number[])[] = [residual ? residual.a : new Array<number>(C).fill(0), ...steps.map((s) => s.a)]
  const n: number[] = [residual ? residual.moles : 0, ...steps.map((s) => s.moles)]
  const c = a[0].map((ai) => ai * n[0])
  for (let k = 1; k <= K; k++) {
    for (let i = 0; i < C; i++) c[i] += a[k][i] * n[k]
    const Nk = steps[k - 1].cumulativeMoles
    const x = c.map((v) => v / Nk)
    const T = input.fillTemperatureK
    const rho = Nk / V
    const eos = steps[k - 1].eos
    const p0 = steps[k - 1].pressurePa ?? eos.pressurePa(T, rho)
    const hr = rho * 1e-6
    const dpdrho = (eos.pressurePa(T, rho + hr) - p0) / hr
    // ∇ρ·(a_m − a_k) for every parent m < k present in the cylinder
    const first = residual ? 0 : 1
    const grad = new Array<number>(k).fill(0)
    for (let m = first; m < k; m++) {
      const h = 1e-6
      const xs = x.map((xi, i) => xi + h * (a[m][i] - a[k][i]))
      if (xs.some((v) => v < 0)) continue
      const dp = (input.eosOf(xs).pressurePa(T, rho) - p0) / h
      grad[m] = -dp / dpdrho
    }
    // ∂x^(k)/∂N_j in the basis (a_m − a_k): j < k → e_j − e_(j+1) ; j = k → −Σ_m (n_m/N_k)·e_m
    for (let j = first; j <= k; j++) {
      let g: number
      if (j < k) g = grad[j] - (j + 1 < k ? grad[j + 1] : 0)
      else {
        g = 0
        for (let m = first; m < k; m++) g -= (n[m] / Nk) * grad[m]
      }
      L[k][j] -= (V * g) / Nk
    }
  }
  return L
}
