import { describe, expect, it } from 'vitest'
import fixture from '../../fixtures/physics/nist-aga8-gerg2008-check.json' with { type: 'json' }
import {
  GERG_COMPONENT_IDS,
  gergCovers,
  gergDensity,
  gergPressure,
  gergProperties,
  gergValidity,
  prepareGergMixture,
  type GergMixture,
  type GergProperties,
} from '../../../shared/physics/eos/gerg-2008/index.ts'
import { PhysicsInputError } from '../../../shared/physics/types.ts'

/** Relative/absolute closeness with a failure message that shows inputs, expected, actual, tolerance. */
function expectClose(actual: number, expected: number, tolerance: { relative: number; absolute?: number }, context: string): void {
  const absolute = tolerance.absolute ?? 0
  const allowed = Math.max(absolute, tolerance.relative * Math.abs(expected))
  const diff = Math.abs(actual - expected)
  if (!(diff <= allowed)) {
    throw new Error(
      `${context}: expected ${expected}, got ${actual} (difference ${diff.toExponential(3)}, ` +
        `relative ${(diff / Math.abs(expected)).toExponential(3)}; tolerance relative ${tolerance.relative}, absolute ${absolute})`,
    )
  }
}

function expectInputError(fn: () => unknown, field: string): void {
  let caught: unknown
  try {
    fn()
  } catch (e) {
    caught = e
  }
  expect(caught).toBeInstanceOf(PhysicsInputError)
  expect((caught as PhysicsInputError).field).toBe(field)
}

/** Fixture quantities converted from the fixture's units (kPa, mol/L, K/kPa) to the SI result. */
const FIXTURE_QUANTITIES: Record<string, (p: GergProperties) => number> = {
  molar_mass: (p) => p.molarMassKgPerMol * 1e3,
  rho: (p) => p.molarDensityMolPerM3 / 1e3,
  Z: (p) => p.compressibility,
  dp_drho: (p) => p.dPdRho, // kPa/(mol/L) = Pa·m³/mol
  d2p_drho2: (p) => p.d2PdRho2 * 1e3, // kPa/(mol/L)² = 1e-3 Pa·m⁶/mol²
  dp_dT: (p) => p.dPdT / 1e3,
  u: (p) => p.internalEnergyJPerMol,
  h: (p) => p.enthalpyJPerMol,
  s: (p) => p.entropyJPerMolK,
  g: (p) => p.gibbsEnergyJPerMol,
  a: (p) => p.helmholtzEnergyJPerMol,
  cv: (p) => p.cvJPerMolK,
  cp: (p) => p.cpJPerMolK,
  w: (p) => p.speedOfSoundMPerS,
  mu_JT: (p) => p.jouleThomsonKPerPa * 1e3,
  kappa: (p) => p.isentropicExponent,
}

const CHECK = fixture.cases[0]
const checkMixture = (): GergMixture => prepareGergMixture(CHECK.gasIds, CHECK.x)

describe('GERG-2008 against NIST AGA8 check values (fixture nist-aga8-gerg2008-check.json)', () => {
  for (const c of fixture.cases) {
    describe(c.id, () => {
      const m = prepareGergMixture(c.gasIds, c.x)
      const solved = gergDensity(m, c.temperatureK, c.pressureKPa * 1e3)
      const props = gergProperties(m, c.temperatureK, solved.molarDensityMolPerM3)
      const expected = c.expected as Record<string, number>

      it('solves density and Z from T and p', () => {
        const ctx = `${c.id} at ${c.temperatureK} K, ${c.pressureKPa} kPa`
        expect(solved.root).toBe('gas')
        expectClose(solved.molarDensityMolPerM3 / 1e3, expected.rho, fixture.tolerance, `${ctx}: rho (mol/L)`)
        expectClose(solved.compressibility, expected.Z, fixture.tolerance, `${ctx}: Z`)
      })

      for (const key of Object.keys(expected)) {
        it(`property ${key}`, () => {
          const get = FIXTURE_QUANTITIES[key]
          expect(get, `no mapping for fixture quantity ${key}`).toBeDefined()
          expectClose(get(props), expected[key], fixture.tolerance, `${c.id}: ${key} (${(fixture.units as Record<string, string>)[key]})`)
        })
      }
    })
  }

  it('reproduces the published 21-component check point digits (Z, rho in mol/L)', () => {
    const solved = gergDensity(checkMixture(), 400, 50e6)
    expectClose(solved.compressibility, 1.174690666383717, { relative: 1e-9 }, 'Z')
    expectClose(solved.molarDensityMolPerM3 / 1e3, 12.79828626082062, { relative: 1e-9 }, 'rho')
  })
})

