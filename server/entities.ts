import { AuditEventSchema } from './modules/audit/audit-event.entity.ts'
import { SessionSchema } from './modules/auth/session.entity.ts'
import { InvoiceSchema, WebhookEventSchema } from './modules/billing/invoice.entity.ts'
import { CustomerSchema } from './modules/customers/customer.entity.ts'
import { CylinderSchema } from './modules/cylinders/cylinder.entity.ts'
import { OrderLineSchema, OrderSchema } from './modules/orders/order.entity.ts'
import { FillPlanSchema } from './modules/plans/fill-plan.entity.ts'
import { PriceEntrySchema } from './modules/pricing/price-entry.entity.ts'
import { AnalysisSchema, CertificateSchema } from './modules/quality/quality.entity.ts'
import { FillReadingSchema, FillRunSchema } from './modules/runs/fill-run.entity.ts'
import { UserSchema } from './modules/users/user.entity.ts'

/** Every entity of the app: one list read by the ORM config and the CLI. */
export const entities = [
  CustomerSchema,
  UserSchema,
  SessionSchema,
  AuditEventSchema,
  CylinderSchema,
  PriceEntrySchema,
  OrderSchema,
  OrderLineSchema,
  FillPlanSchema,
  FillRunSchema,
  FillReadingSchema,
  AnalysisSchema,
  CertificateSchema,
  InvoiceSchema,
  WebhookEventSchema,
]
