import { z } from 'zod'
import {
  CylinderSchema as PlanCylinderSchema,
  DisplayUnitsSchema,
  FillPlanRequestSchema,
  FillPlanResponseSchema,
  GaugeSchema,
  ModelIdSchema,
  PressureSchema,
  ScaleSchema,
  SourceSchema,
  TemperatureSchema,
  type FillPlanRequest,
} from './fill-plan.ts'
import { OrderStatusSchema } from './order-lifecycle.ts'

/**
 * Stored fill plans (the blender's plan workspace) as they cross the wire. A plan is computed on the server from
 * an order line (the specification), optionally a cylinder from the inventory, and the blender's options; the
 * server stores the request it built and the result it computed, never the client's numbers.
 */

export const PlanStatusSchema = z.enum(['draft', 'approved', 'superseded'])
export type PlanStatus = z.infer<typeof PlanStatusSchema>
export const PLAN_STATUS_LABEL: Record<PlanStatus, string> = {
  draft: 'Awaiting approval',
  approved: 'Approved for filling',
  superseded: 'Replaced by a newer version',
}

/** Settled filling pressure of an order line is stated at 15 °C (the order line's contract). */
export const LINE_REFERENCE_TEMPERATURE_C = 15

/** What the blender chooses; everything else comes from the order line and the cylinder. */
export const PlanOptionsSchema = z.strictObject({
  model: ModelIdSchema,
  /** default: the order line's method */
  method: z.enum(['partial-pressure', 'gravimetric']).optional(),
  order: z.enum(['auto', 'as-given']).default('auto'),
  /** gas temperature during the fill; default 15 °C */
  fillTemperature: TemperatureSchema.optional(),
  /** local barometric pressure for gauge readings; default 1.01325 bar absolute */
  atmosphericPressure: PressureSchema.optional(),
  /** lowest temperature in filling, storage or transport (condensation screen) */
  minimumTemperature: TemperatureSchema.optional(),
  maximumTemperature: TemperatureSchema.optional(),
  /** parent gases; default one pure source per component */
  sources: z.array(SourceSchema).min(1).optional(),
  gauge: GaugeSchema.optional(),
  scale: ScaleSchema.optional(),
  uncertaintyBudgetPercent: z.number().gt(0).optional(),
  cylinderRules: z.enum(['eu', 'us']).optional(),
  temperatureUncertaintyK: z.number().nonnegative().optional(),
  proposePremix: z.boolean().optional(),
  /** when no inventory cylinder is chosen: the cylinder to plan for (default: the line's water volume, evacuated) */
  cylinder: PlanCylinderSchema.optional(),
  /** units the plan is shown and printed in (default bar, °C) */
  displayUnits: DisplayUnitsSchema.optional(),
})
export type PlanOptions = z.input<typeof PlanOptionsSchema>
export type PlanOptionsParsed = z.output<typeof PlanOptionsSchema>

export const PlanCreateInputSchema = z.strictObject({
  orderLineId: z.number().int().positive(),
  /** an inventory cylinder; null plans for the order line's cylinder size */
  cylinderId: z.number().int().positive().nullable().default(null),
  options: PlanOptionsSchema,
})
export type PlanCreateInput = z.input<typeof PlanCreateInputSchema>

export const PlanIdParamsSchema = z.strictObject({ id: z.coerce.number().int().positive() })
export const PlanListQuerySchema = z.strictObject({
  orderLineId: z.coerce.number().int().positive().optional(),
  status: PlanStatusSchema.optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
})
export type PlanListQuery = z.input<typeof PlanListQuerySchema>

/** Approving acts on the version the blender saw: a stale version answers 409. */
export const PlanApproveInputSchema = z.strictObject({ version: z.number().int().min(1) })
const IsoDate = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use the date form yyyy-mm-dd')
  .refine((s) => {
    const d = new Date(`${s}T00:00:00Z`)
    return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === s
  }, 'Not a calendar date')
export const PlanAssignInputSchema = z.strictObject({
  cylinderIds: z.array(z.number().int().positive()).min(1, 'Choose at least one cylinder').max(200),
  technicianId: z.number().int().positive(),
  scheduledFor: IsoDate,
})
export type PlanAssignInput = z.infer<typeof PlanAssignInputSchema>
export const PlanEmailInputSchema = z.strictObject({ technicianId: z.number().int().positive() })
export const FillSheetQuerySchema = z.strictObject({ size: z.enum(['A4', 'LETTER']).default('A4') })

