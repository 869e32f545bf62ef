import { createServer, type Server } from 'node:http'
import type { AddressInfo } from 'node:net'
import Stripe from 'stripe'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startPaymentsFake, type PaymentsFake } from '../../fakes/payments/server.ts'
import { createPayments } from '#server/lib/payments.ts'
import { AuditEventSchema } from '#server/modules/audit/audit-event.entity.ts'
import { InvoiceSchema, WebhookEventSchema } from '#server/modules/billing/invoice.entity.ts'
import { CustomerSchema } from '#server/modules/customers/customer.entity.ts'
import { OrderSchema } from '#server/modules/orders/order.entity.ts'
import type { LinePricing } from '#shared/schemas/quote.ts'
import { createQaScenario } from '#tests/support/qa-scenario.ts'
import { createTestApp, type SignedInAgent, type TestApp } from '#tests/support/test-app.ts'

const WEBHOOK_SECRET = 'whsec_test_secret' // the secret createTestApp gives the app

let t: TestApp
let fake: PaymentsFake
let listener: Server
let sales: SignedInAgent
const signer = new Stripe('sk_test_signer', { telemetry: false })

/** one cylinder's price breakdown as the quote would have stored it (invented prices, minor units) */
function pricing(quantity: number): LinePricing {
  const perCylinderMinor = 4210 + 30 * 150 + 6500 + 1200
  return {
    currency: 'EUR',
    model: 'gerg-2008',
    temperatureC: 15,
    pressureBarAbsolute: 151.01325,
    compressibility: 0.997,
    amountMolPerCylinder: 63.5,
    massKgPerCylinder: 1.8,
    referenceLabel: '15 °C, 101.325 kPa',
    gases: [],
    gasMinor: 4210,
    rental: { key: '10L', days: 30, unitPriceMinor: 150, costMinor: 30 * 150 },
    certification: { key: '2 %', label: 'Certified, 2 % relative', costMinor: 6500 },
    surcharges: [{ key: 'toxic', label: 'Toxic gas handling', costMinor: 1200 }],
    perCylinderMinor,
    quantity,
    totalMinor: perCylinderMinor * quantity,
    hazards: ['toxic'],
    cautions: [],
    notes: [],
  }
}

async function shippedOrder(customerCode = 'ALDB', quantity = 2) {
  const p = pricing(quantity)
  return createQaScenario(t.orm, { customerCode, status: 'shipped', cylinders: quantity, pricing: p, priceMinor: p.totalMinor })
}

const invoice = (orderId: number, agent = sales) => agent.agent.post('/api/invoices').set('x-csrf-token', agent.csrf).send({ orderId })

async function until<T>(what: string, check: () => Promise<T | undefined | false>, timeoutMs = 5000): Promise<T> {
  const end = Date.now() + timeoutMs
  for (;;) {
    const v = await check()
    if (v) return v
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`)
    await new Promise((r) => setTimeout(r, 50))
  }
}

function signed(event: Record<string, unknown>, secret = WEBHOOK_SECRET) {
  const payload = JSON.stringify(event)
  return { payload, header: signer.webhooks.generateTestHeaderString({ payload, secret }) }
}

/** as the provider sends it: no session, no CSRF token, only the signature */
function postWebhook(payload: string, header: string | null) {
  const req = request(t.app).post('/api/payments/webhook').set('content-type', 'application/json')
  if (header !== null) req.set('stripe-signature', header)
  return req.send(payload)
}

beforeAll(async () => {
  // the app listens on a real port so the payments fake can deliver its signed webhooks to it
  listener = createServer()
  await new Promise<void>((r) => listener.listen(0, '127.0.0.1', () => r()))
  const appPort = (listener.address() as AddressInfo).port
  fake = await startPaymentsFake({
    port: 0,
    webhookUrl: `http://127.0.0.1:${appPort}/api/payments/webhook`,
    webhookSecret: WEBHOOK_SECRET,
    publicUrl: `http://127.0.0.1:${appPort}`,
  })
  t = await createTestApp({ payments: createPayments({ host: '127.0.0.1', port: fake.port, protocol: 'http', secretKey: 'sk_test_x' }) })
  listener.on('request', t.app)
  sales = await t.signIn('sales')
})
afterAll(async () => {
  await new Promise<void>((r) => listener.close(() => r()))
  await fake.close()
  await t.close()
})

