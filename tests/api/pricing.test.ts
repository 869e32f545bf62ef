import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { PriceEntrySchema } from '#server/modules/pricing/price-entry.entity.ts'
import type { PriceEntry } from '#shared/schemas/pricing.ts'
import { createTestApp, type SignedInAgent, type TestApp } from '#tests/support/test-app.ts'

let t: TestApp
let sales: SignedInAgent
const fieldsOf = (body: { errors?: { field: string }[] }) => (body.errors ?? []).map((e) => e.field)
const post = (body: unknown) =>
  sales.agent
    .post('/api/prices')
    .set('x-csrf-token', sales.csrf)
    .send(body as object)

beforeAll(async () => {
  t = await createTestApp()
  sales = await t.signIn('sales')
})
afterAll(async () => {
  await t.close()
})

describe('price book', () => {
  it('holds the seeded gases, rental classes, certification classes and surcharges', async () => {
    const book = (await sales.agent.get('/api/prices').expect(200)).body as { currency: string; entries: PriceEntry[] }
    expect(book.currency).toBe('EUR')
    const kinds = new Set(book.entries.map((e) => e.kind))
    expect(kinds).toEqual(new Set(['gas', 'rental', 'certification', 'surcharge']))
    expect(
      book.entries
        .filter((e) => e.kind === 'surcharge')
        .map((e) => e.key)
        .sort(),
    ).toEqual(['flammable', 'oxidising', 'reactive', 'toxic'])
    expect(book.entries.every((e) => Number.isInteger(e.priceMinor) && e.priceMinor >= 0)).toBe(true)
    // kinds come in a fixed order for the edit screen
    const order = book.entries.map((e) => e.kind)
    expect(order.indexOf('rental')).toBeGreaterThan(order.lastIndexOf('gas'))
  })

  it('adds, changes and removes a line', async () => {
    const created = await post({ kind: 'gas', key: 'neon', label: 'Neon 5.0', unit: 'm3-15C', priceMinor: 12500 }).expect(201)
    expect(created.body).toMatchObject({ kind: 'gas', key: 'neon', currency: 'EUR', priceMinor: 12500 })
    const changed = await sales.agent
      .put(`/api/prices/${created.body.id}`)
      .set('x-csrf-token', sales.csrf)
      .send({ kind: 'gas', key: 'neon', label: 'Neon 5.0', unit: 'kg', priceMinor: 9900 })
      .expect(200)
    expect(changed.body).toMatchObject({ unit: 'kg', priceMinor: 9900 })
    await sales.agent.delete(`/api/prices/${created.body.id}`).set('x-csrf-token', sales.csrf).expect(204)
    expect(await t.orm.em.fork().count(PriceEntrySchema, { key: 'neon' })).toBe(0)
    await sales.agent.delete(`/api/prices/${created.body.id}`).set('x-csrf-token', sales.csrf).expect(404)
  })

  it('answers 400 naming the field and 409 for a duplicate, writing nothing', async () => {
    const before = await t.orm.em.fork().count(PriceEntrySchema, {})
    expect(fieldsOf((await post({ kind: 'rental', key: '50L', label: 'x', unit: 'kg', priceMinor: 10 }).expect(400)).body)).toContain('unit')
    expect(fieldsOf((await post({ kind: 'rental', key: 'big', label: 'x', unit: 'day', priceMinor: 10 }).expect(400)).body)).toContain('key')
    expect(fieldsOf((await post({ kind: 'gas', key: 'unobtainium', label: 'x', unit: 'kg', priceMinor: 10 }).expect(400)).body)).toContain('key')
    expect(fieldsOf((await post({ kind: 'surcharge', key: 'radioactive', label: 'x', unit: 'cylinder', priceMinor: 10 }).expect(400)).body)).toContain('key')
    expect(fieldsOf((await post({ kind: 'gas', key: 'xenon', label: 'x', unit: 'kg', priceMinor: 10.5 }).expect(400)).body)).toContain('priceMinor')
    expect(fieldsOf((await post({ kind: 'gas', key: 'xenon', label: 'x', unit: 'kg', priceMinor: -1 }).expect(400)).body)).toContain('priceMinor')
    const dup = await post({ kind: 'gas', key: 'nitrogen', label: 'again', unit: 'kg', priceMinor: 10 }).expect(409)
    expect(fieldsOf(dup.body)).toContain('key')
    expect(await t.orm.em.fork().count(PriceEntrySchema, {})).toBe(before)
  })

  it('is for the sales desk and admin only', async () => {
    for (const role of ['blender', 'technician', 'qa', 'customer'] as const) {
      const a = await t.signIn(role)
      await a.agent.get('/api/prices').expect(403)
      await a.agent.post('/api/prices').set('x-csrf-token', a.csrf).send({ kind: 'gas', key: 'xenon', label: 'x', unit: 'kg', priceMinor: 1 }).expect(403)
    }
    await (await t.signIn('admin')).agent.get('/api/prices').expect(200)
  })

  it('a quote needs every price it uses: removing the rental class makes a 50 L line unpriceable (422 on its water volume)', async () => {
    const book = (await sales.agent.get('/api/prices').expect(200)).body as { entries: PriceEntry[] }
    const r50 = book.entries.find((e) => e.kind === 'rental' && e.key === '50L')!
    await sales.agent.delete(`/api/prices/${r50.id}`).set('x-csrf-token', sales.csrf).expect(204)
    const customers = (await sales.agent.get('/api/customers').expect(200)).body.items as { id: number }[]
    const res = await sales.agent
      .post('/api/orders')
      .set('x-csrf-token', sales.csrf)
      .send({
        customerId: customers[0].id,
        reference: '',
        neededBy: null,
        rentalDays: 10,
        notes: '',
        lines: [
          {
            description: '',
            components: [{ gas: 'carbon-dioxide', amount: 8, unit: 'percent' }],
            balanceGas: 'argon',
            blendTolerancePct: 10,
            certificationUncertaintyPct: 10,
            waterVolumeL: 50,
            valveOutlet: 'DIN 477 No. 10',
            quantity: 1,
            finalPressureBarGauge: 200,
            method: 'partial-pressure',
          },
        ],
      })
      .expect(422)
    expect(fieldsOf(res.body)).toContain('lines.0.waterVolumeL')
  })
})
