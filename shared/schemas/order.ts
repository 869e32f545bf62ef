import { z } from 'zod'
import { isKnownGas } from '../physics/gases.ts'
import { type OrderStatus, OrderStatusSchema } from './order-lifecycle.ts'
import { LinePricingSchema, toMoleFraction } from './line-pricing.ts'

/**
 * Orders and their mixture specifications as they cross the wire.
 *
 * A line names its minor components with the amount the customer asked for, in the unit they used
 * (amount fractions: % mol/mol, ppm = µmol/mol, or mol/mol), and a balance gas that makes up the rest.
 * The stored composition keeps both: the mole fraction (0..1) the shop works with and the customer's
 * amount and unit, so the quote and the certificate can repeat the request as it was made.
 */

export const COMPONENT_UNITS = ['percent', 'ppm', 'mol/mol'] as const
export const ComponentUnitSchema = z.enum(COMPONENT_UNITS)
export type ComponentUnit = z.infer<typeof ComponentUnitSchema>
export const COMPONENT_UNIT_LABEL: Record<ComponentUnit, string> = {
  percent: '% mol/mol',
  ppm: 'ppm (µmol/mol)',
  'mol/mol': 'mol/mol',
}
export const COMPONENT_UNIT_SHORT: Record<ComponentUnit, string> = { percent: '%', ppm: 'ppm', 'mol/mol': 'mol/mol' }

export const FILL_METHODS = ['partial-pressure', 'gravimetric'] as const
export const FillMethodSchema = z.enum(FILL_METHODS)
export type FillMethod = z.infer<typeof FillMethodSchema>
export const FILL_METHOD_LABEL: Record<FillMethod, string> = { 'partial-pressure': 'Partial pressure', gravimetric: 'Gravimetric' }

export const GasIdSchema = z
  .string()
  .trim()
  .min(1, 'Choose a gas')
  .max(64)
  .refine((id) => isKnownGas(id), 'Not a gas of the gas library')

const DATE_ONLY = /^\d{4}-\d{2}-\d{2}$/
export const DateOnlySchema = z
  .string()
  .regex(DATE_ONLY, 'Use the date form yyyy-mm-dd')
  .refine((s) => {
    const d = new Date(`${s}T00:00:00Z`)
    return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === s
  }, 'Not a calendar date')

export const SpecComponentInputSchema = z.strictObject({
  gas: GasIdSchema,
  amount: z.number({ error: 'Enter the amount' }).positive('The amount must be above 0').finite(),
  unit: ComponentUnitSchema,
})
export type SpecComponentInput = z.infer<typeof SpecComponentInputSchema>

/** Highest settled fill pressure the quote screen accepts, bar gauge at 15 °C (cylinders of the trade go to 300 bar). */
export const MAX_FILL_PRESSURE_BAR_GAUGE = 300

export const OrderLineInputSchema = z
  .strictObject({
    /** free text shown on the quote; the server writes one from the composition when empty */
    description: z.string().trim().max(200),
    /** the minor components; the balance gas is given separately and makes up the rest */
    components: z.array(SpecComponentInputSchema).max(20, 'At most 20 components'),
    balanceGas: GasIdSchema,
    /** allowed deviation of the prepared content from the requested one, relative % */
    blendTolerancePct: z.number({ error: 'Enter the blend tolerance' }).positive('Above 0 %').max(100),
    /** expanded (k = 2) relative uncertainty of the certified values, % */
    certificationUncertaintyPct: z.number({ error: 'Enter the certification uncertainty' }).positive('Above 0 %').max(100),
    waterVolumeL: z.number({ error: 'Enter the cylinder water volume' }).positive('Above 0 L').max(1000, 'At most 1000 L'),
    valveOutlet: z.string().trim().min(1, 'Enter the valve outlet').max(64),
    quantity: z.number({ error: 'Enter the number of cylinders' }).int('Whole cylinders').min(1, 'At least 1 cylinder').max(1000),
    /** settled filling pressure, bar gauge at 15 °C */
    finalPressureBarGauge: z
      .number({ error: 'Enter the fill pressure' })
      .positive('Above 0 bar')
      .max(MAX_FILL_PRESSURE_BAR_GAUGE, `At most ${MAX_FILL_PRESSURE_BAR_GAUGE} bar gauge`),
    method: FillMethodSchema,
  })
  .superRefine((line, ctx) => {
    const seen = new Map<string, number>()
    let sum = 0
    line.components.forEach((c, i) => {
      if (seen.has(c.gas)) ctx.addIssue({ code: 'custom', path: ['components', i, 'gas'], message: 'This gas is listed twice; combine the amounts' })
      seen.set(c.gas, i)
      if (c.gas === line.balanceGas)
        ctx.addIssue({ code: 'custom', path: ['components', i, 'gas'], message: 'The balance gas makes up the rest; do not list it as a component' })
      const x = toMoleFraction(c.amount, c.unit)
      if (x >= 1) ctx.addIssue({ code: 'custom', path: ['components', i, 'amount'], message: 'A minor component must be below 100 %' })
      sum += x
    })
    if (sum >= 1) {
      ctx.addIssue({ code: 'custom', path: ['components'], message: `The components add up to ${(sum * 100).toFixed(4)} %; leave room for the balance gas` })
    }
  })