describe('invoicing a shipped order through the payment provider', () => {
  it('creates the provider customer, one item per priced part, a finalised invoice, and moves the order to invoiced', async () => {
    const s = await shippedOrder('ALDB', 2)
    const mails = t.sentMail.length
    const res = await invoice(s.orderId).expect(201)
    // 2 cylinders × (gas 42.10 + rental 30 d × 1.50 + certification 65.00 + toxic surcharge 12.00) = 2 × 164.10 EUR
    expect(res.body.invoice).toMatchObject({ orderId: s.orderId, status: 'open', amountMinor: 32820, currency: 'EUR' })
    expect(res.body.lines.map((l: { amountMinor: number }) => l.amountMinor)).toEqual([8420, 9000, 13000, 2400])
    expect(res.body.invoice.hostedUrl).toMatch(new RegExp(`^http://127\\.0\\.0\\.1:${fake.port}/pay/in_`))
    expect(res.body.invoice.number).toMatch(/^FAKE-/)

    const em = t.orm.em.fork()
    const customer = await em.findOneOrFail(CustomerSchema, s.customerId)
    expect(customer.paymentProviderId).toMatch(/^cus_/)
    expect(fake.state.customers.get(customer.paymentProviderId!)?.email).toBe('customer@demo.test')
    const row = await em.findOneOrFail(InvoiceSchema, { order: s.orderId })
    const providerInvoice = fake.state.invoices.get(row.providerInvoiceId)!
    expect(providerInvoice.status).toBe('open')
    expect(providerInvoice.total).toBe(32820)
    expect((providerInvoice.lines as { data: unknown[] }).data).toHaveLength(4)
    expect((await em.findOneOrFail(OrderSchema, s.orderId)).status).toBe('invoiced')
    expect(t.sentMail.length).toBe(mails + 1)
    expect(t.sentMail[mails].text).toContain(res.body.invoice.hostedUrl)

    // a second order of the same customer reuses the provider customer
    const s2 = await shippedOrder('ALDB', 1)
    await invoice(s2.orderId).expect(201)
    expect(fake.state.customers.size).toBe(1)
    expect((await t.orm.em.fork().findOneOrFail(CustomerSchema, s.customerId)).paymentProviderId).toBe(customer.paymentProviderId)
  })

  it('creates the provider customer again when the provider no longer knows the stored id', async () => {
    const s = await shippedOrder('DNMR', 1)
    const em = t.orm.em.fork()
    const customer = await em.findOneOrFail(CustomerSchema, s.customerId)
    customer.paymentProviderId = 'cus_forgotten_by_provider'
    await em.flush()
    await invoice(s.orderId).expect(201)
    const after = await t.orm.em.fork().findOneOrFail(CustomerSchema, s.customerId)
    expect(after.paymentProviderId).toMatch(/^cus_/)
    expect(after.paymentProviderId).not.toBe('cus_forgotten_by_provider')
    expect(fake.state.customers.has(after.paymentProviderId!)).toBe(true)
  })

  it('invoices only shipped orders, once, and only for sales', async () => {
    const notShipped = await createQaScenario(t.orm, { status: 'released', pricing: pricing(1), priceMinor: pricing(1).totalMinor })
    await invoice(notShipped.orderId).expect(409)
    const s = await shippedOrder('CRVF', 1)
    const qa = await t.signIn('qa')
    await invoice(s.orderId, qa).expect(403)
    const customer = await t.signIn('customer')
    await invoice(s.orderId, customer).expect(403)
    await invoice(999999).expect(404)
    await sales.agent.post('/api/invoices').set('x-csrf-token', sales.csrf).send({ orderId: 'x' }).expect(400)
    await invoice(s.orderId).expect(201)
    const again = await invoice(s.orderId).expect(409)
    expect(again.body.detail).toMatch(/Invoiced|invoice/)
    expect(await t.orm.em.fork().count(InvoiceSchema, { order: s.orderId })).toBe(1)
  })

  it('lists shipped orders waiting for an invoice with the items they will carry', async () => {
    const s = await shippedOrder('BRWS', 1)
    const ready = await sales.agent.get('/api/invoices/ready').expect(200)
    const mine = ready.body.find((r: { orderId: number }) => r.orderId === s.orderId)
    expect(mine.totalMinor).toBe(16410)
    expect(mine.lines).toHaveLength(4)
  })

  it('answers 502 when the provider is unreachable, leaving the order shipped', async () => {
    const offline = await createTestApp({ payments: createPayments({ host: '127.0.0.1', port: 9, protocol: 'http', secretKey: 'sk_test_x' }) })
    try {
      const s = await createQaScenario(offline.orm, { status: 'shipped', pricing: pricing(1), priceMinor: pricing(1).totalMinor })
      const a = await offline.signIn('sales')
      const res = await a.agent.post('/api/invoices').set('x-csrf-token', a.csrf).send({ orderId: s.orderId }).expect(502)
      expect(res.body.detail).toMatch(/Nothing was changed/)
      expect((await offline.orm.em.fork().findOneOrFail(OrderSchema, s.orderId)).status).toBe('shipped')
      expect(await offline.orm.em.fork().count(InvoiceSchema, {})).toBe(0)
    } finally {
      await offline.close()
    }
  })
})

