import { defineEntity, type InferEntity, p } from '@mikro-orm/core'

/** A customer company of the shop. Contacts and billing details live here. */
export const CustomerSchema = defineEntity({
  name: 'Customer',
  tableName: 'customers',
  properties: {
    id: p.integer().primary().autoincrement(),
    code: p.string().length(16).unique(),
    company: p.string().length(200),
    contactName: p.string().length(200),
    contactEmail: p.string().length(254),
    phone: p.string().length(64).default(''),
    billingAddress: p.text().default(''),
    paymentProviderId: p.string().length(64).nullable(),
    createdAt: p.datetime().onCreate(() => new Date()),
    updatedAt: p
      .datetime()
      .onCreate(() => new Date())
      .onUpdate(() => new Date()),
  },
})
export type Customer = InferEntity<typeof CustomerSchema>
