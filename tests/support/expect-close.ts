/**
 * Numeric comparison for reference-value tests. Passes when |actual − expected| ≤ max(abs, rel·|expected|).
 * On failure the message prints the inputs, the expected value, the actual value, the difference and the tolerance,
 * so a failing fixture case can be read without a debugger.
 */

export interface Tolerance {
  /** relative tolerance, e.g. 1e-3 for 0.1 % */
  readonly rel?: number
  /** absolute tolerance in the quantity's unit */
  readonly abs?: number
}

function format(value: unknown): string {
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : `${value} (not finite)`
  try {
    return JSON.stringify(value)
  } catch {
    return String(value)
  }
}

export function withinTolerance(actual: number, expected: number, tolerance: Tolerance): boolean {
  if (!Number.isFinite(actual)) return false
  const allowed = Math.max(tolerance.abs ?? 0, (tolerance.rel ?? 0) * Math.abs(expected))
  return Math.abs(actual - expected) <= allowed
}

/**
 * Throws an Error describing the case when `actual` is not within `tolerance` of `expected`.
 * @param context what was computed and from which inputs, e.g. { quantity: 'Z', model: 'srk', T: 288.15 }
 */
export function expectClose(actual: number, expected: number, tolerance: Tolerance, context: Readonly<Record<string, unknown>> = {}): void {
  if (tolerance.rel === undefined && tolerance.abs === undefined) {
    throw new Error('expectClose needs a relative or an absolute tolerance')
  }
  if (withinTolerance(actual, expected, tolerance)) return
  const allowed = Math.max(tolerance.abs ?? 0, (tolerance.rel ?? 0) * Math.abs(expected))
  const lines = [
    'value outside tolerance',
    ...Object.entries(context).map(([key, value]) => `  ${key}: ${format(value)}`),
    `  expected: ${expected}`,
    `  actual:   ${format(actual)}`,
    `  difference: ${actual - expected} (${(((actual - expected) / expected) * 100).toPrecision(3)} %)`,
    `  tolerance: ${tolerance.rel !== undefined ? `rel ${tolerance.rel}` : ''}${
      tolerance.rel !== undefined && tolerance.abs !== undefined ? ', ' : ''
    }${tolerance.abs !== undefined ? `abs ${tolerance.abs}` : ''} → allowed ±${allowed}`,
  ]
  throw new Error(lines.join('\n'))
}
