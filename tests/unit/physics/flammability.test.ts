import { describe, expect, it } from 'vitest'
import { getGas, iso10156Flammability, iso10156OxidisingPower, leChatelierLflPercent, mixtureLc50, PhysicsInputError } from '../../../shared/physics/index.ts'
import examples from '../../fixtures/physics/domain-brief-iso-10156-examples.json' with { type: 'json' }
import { expectClose } from '../../support/expect-close.ts'

const status = `${examples.source.status}`

describe(`ISO 10156 flammability — ${examples.source.citation}`, () => {
  for (const c of examples.flammability.cases) {
    it(`${c.label}: Σ = ${c.index} → ${c.flammable ? 'flammable' : 'not flammable'} (${status})`, () => {
      const result = iso10156Flammability({ gasIds: c.gasIds, x: c.x })
      expectClose(result.index, c.index, examples.flammability.tolerance, c)
      expect(result.flammable).toBe(c.flammable)
      expect(result.dataStatus).toBe('unverified')
      expect(result.warnings.map((w) => w.code)).toContain('unverified-coefficients')
      expect(result.methodApplicable).toBe(true)
    })
  }

  for (const c of examples.maximumFuelContent.cases) {
    it(`largest non-flammable ${c.fuel} content in ${c.inert} ≈ ${c.maxFraction * 100} % (${status})`, () => {
      const index = (x: number): number => iso10156Flammability({ gasIds: [c.fuel, c.inert], x: [x, 1 - x] }).index
      let lo = 0
      let hi = 0.5
      for (let i = 0; i < 60; i++) {
        const mid = (lo + hi) / 2
        if (index(mid) > 1) hi = mid
        else lo = mid
      }
      expectClose(lo, c.maxFraction, examples.maximumFuelContent.tolerance, c)
    })
  }

  it('a pure inert gas or a mixture without fuel is not flammable', () => {
    expect(iso10156Flammability({ gasIds: ['nitrogen', 'argon'], x: [0.5, 0.5] })).toMatchObject({ flammable: false, index: 0 })
  })

  it('uses the LFL in place of a missing Tci and says so (n-pentane has no Tci in the library)', () => {
    const result = iso10156Flammability({ gasIds: ['n-pentane', 'nitrogen'], x: [0.01, 0.99] })
    const lfl = getGas('n-pentane').flammability?.lflPercent ?? Number.NaN
    expectClose(result.index, (100 * 0.01) / lfl, { rel: 1e-12 })
    expect(result.terms[0].tciSubstitutedByLfl).toBe(true)
    expect(result.warnings.map((w) => w.code)).toContain('tci-substituted-by-lfl')
  })

  it('flags fuel + oxidiser mixtures as outside the calculation method (quad detector mix in air-like balance)', () => {
    const q = examples.toxicity.quadMixture
    const result = iso10156Flammability({ gasIds: q.gasIds, x: q.x })
    expect(result.methodApplicable).toBe(false)
    expect(result.warnings.map((w) => w.code)).toContain('fuel-with-oxidiser')
  })

  it('treats air as its constituents (2.5 % CH4 in air is fuel with oxidiser)', () => {
    const result = iso10156Flammability({ gasIds: ['methane', 'air'], x: [0.025, 0.975] })
    expect(result.methodApplicable).toBe(false)
  })
})

describe(`ISO 10156 oxidising power — ${examples.source.citation}`, () => {
  for (const c of examples.oxidisingPower.cases) {
    it(`${c.label}: OP = ${c.oxidisingPower} (${status})`, () => {
      const result = iso10156OxidisingPower({ gasIds: c.gasIds, x: c.x })
      expectClose(result.oxidisingPower, c.oxidisingPower, examples.oxidisingPower.tolerance, c)
      expect(result.oxidising).toBe(c.oxidising)
    })
  }

  it('dry air (library pseudo-component, 20.96 % O2) is not oxidising; pure O2 has OP = 1', () => {
    expect(iso10156OxidisingPower({ gasIds: ['air'], x: [1] }).oxidising).toBe(false)
    expect(iso10156OxidisingPower({ gasIds: ['oxygen'], x: [1] }).oxidisingPower).toBe(1)
    expect(iso10156OxidisingPower({ gasIds: ['nitrogen'], x: [1] }).oxidisingPower).toBe(0)
  })
})

describe(`LC50 additivity — ${examples.toxicity.citation}`, () => {
  for (const c of examples.toxicity.thresholds) {
    it(`${c.gasId} in N2 becomes toxic (LC50 ≤ 5000 ppm) from ${c.toxicFromFraction * 100} %`, () => {
      const lc50 = (x: number) => mixtureLc50({ gasIds: [c.gasId, 'nitrogen'], x: [x, 1 - x] })
      let lo = 0
      let hi = 1
      for (let i = 0; i < 60; i++) {
        const mid = (lo + hi) / 2
        if (lc50(mid).toxic) hi = mid
        else lo = mid
      }
      expectClose(hi, c.toxicFromFraction, c.tolerance, c)
      expect(lc50(Math.min(1, hi * 1.001)).toxic).toBe(true)
      expect(lc50(hi * 0.999).toxic).toBe(false)
    })
  }

  it(`quad detector mix: LC50 ≈ ${examples.toxicity.quadMixture.lc50PpmV} ppm, not toxic`, () => {
    const q = examples.toxicity.quadMixture
    const result = mixtureLc50({ gasIds: q.gasIds, x: q.x })
    expectClose(result.lc50PpmV ?? Number.NaN, q.lc50PpmV, q.tolerance, { mixture: q.gasIds })
    expect(result.toxic).toBe(false)
  })

  it('a mixture of non-toxic gases has no LC50', () => {
    expect(mixtureLc50({ gasIds: ['argon', 'carbon-dioxide'], x: [0.82, 0.18] })).toMatchObject({ lc50PpmV: null, toxic: false })
  })
})

describe("Le Chatelier's rule", () => {
  it('gives the pure-fuel LFL for one fuel and the harmonic mean for two (Zabetakis, USBM Bull. 627, from memory)', () => {
    expectClose(leChatelierLflPercent({ gasIds: ['methane', 'nitrogen'], x: [0.02, 0.98] }) ?? Number.NaN, 4.4, { rel: 1e-12 })
    // 50/50 methane/propane: 1 / (0.5/4.4 + 0.5/1.7) = 2.4525 (hand calculation with IEC 60079-20-1 limits)
    expectClose(leChatelierLflPercent({ gasIds: ['methane', 'propane', 'nitrogen'], x: [0.02, 0.02, 0.96] }) ?? Number.NaN, 2.4525, { abs: 1e-4 })
    expect(leChatelierLflPercent({ gasIds: ['nitrogen'], x: [1] })).toBeNull()
  })
})

describe('validation', () => {
  it('rejects invalid mixtures like the state functions do', () => {
    expect(() => iso10156Flammability({ gasIds: ['hydrogen'], x: [0.5] })).toThrow(PhysicsInputError)
    expect(() => mixtureLc50({ gasIds: ['phosgene'], x: [1] })).toThrow(PhysicsInputError)
  })
})
