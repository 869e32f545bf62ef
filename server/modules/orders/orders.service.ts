import { type EntityManager, raw } from '@mikro-orm/core'
import type { SqlEntityManager } from '@mikro-orm/knex'
import { type Role, type SessionUser, STAFF_ROLES } from '#shared/schemas/auth.ts'
import type {
  OrderDetail,
  OrderInput,
  OrderLine,
  OrderList,
  OrderListParams,
  OrderQueueCounts,
  OrderSort,
  OrderSummary,
  OrderUpdateInput,
  TimelineEvent,
} from '#shared/schemas/order.ts'
import { allowedTransitions, ORDER_STATUS_LABEL, ORDER_STATUSES, ORDER_TRANSITIONS, type OrderStatus } from '#shared/schemas/order-lifecycle.ts'
import { SHOP_CURRENCY } from '#shared/schemas/pricing.ts'
import { describeMixture, lineMixture, type OrderQuote, quoteOrder, toMoleFraction } from '#shared/schemas/quote.ts'
import { getGas } from '#shared/physics/index.ts'
import { audit } from '../../lib/audit.ts'
import { readRows, type SqlParam } from '../../lib/prepared-reads.ts'
import type { AppDeps } from '../../lib/deps.ts'
import { BadRequestError, ConflictError, ForbiddenError, HttpError, NotFoundError, UnprocessableError } from '../../lib/http-errors.ts'
import { AuditEventSchema } from '../audit/audit-event.entity.ts'
import { type Customer, CustomerSchema } from '../customers/customer.entity.ts'
import { getPriceBook } from '../pricing/pricing.service.ts'
import { type Order, type OrderLine as OrderLineEntity, OrderLineSchema, OrderSchema, type SpecComponent } from './order.entity.ts'
import { buildQuotePdf } from './quote-pdf.ts'

/** Days a quote stays valid after it is sent. */
export const QUOTE_VALIDITY_DAYS = 30

// ---- who sees what ---------------------------------------------------------------------------------------

/** A user who holds only the customer role sees their own company's orders and nothing else. */
export function isCustomerOnly(user: SessionUser): boolean {
  return user.roles.includes('customer') && !user.roles.some((r) => STAFF_ROLES.includes(r))
}

/** Loads an order the user may see; 404 (never 403) for another customer's order, so ids are not confirmed. */
async function loadVisibleOrder(em: EntityManager, user: SessionUser, orderId: number): Promise<Order> {
  const order = await em.findOne(OrderSchema, { id: orderId })
  if (!order || (isCustomerOnly(user) && order.customer.id !== user.customerId)) throw new NotFoundError(`No order ${orderId}.`)
  return order
}

// ---- transitions -------------------------------------------------------------------------------------------

export interface OrderTransitionResult {
  id: number
  number: string
  status: OrderStatus
  version: number
}

/**
 * The order lifecycle guard: is `to` reachable from the current status (else 409), and may the user's roles make
 * the move (else 403; admin may make any)?
 */
function checkTransition(order: Order, user: SessionUser, to: OrderStatus): void {
  const status = order.status as OrderStatus
  const exists = ORDER_TRANSITIONS.some((t) => t.from === order.status && t.to === to)
  if (!exists) {
    throw new ConflictError(`Order ${order.number} is "${ORDER_STATUS_LABEL[status]}"; it cannot move to "${ORDER_STATUS_LABEL[to]}" from there.`, {
      currentStatus: order.status,
    })
  }
  if (!allowedTransitions(order.status, user.roles).some((t) => t.to === to)) {
    throw new ForbiddenError(`Your role may not move an order from "${ORDER_STATUS_LABEL[status]}" to "${ORDER_STATUS_LABEL[to]}".`)
  }
  if (to === 'accepted' && isCustomerOnly(user) && order.quoteValidUntil && order.quoteValidUntil < todayIso()) {
    throw new ConflictError(`This quote expired on ${order.quoteValidUntil}. Ask the sales desk for a fresh quote.`, { currentStatus: order.status })
  }
}

function checkVersion(order: Order, expectedVersion: number | undefined): void {
  if (expectedVersion !== undefined && expectedVersion !== order.version) {
    throw new ConflictError(`Order ${order.number} was changed by someone else since you opened it. Reload to see the current state.`, {
      currentStatus: order.status,
    })
  }
}

