import { z } from 'zod'

/**
 * Wire shapes of the cylinder inventory. Pressures are bar gauge at 15 °C (as marked on the cylinder),
 * water volume in litres, dates ISO yyyy-mm-dd.
 */

export const CYLINDER_MATERIALS = ['steel', 'aluminium', 'composite'] as const
export const CylinderMaterialSchema = z.enum(CYLINDER_MATERIALS)
export type CylinderMaterial = z.infer<typeof CylinderMaterialSchema>

export const CYLINDER_STATUSES = ['available', 'reserved', 'filling', 'awaiting-analysis', 'full', 'shipped', 'quarantine', 'retired'] as const
export const CylinderStatusSchema = z.enum(CYLINDER_STATUSES)
export type CylinderStatus = z.infer<typeof CylinderStatusSchema>

/** Fillwright's words for the cylinder states. */
export const CYLINDER_STATUS_LABEL: Record<CylinderStatus, string> = {
  available: 'Ready for use',
  reserved: 'Booked for a fill',
  filling: 'On the manifold',
  'awaiting-analysis': 'Waiting for analysis',
  full: 'Filled and certified',
  shipped: 'With the customer',
  quarantine: 'Held back',
  retired: 'Out of service',
}

/** States a person may set by hand; the others follow the work (booking, filling, analysis, shipping). */
export const MANUAL_CYLINDER_STATUSES = ['available', 'quarantine', 'retired'] as const

/** Days ahead in which a periodic test counts as "due soon". */
export const TEST_DUE_SOON_DAYS = 90

const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/
export const IsoDateSchema = z
  .string()
  .regex(ISO_DATE, 'Use the date form yyyy-mm-dd.')
  .refine((s) => {
    const d = new Date(`${s}T00:00:00Z`)
    return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === s
  }, 'Not a real calendar date.')

export const CylinderResidualSchema = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('evacuated') }),
  z.strictObject({
    kind: z.literal('residual'),
    /** residual gauge pressure, bar */
    pressureBarGauge: z.number().min(0).max(1000),
    composition: z
      .array(z.strictObject({ gas: z.string().min(1).max(64), fraction: z.number().min(0).max(1) }))
      .max(20)
      .default([]),
  }),
])
export type CylinderResidual = z.infer<typeof CylinderResidualSchema>

const serial = z.string().trim().min(1, 'Give the serial number.').max(64)
/** a barcode is printed as Code 128: printable ASCII only */
const barcode = z
  .string()
  .trim()
  .min(1, 'Give the barcode.')
  .max(64)
  .regex(/^[\x21-\x7e]+$/, 'Letters, digits and printable symbols only, no spaces.')

const cylinderFields = {
  serial,
  barcode,
  waterVolumeL: z
    .number({ error: 'Give the water volume in litres.' })
    .positive('Water volume must be above 0 L.')
    .max(1000, 'Water volume above 1000 L is not a cylinder.'),
  servicePressureBar: z.number({ error: 'Give the service pressure in bar.' }).positive('Service pressure must be above 0 bar.').max(1000),
  testPressureBar: z.number({ error: 'Give the test pressure in bar.' }).positive('Test pressure must be above 0 bar.').max(1500),
  material: CylinderMaterialSchema,
  valveOutlet: z.string().trim().min(1, 'Give the valve outlet.').max(64),
  oxygenClean: z.boolean(),
  ownerId: z.number().int().positive().nullable(),
  lastTestDate: IsoDateSchema,
  nextTestDate: IsoDateSchema,
  residual: CylinderResidualSchema,
  notes: z.string().max(2000),
}

type PressureAndDates = { servicePressureBar: number; testPressureBar: number; lastTestDate: string; nextTestDate: string }
function checkPressuresAndDates(v: PressureAndDates, ctx: z.RefinementCtx): void {
  if (v.testPressureBar < v.servicePressureBar) {
    ctx.addIssue({ code: 'custom', path: ['testPressureBar'], message: 'The test pressure is at least the service pressure.' })
  }
  if (v.nextTestDate <= v.lastTestDate) {
    ctx.addIssue({ code: 'custom', path: ['nextTestDate'], message: 'The next test date comes after the last test date.' })
  }
}

/** Create a cylinder. */
export const CylinderInputSchema = z
  .strictObject({
    ...cylinderFields,
    oxygenClean: cylinderFields.oxygenClean.default(false),
    ownerId: cylinderFields.ownerId.default(null),
    residual: cylinderFields.residual.default({ kind: 'evacuated' }),
    notes: cylinderFields.notes.default(''),
    status: z.enum(MANUAL_CYLINDER_STATUSES).default('available'),
  })
  .superRefine(checkPressuresAndDates)
