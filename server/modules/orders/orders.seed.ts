import type { EntityManager } from '@mikro-orm/core'
import type { OrderInput, OrderLineInput } from '#shared/schemas/order.ts'
import { ORDER_TRANSITIONS, type OrderStatus } from '#shared/schemas/order-lifecycle.ts'
import { SHOP_CURRENCY } from '#shared/schemas/pricing.ts'
import { describeMixture, indexPriceBook, lineMixture, quoteLine, toMoleFraction } from '#shared/schemas/quote.ts'
import { getGas } from '#shared/physics/index.ts'
import { addSeedStep, type SeedContext } from '../../seed/demo.ts'
import { AuditEventSchema } from '../audit/audit-event.entity.ts'
import { CustomerSchema } from '../customers/customer.entity.ts'
import { PriceEntrySchema } from '../pricing/price-entry.entity.ts'
import { seedPriceBook } from '../pricing/pricing.seed.ts'
import { OrderLineSchema, OrderSchema } from './order.entity.ts'

/**
 * Demo seed: the price book, then twelve invented orders for the four demo customers spread over the lifecycle.
 * Each line is priced once with the shared quote function (one equation-of-state evaluation per line).
 */

type Line = Omit<OrderLineInput, 'description' | 'method' | 'blendTolerancePct'> & Partial<Pick<OrderLineInput, 'method' | 'blendTolerancePct'>>

interface DemoOrder {
  customer: 'ALDB' | 'BRWS' | 'CRVF' | 'DNMR'
  status: OrderStatus
  /** days before today the specification was entered */
  ageDays: number
  neededInDays: number | null
  reference: string
  notes?: string
  lines: Line[]
}

const pct = (gas: string, amount: number) => ({ gas, amount, unit: 'percent' as const })
const ppm = (gas: string, amount: number) => ({ gas, amount, unit: 'ppm' as const })