describe('GERG-2008 component set and coverage', () => {
  it('lists the 21 components in GERG order', () => {
    expect(GERG_COMPONENT_IDS).toEqual([
      'methane',
      'nitrogen',
      'carbon-dioxide',
      'ethane',
      'propane',
      'isobutane',
      'n-butane',
      'isopentane',
      'n-pentane',
      'n-hexane',
      'n-heptane',
      'n-octane',
      'n-nonane',
      'n-decane',
      'hydrogen',
      'oxygen',
      'carbon-monoxide',
      'water',
      'hydrogen-sulfide',
      'helium',
      'argon',
    ])
  })

  it('gergCovers', () => {
    expect(gergCovers(['argon', 'carbon-dioxide'])).toBe(true)
    expect(gergCovers(GERG_COMPONENT_IDS)).toBe(true)
    expect(gergCovers(['argon', 'sulfur-hexafluoride'])).toBe(false)
    expect(gergCovers(['ammonia'])).toBe(false)
  })

  it('keeps only components with x > 0, in GERG order, normalised', () => {
    const m = prepareGergMixture(['argon', 'methane', 'helium'], [0.25, 0.75, 0])
    expect(m.gasIds).toEqual(['methane', 'argon'])
    expect([...m.x]).toEqual([0.75, 0.25])
    expect([...m.componentIndices]).toEqual([0, 20])
    expectClose(m.molarMassKgPerMol, 0.75 * 0.01604246 + 0.25 * 0.039948, { relative: 1e-12 }, 'molar mass')
  })
})

