/**
 * Real roots of a monic cubic z³ + c2·z² + c1·z + c0 = 0.
 * Method: reduction to the depressed cubic t³ + p·t + q = 0 (t = z + c2/3); one real root by Cardano's formula in
 * its cancellation-free form, three real roots by the trigonometric (Viète) form; every root is then polished with
 * Newton steps on the original polynomial. Reference: W. H. Press et al., Numerical Recipes, 3rd ed. (2007), §5.6.
 */

const TWO_PI_OVER_3 = (2 * Math.PI) / 3

/**
 * Writes the real roots, ascending, into `out` (length ≥ 3) and returns how many there are (1 or 3; a repeated
 * root is reported as often as it occurs in the trigonometric branch). No allocation: suitable for hot loops.
 * @param newtonSteps Newton polishing steps per root (default 2)
 */
export function solveMonicCubicInto(c2: number, c1: number, c0: number, out: Float64Array | number[], newtonSteps = 2): 1 | 3 {
  const shift = c2 / 3
  const p = c1 - c2 * shift
  const q = ((2 * c2 * c2 - 9 * c1) * c2) / 27 + c0
  const halfQ = q / 2
  const thirdP = p / 3
  const disc = halfQ * halfQ + thirdP * thirdP * thirdP
  let count: 1 | 3
  if (disc > 0) {
    const sq = Math.sqrt(disc)
    const u = Math.cbrt(-(halfQ + (halfQ >= 0 ? sq : -sq)))
    const t = u === 0 ? 0 : u - thirdP / u
    out[0] = t - shift
    count = 1
  } else if (thirdP === 0) {
    out[0] = -shift
    out[1] = -shift
    out[2] = -shift
    count = 3
  } else {
    const m = 2 * Math.sqrt(-thirdP)
    let c = (3 * q) / (p * m)
    if (c > 1) c = 1
    else if (c < -1) c = -1
    const theta = Math.acos(c) / 3
    // theta ∈ [0, π/3]: cos(theta) ≥ cos(theta − 2π/3) ≥ cos(theta + 2π/3)
    out[2] = m * Math.cos(theta) - shift
    out[1] = m * Math.cos(theta - TWO_PI_OVER_3) - shift
    out[0] = m * Math.cos(theta + TWO_PI_OVER_3) - shift
    count = 3
  }
  for (let r = 0; r < count; r++) {
    let z = out[r]
    for (let s = 0; s < newtonSteps; s++) {
      const f = ((z + c2) * z + c1) * z + c0
      const df = (3 * z + 2 * c2) * z + c1
      if (df === 0) break
      const next = z - f / df
      if (!Number.isFinite(next)) break
      // keep the step only if it does not increase the residual (protects double roots)
      const fNext = ((next + c2) * next + c1) * next + c0
      if (Math.abs(fNext) > Math.abs(f)) break
      z = next
    }
    out[r] = z
  }
  if (count === 3) {
    // polishing can reorder nearly equal roots: restore ascending order
    if (out[0] > out[1]) [out[0], out[1]] = [out[1], out[0]]
    if (out[1] > out[2]) [out[1], out[2]] = [out[2], out[1]]
    if (out[0] > out[1]) [out[0], out[1]] = [out[1], out[0]]
  }
  return count
}

/**
 * Real roots of z³ + c2·z² + c1·z + c0 = 0, ascending.
 * @throws RangeError if a coefficient is not finite
 * @example realCubicRoots(-6, 11, -6) // [1, 2, 3]
 */
export function realCubicRoots(c2: number, c1: number, c0: number): number[] {
  if (!Number.isFinite(c2) || !Number.isFinite(c1) || !Number.isFinite(c0)) {
    throw new RangeError(`Cubic coefficients must be finite, got ${c2}, ${c1}, ${c0}.`)
  }
  const out = [0, 0, 0]
  const n = solveMonicCubicInto(c2, c1, c0, out)
  return out.slice(0, n)
}
