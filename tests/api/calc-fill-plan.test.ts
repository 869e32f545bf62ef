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

function post(path: string, body: unknown, who: SignedInAgent = blender) {
  return who.agent
    .post(path)
    .set('x-csrf-token', who.csrf)
    .send(body as object)
}

function expectNear(actual: number, expected: number, tolerance: number, what: string) {
  expect(Math.abs(actual - expected), `${what}: expected ${expected} ± ${tolerance}, got ${actual}`).toBeLessThanOrEqual(tolerance)
}

/**
 * ISO 14175 M21 shielding gas, Ar + 18 % CO2, 50 L cylinder filled to 200 bar absolute at 15 °C (DOMAIN §7 row 1),
 * stored no colder than 0 °C, cylinder in test.
 */
const M21 = {
  target: [
    { gas: 'argon', fraction: 0.82, balance: true },
    { gas: 'carbon-dioxide', fraction: 0.18 },
  ],
  finalPressure: { value: 200, unit: 'bar', reference: 'absolute' },
  referenceTemperature: { value: 15, unit: 'C' },
  fillTemperature: { value: 15, unit: 'C' },
  minimumTemperature: { value: 0, unit: 'C' },
  cylinder: {
    waterVolume: { value: 50, unit: 'L' },
    servicePressure: { value: 200, unit: 'bar', reference: 'gauge' },
    testPressure: { value: 300, unit: 'bar', reference: 'gauge' },
    nextTestDate: '2035-01-01',
    oxygenClean: false,
    residual: { kind: 'evacuated' },
  },
  sources: [{ gas: 'argon' }, { gas: 'carbon-dioxide' }],
  order: 'auto',
  model: 'gerg-2008',
  method: 'partial-pressure',
}
const MODELS = ['ideal', 'van-der-waals', 'srk', 'peng-robinson', 'gerg-2008'] as const

describe('POST /api/calc/fill-plan — every model, both methods', () => {
  it.each(MODELS)('%s, partial pressure: CO2 first, final step at the ordered 200 bar absolute', async (model) => {
    const res = await post('/api/calc/fill-plan', { ...M21, model }).expect(200)
    expect(res.body.model).toBe(model)
    expect(res.body.steps.map((s: { gas: string }) => s.gas)).toEqual(['carbon-dioxide', 'argon'])
    // the last cumulative target is the ordered final pressure (at fill temperature = reference temperature here)
    expectNear(res.body.steps[1].cumulativePressure.value, 200, 1e-6, 'final cumulative pressure')
    // gauge = absolute − 1.01325 bar (standard atmosphere, no local value given; DOMAIN §8)
    expectNear(res.body.steps[1].cumulativeGaugePressure.value, 200 - 1.01325, 1e-6, 'final gauge pressure')
    // every step has a tolerance window that brackets its target
    for (const s of res.body.steps) {
      expect(s.toleranceWindow.gaugePressureLow.value).toBeLessThanOrEqual(s.cumulativeGaugePressure.value)
      expect(s.toleranceWindow.gaugePressureHigh.value).toBeGreaterThanOrEqual(s.cumulativeGaugePressure.value)
    }
  })

  it('ideal gas: the CO2 step is Dalton x·p = 36 bar absolute', async () => {
    // ideal-gas limit of the manometric method, x_i = Δp_i / p_final (ISO 6146 as summarised in DOMAIN §2.2)
    const res = await post('/api/calc/fill-plan', { ...M21, model: 'ideal' }).expect(200)
    expectNear(res.body.steps[0].cumulativePressure.value, 36, 1e-6, 'CO2 step, ideal')
  })

  it('GERG-2008: the CO2 step is 88.4 mol at 33.1 bar (15 °C)', async () => {
    // DOMAIN §6.6: "first fill step of the same M21 (88.4 mol CO2 in 50 L, 33.1 bar at 15 °C)" [calc, GERG-2008]
    const res = await post('/api/calc/fill-plan', M21).expect(200)
    expectNear(res.body.steps[0].cumulativeMoles.value, 88.4, 0.05, 'CO2 amount')
    expectNear(res.body.steps[0].cumulativePressure.value, 33.1, 0.05, 'CO2 step pressure')
    expect(res.body.approvable).toBe(true)
  })

  it.each(MODELS)('%s, gravimetric: the CO2 addition is 19.474 % of the gas mass', async (model) => {
    // mass fraction w = x·M_i / Σ x·M (ISO 14912); DOMAIN §4 gives w(CO2) = 0.19474 for x = 0.18 in Ar
    const res = await post('/api/calc/fill-plan', { ...M21, model, method: 'gravimetric' }).expect(200)
    expect(res.body.method).toBe('gravimetric')
    const co2 = res.body.steps.find((s: { gas: string }) => s.gas === 'carbon-dioxide')
    expectNear(co2.massAdded.value / res.body.totalMass.value, 0.19474, 0.00002, `${model} CO2 mass share`)
  })

  it('a blocking finding still answers 200 with the steps, and approvable false', async () => {
    // the finished M21 cylinder fails the condensation screen below about −5 °C (DOMAIN §6.6): storing at −10 °C blocks
    const res = await post('/api/calc/fill-plan', { ...M21, minimumTemperature: { value: -10, unit: 'C' } }).expect(200)
    expect(res.body.steps).toHaveLength(2)
    expect(res.body.approvable).toBe(false)
    const blocks = res.body.warnings.filter((w: { severity: string }) => w.severity === 'block')
    expect(blocks.length).toBeGreaterThan(0)
    // each block says in plain words what to watch for
    expect(blocks.every((w: { message: string }) => w.message.length > 0)).toBe(true)
  })

  it('an unreachable target is 422: CO2 left in the cylinder exceeds what the mixture needs', async () => {
    // a component cannot be removed once in the cylinder (DOMAIN §11.1); 40 bar of CO2 > the 33 bar the recipe needs
    const res = await post('/api/calc/fill-plan', {
      ...M21,
      cylinder: {
        ...M21.cylinder,
        residual: { kind: 'residual', pressure: { value: 40, unit: 'bar', reference: 'gauge' }, composition: [{ gas: 'carbon-dioxide', fraction: 1 }] },
      },
    })
    expect(res.status).toBe(422)
    expect(res.body.errors[0].field).toMatch(/^cylinder\.residual|^sources|^target/)
  })

  it('no source for a component is 422 naming sources', async () => {
    const res = await post('/api/calc/fill-plan', { ...M21, sources: [{ gas: 'argon' }] }).expect(422)
    expect(res.body.errors[0].field).toBe('sources')
  })

  it.each([
    {
      name: 'unknown gas in the target',
      patch: {
        target: [
          { gas: 'unobtainium', fraction: 0.18 },
          { gas: 'argon', fraction: 0.82 },
        ],
      },
      field: 'target.0.gas',
    },
    { name: 'negative absolute final pressure', patch: { finalPressure: { value: -5, unit: 'bar', reference: 'absolute' } }, field: 'finalPressure' },
    { name: 'unknown model', patch: { model: 'magic' }, field: 'model' },
    { name: 'no sources', patch: { sources: [] }, field: 'sources' },
  ])('$name → 400 naming $field', async ({ patch, field }) => {
    const res = await post('/api/calc/fill-plan', { ...M21, ...patch }).expect(400)
    expect(res.body.errors.map((e: { field: string }) => e.field)).toContain(field)
  })

  it('is 401 signed out', async () => {
    await post('/api/calc/fill-plan', M21, await t.anonymous()).expect(401)
  })
})