const DEMO_ORDERS: DemoOrder[] = [
  {
    customer: 'ALDB',
    status: 'quoted',
    ageDays: 6,
    neededInDays: 21,
    reference: 'PO 4471-LEL',
    lines: [
      {
        components: [pct('methane', 2)],
        balanceGas: 'air',
        certificationUncertaintyPct: 2,
        blendTolerancePct: 5,
        waterVolumeL: 10,
        valveOutlet: 'DIN 477 No. 14',
        quantity: 4,
        finalPressureBarGauge: 150,
      },
    ],
  },
  {
    customer: 'BRWS',
    status: 'accepted',
    ageDays: 12,
    neededInDays: 9,
    reference: 'Shop restock M21',
    lines: [
      {
        components: [pct('carbon-dioxide', 18)],
        balanceGas: 'argon',
        certificationUncertaintyPct: 10,
        blendTolerancePct: 10,
        waterVolumeL: 50,
        valveOutlet: 'DIN 477 No. 10',
        quantity: 10,
        finalPressureBarGauge: 200,
      },
    ],
  },
  {
    customer: 'CRVF',
    status: 'planned',
    ageDays: 16,
    neededInDays: 5,
    reference: 'MAP line 2',
    lines: [
      {
        components: [pct('carbon-dioxide', 30)],
        balanceGas: 'nitrogen',
        certificationUncertaintyPct: 5,
        blendTolerancePct: 5,
        waterVolumeL: 50,
        valveOutlet: 'DIN 477 No. 10',
        quantity: 8,
        finalPressureBarGauge: 150,
      },
    ],
  },
  {
    customer: 'ALDB',
    status: 'filling',
    ageDays: 20,
    neededInDays: 3,
    reference: 'PO 4402-CO',
    lines: [
      {
        components: [ppm('carbon-monoxide', 50)],
        balanceGas: 'nitrogen',
        certificationUncertaintyPct: 2,
        blendTolerancePct: 5,
        waterVolumeL: 10,
        valveOutlet: 'DIN 477 No. 14',
        quantity: 4,
        finalPressureBarGauge: 150,
      },
    ],
  },
  {
    customer: 'DNMR',
    status: 'analysis',
    ageDays: 25,
    neededInDays: 2,
    reference: 'H2S bump stock',
    notes: 'Treated aluminium cylinders; condition before filling.',
    lines: [
      {
        components: [pct('hydrogen-sulfide', 1)],
        balanceGas: 'nitrogen',
        certificationUncertaintyPct: 2,
        blendTolerancePct: 5,
        waterVolumeL: 10,
        valveOutlet: 'DIN 477 No. 14',
        quantity: 2,
        finalPressureBarGauge: 150,
        method: 'gravimetric',
      },
    ],
  },
  {
    customer: 'ALDB',
    status: 'released',
    ageDays: 31,
    neededInDays: -1,
    reference: 'Breathing-gas analyser test',
    lines: [
      {
        components: [pct('oxygen', 21)],
        balanceGas: 'helium',
        certificationUncertaintyPct: 1,
        blendTolerancePct: 2,
        waterVolumeL: 10,
        valveOutlet: 'DIN 477 No. 14',
        quantity: 3,
        finalPressureBarGauge: 200,
      },
    ],
  },
  {
    customer: 'BRWS',
    status: 'shipped',
    ageDays: 38,
    neededInDays: -8,
    reference: 'Spray-arc M20',
    lines: [
      {
        components: [pct('carbon-dioxide', 8)],
        balanceGas: 'argon',
        certificationUncertaintyPct: 10,
        blendTolerancePct: 10,
        waterVolumeL: 50,
        valveOutlet: 'DIN 477 No. 10',
        quantity: 12,
        finalPressureBarGauge: 200,
      },
    ],
  },
  {
    customer: 'CRVF',
    status: 'invoiced',
    ageDays: 45,
    neededInDays: -15,
    reference: 'Red-meat trays',
    lines: [
      {
        components: [pct('carbon-dioxide', 30)],
        balanceGas: 'oxygen',
        certificationUncertaintyPct: 5,
        blendTolerancePct: 5,
        waterVolumeL: 40,
        valveOutlet: 'DIN 477 No. 6',
        quantity: 4,
        finalPressureBarGauge: 150,
      },
    ],
  },
  {
    customer: 'DNMR',
    status: 'paid',
    ageDays: 58,
    neededInDays: -30,
    reference: 'Quad bump gas Q1',
    lines: [
      {
        components: [pct('methane', 2.5), pct('oxygen', 18), ppm('carbon-monoxide', 50), ppm('hydrogen-sulfide', 25)],
        balanceGas: 'nitrogen',
        certificationUncertaintyPct: 5,
        blendTolerancePct: 5,
        waterVolumeL: 10,
        valveOutlet: 'DIN 477 No. 14',
        quantity: 6,
        finalPressureBarGauge: 150,
      },
    ],
  },
  {
    customer: 'ALDB',
    status: 'draft',
    ageDays: 1,
    neededInDays: 30,
    reference: 'Stack analyser NO span',
    lines: [
      {
        components: [ppm('nitric-oxide', 250)],
        balanceGas: 'nitrogen',
        certificationUncertaintyPct: 2,
        blendTolerancePct: 5,
        waterVolumeL: 10,
        valveOutlet: 'DIN 477 No. 14',
        quantity: 2,
        finalPressureBarGauge: 150,
      },
    ],
  },
  {
    customer: 'BRWS',
    status: 'draft',
    ageDays: 0,
    neededInDays: null,
    reference: 'Plasma cutting trial',
    lines: [
      {
        components: [pct('hydrogen', 5)],
        balanceGas: 'argon',
        certificationUncertaintyPct: 10,
        blendTolerancePct: 10,
        waterVolumeL: 50,
        valveOutlet: 'DIN 477 No. 1',
        quantity: 6,
        finalPressureBarGauge: 200,
      },
      {
        components: [pct('carbon-dioxide', 18)],
        balanceGas: 'argon',
        certificationUncertaintyPct: 10,
        blendTolerancePct: 10,
        waterVolumeL: 50,
        valveOutlet: 'DIN 477 No. 10',
        quantity: 4,
        finalPressureBarGauge: 200,
      },
    ],
  },
  {
    customer: 'CRVF',
    status: 'cancelled',
    ageDays: 27,
    neededInDays: 10,
    reference: 'Cheese packs trial',
    notes: 'Customer changed the packaging line; no longer needed.',
    lines: [
      {
        components: [pct('carbon-dioxide', 40)],
        balanceGas: 'nitrogen',
        certificationUncertaintyPct: 10,
        blendTolerancePct: 5,
        waterVolumeL: 50,
        valveOutlet: 'DIN 477 No. 10',
        quantity: 5,
        finalPressureBarGauge: 100,
      },
    ],
  },
]