function applyTransition(em: EntityManager, user: SessionUser, order: Order, to: OrderStatus, detail: Record<string, unknown> = {}): void {
  const from = order.status
  order.status = to
  if (to === 'accepted') order.acceptedAt = new Date()
  audit(em, user, 'order.transition', 'Order', order.id, { from, to, ...detail })
}

/**
 * Moves made on the order page itself. The others follow the work and are made by the module that does it, through
 * transitionOrder: approving the fill plans (→ planned), the technician's runs (→ filling, analysis), QA releasing
 * the certificates (→ released), billing (→ invoiced, paid). Making them by hand would skip that work.
 */
export const ORDER_PAGE_TRANSITIONS: readonly OrderStatus[] = ['quoted', 'accepted', 'shipped', 'cancelled']

const MADE_ELSEWHERE: Partial<Record<OrderStatus, string>> = {
  planned: 'when the blender approves the fill plans of every line (fill-plan workspace)',
  filling: 'when the technician starts a fill run',
  analysis: 'when the technician finishes the fill runs',
  released: 'when QA releases the certificates',
  invoiced: 'when the invoice is created (billing)',
  paid: 'when the invoice is paid',
}

/**
 * Moves an order to `to` for the signed-in user, enforcing the lifecycle (409 when `to` is not reachable from the
 * current status, 403 when the user's roles may not make the move, 404 for an order a customer may not see) and
 * writing the audit event. Flushes the unit of work: call it inside `em.transactional` together with the other
 * changes of the same step (e.g. approving fill plans → 'planned'). Sending a quote ('quoted') also e-mails it,
 * so it goes through `sendQuote` instead.
 */
export async function transitionOrder(
  em: EntityManager,
  user: SessionUser,
  orderId: number,
  to: OrderStatus,
  options: { expectedVersion?: number; fromOrderPage?: boolean } = {},
): Promise<OrderTransitionResult> {
  const order = await loadVisibleOrder(em, user, orderId)
  checkTransition(order, user, to)
  if (to === 'quoted') throw new UnprocessableError('Sending a quote e-mails it to the customer: use the sales desk\'s "Send quote".')
  if (options.fromOrderPage && !ORDER_PAGE_TRANSITIONS.includes(to)) {
    throw new ConflictError(`An order moves to "${ORDER_STATUS_LABEL[to]}" ${MADE_ELSEWHERE[to] ?? 'through its own workflow'}, not from the order page.`, {
      currentStatus: order.status,
    })
  }
  checkVersion(order, options.expectedVersion)
  applyTransition(em, user, order, to)
  await em.flush()
  return { id: order.id, number: order.number, status: order.status, version: order.version }
}

// ---- create and edit ---------------------------------------------------------------------------------------

function todayIso(): string {
  return new Date().toISOString().slice(0, 10)
}

function addDaysIso(days: number): string {
  const d = new Date()
  d.setUTCDate(d.getUTCDate() + days)
  return d.toISOString().slice(0, 10)
}

/** FW-2026-00042: the next number of the year, read from the unique index (range scan, no table scan). */
async function nextOrderNumber(em: EntityManager, now = new Date()): Promise<string> {
  const prefix = `FW-${now.getUTCFullYear()}-`
  const last = await em.findOne(OrderSchema, { number: { $gte: prefix, $lt: `${prefix}~` } }, { orderBy: { number: 'desc' }, fields: ['number'] })
  const seq = last ? Number(last.number.slice(prefix.length)) + 1 : 1
  return `${prefix}${String(seq).padStart(5, '0')}`
}

function storedComponents(line: OrderInput['lines'][number]): SpecComponent[] {
  const mixture = lineMixture(line)
  return [
    ...line.components.map((c) => ({ gas: c.gas, fraction: toMoleFraction(c.amount, c.unit), amount: c.amount, unit: c.unit })),
    { gas: line.balanceGas, fraction: mixture.x[mixture.x.length - 1] },
  ]
}

function searchTextOf(number: string, customer: Customer, input: Pick<OrderInput, 'reference' | 'lines'>): string {
  const formulas = new Set<string>()
  for (const l of input.lines) for (const id of [...l.components.map((c) => c.gas), l.balanceGas]) formulas.add(id === 'air' ? 'air' : getGas(id).formula)
  return [number, customer.code, customer.company, input.reference, ...formulas].join(' ').toLowerCase()
}

