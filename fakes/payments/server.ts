import { randomBytes } from 'node:crypto'
import type { Server } from 'node:http'
import type { AddressInfo } from 'node:net'
import express from 'express'
import Stripe from 'stripe'

/**
 * A local stand-in for the payment provider's HTTP API: the part the stripe SDK calls for customers,
 * invoice items, invoices (create, finalize, pay, retrieve, list) — plus a hosted payment page where a
 * customer "pays", after which the fake sends a signed `invoice.paid` webhook back to the app.
 * Amounts are integer minor units, as in the real API. State lives in memory.
 */
export interface PaymentsFake {
  port: number
  close(): Promise<void>
  state: FakeState
  /** webhooks sent, newest last */
  deliveries: { type: string; status: number | 'error'; at: string }[]
}

interface FakeState {
  customers: Map<string, Record<string, unknown>>
  invoiceItems: Map<string, Record<string, unknown>>
  invoices: Map<string, Record<string, unknown>>
}

const id = (prefix: string) => `${prefix}_${randomBytes(10).toString('hex')}`
const now = () => Math.floor(Date.now() / 1000)

function stripeError(res: express.Response, status: number, message: string, param?: string) {
  res.status(status).json({ error: { type: 'invalid_request_error', message, ...(param ? { param } : {}) } })
}