describe('GERG-2008 invariants', () => {
  it('Z → 1 as p → 0, linearly in p (second virial coefficient regime)', () => {
    const m = checkMixture()
    for (const temperatureK of [200, 288.15, 400]) {
      const z1 = gergDensity(m, temperatureK, 1).compressibility
      const z10 = gergDensity(m, temperatureK, 10).compressibility
      expect(Math.abs(z1 - 1)).toBeLessThan(1e-6)
      expectClose((z10 - 1) / (z1 - 1), 10, { relative: 1e-4 }, `(Z(10 Pa) − 1)/(Z(1 Pa) − 1) at ${temperatureK} K`)
    }
    expect(gergPressure(m, 300, 0).compressibility).toBe(1)
    expect(gergPressure(m, 300, 0).pressurePa).toBe(0)
  })

  it('a one-component mixture equals the pure component, however it is given', () => {
    const pure = prepareGergMixture(['nitrogen'], [1])
    const padded = prepareGergMixture(
      GERG_COMPONENT_IDS,
      GERG_COMPONENT_IDS.map((id) => (id === 'nitrogen' ? 1 : 0)),
    )
    const a = gergProperties(pure, 300, 3988.429499330737)
    const b = gergProperties(padded, 300, 3988.429499330737)
    expect(b).toEqual(a)
    expect(pure.reducingTemperatureK).toBe(126.192)
    expect(pure.reducingDensityMolPerM3).toBeCloseTo(11183.9, 6)
    const n2 = fixture.cases[1]
    expectClose(gergDensity(pure, 300, 10e6).molarDensityMolPerM3 / 1e3, n2.expected.rho, fixture.tolerance, 'N2 rho')
  })

  it('the order of components does not change the result', () => {
    const ids = [...CHECK.gasIds]
    const x = [...CHECK.x]
    const order = ids.map((_, k) => k).reverse()
    // a fixed shuffle: reversed, then pairs swapped
    for (let k = 0; k + 1 < order.length; k += 2) [order[k], order[k + 1]] = [order[k + 1], order[k]]
    const shuffled = prepareGergMixture(
      order.map((k) => ids[k]),
      order.map((k) => x[k]),
    )
    const ref = checkMixture()
    const a = gergDensity(ref, 400, 50e6)
    const b = gergDensity(shuffled, 400, 50e6)
    expect(b.molarDensityMolPerM3).toBe(a.molarDensityMolPerM3)
    expect(gergProperties(shuffled, 350, 8000)).toEqual(gergProperties(ref, 350, 8000))
  })

  it('the density solve is the inverse of the pressure function', () => {
    const mixtures: [string[], number[]][] = [
      [
        ['nitrogen', 'argon', 'carbon-dioxide'],
        [0.1, 0.72, 0.18],
      ],
      [
        ['hydrogen', 'methane'],
        [0.3, 0.7],
      ],
      [
        ['helium', 'oxygen'],
        [0.79, 0.21],
      ],
      [CHECK.gasIds, CHECK.x],
      [['carbon-dioxide'], [1]],
      [
        ['water', 'nitrogen'],
        [0.01, 0.99],
      ],
    ]
    for (const [ids, x] of mixtures) {
      const m = prepareGergMixture(ids, x)
      for (const temperatureK of [200, 288.15, 350, 450]) {
        for (const pressurePa of [1e3, 1e5, 1e6, 5e6, 2e7, 3.5e7]) {
          const d = gergDensity(m, temperatureK, pressurePa)
          const back = gergPressure(m, temperatureK, d.molarDensityMolPerM3)
          expectClose(back.pressurePa, pressurePa, { relative: 1e-11 }, `${ids.join('/')} at ${temperatureK} K, ${pressurePa} Pa`)
          expect(back.dPdRho).toBeGreaterThan(0)
          expectClose(back.compressibility, d.compressibility, { relative: 1e-11 }, 'Z')
        }
      }
    }
  })

  it('property derivatives agree with finite differences, and u, h, g, a, s are consistent', () => {
    const m = prepareGergMixture(['nitrogen', 'argon', 'carbon-dioxide'], [0.1, 0.72, 0.18])
    const temperatureK = 288.15
    const rho = gergDensity(m, temperatureK, 20e6).molarDensityMolPerM3
    const p = gergProperties(m, temperatureK, rho)
    const hT = temperatureK * 1e-5
    const hR = rho * 1e-5
    const at = (t: number, r: number): GergProperties => gergProperties(m, t, r)
    const fd = (f: (q: GergProperties) => number, dt: number, dr: number): number =>
      (f(at(temperatureK + dt, rho + dr)) - f(at(temperatureK - dt, rho - dr))) / (2 * (dt || dr))
    const tol = { relative: 1e-7 }
    expectClose(
      fd((q) => q.pressurePa, hT, 0),
      p.dPdT,
      tol,
      'dP/dT',
    )
    expectClose(
      fd((q) => q.pressurePa, 0, hR),
      p.dPdRho,
      tol,
      'dP/dρ',
    )
    expectClose(
      fd((q) => q.dPdRho, 0, hR),
      p.d2PdRho2,
      { relative: 1e-6 },
      'd²P/dρ²',
    )
    expectClose(
      fd((q) => q.internalEnergyJPerMol, hT, 0),
      p.cvJPerMolK,
      tol,
      'cv = (∂u/∂T)_ρ',
    )
    expectClose(
      fd((q) => q.helmholtzEnergyJPerMol, hT, 0),
      -p.entropyJPerMolK,
      tol,
      's = −(∂a/∂T)_ρ',
    )
    expectClose(p.internalEnergyJPerMol, p.helmholtzEnergyJPerMol + temperatureK * p.entropyJPerMolK, { relative: 1e-12 }, 'u = a + Ts')
    expectClose(p.enthalpyJPerMol, p.internalEnergyJPerMol + p.pressurePa / rho, { relative: 1e-12 }, 'h = u + p/ρ')
    expectClose(p.gibbsEnergyJPerMol, p.enthalpyJPerMol - temperatureK * p.entropyJPerMolK, { relative: 1e-12 }, 'g = h − Ts')
    // cp − cv = T (∂p/∂T)²_ρ / (ρ² (∂p/∂ρ)_T)
    expectClose(p.cpJPerMolK - p.cvJPerMolK, (temperatureK * p.dPdT * p.dPdT) / (rho * rho * p.dPdRho), { relative: 1e-12 }, 'cp − cv')
  })

  it('isentropic exponent and speed of sound agree: κ = w² M ρ / p', () => {
    const m = checkMixture()
    const p = gergProperties(m, 300, 5000)
    expectClose(p.isentropicExponent, (p.speedOfSoundMPerS ** 2 * p.molarMassKgPerMol * 5000) / p.pressurePa, { relative: 1e-12 }, 'κ')
  })
})

