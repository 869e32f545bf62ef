import { type EntityManager, UniqueConstraintViolationException } from '@mikro-orm/core'
import Stripe from 'stripe'
import type { SessionUser } from '#shared/schemas/auth.ts'
import { type CreateInvoiceResult, formatMoney, type Invoice as InvoiceDto, type InvoiceListQuery, type ReadyToInvoice } from '#shared/schemas/billing.ts'
import { LinePricingSchema } from '#shared/schemas/quote.ts'
import { audit } from '../../lib/audit.ts'
import type { AppDeps } from '../../lib/deps.ts'
import { BadRequestError, ConflictError, HttpError, NotFoundError, UnprocessableError } from '../../lib/http-errors.ts'
import { DEMO_SHOP } from '../../seed/demo.ts'
import type { Customer } from '../customers/customer.entity.ts'
import { type Order, type OrderLine, OrderLineSchema, OrderSchema } from '../orders/order.entity.ts'
import { transitionOrder } from '../orders/orders.service.ts'
import { type Invoice, InvoiceSchema, WebhookEventSchema } from './invoice.entity.ts'

const STAFF = ['admin', 'sales'] as const
/** payment terms printed on the provider's invoice (common practice, no source) */
const DAYS_UNTIL_DUE = 30

/** Who moves an order to "Paid" when the provider reports a payment: not a person, so audit shows no user id. */
const PAYMENT_PROVIDER: SessionUser = {
  id: 0,
  email: 'payment-provider@webhook',
  name: 'Payment provider (signed webhook)',
  roles: ['sales'],
  customerId: null,
}

const iso = (d: Date | null | undefined): string | null => (d ? new Date(d).toISOString() : null)
const isStaff = (user: SessionUser) => user.roles.some((r) => (STAFF as readonly string[]).includes(r))

type OrderWithCustomer = Order & { customer: Customer }
type InvoiceWithOrder = Invoice & { order: OrderWithCustomer }

function toDto(inv: InvoiceWithOrder): InvoiceDto {
  return {
    id: inv.id,
    orderId: inv.order.id,
    orderNumber: inv.order.number,
    customerId: inv.customerId,
    customerCompany: inv.order.customer.company,
    number: inv.number ?? null,
    status: inv.status,
    amountMinor: inv.amountMinor,
    currency: inv.currency,
    hostedUrl: inv.status === 'open' ? (inv.hostedUrl ?? null) : null,
    paidAt: iso(inv.paidAt),
    createdAt: iso(inv.createdAt) as string,
  }
}

// ---- what is invoiced -----------------------------------------------------------------------------------

export interface InvoiceItemPlan {
  description: string
  amountMinor: number
}

/**
 * The invoice items of an order: per line, the gas, cylinder rental, certification and hazardous-material
 * surcharges from the price breakdown the line was quoted with (times the number of cylinders), when that
 * breakdown adds up to the line's price; otherwise the line's price as one item.
 */
export function invoiceItems(lines: readonly OrderLine[]): InvoiceItemPlan[] {
  const items: InvoiceItemPlan[] = []
  for (const line of [...lines].sort((a, b) => a.lineNo - b.lineNo)) {
    const head = `Line ${line.lineNo}: ${line.description}`
    const parsed = LinePricingSchema.safeParse((line as { pricing?: unknown }).pricing)
    if (parsed.success) {
      const p = parsed.data
      const q = line.quantity
      const parts: InvoiceItemPlan[] = [
        { description: `${head} — gas for ${q} cylinder${q === 1 ? '' : 's'}`, amountMinor: p.gasMinor * q },
        ...(p.rental ? [{ description: `${head} — cylinder rental, ${p.rental.days} days × ${q}`, amountMinor: p.rental.costMinor * q }] : []),
        { description: `${head} — certification (${p.certification.label}) × ${q}`, amountMinor: p.certification.costMinor * q },
        ...p.surcharges.map((s) => ({ description: `${head} — ${s.label} surcharge × ${q}`, amountMinor: s.costMinor * q })),
      ].filter((x) => x.amountMinor !== 0)
      if (parts.reduce((s, x) => s + x.amountMinor, 0) === line.priceMinor) {
        items.push(...parts)
        continue
      }
    }
    items.push({ description: `${head} × ${line.quantity} cylinder${line.quantity === 1 ? '' : 's'}`, amountMinor: line.priceMinor })
  }
  return items.filter((i) => i.amountMinor !== 0)
}

