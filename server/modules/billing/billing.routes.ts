import {
  CreateInvoiceInputSchema,
  CreateInvoiceResultSchema,
  IdParamsSchema,
  InvoiceListQuerySchema,
  InvoiceListSchema,
  InvoiceSchema,
  ReadyToInvoiceListSchema,
  WebhookAckSchema,
} from '#shared/schemas/billing.ts'
import { defineRoute } from '../../lib/route.ts'
import * as billing from './billing.service.ts'

const SALES = ['sales', 'admin'] as const

defineRoute({
  method: 'get',
  path: '/api/invoices/ready',
  summary: 'Shipped orders without an invoice, with the items they would be invoiced with',
  tags: ['billing'],
  access: SALES,
  response: ReadyToInvoiceListSchema,
  handler: ({ em }) => billing.readyToInvoice(em),
})

defineRoute({
  method: 'get',
  path: '/api/invoices',
  summary: 'Invoices (a customer sees only their own)',
  tags: ['billing'],
  access: ['sales', 'admin', 'customer'],
  query: InvoiceListQuerySchema,
  response: InvoiceListSchema,
  handler: ({ em, user, query }) => billing.listInvoices(em, user, query),
})

defineRoute({
  method: 'get',
  path: '/api/invoices/:id',
  summary: 'One invoice with its status and, while open, the hosted payment page',
  tags: ['billing'],
  access: ['sales', 'admin', 'customer'],
  params: IdParamsSchema,
  response: InvoiceSchema,
  handler: ({ em, user, params }) => billing.getInvoice(em, user, params.id),
})

defineRoute({
  method: 'post',
  path: '/api/invoices',
  summary: "Invoice a shipped order through the payment provider; the order moves to 'invoiced'",
  tags: ['billing'],
  access: SALES,
  body: CreateInvoiceInputSchema,
  response: CreateInvoiceResultSchema,
  successStatus: 201,
  handler: ({ em, deps, user, body, req }) => billing.createInvoice(em, deps, user, body.orderId, (err) => req.log?.error({ err }, 'invoice e-mail not sent')),
})

// Public and CSRF-exempt: the provider authenticates by signing the raw body (express.raw in server/app.ts keeps
// it a Buffer, so no body schema here: the handler verifies the signature before reading anything).
defineRoute({
  method: 'post',
  path: '/api/payments/webhook',
  summary: 'Payment provider events (signed; each event handled once): invoice.paid marks the invoice and order paid',
  tags: ['billing'],
  access: 'public',
  response: WebhookAckSchema,
  handler: ({ em, deps, req }) => billing.handleWebhook(em, deps, req.body, req.get('stripe-signature')),
})
