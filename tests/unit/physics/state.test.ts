import { describe, expect, it } from 'vitest'
import {
  evaluateState,
  MODEL_IDS,
  type Mixture,
  type ModelId,
  PhysicsInputError,
  prepareModel,
  pressureFromTRho,
  stateFromTP,
} from '../../../shared/physics/index.ts'
import iso6976 from '../../fixtures/physics/iso-6976-2016-compression-factors.json' with { type: 'json' }
import gergPoint from '../../fixtures/physics/nist-aga8-gerg2008-check-point.json' with { type: 'json' }
import { expectClose } from '../../support/expect-close.ts'

const REAL_MODELS: readonly ModelId[] = ['van-der-waals', 'srk', 'peng-robinson', 'gerg-2008']
const CUBICS = ['van-der-waals', 'srk', 'peng-robinson'] as const

function fieldOf(fn: () => unknown): string {
  try {
    fn()
  } catch (error) {
    if (error instanceof PhysicsInputError) return error.field
    throw error
  }
  throw new Error('expected a PhysicsInputError')
}

describe(`ISO 6976 compression factors at 15 °C, 101.325 kPa — ${iso6976.source.citation}`, () => {
  const T = iso6976.temperatureK
  const p = iso6976.pressurePa
  for (const c of iso6976.cases) {
    it(`${c.gasId}: Z = ${c.compressibility}`, () => {
      const polar = iso6976.tolerance.polarGases.includes(c.gasId)
      for (const model of ['van-der-waals', 'srk', 'peng-robinson'] as const) {
        const tol = iso6976.tolerance[model]
        const rel = polar && model !== 'van-der-waals' ? iso6976.tolerance.polarRelOfNonideality : tol.relOfNonideality
        const z = stateFromTP(model, { gasIds: [c.gasId], x: [1] }, T, p).compressibility
        const abs = tol.abs + rel * (1 - c.compressibility)
        expectClose(z, c.compressibility, { abs }, { gas: c.gasId, model, polar, T, p })
      }
    })
  }
  for (const c of iso6976.cases) {
    it(`${c.gasId}: GERG-2008 where it covers the gas`, () => {
      const prepared = (() => {
        try {
          return prepareModel('gerg-2008', { gasIds: [c.gasId], x: [1] })
        } catch {
          return null
        }
      })()
      if (prepared === null) {
        expect(fieldOf(() => prepareModel('gerg-2008', { gasIds: [c.gasId], x: [1] }))).toBe('model')
        return
      }
      const tol = iso6976.tolerance['gerg-2008']
      const abs = tol.abs + tol.relOfNonideality * (1 - c.compressibility)
      expectClose(prepared.compressibility(T, p), c.compressibility, { abs }, { gas: c.gasId, model: 'gerg-2008' })
    })
  }

  it(`Annex D example natural gas: Z = ${iso6976.annexD.compressibility}`, () => {
    const { mixture, compressibility, tolerance } = iso6976.annexD
    const zGerg = stateFromTP('gerg-2008', mixture, T, p).compressibility
    expectClose(zGerg, compressibility, tolerance['gerg-2008'], { model: 'gerg-2008' })
    const zPr = stateFromTP('peng-robinson', mixture, T, p).compressibility
    const pr = tolerance['peng-robinson']
    expectClose(zPr, compressibility, { abs: pr.abs + pr.relOfNonideality * (1 - compressibility) }, { model: 'peng-robinson' })
  })
})

describe(`GERG-2008 through the dispatcher — ${gergPoint.source.citation}`, () => {
  it('reproduces the published Z, density and molar mass at 400 K, 50 MPa', () => {
    const state = stateFromTP('gerg-2008', gergPoint.mixture, gergPoint.temperatureK, gergPoint.pressurePa)
    const inputs = { T: gergPoint.temperatureK, p: gergPoint.pressurePa }
    expectClose(state.compressibility, gergPoint.expected.compressibility, gergPoint.tolerance, { ...inputs, q: 'Z' })
    expectClose(state.molarDensityMolPerM3, gergPoint.expected.molarDensityMolPerM3, gergPoint.tolerance, { ...inputs, q: 'ρ' })
    expectClose(state.molarMassKgPerMol * 1000, gergPoint.expected.molarMassGPerMol, { rel: gergPoint.tolerance.molarMassRel }, { q: 'M' })
    expect(state.model).toBe('gerg-2008')
    // 50 MPa is above the normal range (35 MPa): the range warning must reach the user
    expect(state.warnings.map((w) => w.code)).toContain('gerg-2008-pressure-extended-range')
  })

  it('p(T, ρ) returns the published pressure at the published density', () => {
    const p = pressureFromTRho('gerg-2008', gergPoint.mixture, gergPoint.temperatureK, gergPoint.expected.molarDensityMolPerM3)
    expectClose(p, gergPoint.pressurePa, gergPoint.tolerance, { T: gergPoint.temperatureK })
  })
})

