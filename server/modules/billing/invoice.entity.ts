import { defineEntity, type InferEntity, p } from '@mikro-orm/core'
import { OrderSchema } from '../orders/order.entity.ts'

/** An invoice raised through the payment provider for a shipped order. Money in integer minor units. */
export const InvoiceSchema = defineEntity({
  name: 'Invoice',
  tableName: 'invoices',
  properties: {
    id: p.integer().primary().autoincrement(),
    order: p.manyToOne(OrderSchema).ref(false).unique(),
    customerId: p.integer().index(),
    providerInvoiceId: p.string().length(64).unique(),
    number: p.string().length(64).nullable(),
    status: p.enum(['draft', 'open', 'paid', 'void', 'uncollectible']).default('draft'),
    amountMinor: p.integer(),
    currency: p.string().length(3),
    hostedUrl: p.text().nullable(),
    paidAt: p.datetime().nullable(),
    createdAt: p.datetime().onCreate(() => new Date()),
    updatedAt: p
      .datetime()
      .onCreate(() => new Date())
      .onUpdate(() => new Date()),
  },
})
export type Invoice = InferEntity<typeof InvoiceSchema>

/** Webhook events already handled (idempotency: a redelivered event is acknowledged and ignored). */
export const WebhookEventSchema = defineEntity({
  name: 'WebhookEvent',
  tableName: 'webhook_events',
  properties: {
    id: p.string().length(64).primary(),
    type: p.string().length(64),
    receivedAt: p.datetime().onCreate(() => new Date()),
  },
})