describe('GERG-2008 density root selection', () => {
  it('returns the gas root of CO2 below its vapour pressure and the dense root above the vapour spinodal', () => {
    const co2 = prepareGergMixture(['carbon-dioxide'], [1])
    const gas = gergDensity(co2, 288.15, 4e6)
    expect(gas.root).toBe('gas')
    expect(gas.compressibility).toBeGreaterThan(0.6)
    expect(gas.compressibility).toBeLessThan(0.9)
    const dense = gergDensity(co2, 288.15, 20e6)
    expect(dense.root).toBe('dense')
    // liquid CO2 at 15 °C, 200 bar: about 0.95 g/cm³ [mem]; only the branch is checked here
    expect(dense.molarDensityMolPerM3 * 0.0440095).toBeGreaterThan(850)
    expect(dense.molarDensityMolPerM3 * 0.0440095).toBeLessThan(1050)
    expectClose(gergPressure(co2, 288.15, dense.molarDensityMolPerM3).pressurePa, 20e6, { relative: 1e-10 }, 'p(ρ_dense)')
  })

  it('matches a brute-force scan: lowest root on the gas branch, else the root on the stable dense branch', () => {
    let seed = 20250101
    const random = (): number => {
      seed = (seed * 1103515245 + 12345) % 2147483648
      return seed / 2147483648
    }
    let checked = 0
    for (let c = 0; c < 40; c++) {
      const count = 1 + Math.floor(random() * 4)
      const chosen = new Set<string>()
      while (chosen.size < count) chosen.add(GERG_COMPONENT_IDS[Math.floor(random() * GERG_COMPONENT_IDS.length)])
      const ids = [...chosen]
      const raw = ids.map(() => random() ** 2 + 1e-3)
      const sum = raw.reduce((a, b) => a + b, 0)
      const m = prepareGergMixture(
        ids,
        raw.map((v) => v / sum),
      )
      for (let q = 0; q < 5; q++) {
        const temperatureK = Math.max(60, m.reducingTemperatureK * (0.55 + random() * 1.1))
        if (temperatureK > 700) continue
        const pressurePa = Math.exp(Math.log(1e4) + random() * Math.log(7e7 / 1e4))
        const ref = bruteForceRoot(m, temperatureK, pressurePa)
        if (ref === null) continue
        const got = gergDensity(m, temperatureK, pressurePa)
        const ctx = `${ids.join('/')} x=${m.x.join(',')} at ${temperatureK} K, ${pressurePa} Pa`
        expect(got.root, ctx).toBe(ref.root)
        expectClose(got.molarDensityMolPerM3, ref.rho, { relative: 1e-8 }, ctx)
        checked++
      }
    }
    expect(checked).toBeGreaterThan(150)
  })

  it('finds no mechanical instability above 1.1 T_r (the solver checks for loops only below 1.25 T_r)', () => {
    const ids = GERG_COMPONENT_IDS
    const mixtures: GergMixture[] = ids.map((id) => prepareGergMixture([id], [1]))
    for (let i = 0; i < ids.length; i++) {
      for (let j = i + 1; j < ids.length; j++) {
        for (const xi of [0.1, 0.5, 0.9]) mixtures.push(prepareGergMixture([ids[i], ids[j]], [xi, 1 - xi]))
      }
    }
    for (const m of mixtures) {
      const temperatureK = 1.1 * m.reducingTemperatureK
      for (let delta = 0.02; delta <= 4; delta += 0.02) {
        const d = gergPressure(m, temperatureK, delta * m.reducingDensityMolPerM3).dPdRho
        if (!(d > 0)) throw new Error(`${m.gasIds.join('/')} x=${m.x.join(',')}: dp/dρ ≤ 0 at δ = ${delta}, T = 1.1 T_r`)
      }
    }
  })
})

/** Reference root by scanning δ on a fine geometric grid, then bisection. */
function bruteForceRoot(m: GergMixture, temperatureK: number, pressurePa: number): { rho: number; root: 'gas' | 'dense' } | null {
  const steps = 3000
  let last: { rho: number; root: 'gas' | 'dense' } | null = null
  let sawUnstable = false
  let prevRho = 0
  let prevP = 0
  for (let k = 0; k <= steps; k++) {
    const rho = 1e-5 * (6 / 1e-5) ** (k / steps) * m.reducingDensityMolPerM3
    const r = gergPressure(m, temperatureK, rho)
    if (!(r.dPdRho > 0)) sawUnstable = true
    if (k > 0 && prevP < pressurePa && r.pressurePa >= pressurePa) {
      let lo = prevRho
      let hi = rho
      for (let i = 0; i < 100; i++) {
        const mid = 0.5 * (lo + hi)
        if (gergPressure(m, temperatureK, mid).pressurePa < pressurePa) lo = mid
        else hi = mid
      }
      if (!sawUnstable) return { rho: 0.5 * (lo + hi), root: 'gas' }
      last = { rho: 0.5 * (lo + hi), root: 'dense' }
    }
    prevRho = rho
    prevP = r.pressurePa
  }
  return last
}

