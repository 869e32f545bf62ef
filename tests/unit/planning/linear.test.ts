/** Material-balance solvers against hand-solved systems. */
import { describe, expect, it } from 'vitest'
import { nnls, solveSquare } from '#shared/planning/linear.ts'

describe('linear solvers', () => {
  it('solveSquare: 2x + y = 5, x − y = 1 → x = 2, y = 1', () => {
    const x = solveSquare(
      [
        [2, 1],
        [1, -1],
      ],
      [5, 1],
    )!
    expect(x[0]).toBeCloseTo(2, 14)
    expect(x[1]).toBeCloseTo(1, 14)
    expect(
      solveSquare(
        [
          [1, 2],
          [2, 4],
        ],
        [1, 2],
      ),
    ).toBeNull()
  })

  it('nnls: unconstrained optimum has a negative part → clamped (hand: min (x−1)² + (x+y−(−1))², y ≥ 0 → x = 1, y = 0)', () => {
    // A = [[1,0],[1,1]], b = [1,−1]: unconstrained x = 1, y = −2; with y ≥ 0: minimise (x−1)² + (x+1)² → x = 0, y = 0? no:
    // for y = 0, f(x) = (x−1)² + (x+1)², minimum at x = 0; check KKT: ∂f/∂y = 2(x + y + 1) = 2 > 0 → y = 0 optimal
    const { x, residualNorm } = nnls(
      [
        [1, 0],
        [1, 1],
      ],
      [1, -1],
    )
    expect(x[0]).toBeCloseTo(0, 12)
    expect(x[1]).toBeCloseTo(0, 12)
    expect(residualNorm).toBeCloseTo(Math.SQRT2, 12)
  })

  it('nnls: overdetermined consistent system is solved exactly', () => {
    const { x, residualNorm } = nnls(
      [
        [1, 0],
        [0, 1],
        [1, 1],
      ],
      [0.3, 0.7, 1],
    )
    expect(x[0]).toBeCloseTo(0.3, 12)
    expect(x[1]).toBeCloseTo(0.7, 12)
    expect(residualNorm).toBeLessThan(1e-12)
  })
})
