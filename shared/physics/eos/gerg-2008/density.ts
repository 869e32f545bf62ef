/**
 * Density from temperature and pressure for GERG-2008: Newton's method on ln ρ, kept inside a
 * bracket [lo, hi] that every evaluation narrows, with bisection (in ln ρ) whenever a Newton step
 * leaves the bracket or lands where (∂p/∂ρ)_T ≤ 0. Written for Fillwright from the equations; the
 * approach (ideal-gas start, Newton on ln ρ) is the one of the published AGA8 DensityGERG routine.
 *
 * Root chosen: the gas (vapour-like) root, i.e. the lowest-density solution, on the branch of the
 * isotherm that is continuous with the ideal gas. If the pressure lies above the largest pressure
 * that branch reaches (the vapour spinodal, possible only below the mixture's critical region),
 * there is no gas root and the dense (liquid-like) root is returned, flagged root = 'dense'.
 * No phase-equilibrium (flash) calculation is done: a gas root below the dew point is metastable.
 */
import { PhysicsInputError } from '../../types.ts'
import { R_GERG } from './data.ts'
import type { GergMixture } from './mixture.ts'
import { residualDensityDerivatives, setResidualTemperature } from './residual.ts'

export interface GergDensityResult {
  /** Molar density, mol/m³. */
  readonly molarDensityMolPerM3: number
  /** Compressibility factor Z = p/(ρRT). */
  readonly compressibility: number
  /** Number of equation-of-state evaluations used. */
  readonly iterations: number
  /** 'gas': lowest-density (vapour-like) root; 'dense': no gas root exists, liquid-like root returned. */
  readonly root: 'gas' | 'dense'
}

/** Newton step |Δ ln ρ| below which the iteration has converged (the result is then good to ~1e-16). */
const STEP_TOLERANCE = 1e-9
/** Largest Newton step in ln ρ. */
const MAX_STEP = 1
/** Evaluation budget for one solve. */
const MAX_EVALUATIONS = 300
/** Relative bracket width at which a bracket without a root is declared empty. */
const BRACKET_TOLERANCE = 1e-11
/**
 * A converged root is checked for a van der Waals loop below it (which would mean it is not the
 * gas root) only where a loop is possible: reduced density above CHECK_DELTA and T below
 * CHECK_T_FACTOR · T_r. No GERG-2008 pure fluid or binary shows (∂p/∂ρ)_T ≤ 0 above 1.03 T_r
 * (scan of all 21 fluids and 210 binaries; test "finds no mechanical instability above 1.1 T_r").
 */
const CHECK_DELTA = 0.25
const CHECK_T_FACTOR = 1.25
const CHECK_SAMPLES = 24
/** Reduced density from which a dense root is approached from above, and the largest one searched. */
const DENSE_START_DELTA = 4
const MAX_DELTA = 10

const scratch = new Float64Array(2)

interface Solver {
  m: GergMixture
  rt: number
  pressure: number
  evaluations: number
  /** pressure and dp/dρ of the last evaluation */
  p: number
  dpdrho: number
  /** upper end of the last bracket (the vapour spinodal after NO_ROOT) */
  hi: number
}

function evaluate(s: Solver, rho: number): void {
  s.evaluations++
  residualDensityDerivatives(s.m.residual, rho / s.m.reducingDensityMolPerM3, scratch)
  s.p = rho * s.rt * (1 + scratch[0])
  s.dpdrho = s.rt * (1 + 2 * scratch[0] + scratch[1])
}

function isStable(s: Solver): boolean {
  return s.dpdrho > 0 && Number.isFinite(s.p)
}

function middle(lo: number, hi: number): number {
  return lo > 0 ? Math.sqrt(lo * hi) : 0.5 * hi
}

const NO_ROOT = -1
const OUT_OF_BUDGET = -2

/**
 * Bracketed Newton on ln ρ. mode 'gas': points with dp/dρ ≤ 0 lie above the gas root (they bound
 * it from above). mode 'dense': they lie below the dense root. Returns the root, NO_ROOT if the
 * bracket closed on an unstable upper bound without a root (gas mode), or OUT_OF_BUDGET.
 */