// ---- what the workspace reads -----------------------------------------------------------------------------

export const LineComponentSchema = z.object({
  gas: z.string(),
  /** mole fraction 0..1 */
  fraction: z.number(),
  /** as the customer asked, when known */
  amount: z.number().optional(),
  unit: z.enum(['percent', 'ppm', 'mol/mol']).optional(),
})

/** The order line as the plan workspace needs it: the specification and its order. */
export const PlanLineSpecSchema = z.object({
  id: z.number().int(),
  lineNo: z.number().int(),
  description: z.string(),
  components: z.array(LineComponentSchema),
  balanceGas: z.string(),
  blendTolerancePct: z.number(),
  certificationUncertaintyPct: z.number(),
  waterVolumeL: z.number(),
  valveOutlet: z.string(),
  quantity: z.number().int(),
  /** settled filling pressure, bar gauge at 15 °C */
  finalPressureBarGauge: z.number(),
  method: z.enum(['partial-pressure', 'gravimetric']),
  order: z.object({
    id: z.number().int(),
    number: z.string(),
    status: OrderStatusSchema,
    customer: z.string(),
    neededBy: z.string().nullable(),
  }),
})
export type PlanLineSpec = z.infer<typeof PlanLineSpecSchema>

/** An inventory cylinder as a plan sees it. */
export const PlanCylinderRefSchema = z.object({
  id: z.number().int(),
  serial: z.string(),
  waterVolumeL: z.number(),
  servicePressureBar: z.number(),
  testPressureBar: z.number(),
  material: z.string(),
  valveOutlet: z.string(),
  oxygenClean: z.boolean(),
  nextTestDate: z.string(),
  residual: z.object({
    kind: z.enum(['evacuated', 'residual']),
    pressureBarGauge: z.number().optional(),
    composition: z.array(z.object({ gas: z.string(), fraction: z.number() })).optional(),
  }),
})
export type PlanCylinderRef = z.infer<typeof PlanCylinderRefSchema>

export const PlanRunRefSchema = z.object({
  id: z.number().int(),
  cylinderId: z.number().int(),
  cylinderSerial: z.string(),
  technicianId: z.number().int().nullable(),
  scheduledFor: z.string(),
  status: z.string(),
})

export const PlanSummarySchema = z.object({
  id: z.number().int(),
  planVersion: z.number().int(),
  status: PlanStatusSchema,
  model: ModelIdSchema,
  method: z.enum(['partial-pressure', 'gravimetric']),
  blocking: z.boolean(),
  /** the first blocking finding, in words (null when approvable) */
  blockingReason: z.string().nullable(),
  version: z.number().int(),
  createdAt: z.string(),
  createdBy: z.string().nullable(),
  approvedAt: z.string().nullable(),
  approvedBy: z.string().nullable(),
  orderLineId: z.number().int(),
  orderId: z.number().int(),
  orderNumber: z.string(),
  lineNo: z.number().int(),
  lineDescription: z.string(),
  customer: z.string(),
  cylinderSerial: z.string().nullable(),
})
export type PlanSummary = z.infer<typeof PlanSummarySchema>

export const PlanDetailSchema = PlanSummarySchema.extend({
  line: PlanLineSpecSchema,
  cylinder: PlanCylinderRefSchema.nullable(),
  options: PlanOptionsSchema,
  request: FillPlanRequestSchema,
  result: FillPlanResponseSchema,
  assignedTechnicianId: z.number().int().nullable(),
  runs: z.array(PlanRunRefSchema),
})
export type PlanDetail = z.infer<typeof PlanDetailSchema>

export const PlanListSchema = z.object({ items: z.array(PlanSummarySchema) })

export const PlanQueueSchema = z.object({
  /** accepted orders with at least one line without an approved plan */
  ordersNeedingPlan: z.array(
    z.object({
      orderId: z.number().int(),
      number: z.string(),
      customer: z.string(),
      neededBy: z.string().nullable(),
      lines: z.array(
        z.object({
          id: z.number().int(),
          lineNo: z.number().int(),
          description: z.string(),
          /** 'none' (no plan yet), 'draft' (waiting for approval) or 'approved' */
          planState: z.enum(['none', 'draft', 'approved']),
        }),
      ),
    }),
  ),
  awaitingApproval: z.array(PlanSummarySchema),
})
export type PlanQueue = z.infer<typeof PlanQueueSchema>

export const TechnicianOptionSchema = z.object({ id: z.number().int(), name: z.string(), email: z.string() })
export const TechnicianOptionsSchema = z.array(TechnicianOptionSchema)
export type TechnicianOption = z.infer<typeof TechnicianOptionSchema>