describe('model comparison, re-plan and batch', () => {
  it('an ideal-gas Dalton plan for M21 really produces 20.0 % CO2 (per GERG-2008)', async () => {
    // DOMAIN §2.2: "an ideal-gas Dalton plan for Ar/CO2 82/18 at 200 bar, 15 °C gives 20.0 % CO2, not 18 %" [calc GERG-2008]
    const res = await post('/api/calc/fill-plan/compare', { ...M21, models: ['ideal', 'gerg-2008'] }).expect(200)
    expect(res.body.reference).toBe('gerg-2008')
    const ideal = res.body.entries.find((e: { model: string }) => e.model === 'ideal')
    const co2 = ideal.realised.find((r: { gas: string }) => r.gas === 'carbon-dioxide')
    expectNear(co2.realised, 0.2, 0.0005, 'CO2 realised by the ideal plan')
    const gerg = res.body.entries.find((e: { model: string }) => e.model === 'gerg-2008')
    expectNear(gerg.realised.find((r: { gas: string }) => r.gas === 'carbon-dioxide').realised, 0.18, 1e-6, 'GERG plan against GERG')
  })

  it('re-plan: a first reading exactly on target is on track', async () => {
    // common practice, no source: a reading on the planned target needs no change
    const plan = { ...M21, method: 'gravimetric' }
    const planned = await post('/api/calc/fill-plan', plan).expect(200)
    const mass = planned.body.steps[0].cumulativeMass
    const res = await post('/api/calc/fill-plan/replan', { plan, actuals: [{ stepIndex: 0, scaleMass: mass }] }).expect(200)
    expect(res.body.status).toBe('on-track')
  })

  it('re-plan: a CO2 step read 3 bar high cannot be corrected by adding argon alone', async () => {
    // DOMAIN §11.1: venting removes all components in proportion; an excess of the first component cannot be taken out
    const res = await post('/api/calc/fill-plan/replan', {
      plan: M21,
      actuals: [{ stepIndex: 0, pressure: { value: 36.1, unit: 'bar', reference: 'absolute' }, temperature: { value: 15, unit: 'C' } }],
    }).expect(200)
    expect(res.body.status).not.toBe('on-track')
    expect(res.body.options.length).toBeGreaterThan(0)
  })

  it('batch: parent gas for 10 cylinders is ten times one cylinder', async () => {
    // arithmetic of identical fills (common practice, no source)
    const res = await post('/api/calc/fill-plan/batch', { plan: M21, cylinderCount: 10 }).expect(200)
    for (const s of res.body.sources) expectNear(s.moles.value, 10 * s.molesPerCylinder.value, 1e-9, `${s.gas} batch amount`)
    const co2 = res.body.sources.find((s: { gas: string }) => s.gas === 'carbon-dioxide')
    expectNear(co2.molesPerCylinder.value, 88.4, 0.05, 'CO2 per cylinder (DOMAIN §6.6)')
  })

  it('batch: zero cylinders is 400 naming cylinderCount', async () => {
    const res = await post('/api/calc/fill-plan/batch', { plan: M21, cylinderCount: 0 }).expect(400)
    expect(res.body.errors[0].field).toBe('cylinderCount')
  })
})