function priceOrThrow(input: Pick<OrderInput, 'lines' | 'rentalDays'>, book: Awaited<ReturnType<typeof getPriceBook>>): OrderQuote {
  const quote = quoteOrder(input, book)
  if (quote.problems.length > 0) {
    throw new UnprocessableError(`The order cannot be priced: ${quote.problems[0].message}`, quote.problems)
  }
  return quote
}

async function findCustomer(em: EntityManager, customerId: number): Promise<Customer> {
  const customer = await em.findOne(CustomerSchema, { id: customerId })
  if (!customer) throw new BadRequestError(`No customer ${customerId}.`, [{ field: 'customerId', message: 'Choose an existing customer' }])
  return customer
}

function writeLines(em: EntityManager, order: Order, input: OrderInput, quote: OrderQuote): void {
  input.lines.forEach((line, i) => {
    const priced = quote.lines[i]
    if (!priced.ok) throw new Error('unpriced line') // priceOrThrow has already refused orders with problems
    em.create(OrderLineSchema, {
      order,
      lineNo: i + 1,
      description: line.description || describeMixture(line),
      components: storedComponents(line),
      balanceGas: line.balanceGas,
      blendTolerancePct: line.blendTolerancePct,
      certificationUncertaintyPct: line.certificationUncertaintyPct,
      waterVolumeL: line.waterVolumeL,
      valveOutlet: line.valveOutlet,
      quantity: line.quantity,
      finalPressureBarGauge: line.finalPressureBarGauge,
      method: line.method,
      priceMinor: priced.pricing.totalMinor,
      pricing: priced.pricing,
    })
  })
}

/** Creates a draft order ("Specification") priced from the current price book; the server's price is the one stored. */
export async function createOrder(em: EntityManager, user: SessionUser, input: OrderInput): Promise<OrderDetail> {
  const id = await em.transactional(async (tx) => {
    const customer = await findCustomer(tx, input.customerId)
    const quote = priceOrThrow(input, await getPriceBook(tx))
    const number = await nextOrderNumber(tx)
    const order = tx.create(OrderSchema, {
      number,
      customer,
      status: 'draft',
      reference: input.reference,
      neededBy: input.neededBy,
      currency: SHOP_CURRENCY,
      totalMinor: quote.totalMinor ?? 0,
      rentalDays: input.rentalDays,
      quoteValidUntil: null,
      quoteSentAt: null,
      acceptedAt: null,
      notes: input.notes,
      searchText: searchTextOf(number, customer, input),
      createdById: user.id,
    })
    writeLines(tx, order, input, quote)
    await tx.flush()
    audit(tx, user, 'order.created', 'Order', order.id, { totalMinor: order.totalMinor, lines: input.lines.length })
    await tx.flush()
    return order.id
  })
  return getOrderDetail(em.fork(), user, id)
}

/** Replaces a draft's header and lines (only while it is a draft; a stale version is 409). */
export async function updateOrder(em: EntityManager, user: SessionUser, orderId: number, input: OrderUpdateInput): Promise<OrderDetail> {
  await em.transactional(async (tx) => {
    const order = await loadVisibleOrder(tx, user, orderId)
    if (order.status !== 'draft') {
      throw new ConflictError(
        `Order ${order.number} is "${ORDER_STATUS_LABEL[order.status as OrderStatus]}"; only a specification that has not been quoted can be edited.`,
        {
          currentStatus: order.status,
        },
      )
    }
    checkVersion(order, input.version)
    const customer = await findCustomer(tx, input.customerId)
    const quote = priceOrThrow(input, await getPriceBook(tx))
    const old = await tx.find(OrderLineSchema, { order })
    for (const l of old) tx.remove(l)
    await tx.flush()
    tx.assign(order, {
      customer,
      reference: input.reference,
      neededBy: input.neededBy,
      rentalDays: input.rentalDays,
      notes: input.notes,
      totalMinor: quote.totalMinor ?? 0,
      searchText: searchTextOf(order.number, customer, input),
      updatedAt: new Date(),
    })
    writeLines(tx, order, input, quote)
    audit(tx, user, 'order.updated', 'Order', order.id, { totalMinor: order.totalMinor, lines: input.lines.length })
    await tx.flush()
  })
  return getOrderDetail(em.fork(), user, orderId)
}

