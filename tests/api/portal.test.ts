import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { OrderSchema } from '#server/modules/orders/order.entity.ts'
import type { OrderDetail, OrderSummary } from '#shared/schemas/order.ts'
import { createTestApp, type SignedInAgent, type TestApp } from '#tests/support/test-app.ts'

let t: TestApp
let customer: SignedInAgent
let sales: SignedInAgent
let own: OrderSummary[]
let others: OrderSummary[]

const post = (a: SignedInAgent, url: string, body: unknown) =>
  a.agent
    .post(url)
    .set('x-csrf-token', a.csrf)
    .send(body as object)

beforeAll(async () => {
  t = await createTestApp()
  customer = await t.signIn('customer')
  sales = await t.signIn('sales')
  const all = (await sales.agent.get('/api/orders?limit=200').expect(200)).body.items as OrderSummary[]
  own = all.filter((o) => o.customer.code === 'ALDB')
  others = all.filter((o) => o.customer.code !== 'ALDB')
})
afterAll(async () => {
  await t.close()
})

describe('customer portal', () => {
  it('lists only the customer’s own orders, filtered on the server', async () => {
    const res = await customer.agent.get('/api/orders?limit=200').expect(200)
    expect(res.body.items.length).toBe(own.length)
    expect(res.body.total).toBe(own.length)
    expect(res.body.items.every((o: OrderSummary) => o.customer.code === 'ALDB')).toBe(true)
    // asking for another customer's orders gives nothing, not their orders
    const brws = others.find((o) => o.customer.code === 'BRWS')!
    const sneaky = await customer.agent.get(`/api/orders?customerId=${brws.customer.id}`).expect(200)
    expect(sneaky.body.items).toEqual([])
    // a text search cannot reach other customers either
    expect((await customer.agent.get('/api/orders?q=brightwater').expect(200)).body.items).toEqual([])
    const counts = (await customer.agent.get('/api/orders/counts').expect(200)).body.counts as Record<string, number>
    expect(Object.values(counts).reduce((a, b) => a + b, 0)).toBe(own.length)
  })

  it('answers 404 for another customer’s order (detail, PDF, transition) and changes nothing', async () => {
    const other = others.find((o) => o.status === 'quoted') ?? others[0]
    await customer.agent.get(`/api/orders/${other.id}`).expect(404)
    await customer.agent.get(`/api/orders/${other.id}/quote.pdf`).expect(404)
    await post(customer, `/api/orders/${other.id}/transition`, { to: 'accepted' }).expect(404)
    await post(customer, `/api/orders/${other.id}/transition`, { to: 'cancelled' }).expect(404)
    expect((await t.orm.em.fork().findOneOrFail(OrderSchema, { id: other.id })).status).toBe(other.status)
  })

  it('accepts its own quote; the history shows who did it; accepting again is 409', async () => {
    const quoted = own.find((o) => o.status === 'quoted')!
    const d = (await customer.agent.get(`/api/orders/${quoted.id}`).expect(200)).body as OrderDetail
    expect(d.transitions.map((x) => x.to).sort()).toEqual(['accepted', 'cancelled'])
    const pdf = await customer.agent.get(`/api/orders/${quoted.id}/quote.pdf`).expect(200)
    expect(pdf.headers['content-type']).toBe('application/pdf')
    const accepted = await post(customer, `/api/orders/${quoted.id}/transition`, { to: 'accepted', version: d.version }).expect(200)
    expect(accepted.body.status).toBe('accepted')
    expect(accepted.body.acceptedAt).not.toBeNull()
    expect(accepted.body.timeline.at(-1)).toMatchObject({ to: 'accepted', actor: 'You' })
    // staff e-mails stay private in the customer's view
    expect(accepted.body.timeline.every((e: { actor: string | null }) => e.actor === null || e.actor === 'You' || e.actor === 'Kestrel Ridge')).toBe(true)
    expect(accepted.body.transitions).toEqual([])
    await post(customer, `/api/orders/${quoted.id}/transition`, { to: 'accepted' }).expect(409)
  })

  it('may not make the shop’s moves (403) nor send quotes, edit or create orders', async () => {
    const draft = own.find((o) => o.status === 'draft')!
    await post(customer, `/api/orders/${draft.id}/transition`, { to: 'quoted' }).expect(403)
    const filling = own.find((o) => o.status === 'filling')!
    await post(customer, `/api/orders/${filling.id}/transition`, { to: 'analysis' }).expect(403)
    await customer.agent.put(`/api/orders/${draft.id}`).set('x-csrf-token', customer.csrf).send({}).expect(403)
    await customer.agent.get('/api/customers').expect(403)
    await customer.agent.get('/api/prices').expect(403)
  })

  it('sees its draft but not a quote PDF before the quote is sent', async () => {
    const draft = own.find((o) => o.status === 'draft')!
    const d = (await customer.agent.get(`/api/orders/${draft.id}`).expect(200)).body as OrderDetail
    expect(d.transitions).toEqual([])
    await customer.agent.get(`/api/orders/${draft.id}/quote.pdf`).expect(404)
  })

  it('cannot accept an expired quote (409), but the sales desk still can', async () => {
    const o = (
      await sales.agent
        .post('/api/orders')
        .set('x-csrf-token', sales.csrf)
        .send({
          customerId: own[0].customer.id,
          reference: 'late answer',
          neededBy: null,
          rentalDays: 0,
          notes: '',
          lines: [
            {
              description: '',
              components: [{ gas: 'carbon-monoxide', amount: 50, unit: 'ppm' }],
              balanceGas: 'nitrogen',
              blendTolerancePct: 5,
              certificationUncertaintyPct: 2,
              waterVolumeL: 10,
              valveOutlet: 'DIN 477 No. 14',
              quantity: 1,
              finalPressureBarGauge: 150,
              method: 'partial-pressure',
            },
          ],
        })
        .expect(201)
    ).body as OrderDetail
    await post(sales, `/api/orders/${o.id}/transition`, { to: 'quoted' }).expect(200)
    const em = t.orm.em.fork()
    const row = await em.findOneOrFail(OrderSchema, { id: o.id })
    row.quoteValidUntil = '2000-01-31'
    await em.flush()
    const res = await post(customer, `/api/orders/${o.id}/transition`, { to: 'accepted' }).expect(409)
    expect(res.body.detail).toMatch(/expired on 2000-01-31/)
    await post(sales, `/api/orders/${o.id}/transition`, { to: 'accepted' }).expect(200)
  })
})