export type OrderLineInput = z.infer<typeof OrderLineInputSchema>

/** Default quoted rental period, days (rental beyond it is charged at the day rate). */
export const DEFAULT_RENTAL_DAYS = 30

export const OrderInputSchema = z.strictObject({
  customerId: z.number({ error: 'Choose the customer' }).int().positive('Choose the customer'),
  /** the customer's reference (PO number, project) */
  reference: z.string().trim().max(120),
  neededBy: DateOnlySchema.nullable(),
  /** rental period included in the quote, days */
  rentalDays: z.number({ error: 'Enter the rental days' }).int('Whole days').min(0).max(3650),
  notes: z.string().trim().max(4000),
  lines: z.array(OrderLineInputSchema).min(1, 'Add at least one mixture').max(50),
})
export type OrderInput = z.infer<typeof OrderInputSchema>

/** Editing a draft: the version read with it, so a stale edit is refused (409). */
export const OrderUpdateInputSchema = OrderInputSchema.extend({ version: z.number().int().min(1) })
export type OrderUpdateInput = z.infer<typeof OrderUpdateInputSchema>

export const TransitionInputSchema = z.strictObject({
  to: OrderStatusSchema,
  /** optional: the version the user acted on; a stale version answers 409 */
  version: z.number().int().min(1).optional(),
})
export type TransitionInput = z.infer<typeof TransitionInputSchema>

export const OrderIdParamsSchema = z.strictObject({ id: z.coerce.number().int().positive() })

// ---- list ------------------------------------------------------------------------------------------------

export const ORDER_SORTS = ['-created', 'created', '-number', 'number', 'neededBy', '-neededBy', '-total', 'total'] as const
export const OrderSortSchema = z.enum(ORDER_SORTS)
export type OrderSort = z.infer<typeof OrderSortSchema>

export const ORDER_LIST_MAX_LIMIT = 200

export const OrderListQuerySchema = z.strictObject({
  /** one status or several, comma-separated (e.g. "quoted,accepted") */
  status: z
    .string()
    .trim()
    .max(200)
    .optional()
    .transform((s) =>
      s
        ? s
            .split(',')
            .map((x) => x.trim())
            .filter(Boolean)
        : undefined,
    )
    .pipe(z.array(OrderStatusSchema).optional()),
  customerId: z.coerce.number().int().positive().optional(),
  /** text search on order number, company and customer reference */
  q: z.string().trim().max(100).optional(),
  sort: OrderSortSchema.default('-created'),
  cursor: z.string().max(300).optional(),
  limit: z.coerce.number().int().min(1).max(ORDER_LIST_MAX_LIMIT).default(50),
})
/** the query as the client sends it */
export type OrderListQuery = z.input<typeof OrderListQuerySchema>
/** the query as the server reads it (parsed, defaults applied) */
export type OrderListParams = z.output<typeof OrderListQuerySchema>

export const OrderCustomerRefSchema = z.object({ id: z.number().int(), code: z.string(), company: z.string() })