// ---- quote ----------------------------------------------------------------------------------------------------

/**
 * "Send quote" (draft → quoted): re-prices every line from the current price book, stores the prices, renders the
 * quote PDF and e-mails it to the customer's contact with the PDF attached — all or nothing: when the e-mail
 * cannot be sent, the order stays a draft.
 */
export async function sendQuote(em: EntityManager, deps: AppDeps, user: SessionUser, orderId: number, expectedVersion?: number): Promise<OrderDetail> {
  await em.transactional(async (tx) => {
    const order = await loadVisibleOrder(tx, user, orderId)
    checkTransition(order, user, 'quoted')
    checkVersion(order, expectedVersion)
    const lines = await tx.find(OrderLineSchema, { order }, { orderBy: { lineNo: 'asc' } })
    const inputs = lines.map(entityLineToInput)
    const quote = priceOrThrow({ lines: inputs, rentalDays: order.rentalDays }, await getPriceBook(tx))
    lines.forEach((l, i) => {
      const priced = quote.lines[i]
      if (priced.ok) {
        l.priceMinor = priced.pricing.totalMinor
        l.pricing = priced.pricing
      }
    })
    order.totalMinor = quote.totalMinor ?? 0
    order.quoteSentAt = new Date()
    order.quoteValidUntil = addDaysIso(QUOTE_VALIDITY_DAYS)
    const customer = await tx.findOneOrFail(CustomerSchema, { id: order.customer.id })
    applyTransition(tx, user, order, 'quoted', { emailedTo: customer.contactEmail, totalMinor: order.totalMinor })
    await tx.flush()
    const detail = toOrderDetail(order, customer, lines, [], user)
    const pdf = await buildQuotePdf(detail, customer)
    try {
      await deps.mailer.send({
        to: customer.contactEmail,
        subject: `Quote ${order.number} from ${QUOTE_SENDER}`,
        text: quoteEmailText(detail, customer),
        attachments: [{ filename: `quote-${order.number}.pdf`, content: pdf, contentType: 'application/pdf' }],
      })
    } catch (err) {
      throw new HttpError(
        502,
        'E-mail not sent',
        `The quote could not be e-mailed (${err instanceof Error ? err.message : String(err)}). The order is still a specification; try again.`,
      )
    }
  })
  return getOrderDetail(em.fork(), user, orderId)
}

const QUOTE_SENDER = 'Kestrel Ridge Gas Blending'

function quoteEmailText(order: OrderDetail, customer: Customer): string {
  const money = new Intl.NumberFormat('en-GB', { style: 'currency', currency: order.currency })
  const lines = order.lines.map(
    (l) =>
      `  ${l.lineNo}. ${l.description} — ${l.quantity} × ${l.waterVolumeL} L at ${l.finalPressureBarGauge} bar gauge (15 °C): ${money.format(l.priceMinor / 100)}`,
  )
  return [
    `Dear ${customer.contactName},`,
    '',
    `thank you for your enquiry${order.reference ? ` (your reference ${order.reference})` : ''}. Our quote ${order.number} is attached as a PDF:`,
    '',
    ...lines,
    '',
    `Total: ${money.format(order.totalMinor / 100)} (excluding VAT and transport)`,
    `Valid until: ${order.quoteValidUntil}`,
    '',
    'You can accept it in the customer portal, or reply to this e-mail.',
    'Standard volumes in the quote are stated at 15 °C and 101.325 kPa.',
    '',
    `${QUOTE_SENDER} — sales desk`,
  ].join('\n')
}

/** The quote PDF of an order (customers: their own orders once quoted). */
export async function quotePdf(em: EntityManager, user: SessionUser, orderId: number): Promise<{ number: string; pdf: Buffer }> {
  const detail = await getOrderDetail(em, user, orderId)
  if (isCustomerOnly(user) && detail.status === 'draft') throw new NotFoundError('This order has not been quoted yet.')
  const customer = await em.findOneOrFail(CustomerSchema, { id: detail.customer.id })
  return { number: detail.number, pdf: await buildQuotePdf(detail, customer) }
}

// ---- reading -----------------------------------------------------------------------------------------------