describe('model selection and fallback', () => {
  const withAmmonia: Mixture = { gasIds: ['nitrogen', 'ammonia'], x: [0.99, 0.01] }

  it("rejects a gas outside GERG-2008 with field 'model' unless the cubic fallback is allowed", () => {
    expect(fieldOf(() => stateFromTP('gerg-2008', withAmmonia, 288.15, 1e6))).toBe('model')
    const state = stateFromTP('gerg-2008', withAmmonia, 288.15, 1e6, { allowCubicFallback: true })
    expect(state.model).toBe('peng-robinson')
    expect(state.requestedModel).toBe('gerg-2008')
    expect(state.warnings.find((w) => w.code === 'fallback-model')?.message).toMatch(/ammonia/)
    const direct = stateFromTP('peng-robinson', withAmmonia, 288.15, 1e6)
    expect(state.compressibility).toBe(direct.compressibility)
  })

  it('uses SRK as fallback when asked', () => {
    const state = stateFromTP('gerg-2008', withAmmonia, 288.15, 1e6, { allowCubicFallback: true, fallbackModel: 'srk' })
    expect(state.model).toBe('srk')
    expect(state.compressibility).toBe(stateFromTP('srk', withAmmonia, 288.15, 1e6).compressibility)
  })

  it('evaluates air through its constituents, so GERG-2008 covers it', () => {
    const air = stateFromTP('gerg-2008', { gasIds: ['air'], x: [1] }, 288.15, 101325)
    const parts = stateFromTP('gerg-2008', { gasIds: ['nitrogen', 'oxygen', 'argon'], x: [0.7812, 0.2096, 0.0092] }, 288.15, 101325)
    expectClose(air.compressibility, parts.compressibility, { abs: 1e-14 })
    // ISO 6976:2016 gives Z(air, 15 °C) = 0.999595 (domain brief §10.2)
    expectClose(air.compressibility, 0.999595, { abs: 2e-4 }, { gas: 'air', source: 'ISO 6976:2016 via DOMAIN §10.2' })
  })
})

describe('input validation', () => {
  const n2: Mixture = { gasIds: ['nitrogen'], x: [1] }
  it.each([
    ['unknown model', () => stateFromTP('redlich' as ModelId, n2, 300, 1e5), 'model'],
    ['empty mixture', () => stateFromTP('ideal', { gasIds: [], x: [] }, 300, 1e5), 'mixture'],
    ['length mismatch', () => stateFromTP('ideal', { gasIds: ['nitrogen'], x: [0.5, 0.5] }, 300, 1e5), 'mixture'],
    ['sum 0.9', () => stateFromTP('ideal', { gasIds: ['nitrogen', 'argon'], x: [0.5, 0.4] }, 300, 1e5), 'mixture'],
    ['unknown gas', () => stateFromTP('ideal', { gasIds: ['nitrogen', 'kryptonite'], x: [0.5, 0.5] }, 300, 1e5), 'mixture[1].gas'],
    ['repeated gas', () => stateFromTP('ideal', { gasIds: ['argon', 'argon'], x: [0.5, 0.5] }, 300, 1e5), 'mixture[1].gas'],
    ['negative fraction', () => stateFromTP('ideal', { gasIds: ['argon', 'helium'], x: [1.2, -0.2] }, 300, 1e5), 'mixture[0].fraction'],
    ['percentage', () => stateFromTP('ideal', { gasIds: ['argon', 'helium'], x: [82, 18] }, 300, 1e5), 'mixture[0].fraction'],
    ['NaN fraction', () => stateFromTP('ideal', { gasIds: ['argon'], x: [Number.NaN] }, 300, 1e5), 'mixture[0].fraction'],
    ['T = 0', () => stateFromTP('peng-robinson', n2, 0, 1e5), 'temperature'],
    ['T = NaN', () => stateFromTP('srk', n2, Number.NaN, 1e5), 'temperature'],
    ['p = 0', () => stateFromTP('peng-robinson', n2, 300, 0), 'pressure'],
    ['p = −1', () => stateFromTP('ideal', n2, 300, -1), 'pressure'],
    ['p = ∞', () => stateFromTP('van-der-waals', n2, 300, Number.POSITIVE_INFINITY), 'pressure'],
    ['ρ ≤ 0', () => pressureFromTRho('peng-robinson', n2, 300, 0), 'molarDensity'],
    ['ρ beyond co-volume', () => pressureFromTRho('peng-robinson', n2, 300, 1e6), 'molarDensity'],
  ])('%s → field %s', (_label, fn, field) => {
    expect(fieldOf(fn)).toBe(field)
  })

  it('accepts fractions that sum to 1 within 1e-6 and rescales them', () => {
    const prepared = prepareModel('ideal', { gasIds: ['argon', 'carbon-dioxide'], x: [0.82, 0.1800005] })
    expectClose(prepared.mixture.x[0] + prepared.mixture.x[1], 1, { abs: 1e-15 })
  })
})

