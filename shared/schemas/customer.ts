import { z } from 'zod'

/**
 * Customers of the shop as they cross the wire. The code is the short handle the sales desk types
 * (upper-case letters, digits and dashes), unique across customers.
 */
export const CustomerCodeSchema = z
  .string()
  .trim()
  .toUpperCase()
  .regex(/^[A-Z0-9][A-Z0-9-]{1,15}$/, 'Use 2–16 letters, digits or dashes, starting with a letter or digit')

export const CustomerInputSchema = z.strictObject({
  code: CustomerCodeSchema,
  company: z.string().trim().min(1, 'Enter the company name').max(200),
  contactName: z.string().trim().min(1, 'Enter the contact person').max(200),
  contactEmail: z.string().trim().toLowerCase().email('Enter an e-mail address quotes can go to').max(254),
  phone: z.string().trim().max(64),
  billingAddress: z.string().trim().max(2000),
})
export type CustomerInput = z.infer<typeof CustomerInputSchema>

export const CustomerSchema = z.object({
  id: z.number().int(),
  code: z.string(),
  company: z.string(),
  contactName: z.string(),
  contactEmail: z.string(),
  phone: z.string(),
  billingAddress: z.string(),
  createdAt: z.string(),
  updatedAt: z.string(),
})
export type Customer = z.infer<typeof CustomerSchema>

export const CustomerListQuerySchema = z.strictObject({
  /** text search on code, company, contact and e-mail */
  q: z.string().trim().max(100).optional(),
})
export type CustomerListQuery = z.infer<typeof CustomerListQuerySchema>

export const CustomerListSchema = z.object({ items: z.array(CustomerSchema) })
export type CustomerList = z.infer<typeof CustomerListSchema>

export const EMPTY_CUSTOMER_INPUT: CustomerInput = { code: '', company: '', contactName: '', contactEmail: '', phone: '', billingAddress: '' }

export const CustomerIdParamsSchema = z.strictObject({ id: z.coerce.number().int().positive() })
