import { z } from 'zod'

/** The roles of Fillwright. A user may hold several. */
export const ROLES = ['admin', 'sales', 'blender', 'technician', 'qa', 'customer'] as const
export const RoleSchema = z.enum(ROLES)
export type Role = z.infer<typeof RoleSchema>

/** Roles of the shop's own staff (everyone but customers). */
export const STAFF_ROLES: readonly Role[] = ['admin', 'sales', 'blender', 'technician', 'qa']

export const LoginInputSchema = z.strictObject({
  email: z.string().trim().toLowerCase().email().max(254),
  password: z.string().min(1).max(512),
})
export type LoginInput = z.infer<typeof LoginInputSchema>

export const SessionUserSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  name: z.string(),
  roles: z.array(RoleSchema),
  customerId: z.number().int().nullable(),
})
export type SessionUser = z.infer<typeof SessionUserSchema>

export const LoginResultSchema = z.object({ user: SessionUserSchema, csrfToken: z.string() })
export const CsrfTokenSchema = z.object({ token: z.string() })
export const OkSchema = z.object({ ok: z.literal(true) })
