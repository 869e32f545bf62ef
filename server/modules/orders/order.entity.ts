import { defineEntity, type InferEntity, p } from '@mikro-orm/core'
import type { OrderStatus } from '#shared/schemas/order-lifecycle.ts'
import { ORDER_STATUSES } from '#shared/schemas/order-lifecycle.ts'
import type { LinePricing } from '#shared/schemas/quote.ts'
import { CustomerSchema } from '../customers/customer.entity.ts'

/**
 * A mixture component of a specification: gas id and mole fraction (0..1); for the minor components also the
 * amount and unit the customer asked in (absent on the balance gas).
 */
export interface SpecComponent {
  gas: string
  fraction: number
  amount?: number
  unit?: 'percent' | 'ppm' | 'mol/mol'
}

/**
 * A customer's order (which begins life as a specification and a quote). Money in integer minor units.
 * Listed at scale: indexes support keyset paging by (createdAt, id) overall, per status and per customer.
 */
export const OrderSchema = defineEntity({
  name: 'Order',
  tableName: 'orders',
  indexes: [
    { properties: ['createdAt', 'id'] },
    { properties: ['status', 'createdAt', 'id'] },
    { properties: ['customer', 'createdAt', 'id'] },
    { properties: ['neededBy', 'id'] },
    { properties: ['totalMinor', 'id'] },
  ],
  properties: {
    id: p.integer().primary().autoincrement(),
    number: p.string().length(32).unique(),
    customer: p.manyToOne(CustomerSchema).ref(false),
    status: p.enum(ORDER_STATUSES as unknown as OrderStatus[]).default('draft'),
    reference: p.string().length(120).default(''),
    neededBy: p.string().length(10).nullable(),
    currency: p.string().length(3).default('EUR'),
    totalMinor: p.integer().default(0),
    quoteValidUntil: p.string().length(10).nullable(),
    /** rental period included in the quoted price, days */
    rentalDays: p.integer().default(30),
    quoteSentAt: p.datetime().nullable(),
    acceptedAt: p.datetime().nullable(),
    notes: p.text().default(''),
    /** searchable text: number, customer company, reference, gas formulas */
    searchText: p.text().default(''),
    createdById: p.integer().nullable(),
    version: p.integer().version(),
    createdAt: p.datetime().onCreate(() => new Date()),
    updatedAt: p
      .datetime()
      .onCreate(() => new Date())
      .onUpdate(() => new Date()),
  },
})
export type Order = InferEntity<typeof OrderSchema>

/**
 * One mixture specification on an order: composition with balance gas, tolerances, cylinder size,
 * valve outlet, quantity of cylinders and the settled filling pressure.
 */
export const OrderLineSchema = defineEntity({
  name: 'OrderLine',
  tableName: 'order_lines',
  properties: {
    id: p.integer().primary().autoincrement(),
    order: p.manyToOne(OrderSchema).ref(false).index(),
    lineNo: p.integer(),
    description: p.string().length(200),
    /** all components including the balance gas, fractions summing to 1 */
    components: p.json<SpecComponent[]>(),
    balanceGas: p.string().length(64),
    /** blend tolerance, relative % of each minor component's value */
    blendTolerancePct: p.float().columnType('double precision'),
    /** certification (analysis) expanded uncertainty, relative % */
    certificationUncertaintyPct: p.float().columnType('double precision'),
    waterVolumeL: p.float().columnType('double precision'),
    valveOutlet: p.string().length(64),
    quantity: p.integer(),
    /** settled filling pressure, bar gauge at 15 °C */
    finalPressureBarGauge: p.float().columnType('double precision'),
    method: p.enum(['partial-pressure', 'gravimetric']).default('partial-pressure'),
    priceMinor: p.integer().default(0),
    /** the breakdown behind priceMinor, as computed when the line was last saved or quoted */
    pricing: p.json<LinePricing>().nullable(),
  },
})
export type OrderLine = InferEntity<typeof OrderLineSchema>