function entityLineToInput(l: OrderLineEntity): OrderInput['lines'][number] {
  return {
    description: l.description,
    components: l.components
      .filter((c) => c.gas !== l.balanceGas)
      .map((c) => ({ gas: c.gas, amount: c.amount ?? c.fraction * 100, unit: c.unit ?? 'percent' })),
    balanceGas: l.balanceGas,
    blendTolerancePct: l.blendTolerancePct,
    certificationUncertaintyPct: l.certificationUncertaintyPct,
    waterVolumeL: l.waterVolumeL,
    valveOutlet: l.valveOutlet,
    quantity: l.quantity,
    finalPressureBarGauge: l.finalPressureBarGauge,
    method: l.method,
  }
}

function toLineDto(l: OrderLineEntity): OrderLine {
  return {
    id: l.id,
    lineNo: l.lineNo,
    description: l.description,
    components: l.components.map((c) => ({
      gas: c.gas,
      fraction: c.fraction,
      ...(c.amount !== undefined ? { amount: c.amount } : {}),
      ...(c.unit ? { unit: c.unit } : {}),
    })),
    balanceGas: l.balanceGas,
    blendTolerancePct: l.blendTolerancePct,
    certificationUncertaintyPct: l.certificationUncertaintyPct,
    waterVolumeL: l.waterVolumeL,
    valveOutlet: l.valveOutlet,
    quantity: l.quantity,
    finalPressureBarGauge: l.finalPressureBarGauge,
    method: l.method,
    priceMinor: l.priceMinor,
    pricing: l.pricing ?? null,
  }
}

function lineSummaryOf(lines: { description: string }[]): string {
  if (lines.length === 0) return ''
  return lines.length === 1 ? lines[0].description : `${lines[0].description} + ${lines.length - 1} more`
}

function toOrderDetail(order: Order, customer: Customer, lines: OrderLineEntity[], timeline: TimelineEvent[], user: SessionUser): OrderDetail {
  const sorted = [...lines].sort((a, b) => a.lineNo - b.lineNo)
  const transitions = allowedTransitions(order.status, user.roles)
    .filter((t) => ORDER_PAGE_TRANSITIONS.includes(t.to))
    .filter((t) => !isCustomerOnly(user) || t.roles.includes('customer'))
    .map((t) => ({ to: t.to, action: t.action }))
  return {
    id: order.id,
    number: order.number,
    status: order.status,
    customer: { id: customer.id, code: customer.code, company: customer.company, contactName: customer.contactName, contactEmail: customer.contactEmail },
    reference: order.reference,
    neededBy: order.neededBy ?? null,
    totalMinor: order.totalMinor,
    currency: order.currency,
    createdAt: order.createdAt.toISOString(),
    lineSummary: lineSummaryOf(sorted),
    cylinders: sorted.reduce((s, l) => s + l.quantity, 0),
    rentalDays: order.rentalDays,
    notes: order.notes,
    quoteValidUntil: order.quoteValidUntil ?? null,
    quoteSentAt: order.quoteSentAt ? order.quoteSentAt.toISOString() : null,
    acceptedAt: order.acceptedAt ? order.acceptedAt.toISOString() : null,
    updatedAt: order.updatedAt.toISOString(),
    version: order.version,
    lines: sorted.map(toLineDto),
    timeline,
    transitions,
  }
}

const ACTION_TEXT: Record<string, string> = {
  'order.created': 'Specification entered',
  'order.updated': 'Specification changed',
}

async function timelineOf(em: EntityManager, order: Order, user: SessionUser): Promise<TimelineEvent[]> {
  const events = await em.find(AuditEventSchema, { entityType: 'Order', entityId: String(order.id) }, { orderBy: { at: 'asc', id: 'asc' } })
  const customerView = isCustomerOnly(user)
  return events.map((e) => {
    const detail = (e.detail ?? {}) as Record<string, unknown>
    const from = typeof detail.from === 'string' && (ORDER_STATUSES as readonly string[]).includes(detail.from) ? (detail.from as OrderStatus) : null
    const to = typeof detail.to === 'string' && (ORDER_STATUSES as readonly string[]).includes(detail.to) ? (detail.to as OrderStatus) : null
    let text = ACTION_TEXT[e.action] ?? e.action
    if (e.action === 'order.transition' && to) {
      text = ORDER_STATUS_LABEL[to]
      if (to === 'quoted' && typeof detail.emailedTo === 'string' && !customerView) text += ` — e-mailed to ${detail.emailedTo}`
    }
    const actor = customerView ? (e.actorId === user.id ? 'You' : 'Kestrel Ridge') : (e.actorEmail ?? null)
    return { at: e.at.toISOString(), action: e.action, text, actor, from, to }
  })
}