describe('invariants', () => {
  const argonCo2: Mixture = { gasIds: ['argon', 'carbon-dioxide', 'oxygen'], x: [0.8, 0.15, 0.05] }

  it('Z → 1 as p → 0 for every model', () => {
    for (const model of REAL_MODELS) {
      const z = stateFromTP(model, argonCo2, 288.15, 10).compressibility
      expectClose(z, 1, { abs: 1e-6 }, { model, p: 10 })
    }
  })

  it('a one-gas mixture equals the pure gas, in any list position', () => {
    for (const model of MODEL_IDS) {
      const pure = stateFromTP(model, { gasIds: ['methane'], x: [1] }, 300, 5e6).compressibility
      const padded = stateFromTP(model, { gasIds: ['nitrogen', 'methane', 'argon'], x: [0, 1, 0] }, 300, 5e6).compressibility
      expectClose(padded, pure, { abs: 1e-12 }, { model })
    }
  })

  it('the order of the gases does not change the result', () => {
    for (const model of MODEL_IDS) {
      const a = stateFromTP(model, argonCo2, 288.15, 150e5).compressibility
      const b = stateFromTP(model, { gasIds: ['oxygen', 'carbon-dioxide', 'argon'], x: [0.05, 0.15, 0.8] }, 288.15, 150e5).compressibility
      expectClose(b, a, { abs: 1e-12 }, { model })
    }
  })

  it('p(T, ρ(T, p)) returns p for every model', () => {
    for (const model of MODEL_IDS) {
      const prepared = prepareModel(model, argonCo2)
      for (const p of [1e5, 50e5, 200e5, 300e5]) {
        const rho = prepared.densityMolPerM3(288.15, p)
        expectClose(prepared.pressurePa(288.15, rho), p, { rel: 1e-9 }, { model, p })
        expectClose(prepared.compressibility(288.15, p), p / (rho * (model === 'gerg-2008' ? 8.314472 : 8.314462618) * 288.15), { rel: 1e-9 }, { model, p })
      }
    }
  })

  it('ideal gas: Z = 1 exactly, with a real-gas caution at cylinder pressure but not near 1 atm', () => {
    const high = stateFromTP('ideal', argonCo2, 288.15, 200e5)
    expect(high.compressibility).toBe(1)
    expect(high.warnings.map((w) => w.code)).toContain('ideal-gas-deviation')
    const low = stateFromTP('ideal', { gasIds: ['nitrogen'], x: [1] }, 288.15, 101325)
    expect(low.warnings.map((w) => w.code)).not.toContain('ideal-gas-deviation')
  })
})

describe('phase warnings', () => {
  const co2: Mixture = { gasIds: ['carbon-dioxide'], x: [1] }

  it('liquid CO2 at 15 °C, 100 bar (above its 51 bar vapour pressure, Perry): liquid-like and condensation warnings', () => {
    for (const model of ['srk', 'peng-robinson', 'gerg-2008'] as const) {
      const codes = stateFromTP(model, co2, 288.15, 100e5).warnings.map((w) => w.code)
      expect(codes, model).toContain('condensation-risk')
      expect(codes, model).toContain('liquid-like-state')
    }
  })

  it('CO2 vapour at 15 °C, 45 bar: three cubic roots, the vapour root stable, no condensation warning', () => {
    const state = stateFromTP('peng-robinson', co2, 288.15, 45e5)
    const codes = state.warnings.map((w) => w.code)
    expect(codes).toContain('near-saturation')
    expect(codes).not.toContain('two-phase-risk')
    expect(codes).not.toContain('condensation-risk')
  })

  it('n-butane at 350 K just above the PR saturation pressure: two-phase risk (liquid root more stable)', () => {
    const state = stateFromTP('peng-robinson', { gasIds: ['n-butane'], x: [1] }, 350, 9.8e5)
    expect(state.warnings.map((w) => w.code)).toContain('two-phase-risk')
  })

  it('warns of condensation of a mixture component by the partial-pressure screen (M21 filled cold)', () => {
    // 18 % CO2 at 200 bar and −10 °C: x·p = 36 bar > p_sat(CO2, −10 °C) = 26.5 bar (domain brief §6.6, Perry)
    const state = stateFromTP('gerg-2008', { gasIds: ['argon', 'carbon-dioxide'], x: [0.82, 0.18] }, 263.15, 200e5)
    expect(state.warnings.find((w) => w.code === 'condensation-risk')?.message).toMatch(/Carbon dioxide/)
  })

  it('a supercritical gas gives no phase warning', () => {
    const codes = stateFromTP('peng-robinson', { gasIds: ['nitrogen'], x: [1] }, 288.15, 200e5).warnings.map((w) => w.code)
    expect(codes).not.toContain('two-phase-risk')
    expect(codes).not.toContain('liquid-like-state')
    expect(codes).not.toContain('condensation-risk')
  })

  it('evaluateState on a prepared model equals stateFromTP', () => {
    for (const model of CUBICS) {
      const prepared = prepareModel(model, co2)
      expect(evaluateState(prepared, 300, 30e5)).toEqual(stateFromTP(model, co2, 300, 30e5))
    }
  })
})
