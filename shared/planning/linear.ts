/**
 * Small dense linear algebra for the material balance: a direct solve for square systems and
 * non-negative least squares (Lawson & Hanson, "Solving Least Squares Problems", 1974, ch. 23)
 * for the rest. Matrices are row-major arrays of rows; sizes are a handful of rows and columns.
 */

/** Solve A·x = b for square A by Gaussian elimination with partial pivoting; null when A is singular. */
export function solveSquare(A: readonly (readonly number[])[], b: readonly number[]): number[] | null {
  const n = b.length
  if (A.length !== n || A.some((row) => row.length !== n)) throw new RangeError('solveSquare: A must be n×n')
  const m = A.map((row, i) => [...row, b[i]])
  const scale = Math.max(1e-300, ...A.flat().map(Math.abs))
  for (let col = 0; col < n; col++) {
    let pivot = col
    for (let r = col + 1; r < n; r++) if (Math.abs(m[r][col]) > Math.abs(m[pivot][col])) pivot = r
    if (Math.abs(m[pivot][col]) <= 1e-13 * scale) return null
    if (pivot !== col) [m[pivot], m[col]] = [m[col], m[pivot]]
    for (let r = col + 1; r < n; r++) {
      const f = m[r][col] / m[col][col]
      if (f === 0) continue
      for (let c = col; c <= n; c++) m[r][c] -= f * m[col][c]
    }
  }
  const x = new Array<number>(n).fill(0)
  for (let r = n - 1; r >= 0; r--) {
    let s = m[r][n]
    for (let c = r + 1; c < n; c++) s -= m[r][c] * x[c]
    x[r] = s / m[r][r]
  }
  return x
}

/**
 * Unconstrained least squares min ‖A·x − b‖ over the columns `cols` of A (other unknowns fixed at 0),
 * by Householder QR. Columns that are numerically dependent on earlier ones get x = 0.
 */
function leastSquaresOnColumns(A: readonly (readonly number[])[], b: readonly number[], cols: readonly number[]): number[] {
  const m = A.length
  const k = cols.length
  const R = A.map((row) => cols.map((c) => row[c]))
  const y = [...b]
  const rank: boolean[] = new Array<boolean>(k).fill(false)
  const colNorm0 = cols.map((_, j) => Math.sqrt(R.reduce((s, row) => s + row[j] * row[j], 0)))
  let r0 = 0
  for (let j = 0; j < k && r0 < m; j++) {
    let norm = 0
    for (let i = r0; i < m; i++) norm += R[i][j] * R[i][j]
    norm = Math.sqrt(norm)
    if (norm <= 1e-12 * Math.max(colNorm0[j], 1e-300)) continue
    const alpha = R[r0][j] > 0 ? -norm : norm
    const v = new Array<number>(m).fill(0)
    for (let i = r0; i < m; i++) v[i] = R[i][j]
    v[r0] -= alpha
    let vv = 0
    for (let i = r0; i < m; i++) vv += v[i] * v[i]
    if (vv > 0) {
      for (let jj = j; jj < k; jj++) {
        let d = 0
        for (let i = r0; i < m; i++) d += v[i] * R[i][jj]
        const f = (2 * d) / vv
        for (let i = r0; i < m; i++) R[i][jj] -= f * v[i]
      }
      let d = 0
      for (let i = r0; i < m; i++) d += v[i] * y[i]
      const f = (2 * d) / vv
      for (let i = r0; i < m; i++) y[i] -= f * v[i]
    }
    rank[j] = true
    r0++
  }
  // back substitution over the independent columns, in the order their pivots were taken
  const pivotCols: number[] = []
  for (let j = 0; j < k; j++) if (rank[j]) pivotCols.push(j)
  const x = new Array<number>(k).fill(0)
  for (let p = pivotCols.length - 1; p >= 0; p--) {
    const j = pivotCols[p]
    let s = y[p]
    for (let q = p + 1; q < pivotCols.length; q++) s -= R[p][pivotCols[q]] * x[pivotCols[q]]
    x[j] = s / R[p][j]
  }
  return x
}

export interface NnlsResult {
  readonly x: number[]
  /** Euclidean norm of A·x − b */
  readonly residualNorm: number
}

/**
 * Non-negative least squares: min ‖A·x − b‖ subject to x ≥ 0, Lawson–Hanson active-set method.
 * Reference: C. L. Lawson, R. J. Hanson, Solving Least Squares Problems (1974), algorithm NNLS, ch. 23.
 */
export function nnls(A: readonly (readonly number[])[], b: readonly number[], maxIterations = 200): NnlsResult {
  const m = A.length
  const n = m === 0 ? 0 : A[0].length
  const x = new Array<number>(n).fill(0)
  const inP = new Array<boolean>(n).fill(false)
  const tol = 1e-12 * Math.max(1, ...A.flat().map(Math.abs)) * Math.max(1, ...b.map(Math.abs))
  const gradient = (): number[] => {
    const r = b.map((bi, i) => bi - A[i].reduce((s, a, j) => s + a * x[j], 0))
    return Array.from({ length: n }, (_, j) => A.reduce((s, row, i) => s + row[j] * r[i], 0))
  }
  let iterations = 0
  for (;;) {
    const w = gradient()
    let t = -1
    let wMax = tol
    for (let j = 0; j < n; j++)
      if (!inP[j] && w[j] > wMax) {
        wMax = w[j]
        t = j
      }
    if (t < 0 || iterations++ >= maxIterations) break
    inP[t] = true
    for (;;) {
      const P = inP.flatMap((v, j) => (v ? [j] : []))
      const sP = leastSquaresOnColumns(A, b, P)
      const s = new Array<number>(n).fill(0)
      P.forEach((j, q) => {
        s[j] = sP[q]
      })
      if (P.every((j) => s[j] > 0)) {
        for (let j = 0; j < n; j++) x[j] = s[j]
        break
      }
      let alpha = Infinity
      let argmin = -1
      for (const j of P) {
        if (s[j] > 0) continue
        const a = x[j] / (x[j] - s[j])
        if (a < alpha) {
          alpha = a
          argmin = j
        }
      }
      if (argmin < 0) {
        inP[t] = false
        break
      }
      for (let j = 0; j < n; j++) x[j] += alpha * (s[j] - x[j])
      x[argmin] = 0
      for (const j of P)
        if (x[j] <= 1e-15) {
          inP[j] = false
          x[j] = 0
        }
      if (iterations++ >= maxIterations) break
    }
  }
  const residualNorm = Math.sqrt(
    b.reduce((s, bi, i) => {
      const r = A[i].reduce((acc, a, j) => acc + a * x[j], 0) - bi
      return s + r * r
    }, 0),
  )
  return { x, residualNorm }
}