/** One order with its lines, status timeline (from the audit trail) and the moves the user may make. */
export async function getOrderDetail(em: EntityManager, user: SessionUser, orderId: number): Promise<OrderDetail> {
  const order = await loadVisibleOrder(em, user, orderId)
  const [customer, lines] = await Promise.all([
    em.findOneOrFail(CustomerSchema, { id: order.customer.id }),
    em.find(OrderLineSchema, { order }, { orderBy: { lineNo: 'asc' } }),
  ])
  return toOrderDetail(order, customer, lines, await timelineOf(em, order, user), user)
}

// ---- the orders table: keyset paging ----------------------------------------------------------------------------

type SortField = 'createdAt' | 'number' | 'neededBy' | 'totalMinor'
const SORT_FIELD: Record<string, SortField> = { created: 'createdAt', number: 'number', neededBy: 'neededBy', total: 'totalMinor' }

function parseSort(sort: OrderSort): { field: SortField; dir: 'asc' | 'desc' } {
  const desc = sort.startsWith('-')
  return { field: SORT_FIELD[desc ? sort.slice(1) : sort], dir: desc ? 'desc' : 'asc' }
}

interface Cursor {
  /** the sort key of the last row (ISO string for dates, null for an order without a needed-by date) */
  v: string | number | null
  id: number
}

function encodeCursor(c: Cursor): string {
  return Buffer.from(JSON.stringify(c)).toString('base64url')
}

function decodeCursor(text: string, field: SortField): Cursor {
  const bad = () => new BadRequestError('The paging cursor is not valid; reload the list.', [{ field: 'cursor', message: 'Not a cursor of this list' }])
  let raw: unknown
  try {
    raw = JSON.parse(Buffer.from(text, 'base64url').toString('utf8'))
  } catch {
    throw bad()
  }
  if (typeof raw !== 'object' || raw === null) throw bad()
  const { v, id } = raw as Record<string, unknown>
  if (typeof id !== 'number' || !Number.isInteger(id) || id < 1) throw bad()
  if (field === 'totalMinor' && !(typeof v === 'number' && Number.isInteger(v))) throw bad()
  if (field === 'createdAt' && !(typeof v === 'string' && !Number.isNaN(Date.parse(v)))) throw bad()
  if (field === 'number' && typeof v !== 'string') throw bad()
  if (field === 'neededBy' && !(v === null || (typeof v === 'string' && /^\d{4}-\d{2}-\d{2}$/.test(v)))) throw bad()
  return { v: v as Cursor['v'], id }
}

interface ListedRow {
  id: number
  number: string
  status: OrderStatus
  reference: string
  needed_by: string | null
  /** a number in SQLite, possibly a string for a PostgreSQL bigint */
  total_minor: number | string
  currency: string
  /** epoch ms in SQLite, a timestamp in PostgreSQL */
  created_at: number | string | Date
  customer_id: number
  code: string
  company: string
}

/** Columns of the sort keys (the orders table's keyset). */
const SORT_COLUMN: Record<SortField, string> = { createdAt: 'created_at', number: 'number', neededBy: 'needed_by', totalMinor: 'total_minor' }

/**
 * SQL text of the orders list for one database platform: identifiers quoted the platform's way, values always
 * passed as `?` parameters. Built once per platform (SQLite and PostgreSQL quote differently).
 */
interface ListSql {
  /** `alias.column`, quoted */
  col(alias: string, column: string): string
  pageHead: string
  linesHead: string
  countHead: string
}

const listSqlCache = new WeakMap<object, ListSql>()