describe('payment webhook', () => {
  it('is declared public in the API description', async () => {
    const doc = (await sales.agent.get('/api/openapi.json').expect(200)).body as { paths: Record<string, Record<string, { 'x-roles': string[] }>> }
    expect(doc.paths['/api/payments/webhook'].post['x-roles']).toEqual([])
  })

  it('pays end to end: the hosted page marks the provider invoice paid, its signed webhook marks invoice and order paid', async () => {
    const s = await shippedOrder('ALDB', 1)
    const res = await invoice(s.orderId).expect(201)
    const hosted = new URL(res.body.invoice.hostedUrl)
    // the customer presses "Pay" on the provider's page
    const pay = await fetch(hosted, { method: 'POST', redirect: 'manual' })
    expect(pay.status).toBe(303)
    const paid = await until('the invoice to be marked paid', async () => {
      const row = await t.orm.em.fork().findOne(InvoiceSchema, { order: s.orderId })
      return row?.status === 'paid' ? row : undefined
    })
    expect(paid.paidAt).toBeInstanceOf(Date)
    expect((await t.orm.em.fork().findOneOrFail(OrderSchema, s.orderId)).status).toBe('paid')
    expect(fake.deliveries.some((d) => d.type === 'invoice.paid' && d.status === 200)).toBe(true)
    const customer = await t.signIn('customer')
    const mine = await customer.agent.get(`/api/invoices/${paid.id}`).expect(200)
    expect(mine.body.status).toBe('paid')
    expect(mine.body.hostedUrl).toBeNull()
  })

  it('refuses a bad signature with 400 and changes nothing', async () => {
    const s = await shippedOrder('ALDB', 1)
    await invoice(s.orderId).expect(201)
    const row = await t.orm.em.fork().findOneOrFail(InvoiceSchema, { order: s.orderId })
    const event = {
      id: 'evt_forged_1',
      object: 'event',
      type: 'invoice.paid',
      created: 1,
      data: { object: { id: row.providerInvoiceId, object: 'invoice', status: 'paid' } },
    }
    const wrongSecret = signed(event, 'whsec_someone_else')
    await postWebhook(wrongSecret.payload, wrongSecret.header).expect(400)
    const good = signed(event)
    // the body changed after signing
    await postWebhook(good.payload.replace('"invoice.paid"', '"invoice.paid" '), good.header).expect(400)
    await postWebhook(good.payload, null).expect(400)
    await postWebhook(good.payload, 'garbage').expect(400)
    const em = t.orm.em.fork()
    expect((await em.findOneOrFail(InvoiceSchema, row.id)).status).toBe('open')
    expect((await em.findOneOrFail(OrderSchema, s.orderId)).status).toBe('invoiced')
    expect(await em.count(WebhookEventSchema, { id: 'evt_forged_1' })).toBe(0)
  })

  it('handles the same event once when it is delivered twice', async () => {
    const s = await shippedOrder('ALDB', 1)
    await invoice(s.orderId).expect(201)
    const row = await t.orm.em.fork().findOneOrFail(InvoiceSchema, { order: s.orderId })
    const event = {
      id: `evt_twice_${s.orderId}`,
      object: 'event',
      type: 'invoice.paid',
      created: 1,
      data: { object: { id: row.providerInvoiceId, object: 'invoice', status: 'paid', status_transitions: { paid_at: 1_800_000_000 } } },
    }
    const { payload, header } = signed(event)
    const first = await postWebhook(payload, header).expect(200)
    expect(first.body).toEqual({ received: true, duplicate: false })
    const second = await postWebhook(payload, header).expect(200)
    expect(second.body).toEqual({ received: true, duplicate: true })
    const em = t.orm.em.fork()
    const inv = await em.findOneOrFail(InvoiceSchema, row.id)
    expect(inv.status).toBe('paid')
    expect(inv.paidAt?.toISOString()).toBe(new Date(1_800_000_000 * 1000).toISOString())
    expect(await em.count(WebhookEventSchema, { id: event.id })).toBe(1)
    expect(await em.count(AuditEventSchema, { action: 'invoice.paid', entityId: String(row.id) })).toBe(1)
    const transitions = await em.find(AuditEventSchema, { action: 'order.transition', entityId: String(s.orderId) })
    expect(transitions.filter((a) => (a.detail as { to?: string } | null)?.to === 'paid')).toHaveLength(1)
    expect((await em.findOneOrFail(OrderSchema, s.orderId)).status).toBe('paid')
  })

  it('acknowledges events about invoices it does not know, recording them once', async () => {
    const { payload, header } = signed({
      id: 'evt_unknown_invoice',
      object: 'event',
      type: 'invoice.paid',
      created: 1,
      data: { object: { id: 'in_not_ours', object: 'invoice' } },
    })
    await postWebhook(payload, header).expect(200)
    expect(await t.orm.em.fork().count(WebhookEventSchema, { id: 'evt_unknown_invoice' })).toBe(1)
  })
})

describe("the customer's invoices", () => {
  it("lists only their own and answers 404 for another customer's invoice", async () => {
    const own = await shippedOrder('ALDB', 1)
    const other = await shippedOrder('BRWS', 1)
    const ownInv = (await invoice(own.orderId).expect(201)).body.invoice
    const otherInv = (await invoice(other.orderId).expect(201)).body.invoice
    const customer = await t.signIn('customer')
    const list = await customer.agent.get('/api/invoices').expect(200)
    const ids = list.body.map((i: { id: number }) => i.id)
    expect(ids).toContain(ownInv.id)
    expect(ids).not.toContain(otherInv.id)
    expect(list.body.every((i: { customerCompany: string }) => i.customerCompany === 'Alderbank Environmental Laboratory')).toBe(true)
    await customer.agent.get(`/api/invoices/${otherInv.id}`).expect(404)
    const mine = await customer.agent.get(`/api/invoices/${ownInv.id}`).expect(200)
    expect(mine.body.hostedUrl).toBe(ownInv.hostedUrl)
    await customer.agent.get('/api/invoices/ready').expect(403)
  })
})
