/**
 * The van der Waals one-fluid mixing rule, checked against a direct evaluation of its defining double sum
 * a_mix = Σ_i Σ_j x_i x_j √(a_i a_j)(1 − k_ij), b_mix = Σ x_i b_i, with a_i = Ω_a R² Tc_i²/Pc_i · α_i(T) and
 * √α_i = 1 + m_i(1 − √(T/Tc_i)) (Soave 1972; Peng & Robinson 1976).
 */
import fc from 'fast-check'
import { describe, it } from 'vitest'
import {
  GAS_CONSTANT_J_PER_MOL_K as R,
  GAS_IDS,
  getGas,
  interactionParameter,
  PENG_ROBINSON,
  prepareCubicModel,
  SOAVE_REDLICH_KWONG,
  VAN_DER_WAALS,
  type CubicFamily,
} from '../../../../shared/physics/index.ts'
import { expectClose } from '../../../support/expect-close.ts'

const FAMILIES = [VAN_DER_WAALS, SOAVE_REDLICH_KWONG, PENG_ROBINSON] as const

function directSum(family: CubicFamily, gasIds: readonly string[], x: readonly number[], T: number) {
  const a = gasIds.map((id) => {
    const g = getGas(id)
    const m = family.alphaSlope?.(g.acentricFactor) ?? 0
    const root = Math.max(0, 1 + m * (1 - Math.sqrt(T / g.criticalTemperatureK)))
    return ((family.omegaA * R * R * g.criticalTemperatureK ** 2) / g.criticalPressurePa) * root * root
  })
  let aMix = 0
  for (let i = 0; i < x.length; i++) {
    for (let j = 0; j < x.length; j++) {
      aMix += x[i] * x[j] * Math.sqrt(a[i] * a[j]) * (1 - interactionParameter(family.id, gasIds[i], gasIds[j]))
    }
  }
  const bMix = gasIds.reduce((s, id, i) => {
    const g = getGas(id)
    return s + (x[i] * family.omegaB * R * g.criticalTemperatureK) / g.criticalPressurePa
  }, 0)
  return { aMix, bMix }
}

const realGases = GAS_IDS.filter((id) => id !== 'air')

describe('one-fluid mixing rule', () => {
  it('a_mix(T) and b_mix equal the direct double sum for random mixtures, 50–3000 K (property)', () => {
    fc.assert(
      fc.property(
        fc.uniqueArray(fc.constantFrom(...realGases), { minLength: 1, maxLength: 6 }),
        fc.constantFrom(...FAMILIES),
        fc.double({ min: 50, max: 3000, noNaN: true }),
        fc.array(fc.double({ min: 0.01, max: 1, noNaN: true }), { minLength: 6, maxLength: 6 }),
        (gasIds, family, T, weights) => {
          const w = weights.slice(0, gasIds.length)
          const total = w.reduce((s, v) => s + v, 0)
          const x = w.map((v) => v / total)
          const eos = prepareCubicModel(family.id, { gasIds, x })
          const expected = directSum(family, gasIds, x, T)
          expectClose(eos.attractionParameter(T), expected.aMix, { rel: 1e-10, abs: 1e-14 }, { family: family.id, gasIds, x, T })
          expectClose(eos.coVolumeM3PerMol, expected.bMix, { rel: 1e-12 }, { family: family.id, gasIds, x })
        },
      ),
      { numRuns: 500 },
    )
  })
})
