import { describe, expect, it } from 'vitest'
import {
  GAS_IDS,
  GASES,
  GERG_COMPONENT_IDS,
  getGas,
  INCOMPATIBLE_PAIRS,
  isKnownGas,
  KIJ_TABLES,
  PhysicsInputError,
  vapourPressureEstimatePa,
  vapourPressurePa,
} from '../../../shared/physics/index.ts'
import atomic from '../../fixtures/physics/iupac-2007-atomic-weights.json' with { type: 'json' }
import annex from '../../fixtures/physics/iso-6976-2016-compression-factors.json' with { type: 'json' }
import domainVp from '../../fixtures/physics/domain-brief-vapour-pressures.json' with { type: 'json' }
import nistVp from '../../fixtures/physics/nist-webbook-vapour-pressures.json' with { type: 'json' }
import { expectClose } from '../../support/expect-close.ts'

const REQUIRED_IDS = [
  'nitrogen',
  'oxygen',
  'argon',
  'helium',
  'hydrogen',
  'carbon-dioxide',
  'carbon-monoxide',
  'methane',
  'ethane',
  'propane',
  'n-butane',
  'isobutane',
  'n-pentane',
  'isopentane',
  'n-hexane',
  'n-heptane',
  'n-octane',
  'n-nonane',
  'n-decane',
  'ethylene',
  'acetylene',
  'nitrous-oxide',
  'nitric-oxide',
  'nitrogen-dioxide',
  'sulfur-dioxide',
  'hydrogen-sulfide',
  'ammonia',
  'sulfur-hexafluoride',
  'neon',
  'krypton',
  'xenon',
  'hydrogen-chloride',
  'chlorine',
  'water',
  'air',
]

/** molar mass from a formula such as 'C4H10' or 'SF6' with the fixture's atomic weights */
function formulaMass(formula: string): number {
  const weights = atomic.atomicWeights as Record<string, number>
  let total = 0
  for (const [, element, count] of formula.matchAll(/([A-Z][a-z]?)(\d*)/g)) {
    const w = weights[element]
    if (w === undefined) throw new Error(`no atomic weight for ${element} in ${formula}`)
    total += w * (count === '' ? 1 : Number(count))
  }
  return total
}

describe('gas library contents', () => {
  it('holds every required gas id exactly once', () => {
    for (const id of REQUIRED_IDS) expect(isKnownGas(id), id).toBe(true)
    expect(new Set(GAS_IDS).size).toBe(GAS_IDS.length)
  })

  it('has finite, positive critical constants and molar masses, and a source for each group of values', () => {
    for (const gas of GASES) {
      expect(gas.molarMassGPerMol, gas.id).toBeGreaterThan(0)
      expect(gas.criticalTemperatureK, gas.id).toBeGreaterThan(0)
      expect(gas.criticalPressurePa, gas.id).toBeGreaterThan(1e5)
      expect(Number.isFinite(gas.acentricFactor), gas.id).toBe(true)
      expect(gas.normalBoilingPointK, gas.id).toBeLessThan(gas.criticalTemperatureK)
      for (const key of ['identity', 'molarMass', 'criticalPoint', 'acentricFactor', 'normalBoilingPoint', 'hazards'] as const) {
        expect(gas.sources[key], `${gas.id}.sources.${key}`).toBeTruthy()
      }
      if (gas.vapourPressure !== null) expect(gas.sources.vapourPressure, gas.id).toBeTruthy()
      if (gas.flammability !== null) expect(gas.sources.flammability, gas.id).toBeTruthy()
      if (gas.iso10156 !== null) expect(gas.sources.iso10156, gas.id).toBeTruthy()
      if (gas.toxicity !== null) expect(gas.toxicity.source, gas.id).toBeTruthy()
    }
  })

  it(`molar masses equal the formula mass — ${atomic.source.citation}`, () => {
    for (const gas of GASES) {
      if (gas.composition !== undefined) continue
      expectClose(gas.molarMassGPerMol, formulaMass(gas.formula), atomic.tolerance, { gas: gas.id, formula: gas.formula })
    }
  })

  it(`ISO 6976:2016 Annex D example molar mass ${annex.annexD.molarMassGPerMol} g/mol from library molar masses`, () => {
    const { gasIds, x } = annex.annexD.mixture
    const m = gasIds.reduce((s, id, i) => s + x[i] * getGas(id).molarMassGPerMol, 0)
    expectClose(m, annex.annexD.molarMassGPerMol, { rel: annex.annexD.tolerance.molarMassRel }, { mixture: gasIds })
  })

  it('marks exactly the 21 GERG-2008 components as GERG-covered', () => {
    const flagged = GASES.filter((g) => g.gerg2008).map((g) => g.id)
    expect([...flagged].sort()).toEqual([...GERG_COMPONENT_IDS].sort())
  })

  it("flags as 'condensable' exactly the gases with Tc above −20 °C (the library's stated rule)", () => {
    for (const gas of GASES) {
      if (gas.composition !== undefined) continue
      expect(gas.hazards.includes('condensable'), gas.id).toBe(gas.criticalTemperatureK > 253.15)
    }
  })

  it('keeps LFL below Tci for every fuel that has both (the conservative LFL-for-Tci substitution relies on it)', () => {
    for (const gas of GASES) {
      const tci = gas.iso10156?.tciPercent
      if (tci === undefined || gas.flammability === null) continue
      expect(gas.flammability.lflPercent, gas.id).toBeLessThan(tci)
    }
  })

  it('is consistent between hazards, groups and data: flammables have limits, toxics an LC50, oxidisers a Ci', () => {
    for (const gas of GASES) {
      expect(gas.hazards.includes('flammable'), gas.id).toBe(gas.flammability !== null)
      expect(gas.hazards.includes('flammable'), gas.id).toBe(gas.groups.includes('fuel'))
      expect(gas.hazards.includes('toxic'), gas.id).toBe(gas.toxicity !== null)
      if (gas.hazards.includes('oxidiser')) expect(gas.iso10156?.ci, gas.id).toBeGreaterThan(0)
      if (gas.flammability !== null) expect(gas.flammability.lflPercent).toBeLessThan(gas.flammability.uflPercent)
    }
  })

  it('expands air into constituents whose fractions sum to 1 and whose molar mass matches air (Lemmon et al. 2000, from memory)', () => {
    const air = getGas('air')
    const parts = air.composition ?? []
    expectClose(
      parts.reduce((s, p) => s + p.x, 0),
      1,
      { abs: 1e-12 },
    )
    const m = parts.reduce((s, p) => s + p.x * getGas(p.gasId).molarMassGPerMol, 0)
    expectClose(m, air.molarMassGPerMol, { rel: 1e-4 }, { gas: 'air' })
  })

  it('refers only to library gases from the k_ij tables and the incompatibility list', () => {
    for (const table of Object.values(KIJ_TABLES)) {
      for (const e of table.entries) {
        expect(isKnownGas(e.a), `${table.model}: ${e.a}`).toBe(true)
        expect(isKnownGas(e.b), `${table.model}: ${e.b}`).toBe(true)
      }
    }
    for (const pair of INCOMPATIBLE_PAIRS) {
      expect(isKnownGas(pair.a), pair.a).toBe(true)
      expect(isKnownGas(pair.b), pair.b).toBe(true)
    }
  })

  it("throws PhysicsInputError with field 'gas' for an unknown id", () => {
    expect(() => getGas('unobtainium')).toThrow(PhysicsInputError)
    try {
      getGas('unobtainium')
    } catch (error) {
      expect((error as PhysicsInputError).field).toBe('gas')
    }
  })
})