async function orderLines(em: EntityManager, orderId: number): Promise<OrderLine[]> {
  return em.find(OrderLineSchema, { order: orderId }, { orderBy: { lineNo: 'asc' } })
}

/** Shipped orders without an invoice, oldest first. */
export async function readyToInvoice(em: EntityManager): Promise<ReadyToInvoice[]> {
  const orders = (await em.find(
    OrderSchema,
    { status: 'shipped' },
    { populate: ['customer'], orderBy: { updatedAt: 'asc', id: 'asc' }, limit: 200 },
  )) as OrderWithCustomer[]
  if (!orders.length) return []
  const invoiced = new Set((await em.find(InvoiceSchema, { order: { $in: orders.map((o) => o.id) } })).map((i) => (i.order as Order).id))
  const out: ReadyToInvoice[] = []
  for (const o of orders.filter((x) => !invoiced.has(x.id))) {
    const lines = invoiceItems(await orderLines(em, o.id)).map((i) => ({ description: i.description, amountMinor: i.amountMinor }))
    out.push({
      orderId: o.id,
      orderNumber: o.number,
      customerCompany: o.customer.company,
      reference: o.reference,
      totalMinor: lines.reduce((s, l) => s + l.amountMinor, 0),
      currency: o.currency,
      lines,
    })
  }
  return out
}

// ---- the provider ---------------------------------------------------------------------------------------

/** Provider failures are the provider's: 502 with its message, never a 500. */
async function provider<T>(what: string, call: () => Promise<T>): Promise<T> {
  try {
    return await call()
  } catch (err) {
    if (err instanceof Stripe.errors.StripeError) {
      throw new HttpError(
        502,
        'Payment provider error',
        `The payment provider refused to ${what}: ${err.message} Nothing was changed in Fillwright; try again.`,
      )
    }
    throw new HttpError(502, 'Payment provider unreachable', `Could not reach the payment provider to ${what}. Nothing was changed in Fillwright; try again.`)
  }
}

/**
 * The customer's id at the provider: created on first use and kept on the Customer row; created again when the
 * provider no longer knows the stored id (a deleted customer, or a local stand-in that was restarted).
 */
async function providerCustomerId(em: EntityManager, payments: AppDeps['payments'], customer: Customer): Promise<string> {
  const stored = customer.paymentProviderId
  if (stored) {
    const known = await payments.customers.retrieve(stored).then(
      (c) => !(c as { deleted?: boolean }).deleted,
      (err: unknown) => {
        if (err instanceof Stripe.errors.StripeError && (err.statusCode === 404 || err.code === 'resource_missing')) return false
        throw new HttpError(
          502,
          'Payment provider unreachable',
          'Could not reach the payment provider to look up the customer. Nothing was changed in Fillwright; try again.',
        )
      },
    )
    if (known) return stored
  }
  const created = await provider('create the customer', () =>
    payments.customers.create(
      { name: customer.company, email: customer.contactEmail, metadata: { fillwrightCustomerId: String(customer.id), code: customer.code } },
      { idempotencyKey: `fillwright-customer-${customer.id}${stored ? `-after-${stored}` : ''}` },
    ),
  )
  customer.paymentProviderId = created.id
  await em.flush()
  return created.id
}

/**
 * Raises the provider invoice for a shipped order: the customer (created once, its id kept), a draft invoice
 * that takes only its own items, one item per priced part of each line, then finalisation — every call with
 * an idempotency key, so a retry after a failure cannot bill twice. Then, in one transaction, the Invoice row
 * (open, with the hosted payment page) and the order's move to "Invoiced".
 */