export type CylinderInput = z.input<typeof CylinderInputSchema>
export type CylinderInputParsed = z.output<typeof CylinderInputSchema>

/** Edit a cylinder: every field, plus the version read (a stale version is 409). */
export const CylinderUpdateSchema = z
  .strictObject({
    ...cylinderFields,
    status: z.enum(MANUAL_CYLINDER_STATUSES).optional(),
    expectedVersion: z.number().int().min(1),
  })
  .superRefine(checkPressuresAndDates)
export type CylinderUpdate = z.infer<typeof CylinderUpdateSchema>

export const TestStateSchema = z.enum(['ok', 'due-soon', 'overdue'])
export type TestState = z.infer<typeof TestStateSchema>

export const CylinderSchema = z.object({
  id: z.number().int(),
  serial: z.string(),
  barcode: z.string(),
  waterVolumeL: z.number(),
  servicePressureBar: z.number(),
  testPressureBar: z.number(),
  material: CylinderMaterialSchema,
  valveOutlet: z.string(),
  oxygenClean: z.boolean(),
  ownerId: z.number().int().nullable(),
  /** customer company, or null for shop-owned */
  ownerName: z.string().nullable(),
  lastTestDate: z.string(),
  nextTestDate: z.string(),
  testState: TestStateSchema,
  status: CylinderStatusSchema,
  residual: CylinderResidualSchema,
  notes: z.string(),
  /** true when the cylinder may not be booked for a fill or planned; `blockReason` says why */
  blocked: z.boolean(),
  blockReason: z.string().nullable(),
  version: z.number().int(),
  updatedAt: z.string(),
})
export type Cylinder = z.infer<typeof CylinderSchema>

export const CYLINDER_SORTS = ['serial', 'nextTestDate', 'waterVolumeL', 'status'] as const

export const CylinderListQuerySchema = z.strictObject({
  /** matches serial, barcode, valve outlet or owner */
  q: z.string().trim().max(100).optional(),
  status: CylinderStatusSchema.optional(),
  material: CylinderMaterialSchema.optional(),
  oxygenClean: z.enum(['true', 'false']).optional(),
  /** 'overdue': past the next test date; 'due-soon': due within TEST_DUE_SOON_DAYS days (overdue included) */
  test: z.enum(['overdue', 'due-soon']).optional(),
  ownerId: z.coerce.number().int().positive().optional(),
  sort: z.enum(CYLINDER_SORTS).default('serial'),
  dir: z.enum(['asc', 'desc']).default('asc'),
  limit: z.coerce.number().int().min(1).max(500).default(100),
  offset: z.coerce.number().int().min(0).default(0),
})
export type CylinderListQuery = z.input<typeof CylinderListQuerySchema>

export const CylinderListSchema = z.object({ items: z.array(CylinderSchema), total: z.number().int() })
export type CylinderList = z.infer<typeof CylinderListSchema>

export const CylinderOwnerOptionSchema = z.object({ id: z.number().int(), code: z.string(), company: z.string() })
export const CylinderOwnerOptionsSchema = z.array(CylinderOwnerOptionSchema)
export type CylinderOwnerOption = z.infer<typeof CylinderOwnerOptionSchema>

// ---- CSV import ------------------------------------------------------------------------------------------

/** Columns of the import file, in the order of the template; headers are matched without case, spaces or underscores. */
export const CYLINDER_CSV_COLUMNS = [
  { key: 'serial', header: 'serial', required: true, note: 'unique serial number' },
  { key: 'barcode', header: 'barcode', required: true, note: 'unique; printed as Code 128' },
  { key: 'waterVolumeL', header: 'water_volume_l', required: true, note: 'water capacity, litres' },
  { key: 'servicePressureBar', header: 'service_pressure_bar', required: true, note: 'bar gauge at 15 °C' },
  { key: 'testPressureBar', header: 'test_pressure_bar', required: true, note: 'bar gauge' },
  { key: 'material', header: 'material', required: true, note: 'steel, aluminium or composite' },
  { key: 'valveOutlet', header: 'valve_outlet', required: true, note: 'e.g. DIN 477 No. 10' },
  { key: 'oxygenClean', header: 'oxygen_clean', required: false, note: 'yes/no (default no)' },
  { key: 'ownerCode', header: 'owner_code', required: false, note: 'customer code; empty = shop-owned' },
  { key: 'lastTestDate', header: 'last_test_date', required: true, note: 'yyyy-mm-dd' },
  { key: 'nextTestDate', header: 'next_test_date', required: true, note: 'yyyy-mm-dd' },
  { key: 'notes', header: 'notes', required: false, note: 'free text' },
] as const

