import { defineEntity, type InferEntity, p } from '@mikro-orm/core'
import type { Role } from '#shared/schemas/auth.ts'
import { CustomerSchema } from '../customers/customer.entity.ts'

/** A person who signs in. A user may hold several roles; a customer user belongs to one customer. */
export const UserSchema = defineEntity({
  name: 'User',
  tableName: 'users',
  properties: {
    id: p.integer().primary().autoincrement(),
    email: p.string().length(254).unique(),
    name: p.string().length(200),
    passwordHash: p.string().length(255).lazy(true, false),
    roles: p.json<Role[]>(),
    active: p.boolean().default(true),
    customer: p.manyToOne(CustomerSchema).nullable().ref(false),
    createdAt: p.datetime().onCreate(() => new Date()),
    updatedAt: p
      .datetime()
      .onCreate(() => new Date())
      .onUpdate(() => new Date()),
  },
})
export type User = InferEntity<typeof UserSchema>
