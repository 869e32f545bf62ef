import { z } from 'zod'
import { RoleSchema } from './auth.ts'

/** Accounts as the admin manages them. Passwords: at least 10 characters. */
export const PasswordSchema = z.string().min(10, 'Use at least 10 characters').max(200)

const RolesSchema = z.array(RoleSchema).min(1, 'Give the account at least one role').max(6)

export const UserCreateInputSchema = z
  .strictObject({
    email: z.string().trim().toLowerCase().email('Enter an e-mail address').max(254),
    name: z.string().trim().min(1, 'Enter the person’s name').max(200),
    roles: RolesSchema,
    customerId: z.number().int().positive().nullable(),
    password: PasswordSchema,
  })
  .refine((u) => !u.roles.includes('customer') || u.customerId !== null, { message: 'A customer account belongs to a customer', path: ['customerId'] })
export type UserCreateInput = z.infer<typeof UserCreateInputSchema>

export const UserUpdateInputSchema = z
  .strictObject({
    name: z.string().trim().min(1, 'Enter the person’s name').max(200),
    roles: RolesSchema,
    customerId: z.number().int().positive().nullable(),
    active: z.boolean(),
  })
  .refine((u) => !u.roles.includes('customer') || u.customerId !== null, { message: 'A customer account belongs to a customer', path: ['customerId'] })
export type UserUpdateInput = z.infer<typeof UserUpdateInputSchema>

export const UserPasswordResetSchema = z.strictObject({ password: PasswordSchema })
export const OwnPasswordChangeSchema = z.strictObject({ currentPassword: z.string().min(1).max(200), newPassword: PasswordSchema })

export const UserSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  name: z.string(),
  roles: z.array(RoleSchema),
  active: z.boolean(),
  customerId: z.number().int().nullable(),
  customerName: z.string().nullable(),
  createdAt: z.string(),
})
export type User = z.infer<typeof UserSchema>
export const UserListSchema = z.object({ items: z.array(UserSchema) })
export const UserIdParamsSchema = z.strictObject({ id: z.coerce.number().int().positive() })

export const AuditQuerySchema = z.strictObject({
  entityType: z.string().trim().max(64).optional(),
  entityId: z.string().trim().max(64).optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
})
export const AuditEventSchema = z.object({
  id: z.number().int(),
  at: z.string(),
  actorEmail: z.string().nullable(),
  action: z.string(),
  entityType: z.string(),
  entityId: z.string(),
  detail: z.record(z.string(), z.unknown()).nullable(),
})
export const AuditListSchema = z.object({ items: z.array(AuditEventSchema) })
