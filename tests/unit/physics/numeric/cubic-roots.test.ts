import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { realCubicRoots, solveMonicCubicInto } from '../../../../shared/physics/numeric/cubic-roots.ts'
import { expectClose } from '../../../support/expect-close.ts'

/** monic cubic with the given roots: (z − r1)(z − r2)(z − r3) */
function coefficients(r1: number, r2: number, r3: number): [number, number, number] {
  return [-(r1 + r2 + r3), r1 * r2 + r1 * r3 + r2 * r3, -(r1 * r2 * r3)]
}

describe('realCubicRoots', () => {
  it('finds three distinct roots of (z−1)(z−2)(z−3) (hand algebra)', () => {
    const roots = realCubicRoots(-6, 11, -6)
    expect(roots).toHaveLength(3)
    for (const [i, r] of [1, 2, 3].entries()) expectClose(roots[i], r, { abs: 1e-12 }, { root: i })
  })

  it('finds the single real root of z³ + z + 10 = 0 (z = −2, hand algebra)', () => {
    const roots = realCubicRoots(0, 1, 10)
    expect(roots).toHaveLength(1)
    expectClose(roots[0], -2, { abs: 1e-12 })
  })

  it('handles a triple root z = 0.5 (z − 0.5)³', () => {
    const [c2, c1, c0] = coefficients(0.5, 0.5, 0.5)
    const roots = realCubicRoots(c2, c1, c0)
    for (const r of roots) expectClose(r, 0.5, { abs: 1e-5 })
  })

  it('rejects non-finite coefficients', () => {
    expect(() => realCubicRoots(Number.NaN, 0, 0)).toThrow(RangeError)
  })

  it('recovers well-separated real roots of random cubics (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -10, max: 10, noNaN: true }),
        fc.double({ min: 0.01, max: 5, noNaN: true }),
        fc.double({ min: 0.01, max: 5, noNaN: true }),
        (r1, gap1, gap2) => {
          const r2 = r1 + gap1
          const r3 = r2 + gap2
          const [c2, c1, c0] = coefficients(r1, r2, r3)
          const out = new Float64Array(3)
          const n = solveMonicCubicInto(c2, c1, c0, out)
          expect(n).toBe(3)
          const scale = Math.max(1, Math.abs(r1), Math.abs(r3))
          expectClose(out[0], r1, { abs: 1e-7 * scale }, { r1, r2, r3 })
          expectClose(out[1], r2, { abs: 1e-7 * scale }, { r1, r2, r3 })
          expectClose(out[2], r3, { abs: 1e-7 * scale }, { r1, r2, r3 })
        },
      ),
    )
  })

  it('returns one root when the other two are complex (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -10, max: 10, noNaN: true }),
        fc.double({ min: -5, max: 5, noNaN: true }),
        fc.double({ min: 0.1, max: 5, noNaN: true }),
        (r, re, im) => {
          // (z − r)(z² − 2·re·z + re² + im²)
          const q1 = -2 * re
          const q0 = re * re + im * im
          const roots = realCubicRoots(q1 - r, q0 - r * q1, -r * q0)
          expect(roots).toHaveLength(1)
          expectClose(roots[0], r, { abs: 1e-8 * Math.max(1, Math.abs(r), q0) }, { r, re, im })
        },
      ),
    )
  })
})