/** The path of statuses from draft to `status` (cancelled orders were quoted first). */
function pathTo(status: OrderStatus): OrderStatus[] {
  if (status === 'cancelled') return ['quoted', 'cancelled']
  const path: OrderStatus[] = []
  let at: OrderStatus = 'draft'
  while (at !== status) {
    const next = ORDER_TRANSITIONS.find((t) => t.from === at && t.to !== 'cancelled')
    if (!next) break
    path.push(next.to)
    at = next.to
  }
  return path
}

const DAY_MS = 86_400_000

interface SeedEvents {
  order: { id: number }
  createdAt: Date
  path: OrderStatus[]
  stepAt: (k: number) => Date
  actors: Partial<Record<OrderStatus, { id: number | null; email: string }>>
  customerEmail: string
  customerUserId: number | null
}

async function seedOrders(em: EntityManager, ctx: SeedContext): Promise<void> {
  const entries = await em.find(PriceEntrySchema, {})
  const index = indexPriceBook({ currency: SHOP_CURRENCY, entries: entries.map((e) => ({ ...e, updatedAt: e.updatedAt.toISOString() })) })
  const customers = new Map((await em.find(CustomerSchema, {})).map((c) => [c.code, c]))
  const sales = ctx.users['sales@demo.test']
  const actors: Partial<Record<OrderStatus, { id: number | null; email: string }>> = {
    quoted: { id: sales?.id ?? null, email: 'sales@demo.test' },
    accepted: { id: sales?.id ?? null, email: 'sales@demo.test' },
    planned: { id: ctx.users['blender@demo.test']?.id ?? null, email: 'blender@demo.test' },
    filling: { id: ctx.users['technician@demo.test']?.id ?? null, email: 'technician@demo.test' },
    analysis: { id: ctx.users['technician@demo.test']?.id ?? null, email: 'technician@demo.test' },
    released: { id: ctx.users['qa@demo.test']?.id ?? null, email: 'qa@demo.test' },
    shipped: { id: sales?.id ?? null, email: 'sales@demo.test' },
    invoiced: { id: sales?.id ?? null, email: 'sales@demo.test' },
    paid: { id: sales?.id ?? null, email: 'sales@demo.test' },
    cancelled: { id: sales?.id ?? null, email: 'sales@demo.test' },
  }
  const events: SeedEvents[] = []
  const now = Date.now()
  const year = new Date(now).getUTCFullYear()
  // oldest first, so numbers follow the order of entry
  const ordered = [...DEMO_ORDERS].sort((a, b) => b.ageDays - a.ageDays)
  ordered.forEach((spec, i) => {
    const customer = customers.get(spec.customer)
    if (!customer) return
    const createdAt = new Date(now - spec.ageDays * DAY_MS - (i + 1) * 3_600_000)
    const lines: OrderInput['lines'] = spec.lines.map((l) => ({ description: '', method: 'partial-pressure', blendTolerancePct: 5, ...l }))
    const priced = lines.map((l) => quoteLine(l, index, 30))
    const number = `FW-${year}-${String(i + 1).padStart(5, '0')}`
    const path = pathTo(spec.status)
    const stepAt = (k: number) => new Date(createdAt.getTime() + (k + 1) * Math.max(1, spec.ageDays / (path.length + 1)) * DAY_MS * 0.8)
    const quotedAt = path.includes('quoted') ? stepAt(path.indexOf('quoted')) : null
    const acceptedAt = path.includes('accepted') ? stepAt(path.indexOf('accepted')) : null
    const total = priced.reduce((s, p) => s + (p.ok ? p.pricing.totalMinor : 0), 0)
    const formulas = new Set(lines.flatMap((l) => [...l.components.map((c) => c.gas), l.balanceGas]).map((id) => (id === 'air' ? 'air' : getGas(id).formula)))
    const order = em.create(OrderSchema, {
      number,
      customer,
      status: spec.status,
      reference: spec.reference,
      neededBy: spec.neededInDays === null ? null : new Date(now + spec.neededInDays * DAY_MS).toISOString().slice(0, 10),
      currency: SHOP_CURRENCY,
      totalMinor: total,
      rentalDays: 30,
      quoteValidUntil: quotedAt ? new Date(quotedAt.getTime() + 30 * DAY_MS).toISOString().slice(0, 10) : null,
      quoteSentAt: quotedAt,
      acceptedAt,
      notes: spec.notes ?? '',
      searchText: [number, customer.code, customer.company, spec.reference, ...formulas].join(' ').toLowerCase(),
      createdById: sales?.id ?? null,
      createdAt,
      updatedAt: path.length ? stepAt(path.length - 1) : createdAt,
    })
    lines.forEach((l, k) => {
      const p = priced[k]
      const mixture = lineMixture(l)
      em.create(OrderLineSchema, {
        order,
        lineNo: k + 1,
        description: describeMixture(l),
        components: [
          ...l.components.map((c) => ({ gas: c.gas, fraction: toMoleFraction(c.amount, c.unit), amount: c.amount, unit: c.unit })),
          { gas: l.balanceGas, fraction: mixture.x[mixture.x.length - 1] },
        ],
        balanceGas: l.balanceGas,
        blendTolerancePct: l.blendTolerancePct,
        certificationUncertaintyPct: l.certificationUncertaintyPct,
        waterVolumeL: l.waterVolumeL,
        valveOutlet: l.valveOutlet,
        quantity: l.quantity,
        finalPressureBarGauge: l.finalPressureBarGauge,
        method: l.method,
        priceMinor: p.ok ? p.pricing.totalMinor : 0,
        pricing: p.ok ? p.pricing : null,
      })
    })
    events.push({
      order,
      createdAt,
      path,
      stepAt,
      actors,
      customerEmail: customer.contactEmail,
      customerUserId: spec.customer === 'ALDB' ? (ctx.users['customer@demo.test']?.id ?? null) : null,
    })
  })
  await em.flush()
  for (const ev of events) {
    em.create(AuditEventSchema, {
      at: ev.createdAt,
      actorId: sales?.id ?? null,
      actorEmail: 'sales@demo.test',
      action: 'order.created',
      entityType: 'Order',
      entityId: String(ev.order.id),
      detail: null,
    })
    let from: OrderStatus = 'draft'
    ev.path.forEach((to, k) => {
      const actor =
        to === 'accepted' && ev.customerUserId
          ? { id: ev.customerUserId, email: 'customer@demo.test' }
          : (ev.actors[to] ?? { id: null, email: 'sales@demo.test' })
      const detail: Record<string, unknown> = { from, to }
      if (to === 'quoted') detail.emailedTo = ev.customerEmail
      em.create(AuditEventSchema, {
        at: ev.stepAt(k),
        actorId: actor.id,
        actorEmail: actor.email,
        action: 'order.transition',
        entityType: 'Order',
        entityId: String(ev.order.id),
        detail,
      })
      from = to
    })
  }
}

addSeedStep(async (em, ctx) => {
  seedPriceBook(em)
  await em.flush()
  await seedOrders(em, ctx)
})
