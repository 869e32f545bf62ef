/**
 * Material balance: amounts of each parent gas so that residual + additions give the target
 * composition at the target total amount. Impurities of every parent are carried as components
 * (ISO 6142-1 composition from parent amounts; ISO 19229 purity tables).
 *
 *   Σ_A a_iA·n_A = N·b_i − r_i   for every target component i other than the balance gas
 *   Σ_A n_A      = N − n_res     (the total amount fixed by the final pressure)
 *
 * When there is one source per target component this is square and solved directly; otherwise
 * (or when the direct solution has a negative amount) a weighted non-negative least-squares problem
 * over every component is solved, with the total-amount row weighted heavily.
 */
import { PlanningInputError } from './errors.ts'
import { nnls, solveSquare } from './linear.ts'

export interface BalanceProblem {
  readonly components: readonly string[]
  readonly target: readonly number[]
  readonly balanceIndex: number
  /** source compositions over the component list */
  readonly sourceA: readonly (readonly number[])[]
  readonly sourceIds: readonly string[]
  /** amounts already in the cylinder, per component, mol */
  readonly present: readonly number[]
  readonly totalMoles: number
  readonly toleranceRelative: number
  /** field to blame when the present contents make the target unreachable */
  readonly presentField: string
}

export interface BalanceSolution {
  readonly amounts: number[]
  readonly method: 'direct' | 'nnls'
  readonly predicted: number[]
  readonly maxRelativeDeviation: number
  /** target component with the largest relative deviation */
  readonly worstIndex: number
}

function predict(problem: BalanceProblem, amounts: readonly number[]): number[] {
  const C = problem.components.length
  const c = [...problem.present]
  amounts.forEach((n, A) => {
    for (let i = 0; i < C; i++) c[i] += problem.sourceA[A][i] * n
  })
  const total = c.reduce((s, v) => s + v, 0)
  return c.map((v) => v / total)
}

function deviation(problem: BalanceProblem, predicted: readonly number[]): { max: number; worst: number } {
  let max = -1
  let worst = -1
  problem.target.forEach((b, i) => {
    if (b <= 0) return
    const d = Math.abs(predicted[i] - b) / b
    if (d > max) {
      max = d
      worst = i
    }
  })
  return { max: Math.max(0, max), worst }
}

/** Solve the balance without judging the result. */
export function solveBalanceRaw(problem: BalanceProblem): BalanceSolution {
  const { components, target, balanceIndex, sourceA, present, totalMoles: N } = problem
  const C = components.length
  const m = sourceA.length
  const presentTotal = present.reduce((s, v) => s + v, 0)
  const targetRows = target.flatMap((b, i) => (b > 0 && i !== balanceIndex ? [i] : []))

  if (m === targetRows.length + 1) {
    const rows = targetRows.map((i) => sourceA.map((a) => a[i] / (N * target[i])))
    rows.push(sourceA.map(() => 1 / N))
    const rhs = targetRows.map((i) => (N * target[i] - present[i]) / (N * target[i]))
    rhs.push((N - presentTotal) / N)
    const direct = solveSquare(rows, rhs)
    if (direct?.every((n) => n >= -1e-12 * N)) {
      const amounts = direct.map((n) => Math.max(0, n))
      const predicted = predict(problem, amounts)
      const d = deviation(problem, predicted)
      return { amounts, method: 'direct', predicted, maxRelativeDeviation: d.max, worstIndex: d.worst }
    }
  }
  // weighted NNLS over every component, in units of N
  const rows: number[][] = []
  const rhs: number[] = []
  for (let i = 0; i < C; i++) {
    const w = target[i] > 0 ? 1 / target[i] : 1
    rows.push(sourceA.map((a) => a[i] * w))
    rhs.push((target[i] - present[i] / N) * w)
  }
  const totalWeight = 1e4
  rows.push(sourceA.map(() => totalWeight))
  rhs.push(((N - presentTotal) / N) * totalWeight)
  const { x } = nnls(rows, rhs)
  const amounts = x.map((v) => v * N)
  const predicted = predict(problem, amounts)
  const d = deviation(problem, predicted)
  return { amounts, method: 'nnls', predicted, maxRelativeDeviation: d.max, worstIndex: d.worst }
}

/** Solve and throw a PlanningInputError (422) with the reason when the target is out of reach. */
export function solveBalance(problem: BalanceProblem): BalanceSolution {
  const solution = solveBalanceRaw(problem)
  if (solution.maxRelativeDeviation <= problem.toleranceRelative) return solution
  const i = solution.worstIndex
  const gas = problem.components[i]
  const supplied = problem.sourceA.some((a) => a[i] > 0)
  const presentTotal = problem.present.reduce((s, v) => s + v, 0)
  const pct = (v: number): string => `${(v * 100).toPrecision(4)} %`
  const closest = `closest reachable ${gas}: ${pct(solution.predicted[i])} against ${pct(problem.target[i])}`
  if (!supplied && problem.present[i] < problem.target[i] * problem.totalMoles) {
    throw new PlanningInputError(`no source supplies ${gas}; ${closest}`, 'sources', 422)
  }
  if (problem.present[i] > problem.target[i] * problem.totalMoles * (1 + problem.toleranceRelative)) {
    throw new PlanningInputError(
      `the gas already in the cylinder holds more ${gas} than the finished mixture may contain; ${closest}`,
      problem.presentField,
      422,
    )
  }
  if (presentTotal > 0) {
    throw new PlanningInputError(`the gas already in the cylinder cannot be brought to the target with these sources; ${closest}`, problem.presentField, 422)
  }
  throw new PlanningInputError(`no non-negative combination of the sources reaches the target; ${closest}`, 'target', 422)
}