function listSqlOf(em: EntityManager): ListSql {
  const platform = em.getPlatform()
  let cached = listSqlCache.get(platform)
  if (!cached) {
    const q = (id: string) => platform.quoteIdentifier(id)
    const col = (alias: string, column: string) => q(`${alias}.${column}`)
    const page = ['id', 'number', 'status', 'reference', 'needed_by', 'total_minor', 'currency', 'created_at'].map((c) => col('o', c))
    cached = {
      col,
      pageHead:
        `select ${page.join(', ')}, o.customer_id as customer_id, ${col('c', 'code')}, ${col('c', 'company')} ` +
        `from ${q('orders')} as ${q('o')} inner join ${q('customers')} as ${q('c')} on ${col('o', 'customer_id')} = ${col('c', 'id')}`,
      linesHead:
        `select ${['order_id', 'line_no', 'description', 'quantity'].map((c) => col('l', c)).join(', ')} ` +
        `from ${q('order_lines')} as ${q('l')} where ${col('l', 'order_id')} in `,
      countHead: `select count(*) as ${q('count')} from ${q('orders')} as ${q('o0')}`,
    }
    listSqlCache.set(platform, cached)
  }
  return cached
}

/** A condition of the orders list: SQL with `?` placeholders and its values. */
interface Condition {
  sql: string
  params: SqlParam[]
}

function whereOf(conditions: Condition[]): { sql: string; params: SqlParam[] } {
  if (conditions.length === 0) return { sql: '', params: [] }
  return { sql: ` where ${conditions.map((c) => c.sql).join(' and ')}`, params: conditions.flatMap((c) => c.params) }
}

const placeholders = (n: number) => `(${Array.from({ length: n }, () => '?').join(', ')})`

/**
 * The orders table: filter (status, customer, text), sort (created, number, needed-by, total) and keyset paging on
 * (sort key, id) — each page is one indexed range scan however deep it is, plus one query for the lines of the
 * page's orders and, on the first page, one count. The statements are plain SQL with `?` parameters, read as plain
 * rows (no query builder, no entity hydration: only the columns shown) through server/lib/prepared-reads.ts, which
 * keeps them compiled on SQLite. Customers see only their own company's orders.
 */