export async function createInvoice(
  em: EntityManager,
  deps: AppDeps,
  user: SessionUser,
  orderId: number,
  log: (err: unknown) => void,
): Promise<CreateInvoiceResult> {
  const order = (await em.findOne(OrderSchema, orderId, { populate: ['customer'] })) as OrderWithCustomer | null
  if (!order) throw new NotFoundError('No order with this id.')
  if (order.status !== 'shipped') throw new ConflictError(`Only a shipped order is invoiced; order ${order.number} is ${order.status}.`)
  if (await em.findOne(InvoiceSchema, { order: orderId })) throw new ConflictError(`Order ${order.number} already has an invoice.`)
  const items = invoiceItems(await orderLines(em, orderId))
  const totalMinor = items.reduce((s, i) => s + i.amountMinor, 0)
  if (!items.length || totalMinor <= 0) throw new UnprocessableError(`Order ${order.number} has no priced lines to invoice.`)

  const payments = deps.payments
  const customer = order.customer
  const currency = order.currency.toLowerCase()
  const providerCustomer = await providerCustomerId(em, payments, customer)
  // keyed by order and provider customer: a retry replays the same calls, a re-created customer starts afresh
  const key = `fillwright-order-${order.id}-${providerCustomer}`
  const draft = await provider('create the invoice', () =>
    payments.invoices.create(
      {
        customer: providerCustomer,
        currency,
        collection_method: 'send_invoice',
        days_until_due: DAYS_UNTIL_DUE,
        auto_advance: false,
        pending_invoice_items_behavior: 'exclude',
        description: `${DEMO_SHOP.name} — order ${order.number}${order.reference ? ` (your reference ${order.reference})` : ''}`,
        metadata: { fillwrightOrderId: String(order.id), orderNumber: order.number },
      },
      { idempotencyKey: `${key}-invoice` },
    ),
  )
  for (const [i, item] of items.entries()) {
    await provider('add an invoice item', () =>
      payments.invoiceItems.create(
        {
          customer: providerCustomer,
          invoice: draft.id,
          amount: item.amountMinor,
          currency,
          description: item.description,
          metadata: { fillwrightOrderId: String(order.id) },
        },
        { idempotencyKey: `${key}-item-${i}` },
      ),
    )
  }
  const finalized = await provider('finalise the invoice', () =>
    payments.invoices.finalizeInvoice(draft.id as string, {}, { idempotencyKey: `${key}-finalize` }),
  )
  if (finalized.total !== totalMinor) {
    throw new HttpError(
      502,
      'Payment provider mismatch',
      `The provider's invoice totals ${finalized.total}, not ${totalMinor} (minor units). Nothing was recorded; check the provider before retrying.`,
    )
  }

  let invoiceId = 0
  await em.transactional(async (tx) => {
    const inv = tx.create(InvoiceSchema, {
      order: orderId,
      customerId: customer.id,
      providerInvoiceId: finalized.id as string,
      number: finalized.number ?? null,
      status: 'open',
      amountMinor: totalMinor,
      currency: order.currency,
      hostedUrl: finalized.hosted_invoice_url ?? null,
      paidAt: null,
    })
    await tx.flush()
    invoiceId = inv.id
    audit(tx, user, 'invoice.created', 'Invoice', inv.id, { orderId, providerInvoiceId: finalized.id, amountMinor: totalMinor, currency: order.currency })
    await transitionOrder(tx, user, orderId, 'invoiced')
    await tx.flush()
  })
  const inv = (await em.findOneOrFail(InvoiceSchema, invoiceId, { populate: ['order', 'order.customer'] })) as InvoiceWithOrder
  const dto = toDto(inv)
  let emailed = false
  try {
    await deps.mailer.send({
      to: customer.contactEmail,
      subject: `Invoice ${dto.number ?? ''} for order ${order.number} — ${formatMoney(totalMinor, order.currency)}`.replace('  ', ' '),
      text: [
        `Dear ${customer.contactName},`,
        '',
        `the invoice for order ${order.number} is ready: ${formatMoney(totalMinor, order.currency)}, due within ${DAYS_UNTIL_DUE} days.`,
        ...items.map((i) => `  ${i.description}: ${formatMoney(i.amountMinor, order.currency)}`),
        '',
        dto.hostedUrl ? `Pay online: ${dto.hostedUrl}` : '',
        `Your invoices and certificates are also in your Fillwright documents: ${deps.publicUrl}/portal/invoices`,
        '',
        DEMO_SHOP.name,
      ].join('\n'),
    })
    emailed = true
  } catch (err) {
    log(err)
  }
  return { invoice: dto, lines: items, emailed }
}