export async function startPaymentsFake(options: {
  port: number
  host?: string
  webhookUrl: string
  webhookSecret: string
  publicUrl?: string
}): Promise<PaymentsFake> {
  const host = options.host ?? '127.0.0.1'
  const state: FakeState = { customers: new Map(), invoiceItems: new Map(), invoices: new Map() }
  const deliveries: PaymentsFake['deliveries'] = []
  const signer = new Stripe('sk_test_fake_signer', { telemetry: false })
  const app = express()
  app.disable('x-powered-by')
  app.use(express.urlencoded({ extended: true }))
  let baseUrl = ''

  const sendWebhook = async (type: string, object: Record<string, unknown>) => {
    const payload = JSON.stringify({ id: id('evt'), object: 'event', type, created: now(), data: { object }, livemode: false, api_version: '2025-01-01' })
    const header = signer.webhooks.generateTestHeaderString({ payload, secret: options.webhookSecret })
    try {
      const r = await fetch(options.webhookUrl, { method: 'POST', headers: { 'content-type': 'application/json', 'stripe-signature': header }, body: payload })
      deliveries.push({ type, status: r.status, at: new Date().toISOString() })
    } catch {
      deliveries.push({ type, status: 'error', at: new Date().toISOString() })
    }
  }

  app.use('/v1', (req, res, next) => {
    if (!/^Bearer sk_(test|live)_/.test(req.get('authorization') ?? '')) return stripeError(res, 401, 'Invalid API key provided.')
    next()
  })

  // Idempotency-Key on POST: a retried request with the same key gets the first answer again (as the real API does)
  const idempotent = new Map<string, { path: string; status: number; body: unknown }>()
  app.use('/v1', (req, res, next) => {
    const key = req.get('idempotency-key')
    if (req.method !== 'POST' || !key) return next()
    const seen = idempotent.get(key)
    if (seen) {
      if (seen.path !== req.originalUrl) return stripeError(res, 400, 'Keys for idempotent requests can only be used for the same endpoint.', 'idempotency_key')
      res.setHeader('idempotent-replayed', 'true')
      return res.status(seen.status).json(seen.body)
    }
    const json = res.json.bind(res)
    res.json = (body: unknown) => {
      if (res.statusCode < 500) idempotent.set(key, { path: req.originalUrl, status: res.statusCode, body: structuredClone(body) })
      return json(body)
    }
    next()
  })

  app.post('/v1/customers', (req, res) => {
    const c = {
      id: id('cus'),
      object: 'customer',
      created: now(),
      email: req.body.email ?? null,
      name: req.body.name ?? null,
      metadata: req.body.metadata ?? {},
    }
    state.customers.set(c.id, c)
    res.json(c)
  })
  app.get('/v1/customers/:id', (req, res) => {
    const c = state.customers.get(req.params.id)
    if (!c) return stripeError(res, 404, `No such customer: '${req.params.id}'`, 'id')
    res.json(c)
  })

  app.post('/v1/invoiceitems', (req, res) => {
    const customer = String(req.body.customer ?? '')
    if (!state.customers.has(customer)) return stripeError(res, 400, `No such customer: '${customer}'`, 'customer')
    const amount = Number(req.body.amount)
    if (!Number.isInteger(amount)) return stripeError(res, 400, 'Invalid integer: amount', 'amount')
    const target = req.body.invoice ? state.invoices.get(String(req.body.invoice)) : undefined
    if (req.body.invoice && !target) return stripeError(res, 400, `No such invoice: '${req.body.invoice}'`, 'invoice')
    if (target && target.status !== 'draft') return stripeError(res, 400, 'Invoice items can only be added to a draft invoice.', 'invoice')
    if (target && target.customer !== customer) return stripeError(res, 400, 'The invoice belongs to another customer.', 'invoice')
    const item = {
      id: id('ii'),
      object: 'invoiceitem',
      customer,
      amount,
      currency: String(req.body.currency ?? 'eur'),
      description: req.body.description ?? null,
      invoice: req.body.invoice ?? null,
      metadata: req.body.metadata ?? {},
    }
    state.invoiceItems.set(item.id, item)
    if (target) {
      ;(target.lines as { data: unknown[] }).data.push({ id: id('il'), object: 'line_item', amount: item.amount, description: item.description })
      const total = (target.lines as { data: { amount: number }[] }).data.reduce((s, l) => s + l.amount, 0)
      Object.assign(target, { total, amount_due: total })
    }
    res.json(item)
  })

  app.post('/v1/invoices', (req, res) => {
    const customer = String(req.body.customer ?? '')
    if (!state.customers.has(customer)) return stripeError(res, 400, `No such customer: '${customer}'`, 'customer')
    const inv: Record<string, unknown> = {
      id: id('in'),
      object: 'invoice',
      customer,
      status: 'draft',
      currency: String(req.body.currency ?? 'eur'),
      created: now(),
      metadata: req.body.metadata ?? {},
      description: req.body.description ?? null,
      collection_method: req.body.collection_method ?? 'send_invoice',
      days_until_due: req.body.days_until_due ? Number(req.body.days_until_due) : null,
      lines: { object: 'list', data: [] as unknown[] },
      amount_due: 0,
      amount_paid: 0,
      total: 0,
      hosted_invoice_url: null,
      number: null,
    }
    state.invoices.set(inv.id as string, inv)
    // pending invoice items of this customer attach to the new invoice unless pending_invoice_items_behavior=exclude
    const includePending = req.body.pending_invoice_items_behavior !== 'exclude'
    for (const item of includePending ? state.invoiceItems.values() : []) {
      if (item.customer === customer && (item.invoice == null || item.invoice === inv.id)) {
        item.invoice = inv.id
        ;(inv.lines as { data: unknown[] }).data.push({ id: id('il'), object: 'line_item', amount: item.amount, description: item.description })
      }
    }
    const total = (inv.lines as { data: { amount: number }[] }).data.reduce((s, l) => s + l.amount, 0)
    Object.assign(inv, { total, amount_due: total })
    res.json(inv)
  })

  const findInvoice = (req: express.Request, res: express.Response) => {
    const inv = state.invoices.get(String(req.params.id))
    if (!inv) stripeError(res, 404, `No such invoice: '${req.params.id}'`, 'id')
    return inv
  }
  app.get('/v1/invoices/:id', (req, res) => {
    const inv = findInvoice(req, res)
    if (inv) res.json(inv)
  })
  app.get('/v1/invoices', (req, res) => {
    const data = [...state.invoices.values()].filter((i) => !req.query.customer || i.customer === req.query.customer)
    res.json({ object: 'list', data, has_more: false, url: '/v1/invoices' })
  })
  app.post('/v1/invoices/:id/finalize', (req, res) => {
    const inv = findInvoice(req, res)
    if (!inv) return
    if (inv.status !== 'draft') return stripeError(res, 400, 'This invoice is already finalized.', 'invoice')
    Object.assign(inv, { status: 'open', number: `FAKE-${String(state.invoices.size).padStart(5, '0')}`, hosted_invoice_url: `${baseUrl}/pay/${inv.id}` })
    void sendWebhook('invoice.finalized', inv)
    res.json(inv)
  })

  const markPaid = (inv: Record<string, unknown>) => {
    Object.assign(inv, {
      status: 'paid',
      amount_paid: inv.amount_due,
      amount_due: 0,
      paid_at: now(),
      status_transitions: { ...((inv.status_transitions as object | undefined) ?? {}), paid_at: now() },
    })
    void sendWebhook('invoice.paid', inv)
  }
  app.post('/v1/invoices/:id/pay', (req, res) => {
    const inv = findInvoice(req, res)
    if (!inv) return
    if (inv.status !== 'open') return stripeError(res, 400, `Invoice is ${String(inv.status)}, not open.`, 'invoice')
    markPaid(inv)
    res.json(inv)
  })

  // hosted payment page: the customer's browser lands here from the portal
  app.get('/pay/:id', (req, res) => {
    const inv = state.invoices.get(req.params.id)
    if (!inv) return res.status(404).send('No such invoice')
    const amount = (Number(inv.total) / 100).toFixed(2)
    const back = `${options.publicUrl ?? ''}/portal/invoices`
    res
      .type('html')
      .send(
        `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Test payment</title><style>body{font-family:system-ui;max-width:30rem;margin:3rem auto}button{font-size:1.1rem;padding:.75rem 1.5rem}</style></head><body>` +
          `<h1>Test payment page</h1><p>This local stand-in for the payment provider takes no real money.</p>` +
          `<p>Invoice <b>${inv.number}</b>: <b>${amount} ${String(inv.currency).toUpperCase()}</b> — status <b>${inv.status}</b></p>` +
          (inv.status === 'open' ? `<form method="post" action="/pay/${inv.id}"><button type="submit">Pay with test card</button></form>` : '') +
          `<p><a href="${back}">Back to Fillwright</a></p></body></html>`,
      )
  })
  app.post('/pay/:id', (req, res) => {
    const inv = state.invoices.get(req.params.id)
    if (!inv) return res.status(404).send('No such invoice')
    if (inv.status === 'open') markPaid(inv)
    res.redirect(303, `${options.publicUrl ?? ''}/portal/invoices?paid=${encodeURIComponent(String(inv.id))}`)
  })
  app.get('/health', (_req, res) => res.json({ ok: true }))

  const server: Server = await new Promise((resolve) => {
    const s = app.listen(options.port, host, () => resolve(s))
  })
  const port = (server.address() as AddressInfo).port
  baseUrl = `http://${host}:${port}`
  return {
    port,
    state,
    deliveries,
    close: () => new Promise<void>((res) => server.close(() => res())),
  }
}
