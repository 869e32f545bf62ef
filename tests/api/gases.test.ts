import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { GasListSchema } from '#shared/schemas/gas.ts'
import { createTestApp, type TestApp } from '#tests/support/test-app.ts'

let t: TestApp
beforeAll(async () => {
  t = await createTestApp()
})
afterAll(async () => {
  await t.close()
})

describe('GET /api/gases', () => {
  it('lists every gas with units and sources, matching published constants', async () => {
    const { agent } = await t.signIn('technician')
    const res = await agent.get('/api/gases').expect(200)
    const list = GasListSchema.parse(res.body)
    const byId = new Map(list.items.map((g) => [g.id, g]))
    const argon = byId.get('argon')!
    // ISO 6976:2016 Table A.2 / GERG-2008 molar mass of Ar (DOMAIN §9)
    expect(argon.molarMass).toEqual({ value: 39.948, unit: 'g/mol' })
    expect(argon.formula).toBe('Ar')
    expect(argon.casNumber).toBe('7440-37-1')
    const co2 = byId.get('carbon-dioxide')!
    // reference-EOS constants of CO2: Tc 304.1282 K, Pc 7.3773 MPa (DOMAIN §9, chemicals heos_constants.tsv)
    expect(co2.criticalTemperature).toEqual({ value: 304.1282, unit: 'K' })
    expect(co2.criticalPressure.unit).toBe('MPa')
    expect(Math.abs(co2.criticalPressure.value - 7.3773)).toBeLessThan(1e-9)
    // every entry names the source of its molar mass and critical point
    for (const g of list.items) {
      expect(g.sources.molarMass, `${g.id} molar-mass source`).toBeTruthy()
      expect(g.sources.criticalPoint, `${g.id} critical-point source`).toBeTruthy()
    }
  })

  it('marks GERG-2008 coverage: its 21 components, not SF6, NH3 or N2O', async () => {
    // GERG-2008 covers exactly 21 components (NIST AGA8 GERG2008.cpp header, DOMAIN §9)
    const { agent } = await t.signIn('blender')
    const list = GasListSchema.parse((await agent.get('/api/gases').expect(200)).body)
    expect(list.items.filter((g) => g.gerg2008)).toHaveLength(21)
    for (const id of ['sulfur-hexafluoride', 'ammonia', 'nitrous-oxide']) {
      expect(list.items.find((g) => g.id === id)?.models).not.toContain('gerg-2008')
    }
    expect(list.items.find((g) => g.id === 'methane')?.models).toContain('gerg-2008')
  })

  it('carries flammability limits and toxicity with their status', async () => {
    const { agent } = await t.signIn('sales')
    const list = GasListSchema.parse((await agent.get('/api/gases').expect(200)).body)
    const h2 = list.items.find((g) => g.id === 'hydrogen')!
    // LFL of H2 in air 4.0 % (IEC 60079-20-1:2010, DOMAIN §6.2)
    expect(h2.flammability?.lowerLimit).toEqual({ value: 4, unit: '% vol in air' })
    const h2s = list.items.find((g) => g.id === 'hydrogen-sulfide')!
    // LC50 712 ppm (ADR P200 / ISO 10298, from memory in DOMAIN §6.4) — must be flagged unverified
    expect(h2s.toxicity?.lc50.value).toBe(712)
    expect(h2s.toxicity?.status).toBe('unverified')
  })

  it('is 401 signed out', async () => {
    const { agent } = await t.anonymous()
    await agent.get('/api/gases').expect(401)
  })
})