export async function listOrders(em: EntityManager, user: SessionUser, query: OrderListParams): Promise<OrderList> {
  const sql = listSqlOf(em)
  const run = <T>(text: string, params: SqlParam[]) => readRows<T>(em, text, params)

  let customerId: number | undefined
  if (isCustomerOnly(user)) {
    if (user.customerId === null || (query.customerId !== undefined && query.customerId !== user.customerId)) return { items: [], nextCursor: null, total: 0 }
    customerId = user.customerId
  } else customerId = query.customerId

  // the filters, written once per table alias: 'o' for the page, 'o0' for the count
  const base = (alias: string): Condition[] => {
    const out: Condition[] = []
    if (customerId !== undefined) out.push({ sql: `${sql.col(alias, 'customer_id')} = ?`, params: [customerId] })
    if (query.status?.length) out.push({ sql: `${sql.col(alias, 'status')} in ${placeholders(query.status.length)}`, params: [...query.status] })
    if (query.q) {
      // an order number (or its start) is a range on the unique index; anything else is a substring search
      const asNumber = /^fw-\d{4}(-\d{0,5})?$/i.test(query.q) ? query.q.toUpperCase() : null
      out.push(
        asNumber
          ? { sql: `${sql.col(alias, 'number')} >= ? and ${sql.col(alias, 'number')} < ?`, params: [asNumber, `${asNumber}~`] }
          : { sql: `${sql.col(alias, 'search_text')} like ?`, params: [`%${query.q.toLowerCase()}%`] },
      )
    }
    return out
  }
  const { field, dir } = parseSort(query.sort)
  const cursor = query.cursor ? decodeCursor(query.cursor, field) : null
  const limit = query.limit
  const cmp = dir === 'asc' ? '>' : '<'
  const id = sql.col('o', 'id')

  const fetch = (where: Condition[], orderBy: [string, 'asc' | 'desc'][], take: number) => {
    const w = whereOf(where)
    const order = orderBy.map(([c, d]) => `${c} ${d}`).join(', ')
    return run<ListedRow>(`${sql.pageHead}${w.sql} order by ${order} limit ?`, [...w.params, take])
  }

  let rows: ListedRow[]
  if (field === 'neededBy') {
    // dated orders first (by date), then undated ones (by id); each part is one range scan on its index
    const neededBy = sql.col('o', 'needed_by')
    rows = []
    if (!cursor || cursor.v !== null) {
      const keyset: Condition[] = cursor
        ? [{ sql: `(${neededBy} ${cmp} ? or (${neededBy} = ? and ${id} ${cmp} ?))`, params: [cursor.v, cursor.v, cursor.id] }]
        : []
      rows = await fetch(
        [...base('o'), { sql: `${neededBy} is not null`, params: [] }, ...keyset],
        [
          [neededBy, dir],
          [id, dir],
        ],
        limit + 1,
      )
    }
    if (rows.length <= limit) {
      const keyset: Condition[] = cursor && cursor.v === null ? [{ sql: `${id} > ?`, params: [cursor.id] }] : []
      rows.push(...(await fetch([...base('o'), { sql: `${neededBy} is null`, params: [] }, ...keyset], [[id, 'asc']], limit + 1 - rows.length)))
    }
  } else {
    const key = sql.col('o', SORT_COLUMN[field])
    const keyset: Condition[] = []
    if (cursor) {
      const v = field === 'createdAt' ? new Date(cursor.v as string) : cursor.v
      keyset.push({ sql: `(${key} ${cmp} ? or (${key} = ? and ${id} ${cmp} ?))`, params: [v, v, cursor.id] })
    }
    rows = await fetch(
      [...base('o'), ...keyset],
      [
        [key, dir],
        [id, dir],
      ],
      limit + 1,
    )
  }

  const page = rows.slice(0, limit)
  const createdIso = (r: ListedRow) =>
    new Date(typeof r.created_at === 'string' && /^\d+$/.test(r.created_at) ? Number(r.created_at) : r.created_at).toISOString()
  const last = page.at(-1)
  const nextCursor =
    rows.length > limit && last
      ? encodeCursor({
          id: last.id,
          v:
            field === 'createdAt'
              ? createdIso(last)
              : field === 'neededBy'
                ? (last.needed_by ?? null)
                : field === 'number'
                  ? last.number
                  : Number(last.total_minor),
        })
      : null

  const ids = page.map((o) => o.id)
  const lines = ids.length
    ? await run<{ order_id: number; line_no: number; description: string; quantity: number }>(`${sql.linesHead}${placeholders(ids.length)}`, ids)
    : []
  // sorted here (a handful of rows) so the query stays a plain index lookup
  lines.sort((a, b) => a.order_id - b.order_id || a.line_no - b.line_no)
  const byOrder = new Map<number, { description: string; quantity: number }[]>()
  for (const l of lines) {
    const list = byOrder.get(l.order_id)
    if (list) list.push({ description: l.description, quantity: l.quantity })
    else byOrder.set(l.order_id, [{ description: l.description, quantity: l.quantity }])
  }
  // the count rides on an index for status and customer filters; a text search would scan every row, so it has none
  let total: number | null = null
  if (!cursor && !query.q) {
    const w = whereOf(base('o0'))
    const counted = await run<{ count: number | string }>(`${sql.countHead}${w.sql}`, w.params)
    total = Number(counted[0]?.count ?? 0)
  }
  const items: OrderSummary[] = page.map((o) => {
    const ls = byOrder.get(o.id) ?? []
    return {
      id: o.id,
      number: o.number,
      status: o.status,
      customer: { id: o.customer_id, code: o.code, company: o.company },
      reference: o.reference,
      neededBy: o.needed_by ?? null,
      totalMinor: Number(o.total_minor),
      currency: o.currency,
      createdAt: createdIso(o),
      lineSummary: lineSummaryOf(ls),
      cylinders: ls.reduce((s, l) => s + l.quantity, 0),
    }
  })
  return { items, nextCursor, total }
}

/** Orders per status (the home queues); a customer's own orders only. One grouped query on the status index. */
export async function orderCounts(em: EntityManager, user: SessionUser): Promise<OrderQueueCounts> {
  const counts = Object.fromEntries(ORDER_STATUSES.map((s) => [s, 0])) as Record<OrderStatus, number>
  const qb = (em as SqlEntityManager)
    .createQueryBuilder(OrderSchema, 'o')
    .select(['o.status', raw('count(*) as n')])
    .groupBy('o.status')
  if (isCustomerOnly(user)) {
    if (user.customerId === null) return { counts }
    qb.where({ customer: user.customerId })
  }
  const rows = await qb.execute<{ status: OrderStatus; n: number | string }[]>('all', false)
  for (const r of rows) counts[r.status] = Number(r.n)
  return { counts }
}

/** Roles that may read orders: every staff role (the monitor and the benches) and customers (their own). */
export const ORDER_READERS: readonly Role[] = ['admin', 'sales', 'blender', 'technician', 'qa', 'customer']
