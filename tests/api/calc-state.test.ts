import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createTestApp, type SignedInAgent, type TestApp } from '#tests/support/test-app.ts'

let t: TestApp
let blender: SignedInAgent
beforeAll(async () => {
  t = await createTestApp()
  blender = await t.signIn('blender')
})
afterAll(async () => {
  await t.close()
})

function post(body: unknown, who: SignedInAgent = blender) {
  return who.agent
    .post('/api/calc/state')
    .set('x-csrf-token', who.csrf)
    .send(body as object)
}

const pure = (gas: string) => [{ gas, fraction: 1 }]

/** relative and absolute closeness with the numbers printed on failure */
function expectNear(actual: number, expected: number, tolerance: number, what: string) {
  expect(Math.abs(actual - expected), `${what}: expected ${expected} ± ${tolerance}, got ${actual}`).toBeLessThanOrEqual(tolerance)
}

describe('POST /api/calc/state — each model against outside values', () => {
  it('ideal gas: molar volume at 0 °C, 101.325 kPa is 22.41397 L/mol and Z = 1', async () => {
    // Source: CODATA 2018 R = 8.314462618 J/(mol·K); V = RT/p = 22.413 969 54 L/mol (DOMAIN §5 / §10.5).
    const res = await post({
      mixture: pure('nitrogen'),
      temperature: { value: 0, unit: 'degC' },
      pressure: { value: 101.325, unit: 'kPa', reference: 'absolute' },
      model: 'ideal',
    }).expect(200)
    expect(res.body.compressibility).toBe(1)
    expect(res.body.molarVolume.unit).toBe('L/mol')
    expectNear(res.body.molarVolume.value, 22.41397, 0.00001, 'ideal molar volume')
    // density = M / V with M(N2) = 28.0134 g/mol (ISO 6976:2016 Table A.2) and the CODATA molar volume above
    expectNear(res.body.density.value, 28.0134 / 22.41396954, 1e-5, 'ideal density of N2')
    expect(res.body.density.unit).toBe('kg/m³')
    expectNear(res.body.molarMass.value, 28.0134, 1e-9, 'molar mass of N2')
    expect(res.body.molarMass.unit).toBe('g/mol')
  })

  // Source: DOMAIN §10.3 "Cubic models at cylinder pressure" table [calc with the published Tc, Pc, ω of §9, the standard
  // Ω and α forms, k_ij = 0]: Z at 15 °C, 200 bar. Printed to 4 decimals → tolerance 0.0006.
  const cubicTable: { model: string; gas: string; z: number }[] = [
    { model: 'van-der-waals', gas: 'nitrogen', z: 0.9994 },
    { model: 'srk', gas: 'nitrogen', z: 1.0681 },
    { model: 'peng-robinson', gas: 'nitrogen', z: 1.0181 },
    { model: 'van-der-waals', gas: 'argon', z: 0.8988 },
    { model: 'srk', gas: 'argon', z: 0.9605 },
    { model: 'peng-robinson', gas: 'argon', z: 0.9134 },
    { model: 'peng-robinson', gas: 'methane', z: 0.7829 },
  ]
  it.each(cubicTable)('$model: Z of $gas at 15 °C, 200 bar absolute is $z', async ({ model, gas, z }) => {
    const res = await post({
      mixture: pure(gas),
      temperature: { value: 15, unit: 'degC' },
      pressure: { value: 200, unit: 'bar', reference: 'absolute' },
      model,
    }).expect(200)
    expect(res.body.model).toBe(model)
    expectNear(res.body.compressibility, z, 0.0006, `${model} Z(${gas})`)
    // the molar volume follows from Z by definition: v = Z·R·T/p (R from CODATA 2018)
    expectNear(res.body.molarVolume.value, ((z * 8.314462618 * 288.15) / 200e5) * 1000, 0.0006 * 0.12, `${model} molar volume`)
  })

  it('gerg-2008: NIST verification point (21 components, 400 K, 50 MPa)', async () => {
    // Source: usnistgov/AGA8, AGA8CODE/C/GERG2008_test_01.cpp (DOMAIN §10.1): M = 20.5427445016 g/mol,
    // ρ = 12.79828626082062 mol/L, Z = 1.174690666383717.
    const ids = [
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
    ]
    const x = [
      0.77824, 0.02, 0.06, 0.08, 0.03, 0.0015, 0.003, 0.0005, 0.00165, 0.00215, 0.00088, 0.00024, 0.00015, 0.00009, 0.004, 0.005, 0.002, 0.0001, 0.0025, 0.007,
      0.001,
    ]
    const res = await post({
      mixture: ids.map((gas, i) => ({ gas, fraction: x[i] })),
      temperature: { value: 400, unit: 'K' },
      pressure: { value: 50, unit: 'MPa', reference: 'absolute' },
      model: 'gerg-2008',
    }).expect(200)
    expectNear(res.body.compressibility, 1.174690666383717, 1e-9, 'GERG Z')
    expectNear(res.body.molarDensity.value, 12.79828626082062, 1e-8, 'GERG molar density, mol/L')
    expectNear(res.body.molarMass.value, 20.5427445016, 1e-7, 'GERG molar mass')
    // 50 MPa is above the normal range (≤ 35 MPa, Kunz & Wagner 2012 §1): the answer says so
    expect(res.body.warnings.length).toBeGreaterThan(0)
  })

  it('Dalton partial pressures are x·p, with the real-gas caveat at cylinder pressure', async () => {
    // Dalton's law: p_i = x_i·p (ideal-gas limit of ISO 6146, DOMAIN §2.2). Ar/CO2 82/18 at 200 bar: 164 / 36 bar.
    const res = await post({
      mixture: [
        { gas: 'argon', fraction: 0.82 },
        { gas: 'carbon-dioxide', fraction: 0.18 },
      ],
      temperature: { value: 15, unit: 'degC' },
      pressure: { value: 200, unit: 'bar', reference: 'absolute' },
      model: 'peng-robinson',
    }).expect(200)
    expect(res.body.partialPressures).toHaveLength(2)
    expectNear(res.body.partialPressures[0].value, 164, 1e-9, 'p(Ar)')
    expectNear(res.body.partialPressures[1].value, 36, 1e-9, 'p(CO2)')
    expect(res.body.partialPressures[1]).toMatchObject({ gas: 'carbon-dioxide', unit: 'bar' })
    // Z of this mixture is far from 1 (PR 0.8196, DOMAIN §10.3): the ideal mixing law must carry a caveat
    expect(res.body.warnings.map((w: { code: string }) => w.code)).toContain('real-gas-caveat')
  })

  it('a gauge pressure adds the stated local atmospheric pressure; °F is converted', async () => {
    // p_abs = p_gauge + p_atm (DOMAIN §8); 70 °F = 294.26 K (DOMAIN §5 table, T = (70 − 32)·5/9 + 273.15)
    const res = await post({
      mixture: pure('nitrogen'),
      temperature: { value: 70, unit: 'degF' },
      pressure: { value: 200, unit: 'bar', reference: 'gauge' },
      atmosphericPressure: { value: 0.95, unit: 'bar' },
      model: 'ideal',
    }).expect(200)
    expectNear(res.body.absolutePressure.value, 200.95, 1e-9, 'absolute pressure')
    expectNear(res.body.temperature.value, 294.2611, 0.0001, 'temperature')
  })

  it('GERG-2008 with a gas it does not cover: 400 naming the model, or a labelled fallback when allowed', async () => {
    // GERG-2008 covers 21 components, not SF6 (NIST AGA8 GERG2008.cpp header, DOMAIN §9)
    const body = {
      mixture: [
        { gas: 'nitrogen', fraction: 0.99 },
        { gas: 'sulfur-hexafluoride', fraction: 0.01 },
      ],
      temperature: { value: 15, unit: 'degC' },
      pressure: { value: 100, unit: 'bar', reference: 'absolute' },
      model: 'gerg-2008',
    }
    const refused = await post(body).expect(400)
    expect(refused.body.errors[0].field).toBe('model')
    const fallback = await post({ ...body, allowCubicFallback: true }).expect(200)
    expect(fallback.body.requestedModel).toBe('gerg-2008')
    expect(fallback.body.model).not.toBe('gerg-2008')
    expect(fallback.body.warnings.map((w: { code: string }) => w.code)).toContain('fallback-model')
  })
})

