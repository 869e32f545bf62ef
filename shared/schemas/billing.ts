import { z } from 'zod'

/**
 * Invoices raised through the payment provider for shipped orders, and their payment. Money is integer
 * minor units (cents) with an ISO 4217 currency code.
 */

export const INVOICE_STATUSES = ['draft', 'open', 'paid', 'void', 'uncollectible'] as const
export const InvoiceStatusSchema = z.enum(INVOICE_STATUSES)
export type InvoiceStatus = z.infer<typeof InvoiceStatusSchema>

export const INVOICE_STATUS_LABEL: Record<InvoiceStatus, string> = {
  draft: 'Being prepared',
  open: 'Awaiting payment',
  paid: 'Paid',
  void: 'Cancelled',
  uncollectible: 'Written off',
}

export const InvoiceLineSchema = z.object({
  description: z.string(),
  amountMinor: z.number().int(),
})

export const InvoiceSchema = z.object({
  id: z.number().int(),
  orderId: z.number().int(),
  orderNumber: z.string(),
  customerId: z.number().int(),
  customerCompany: z.string(),
  number: z.string().nullable(),
  status: InvoiceStatusSchema,
  amountMinor: z.number().int(),
  currency: z.string(),
  /** the provider's hosted payment page (open invoices) */
  hostedUrl: z.string().nullable(),
  paidAt: z.string().nullable(),
  createdAt: z.string(),
})
export type Invoice = z.infer<typeof InvoiceSchema>
export const InvoiceListSchema = z.array(InvoiceSchema)

export const InvoiceListQuerySchema = z.strictObject({
  status: InvoiceStatusSchema.optional(),
  orderId: z.coerce.number().int().positive().optional(),
})
export type InvoiceListQuery = z.infer<typeof InvoiceListQuerySchema>

export const CreateInvoiceInputSchema = z.strictObject({
  orderId: z.number().int().positive(),
})
export type CreateInvoiceInput = z.infer<typeof CreateInvoiceInputSchema>

export const CreateInvoiceResultSchema = z.object({
  invoice: InvoiceSchema,
  lines: z.array(InvoiceLineSchema),
  emailed: z.boolean(),
})
export type CreateInvoiceResult = z.infer<typeof CreateInvoiceResultSchema>

/** a shipped order that has no invoice yet */
export const ReadyToInvoiceSchema = z.object({
  orderId: z.number().int(),
  orderNumber: z.string(),
  customerCompany: z.string(),
  reference: z.string(),
  totalMinor: z.number().int(),
  currency: z.string(),
  lines: z.array(InvoiceLineSchema),
})
export type ReadyToInvoice = z.infer<typeof ReadyToInvoiceSchema>
export const ReadyToInvoiceListSchema = z.array(ReadyToInvoiceSchema)

export const WebhookAckSchema = z.object({
  received: z.literal(true),
  /** the event was handled before (same event id): acknowledged, nothing done */
  duplicate: z.boolean(),
})

export const IdParamsSchema = z.strictObject({ id: z.coerce.number().int().positive() })

/** "1 234.50 EUR" style, from minor units (two decimals; the currencies the shop bills in have two) */
export function formatMoney(amountMinor: number, currency: string): string {
  const sign = amountMinor < 0 ? '−' : ''
  const abs = Math.abs(amountMinor)
  const major = Math.floor(abs / 100)
    .toString()
    .replace(/\B(?=(\d{3})+(?!\d))/g, '\u202f')
  return `${sign}${major}.${String(abs % 100).padStart(2, '0')} ${currency.toUpperCase()}`
}