export const CylinderImportRowValuesSchema = z.object({
  serial: z.string(),
  barcode: z.string(),
  waterVolumeL: z.number(),
  servicePressureBar: z.number(),
  testPressureBar: z.number(),
  material: CylinderMaterialSchema,
  valveOutlet: z.string(),
  oxygenClean: z.boolean(),
  ownerId: z.number().int().nullable(),
  ownerCode: z.string().nullable(),
  lastTestDate: z.string(),
  nextTestDate: z.string(),
  notes: z.string(),
})

export const ImportRowErrorSchema = z.object({ field: z.string(), message: z.string() })

export const CylinderImportRowSchema = z.object({
  /** line number in the file (the header is line 1) */
  line: z.number().int(),
  ok: z.boolean(),
  /** the raw cells as read, keyed by column key */
  raw: z.record(z.string(), z.string()),
  /** the parsed row when ok */
  values: CylinderImportRowValuesSchema.nullable(),
  errors: z.array(ImportRowErrorSchema),
  /** an ok row whose next test date has passed: it imports, and shows as blocked */
  overdue: z.boolean(),
})
export type CylinderImportRow = z.infer<typeof CylinderImportRowSchema>

export const CylinderImportPreviewSchema = z.object({
  fileName: z.string(),
  rows: z.array(CylinderImportRowSchema),
  validCount: z.number().int(),
  errorCount: z.number().int(),
  /** problems with the file as a whole (unknown or missing columns) */
  fileErrors: z.array(z.string()),
})
export type CylinderImportPreview = z.infer<typeof CylinderImportPreviewSchema>

export const CylinderImportResultSchema = z.object({
  created: z.number().int(),
  skipped: z.number().int(),
  createdIds: z.array(z.number().int()),
  rows: z.array(CylinderImportRowSchema),
})
export type CylinderImportResult = z.infer<typeof CylinderImportResultSchema>

// ---- fill history ----------------------------------------------------------------------------------------

export const CylinderHistoryReadingSchema = z.object({
  id: z.number().int(),
  stepIndex: z.number().int(),
  gas: z.string(),
  pressureBarGauge: z.number().nullable(),
  pressureBarAbs: z.number().nullable(),
  temperatureC: z.number().nullable(),
  scaleKg: z.number().nullable(),
  outcome: z.enum(['on-target', 'under', 'over']),
  recordedBy: z.string().nullable(),
  recordedAt: z.string(),
})

export const CylinderHistoryRunSchema = z.object({
  runId: z.number().int(),
  planId: z.number().int(),
  orderNumber: z.string().nullable(),
  description: z.string().nullable(),
  status: z.enum(['ready', 'in-progress', 'paused', 'completed', 'aborted']),
  scheduledFor: z.string(),
  startedAt: z.string().nullable(),
  completedAt: z.string().nullable(),
  technician: z.string().nullable(),
  replanCount: z.number().int(),
  readings: z.array(CylinderHistoryReadingSchema),
})
export const CylinderHistorySchema = z.object({ cylinderId: z.number().int(), runs: z.array(CylinderHistoryRunSchema) })
export type CylinderHistory = z.infer<typeof CylinderHistorySchema>

// ---- shared rules ----------------------------------------------------------------------------------------

/** Today's date in the local time zone as yyyy-mm-dd. */
export function localIsoDate(d: Date = new Date()): string {
  const y = d.getFullYear()
  const m = String(d.getMonth() + 1).padStart(2, '0')
  const day = String(d.getDate()).padStart(2, '0')
  return `${y}-${m}-${day}`
}

/** Adds days to an ISO date (calendar arithmetic in UTC, so no daylight-saving surprises). */
export function addDaysIso(iso: string, days: number): string {
  const d = new Date(`${iso}T00:00:00Z`)
  d.setUTCDate(d.getUTCDate() + days)
  return d.toISOString().slice(0, 10)
}

/**
 * Whether a cylinder's periodic test is valid on a date: a cylinder may be filled up to and including its
 * next test date, and not after it (49 CFR 180.205 and ADR P200 forbid filling a cylinder past its
 * requalification date).
 */
export function testStateOn(nextTestDate: string, onDate: string): TestState {
  if (nextTestDate < onDate) return 'overdue'
  if (nextTestDate <= addDaysIso(onDate, TEST_DUE_SOON_DAYS)) return 'due-soon'
  return 'ok'
}
