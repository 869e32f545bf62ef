/**
 * "Each @example is a test too" (STYLE.md): every one-line `@example expression // expected` in the physics core's
 * own files is evaluated against the public API. Expected values written as "≈ v" are compared to the precision of
 * the digits shown (±0.6 in the last digit); exact values must match to 1e-12 relative. Examples whose expected value
 * is not a number or a quoted string are counted but not evaluated.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs'
import { join, relative } from 'node:path'
import { describe, expect, it } from 'vitest'
import * as physics from '../../../shared/physics/index.ts'
import { expectClose } from '../../support/expect-close.ts'

const ROOT = join(import.meta.dirname, '../../../shared/physics')
const SKIP_DIRS = new Set(['gerg-2008', 'data'])

function sourceFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name)
    if (statSync(path).isDirectory()) return SKIP_DIRS.has(name) ? [] : sourceFiles(path)
    return name.endsWith('.ts') ? [path] : []
  })
}

interface Example {
  readonly file: string
  readonly expression: string
  readonly expected: string
}

const EXAMPLE = /@example\s+(.+?)\s+\/\/\s*(.+?)\s*(?:\*\/)?$/

const examples: Example[] = sourceFiles(ROOT).flatMap((file) =>
  readFileSync(file, 'utf8')
    .split('\n')
    .map((line) => EXAMPLE.exec(line))
    .filter((m): m is RegExpExecArray => m !== null)
    .map((m) => ({ file: relative(ROOT, file), expression: m[1], expected: m[2] })),
)

function evaluate(expression: string): unknown {
  const names = Object.keys(physics)
  const fn = new Function(...names, `return (${expression})`)
  return fn(...names.map((n) => (physics as Record<string, unknown>)[n]))
}

/** tolerance from the digits of a number as written, e.g. "0.877" → 6e-4, "5.74e6" → 6e3, "22.41396954" → 6e-9 */
function digitsTolerance(text: string): number {
  const [mantissa, exponent] = text.toLowerCase().split('e')
  const decimals = mantissa.includes('.') ? mantissa.split('.')[1].replace(/[^0-9]/g, '').length : 0
  return 0.6 * 10 ** (-decimals + (exponent === undefined ? 0 : Number(exponent)))
}

describe('documentation examples of shared/physics', () => {
  it('finds examples to check', () => {
    expect(examples.length).toBeGreaterThan(30)
  })

  for (const ex of examples) {
    const approx = /^≈\s*/.test(ex.expected)
    const value = ex.expected
      .replace(/^≈\s*/, '')
      .replace(/\s*\(.*\)$/, '')
      .replace(/_/g, '')
    const numeric = /^-?\d[\d.]*(e-?\d+)?$/i.test(value)
    const quoted = /^'[^']*'$/.test(value)
    if (!numeric && !quoted) continue
    it(`${ex.file}: ${ex.expression} → ${ex.expected}`, () => {
      const actual = evaluate(ex.expression)
      if (quoted) {
        expect(actual).toBe(value.slice(1, -1))
        return
      }
      const expected = Number(value)
      expect(typeof actual).toBe('number')
      const tolerance = approx ? { abs: digitsTolerance(value) } : { rel: 1e-12, abs: 1e-12 }
      expectClose(actual as number, expected, tolerance, { file: ex.file, expression: ex.expression })
    })
  }
})