describe(`vapour pressure — ${nistVp.source.citation}`, () => {
  for (const c of nistVp.cases) {
    it(`${c.gasId} at ${c.temperatureK} K ≈ ${c.pressurePa} Pa (${nistVp.source.status})`, () => {
      expectClose(vapourPressurePa(c.gasId, c.temperatureK) ?? Number.NaN, c.pressurePa, nistVp.tolerance.correlation, c)
    })
  }
})

describe(`vapour pressure — ${domainVp.source.citation} (${domainVp.source.status})`, () => {
  for (const c of domainVp.cases) {
    it(`${c.gasId} at ${c.temperatureK} K = ${c.pressureBar} bar`, () => {
      expectClose((vapourPressurePa(c.gasId, c.temperatureK) ?? Number.NaN) / 1e5, c.pressureBar, domainVp.tolerance, c)
    })
  }
})

describe('vapour pressure limits and estimates', () => {
  it('returns null at or above the critical temperature and outside the correlation range', () => {
    expect(vapourPressurePa('carbon-dioxide', 304.2)).toBeNull()
    expect(vapourPressurePa('carbon-dioxide', 200)).toBeNull() // below the triple point, outside 216.58–304.21 K
    expect(vapourPressurePa('nitrogen', 300)).toBeNull()
    expect(vapourPressurePa('nitrogen-dioxide', 290)).toBeNull() // no correlation adopted
  })

  it('rises monotonically with temperature inside the range (every correlation)', () => {
    for (const gas of GASES) {
      const vp = gas.vapourPressure
      if (vp === null) continue
      const top = Math.min(vp.maxTemperatureK, gas.criticalTemperatureK) - 1e-6
      let previous = 0
      for (let i = 0; i <= 20; i++) {
        const t = vp.minTemperatureK + ((top - vp.minTemperatureK) * i) / 20
        const p = vapourPressurePa(gas.id, t)
        if (p === null) continue
        expect(p, `${gas.id} at ${t} K`).toBeGreaterThan(previous)
        previous = p
      }
    }
  })

  it('reaches about 1 atm at the normal boiling point (liquid-boiling gases; Perry/Poling correlations vs heos Tb)', () => {
    for (const gas of GASES) {
      if (gas.normalBoilingPointIsSublimation || gas.vapourPressure === null) continue
      const p = vapourPressurePa(gas.id, gas.normalBoilingPointK)
      if (p === null) continue
      // 3 %: helium and air correlations are the loosest fits (common practice, no source)
      expectClose(p, 101325, { rel: 0.03 }, { gas: gas.id, T: gas.normalBoilingPointK })
    }
  })

  it('Lee–Kesler estimate agrees with the correlations for non-polar fluids at Tr 0.7–0.95 within 3 % (Poling et al. quote 1–2 %, from memory)', () => {
    for (const id of ['carbon-dioxide', 'ethane', 'propane', 'n-butane', 'argon', 'methane']) {
      const gas = getGas(id)
      for (const tr of [0.7, 0.8, 0.9, 0.95]) {
        const t = tr * gas.criticalTemperatureK
        const reference = vapourPressurePa(id, t)
        if (reference === null) continue
        expectClose(vapourPressureEstimatePa(id, t) ?? Number.NaN, reference, { rel: 0.03 }, { gas: id, Tr: tr })
      }
    }
  })

  it('rejects non-positive temperatures and unknown gases', () => {
    expect(() => vapourPressurePa('propane', 0)).toThrow(PhysicsInputError)
    expect(() => vapourPressurePa('propane', Number.NaN)).toThrow(PhysicsInputError)
    expect(() => vapourPressurePa('unobtainium', 300)).toThrow(PhysicsInputError)
  })
})