// ---- reading ---------------------------------------------------------------------------------------------

export async function listInvoices(em: EntityManager, user: SessionUser, query: InvoiceListQuery): Promise<InvoiceDto[]> {
  const where: Record<string, unknown> = {}
  if (!isStaff(user)) {
    if (user.customerId === null) return []
    where.customerId = user.customerId
  }
  if (query.status) where.status = query.status
  if (query.orderId) where.order = query.orderId
  const rows = (await em.find(InvoiceSchema, where, {
    populate: ['order', 'order.customer'],
    orderBy: { createdAt: 'desc', id: 'desc' },
    limit: 500,
  })) as InvoiceWithOrder[]
  return rows.map(toDto)
}

export async function getInvoice(em: EntityManager, user: SessionUser, id: number): Promise<InvoiceDto> {
  const inv = (await em.findOne(InvoiceSchema, id, { populate: ['order', 'order.customer'] })) as InvoiceWithOrder | null
  if (!inv || (!isStaff(user) && (user.customerId === null || inv.customerId !== user.customerId))) throw new NotFoundError('No invoice with this id.')
  return toDto(inv)
}

// ---- webhook ---------------------------------------------------------------------------------------------

function paidAtOf(obj: Record<string, unknown>): Date {
  const transitions = obj.status_transitions as { paid_at?: unknown } | undefined
  const seconds = typeof transitions?.paid_at === 'number' ? transitions.paid_at : typeof obj.paid_at === 'number' ? obj.paid_at : null
  return seconds ? new Date(seconds * 1000) : new Date()
}

const STATUS_BY_EVENT: Record<string, Invoice['status']> = {
  'invoice.paid': 'paid',
  'invoice.voided': 'void',
  'invoice.marked_uncollectible': 'uncollectible',
}

/**
 * A payment-provider event: verified against the signing secret on the exact raw bytes (400 otherwise, nothing
 * read), handled once per event id (a redelivery is acknowledged and ignored). invoice.paid marks the invoice
 * paid and moves its order to "Paid"; voided and uncollectible invoices take that status.
 */
export async function handleWebhook(
  em: EntityManager,
  deps: AppDeps,
  rawBody: unknown,
  signature: string | undefined,
): Promise<{ received: true; duplicate: boolean }> {
  if (!Buffer.isBuffer(rawBody) || rawBody.length === 0) throw new BadRequestError('Send the event as application/json.')
  if (!signature) throw new BadRequestError('The Stripe-Signature header is missing.')
  let event: Stripe.Event
  try {
    event = deps.payments.webhooks.constructEvent(rawBody, signature, deps.webhookSecret)
  } catch {
    throw new BadRequestError('The webhook signature is not valid for this payload.')
  }
  try {
    return await em.transactional(async (tx) => {
      if (await tx.findOne(WebhookEventSchema, event.id)) return { received: true as const, duplicate: true }
      tx.create(WebhookEventSchema, { id: event.id, type: event.type.slice(0, 64) })
      await tx.flush()
      const status = STATUS_BY_EVENT[event.type]
      const obj = (event.data?.object ?? {}) as unknown as Record<string, unknown>
      if (status && typeof obj.id === 'string') {
        const inv = (await tx.findOne(InvoiceSchema, { providerInvoiceId: obj.id }, { populate: ['order'] })) as (Invoice & { order: Order }) | null
        if (inv && inv.status !== status && inv.status !== 'paid') {
          const from = inv.status
          inv.status = status
          if (status === 'paid') inv.paidAt = paidAtOf(obj)
          audit(tx, null, `invoice.${status}`, 'Invoice', inv.id, { eventId: event.id, from, providerInvoiceId: obj.id })
          await tx.flush()
          if (status === 'paid' && inv.order.status === 'invoiced') await transitionOrder(tx, PAYMENT_PROVIDER, inv.order.id, 'paid')
        }
      }
      await tx.flush()
      return { received: true as const, duplicate: false }
    })
  } catch (err) {
    // the same event delivered twice at once: the second insert of its id loses; it was handled by the first
    if (err instanceof UniqueConstraintViolationException) return { received: true, duplicate: true }
    throw err
  }
}