describe('GERG-2008 range of validity', () => {
  it('is silent inside the normal range', () => {
    expect(gergValidity(288.15, 20e6)).toEqual([])
    expect(gergValidity(90, 35e6)).toEqual([])
    expect(gergValidity(450, 1e5)).toEqual([])
  })

  it('warns in the extended range', () => {
    const hot = gergValidity(500, 1e6)
    expect(hot.map((w) => w.code)).toEqual(['gerg-2008-temperature-extended-range'])
    expect(hot[0].severity).toBe('caution')
    expect(gergValidity(70, 1e6).map((w) => w.code)).toEqual(['gerg-2008-temperature-extended-range'])
    expect(gergValidity(300, 50e6).map((w) => w.code)).toEqual(['gerg-2008-pressure-extended-range'])
    expect(gergValidity(650, 60e6)).toHaveLength(2)
  })

  it('throws outside the extended range', () => {
    expectInputError(() => gergValidity(59, 1e5), 'temperature')
    expectInputError(() => gergValidity(701, 1e5), 'temperature')
    expectInputError(() => gergValidity(300, 70.1e6), 'pressure')
    expectInputError(() => gergValidity(0, 1e5), 'temperature')
    expectInputError(() => gergValidity(300, 0), 'pressure')
    expectInputError(() => gergValidity(Number.NaN, 1e5), 'temperature')
  })
})

describe('GERG-2008 invalid input', () => {
  it('rejects gases outside the 21 components, naming the mixture', () => {
    expectInputError(() => prepareGergMixture(['nitrogen', 'sulfur-hexafluoride'], [0.5, 0.5]), 'mixture')
    expectInputError(() => prepareGergMixture(['ammonia'], [1]), 'mixture')
  })

  it('rejects fractions that do not sum to 1, negative or non-finite fractions, repeats and length mismatch', () => {
    expectInputError(() => prepareGergMixture(['nitrogen', 'argon'], [0.5, 0.4]), 'mixture')
    expectInputError(() => prepareGergMixture(['nitrogen', 'argon'], [1.2, -0.2]), 'mixture')
    expectInputError(() => prepareGergMixture(['nitrogen', 'argon'], [Number.NaN, 1]), 'mixture')
    expectInputError(() => prepareGergMixture(['nitrogen', 'nitrogen'], [0.5, 0.5]), 'mixture')
    expectInputError(() => prepareGergMixture(['nitrogen', 'argon'], [1]), 'mixture')
    expectInputError(() => prepareGergMixture([], []), 'mixture')
    // within 1e-6 is accepted and normalised
    expect(prepareGergMixture(['nitrogen', 'argon'], [0.5, 0.5000005]).x[0]).toBeCloseTo(0.5, 6)
  })

  it('rejects T ≤ 0, p ≤ 0, ρ < 0 and non-finite state inputs', () => {
    const m = prepareGergMixture(['nitrogen'], [1])
    expectInputError(() => gergDensity(m, 0, 1e5), 'temperature')
    expectInputError(() => gergDensity(m, -10, 1e5), 'temperature')
    expectInputError(() => gergDensity(m, Number.POSITIVE_INFINITY, 1e5), 'temperature')
    expectInputError(() => gergDensity(m, 300, 0), 'pressure')
    expectInputError(() => gergDensity(m, 300, -1), 'pressure')
    expectInputError(() => gergDensity(m, 300, Number.NaN), 'pressure')
    expectInputError(() => gergPressure(m, 0, 100), 'temperature')
    expectInputError(() => gergPressure(m, 300, -1), 'density')
    expectInputError(() => gergProperties(m, -1, 100), 'temperature')
    expectInputError(() => gergProperties(m, 300, 0), 'density')
  })
})

describe('GERG-2008 @examples in the doc comments', () => {
  it('prepareGergMixture example', () => {
    expect(prepareGergMixture(['nitrogen', 'argon'], [0.5, 0.5]).reducingTemperatureK).toBeCloseTo(137.48, 2)
  })
  it('gergDensity example', () => {
    expect(gergDensity(prepareGergMixture(['nitrogen'], [1]), 300, 10e6).compressibility).toBeCloseTo(1.00518, 5)
  })
  it('gergPressure example', () => {
    expectClose(gergPressure(prepareGergMixture(['nitrogen'], [1]), 300, 3988.429499330737).pressurePa, 1e7, { relative: 1e-12 }, 'p')
  })
  it('gergValidity example', () => {
    expect(gergValidity(288.15, 20e6)).toEqual([])
  })
})