export const PlanAssignResultSchema = z.object({ runs: z.array(PlanRunRefSchema) })
export const PlanEmailResultSchema = z.object({ sentTo: z.string(), messageId: z.string() })

// ---- the one way a stored plan's request is built (used by the server and by the browser preview) ------------

export class PlanSetupError extends Error {
  constructor(
    message: string,
    readonly field: string,
  ) {
    super(message)
    this.name = 'PlanSetupError'
  }
}

/**
 * The planning request for an order line, an optional inventory cylinder and the blender's options.
 * The line's fill pressure is bar gauge settled at 15 °C; its blend tolerance becomes the plan's tolerance.
 * @throws PlanSetupError when the cylinder holds gas of unknown composition (it must be evacuated or analysed
 *   first: never top up an unknown residue)
 */
export function planRequestFromLine(line: PlanLineSpec, cylinder: PlanCylinderRef | null, options: PlanOptionsParsed, asOfDate?: string): FillPlanRequest {
  let planCylinder: FillPlanRequest['cylinder']
  if (cylinder) {
    const r = cylinder.residual
    // a vented cylinder (0 bar gauge) still holds about 1 bar absolute of its last contents
    if (r.kind === 'residual' && !(r.composition && r.composition.length > 0)) {
      throw new PlanSetupError(
        `Cylinder ${cylinder.serial} holds ${r.pressureBarGauge ?? 0} bar (gauge) of gas of unknown composition: evacuate it or record the analysed residue before planning.`,
        'cylinderId',
      )
    }
    planCylinder = {
      waterVolume: { value: cylinder.waterVolumeL, unit: 'L' },
      servicePressure: { value: cylinder.servicePressureBar, unit: 'bar', reference: 'gauge' },
      testPressure: { value: cylinder.testPressureBar, unit: 'bar', reference: 'gauge' },
      material: cylinder.material,
      oxygenClean: cylinder.oxygenClean,
      nextTestDate: cylinder.nextTestDate,
      residual:
        r.kind === 'residual' && r.composition
          ? {
              kind: 'residual',
              pressure: { value: r.pressureBarGauge ?? 0, unit: 'bar', reference: 'gauge' },
              composition: r.composition.map((c) => ({ gas: c.gas, fraction: c.fraction })),
            }
          : { kind: 'evacuated' },
    }
  } else {
    planCylinder = options.cylinder ?? {
      waterVolume: { value: line.waterVolumeL, unit: 'L' },
      servicePressure: { value: line.finalPressureBarGauge, unit: 'bar', reference: 'gauge' },
      oxygenClean: false,
      residual: { kind: 'evacuated' },
    }
  }
  const request: FillPlanRequest = {
    target: line.components.map((c) =>
      c.gas === line.balanceGas ? { gas: c.gas, fraction: c.fraction, balance: true } : { gas: c.gas, fraction: c.fraction },
    ),
    finalPressure: { value: line.finalPressureBarGauge, unit: 'bar', reference: 'gauge' },
    referenceTemperature: { value: LINE_REFERENCE_TEMPERATURE_C, unit: 'C' },
    fillTemperature: options.fillTemperature ?? { value: LINE_REFERENCE_TEMPERATURE_C, unit: 'C' },
    cylinder: planCylinder,
    sources: options.sources ?? line.components.map((c) => ({ gas: c.gas })),
    order: options.order,
    model: options.model,
    method: options.method ?? line.method,
    blendTolerancePercent: line.blendTolerancePct,
  }
  if (options.atmosphericPressure) request.atmosphericPressure = options.atmosphericPressure
  if (options.minimumTemperature) request.minimumTemperature = options.minimumTemperature
  if (options.maximumTemperature) request.maximumTemperature = options.maximumTemperature
  if (options.gauge) request.gauge = options.gauge
  if (options.scale) request.scale = options.scale
  if (options.uncertaintyBudgetPercent !== undefined) request.uncertaintyBudgetPercent = options.uncertaintyBudgetPercent
  if (options.cylinderRules) request.cylinderRules = options.cylinderRules
  if (options.temperatureUncertaintyK !== undefined) request.temperatureUncertaintyK = options.temperatureUncertaintyK
  if (options.proposePremix !== undefined) request.proposePremix = options.proposePremix
  if (options.displayUnits) request.displayUnits = options.displayUnits
  if (asOfDate) request.asOfDate = asOfDate
  return request
}