function solveBracketed(s: Solver, start: number, lo: number, hi: number, mode: 'gas' | 'dense'): number {
  let rho = start
  let hiUnstable = false
  while (s.evaluations < MAX_EVALUATIONS) {
    evaluate(s, rho)
    let next: number
    if (!isStable(s)) {
      if (mode === 'gas') {
        hi = rho
        hiUnstable = true
      } else {
        lo = rho
      }
      next = middle(lo, hi)
    } else {
      const err = s.pressure - s.p
      if (err > 0) {
        lo = rho
        // Just below the vapour spinodal the isotherm is concave, so its tangent bounds it from
        // above: if the tangent stays below the target up to the unstable point, no root is left.
        if (hiUnstable && hi - lo < 0.05 * hi && s.p + s.dpdrho * (hi - lo) < s.pressure) {
          s.hi = hi
          return NO_ROOT
        }
      } else if (err < 0) {
        hi = rho
        hiUnstable = false
      } else return rho
      let step = err / (rho * s.dpdrho)
      if (step > MAX_STEP) step = MAX_STEP
      else if (step < -MAX_STEP) step = -MAX_STEP
      next = rho * Math.exp(step)
      if (Math.abs(step) < STEP_TOLERANCE) return next
      if (!(next > lo && next < hi)) next = Number.isFinite(hi) ? middle(lo, hi) : rho * Math.E
    }
    if (hi - lo <= BRACKET_TOLERANCE * hi && Number.isFinite(hi)) {
      s.hi = hi
      if (hiUnstable) return NO_ROOT
      return middle(lo, hi)
    }
    rho = next
  }
  return OUT_OF_BUDGET
}

/**
 * If a loop ((∂p/∂ρ)_T ≤ 0) lies below the converged root, return the lowest unstable sampled
 * density; else 0.
 */
function unstableBelow(s: Solver, rho: number): number {
  for (let k = 1; k <= CHECK_SAMPLES; k++) {
    const r = (rho * k) / (CHECK_SAMPLES + 1)
    evaluate(s, r)
    if (!isStable(s)) return r
  }
  return 0
}

/**
 * The dense (liquid-like) root, used only when there is no gas root. Inside the two-phase region a
 * multiparameter equation of state may oscillate, with spurious stretches where (∂p/∂ρ)_T > 0, so
 * the root is approached from above: from a liquid-like density with p ≥ target on the stable
 * branch, Newton on the convex liquid branch descends monotonically onto the root.
 */
function solveDense(s: Solver): number {
  const rr = s.m.reducingDensityMolPerM3
  let lo = Math.max(s.hi, 0)
  let r = DENSE_START_DELTA * rr
  for (;;) {
    evaluate(s, r)
    if (isStable(s) && s.p >= s.pressure) break
    lo = r
    r *= 1.25
    if (r > MAX_DELTA * rr || s.evaluations >= MAX_EVALUATIONS) return OUT_OF_BUDGET
  }
  return solveBracketed(s, r, lo, r, 'dense')
}

function noConvergence(s: Solver, temperatureK: number): never {
  throw new PhysicsInputError(`GERG-2008: no density found for p = ${s.pressure} Pa at T = ${temperatureK} K (${s.evaluations} evaluations)`, 'pressure')
}

/**
 * Molar density (mol/m³) of the prepared mixture at T (K) and p (Pa): the gas (vapour-like) root,
 * or the dense root when no gas root exists (see the module comment). Throws PhysicsInputError
 * ('temperature' / 'pressure') for non-positive or non-finite input, and ('pressure') when the
 * iteration does not converge. Does not check the GERG-2008 range of validity (see gergValidity).
 * @example gergDensity(prepareGergMixture(['nitrogen'], [1]), 300, 10e6).compressibility // ≈ 1.00518
 */
export function gergDensity(m: GergMixture, temperatureK: number, pressurePa: number): GergDensityResult {
  if (!(temperatureK > 0) || !Number.isFinite(temperatureK)) {
    throw new PhysicsInputError(`GERG-2008: temperature must be a positive number of kelvin, got ${temperatureK}`, 'temperature')
  }
  if (!(pressurePa > 0) || !Number.isFinite(pressurePa)) {
    throw new PhysicsInputError(`GERG-2008: pressure must be a positive number of pascals, got ${pressurePa}`, 'pressure')
  }
  setResidualTemperature(m, temperatureK)
  const rt = R_GERG * temperatureK
  const s: Solver = { m, rt, pressure: pressurePa, evaluations: 0, p: 0, dpdrho: 0, hi: 0 }

  let rho = solveBracketed(s, pressurePa / rt, 0, Number.POSITIVE_INFINITY, 'gas')
  if (rho === OUT_OF_BUDGET) noConvergence(s, temperatureK)
  if (rho > 0 && rho > CHECK_DELTA * m.reducingDensityMolPerM3 && temperatureK < CHECK_T_FACTOR * m.reducingTemperatureK) {
    const unstable = unstableBelow(s, rho)
    if (unstable > 0) {
      // The root found lies above a loop: the gas root, if any, lies below the loop.
      rho = solveBracketed(s, 0.5 * unstable, 0, unstable, 'gas')
      if (rho === OUT_OF_BUDGET) noConvergence(s, temperatureK)
    }
  }
  let root: 'gas' | 'dense' = 'gas'
  if (!(rho > 0)) {
    root = 'dense'
    rho = solveDense(s)
    if (!(rho > 0)) noConvergence(s, temperatureK)
  }

  return {
    molarDensityMolPerM3: rho,
    compressibility: pressurePa / (rho * rt),
    iterations: s.evaluations,
    root,
  }
}