describe('POST /api/calc/state — bad input is 400 naming the field, never 500', () => {
  const base = {
    mixture: [
      { gas: 'argon', fraction: 0.82 },
      { gas: 'carbon-dioxide', fraction: 0.18 },
    ],
    temperature: { value: 15, unit: 'degC' },
    pressure: { value: 200, unit: 'bar', reference: 'gauge' },
    model: 'peng-robinson',
  }
  const cases: { name: string; body: unknown; field: string }[] = [
    { name: 'unknown gas id', body: { ...base, mixture: [{ gas: 'unobtainium', fraction: 1 }] }, field: 'mixture.0.gas' },
    {
      name: 'fractions summing to 0.99',
      body: {
        ...base,
        mixture: [
          { gas: 'argon', fraction: 0.81 },
          { gas: 'carbon-dioxide', fraction: 0.18 },
        ],
      },
      field: 'mixture',
    },
    {
      name: 'a percentage instead of a fraction',
      body: {
        ...base,
        mixture: [
          { gas: 'argon', fraction: 82 },
          { gas: 'carbon-dioxide', fraction: 18 },
        ],
      },
      field: 'mixture.0.fraction',
    },
    { name: 'absolute pressure of zero', body: { ...base, pressure: { value: 0, unit: 'bar', reference: 'absolute' } }, field: 'pressure' },
    { name: 'gauge pressure below vacuum', body: { ...base, pressure: { value: -2, unit: 'bar', reference: 'gauge' } }, field: 'pressure' },
    { name: 'temperature below absolute zero', body: { ...base, temperature: { value: -300, unit: 'degC' } }, field: 'temperature' },
    { name: 'temperature of 0 K', body: { ...base, temperature: { value: 0, unit: 'K' } }, field: 'temperature' },
    { name: 'unknown model', body: { ...base, model: 'benedict-webb-rubin' }, field: 'model' },
    { name: 'missing pressure reference', body: { ...base, pressure: { value: 200, unit: 'bar' } }, field: 'pressure.reference' },
    { name: 'unknown field', body: { ...base, colour: 'red' }, field: '(root)' },
    { name: 'empty mixture', body: { ...base, mixture: [] }, field: 'mixture' },
  ]
  it.each(cases)('$name → 400 naming $field', async ({ body, field }) => {
    const res = await post(body).expect(400)
    expect(res.headers['content-type']).toMatch(/application\/problem\+json/)
    expect(res.body.errors.map((e: { field: string }) => e.field)).toContain(field)
  })

  it('GERG-2008 below its extended temperature range (60 K, Kunz & Wagner 2012 §1) is 400 naming the temperature', async () => {
    const res = await post({
      ...base,
      mixture: [{ gas: 'helium', fraction: 1 }],
      temperature: { value: 20, unit: 'K' },
      pressure: { value: 1, unit: 'bar', reference: 'absolute' },
      model: 'gerg-2008',
    })
    expect(res.status).toBe(400)
    expect(res.body.errors[0].field).toBe('temperature')
  })

  it('is 401 signed out', async () => {
    const anon = await t.anonymous()
    await post(base, anon).expect(401)
  })
})
