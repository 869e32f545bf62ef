/** Property tests: finite results for valid inputs across models, clear PhysicsInputError for invalid ones. */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { GAS_IDS, GERG_COMPONENT_IDS, type Mixture, PhysicsInputError, prepareModel, stateFromTP } from '../../../shared/physics/index.ts'

/** a random mixture of `ids`: 1–5 distinct gases with positive fractions summing to 1 */
function mixtureOf(ids: readonly string[]): fc.Arbitrary<Mixture> {
  return fc.uniqueArray(fc.constantFrom(...ids), { minLength: 1, maxLength: 5 }).chain((gasIds) =>
    fc.array(fc.double({ min: 0.01, max: 1, noNaN: true }), { minLength: gasIds.length, maxLength: gasIds.length }).map((w) => {
      const total = w.reduce((s, v) => s + v, 0)
      return { gasIds, x: w.map((v) => v / total) }
    }),
  )
}

const supercriticalish = GAS_IDS.filter((id) => id !== 'water')

describe('finite results for valid inputs', () => {
  it('ideal and cubic models: Z > 0, ρ > 0 and p(T, ρ) = p for any library mixture, 200–500 K, 1 kPa–30 MPa', () => {
    fc.assert(
      fc.property(
        mixtureOf(supercriticalish),
        fc.constantFrom('ideal', 'van-der-waals', 'srk', 'peng-robinson' as const),
        fc.double({ min: 200, max: 500, noNaN: true }),
        fc.double({ min: 1e3, max: 3e7, noNaN: true }),
        (mixture, model, T, p) => {
          const state = stateFromTP(model, mixture, T, p)
          expect(Number.isFinite(state.compressibility) && state.compressibility > 0).toBe(true)
          expect(Number.isFinite(state.molarDensityMolPerM3) && state.molarDensityMolPerM3 > 0).toBe(true)
          expect(state.molarMassKgPerMol).toBeGreaterThan(0)
          const back = prepareModel(model, mixture).pressurePa(T, state.molarDensityMolPerM3)
          expect(Math.abs(back - p) / p).toBeLessThan(1e-8)
        },
      ),
      { numRuns: 300 },
    )
  })

  it('GERG-2008: finite Z and ρ for mixtures of its components, 250–450 K, 0.1–20 MPa', () => {
    fc.assert(
      fc.property(
        mixtureOf(GERG_COMPONENT_IDS),
        fc.double({ min: 250, max: 450, noNaN: true }),
        fc.double({ min: 1e5, max: 2e7, noNaN: true }),
        (mixture, T, p) => {
          const state = stateFromTP('gerg-2008', mixture, T, p)
          expect(Number.isFinite(state.compressibility) && state.compressibility > 0).toBe(true)
          expect(Number.isFinite(state.molarDensityMolPerM3) && state.molarDensityMolPerM3 > 0).toBe(true)
        },
      ),
      { numRuns: 100 },
    )
  })
})

describe('clear errors for invalid inputs', () => {
  const fieldOf = (fn: () => unknown): string | null => {
    try {
      fn()
      return null
    } catch (error) {
      return error instanceof PhysicsInputError ? error.field : `not a PhysicsInputError: ${String(error)}`
    }
  }

  it("fractions that do not sum to 1 ± 1e-6 → field 'mixture'", () => {
    fc.assert(
      fc.property(
        mixtureOf(supercriticalish).filter((m) => m.gasIds.length > 1),
        fc.oneof(fc.double({ min: 1e-5, max: 0.5, noNaN: true }), fc.double({ min: -0.5, max: -1e-5, noNaN: true })),
        (mixture, offset) => {
          // shift the last fraction so the sum misses 1, keeping every fraction in 0..1
          const x = [...mixture.x]
          const last = x.length - 1
          const shifted = x[last] + offset
          fc.pre(shifted >= 0 && shifted <= 1)
          x[last] = shifted
          expect(fieldOf(() => stateFromTP('peng-robinson', { gasIds: mixture.gasIds, x }, 300, 1e5))).toBe('mixture')
        },
      ),
    )
  })

  it("non-positive or non-finite temperature → 'temperature', pressure → 'pressure'", () => {
    const bad = fc.oneof(fc.double({ max: 0, noNaN: true }), fc.constant(Number.NaN), fc.constant(Number.POSITIVE_INFINITY))
    fc.assert(
      fc.property(fc.constantFrom('ideal', 'van-der-waals', 'srk', 'peng-robinson', 'gerg-2008' as const), bad, (model, value) => {
        const n2 = { gasIds: ['nitrogen'], x: [1] }
        expect(fieldOf(() => stateFromTP(model, n2, value, 1e5))).toBe('temperature')
        expect(fieldOf(() => stateFromTP(model, n2, 300, value))).toBe('pressure')
      }),
    )
  })

  it("unknown gas ids → 'mixture[i].gas' naming the position", () => {
    fc.assert(
      fc.property(
        fc.string({ minLength: 1, maxLength: 12 }).filter((s) => !GAS_IDS.includes(s)),
        fc.nat({ max: 2 }),
        (unknown, position) => {
          const gasIds = ['nitrogen', 'argon', 'helium']
          gasIds[position] = unknown
          expect(fieldOf(() => stateFromTP('ideal', { gasIds, x: [0.5, 0.3, 0.2] }, 300, 1e5))).toBe(`mixture[${position}].gas`)
        },
      ),
    )
  })
})