export const OrderSummarySchema = z.object({
  id: z.number().int(),
  number: z.string(),
  status: OrderStatusSchema,
  customer: OrderCustomerRefSchema,
  reference: z.string(),
  neededBy: z.string().nullable(),
  totalMinor: z.number().int(),
  currency: z.string(),
  createdAt: z.string(),
  /** the first line's description, "+ n more" when there are several */
  lineSummary: z.string(),
  cylinders: z.number().int(),
})
export type OrderSummary = z.infer<typeof OrderSummarySchema>

export const OrderListSchema = z.object({
  items: z.array(OrderSummarySchema),
  nextCursor: z.string().nullable(),
  /** number of matching orders (first page only; null on later pages and for text searches, which would scan every order) */
  total: z.number().int().nullable(),
})
export type OrderList = z.infer<typeof OrderListSchema>

// ---- detail ----------------------------------------------------------------------------------------------

export const StoredComponentSchema = z.object({
  gas: z.string(),
  /** mole fraction 0..1 */
  fraction: z.number(),
  /** as the customer asked (absent on the balance gas) */
  amount: z.number().optional(),
  unit: ComponentUnitSchema.optional(),
})

export const OrderLineSchema = z.object({
  id: z.number().int(),
  lineNo: z.number().int(),
  description: z.string(),
  /** all components including the balance gas, mole fractions summing to 1 */
  components: z.array(StoredComponentSchema),
  balanceGas: z.string(),
  blendTolerancePct: z.number(),
  certificationUncertaintyPct: z.number(),
  waterVolumeL: z.number(),
  valveOutlet: z.string(),
  quantity: z.number().int(),
  finalPressureBarGauge: z.number(),
  method: FillMethodSchema,
  priceMinor: z.number().int(),
  /** the breakdown the price was built from (as computed when the order was last saved or quoted) */
  pricing: LinePricingSchema.nullable(),
})
export type OrderLine = z.infer<typeof OrderLineSchema>

export const TimelineEventSchema = z.object({
  at: z.string(),
  action: z.string(),
  /** what happened, in words */
  text: z.string(),
  actor: z.string().nullable(),
  from: OrderStatusSchema.nullable(),
  to: OrderStatusSchema.nullable(),
})
export type TimelineEvent = z.infer<typeof TimelineEventSchema>

export const AvailableTransitionSchema = z.object({ to: OrderStatusSchema, action: z.string() })

export const OrderDetailSchema = OrderSummarySchema.extend({
  customer: OrderCustomerRefSchema.extend({ contactName: z.string(), contactEmail: z.string() }),
  rentalDays: z.number().int(),
  notes: z.string(),
  quoteValidUntil: z.string().nullable(),
  quoteSentAt: z.string().nullable(),
  acceptedAt: z.string().nullable(),
  updatedAt: z.string(),
  version: z.number().int(),
  lines: z.array(OrderLineSchema),
  timeline: z.array(TimelineEventSchema),
  /** the moves the signed-in user may make from the current status */
  transitions: z.array(AvailableTransitionSchema),
})
export type OrderDetail = z.infer<typeof OrderDetailSchema>

/** The status counts behind the sales and customer home queues. */
export const OrderQueueCountsSchema = z.object({ counts: z.record(OrderStatusSchema, z.number().int()) })
export type OrderQueueCounts = z.infer<typeof OrderQueueCountsSchema>

/** Statuses a customer still waits on (not finished, not cancelled). */
export const OPEN_ORDER_STATUSES: readonly OrderStatus[] = ['draft', 'quoted', 'accepted', 'planned', 'filling', 'analysis', 'released', 'shipped', 'invoiced']

/** An order line as the edit form holds it, from a stored line. */
export function lineToInput(line: OrderLine): OrderLineInput {
  return {
    description: line.description,
    components: line.components
      .filter((c) => c.gas !== line.balanceGas)
      .map((c) => ({ gas: c.gas, amount: c.amount ?? c.fraction * 100, unit: c.unit ?? 'percent' })),
    balanceGas: line.balanceGas,
    blendTolerancePct: line.blendTolerancePct,
    certificationUncertaintyPct: line.certificationUncertaintyPct,
    waterVolumeL: line.waterVolumeL,
    valveOutlet: line.valveOutlet,
    quantity: line.quantity,
    finalPressureBarGauge: line.finalPressureBarGauge,
    method: line.method,
  }
}
