import { z } from 'zod'
import { IsoDateSchema } from './cylinder.ts'

/**
 * Wire shapes of fill runs: one cylinder filled at the manifold from an approved plan, step by step.
 * Targets and readings are sent in bar and °C with the reference said on every pressure; the technician's
 * screen converts to the display unit at the edge. Also the two pure helpers both sides need: unit
 * conversion of a reading, and the target at a measured temperature (constant density).
 */

// ---- units --------------------------------------------------------------------------------------------------

export const READING_PRESSURE_UNITS = ['bar', 'mbar', 'psi', 'kPa', 'MPa', 'Pa', 'atm'] as const
export const READING_TEMPERATURE_UNITS = ['C', 'F', 'K'] as const
export const READING_MASS_UNITS = ['kg', 'g', 'lb'] as const
export type ReadingPressureUnit = (typeof READING_PRESSURE_UNITS)[number]
export type ReadingTemperatureUnit = (typeof READING_TEMPERATURE_UNITS)[number]

/**
 * Pa per unit. bar, mbar, kPa, MPa, Pa: SI Brochure 9th ed. (2019) Table 8 (exact). atm: 101 325 Pa by
 * definition (10th CGPM 1954). psi: 0.45359237 kg × 9.80665 m/s² / (0.0254 m)² (NIST SP 811 App. B.8).
 */
export const PA_PER_PRESSURE_UNIT: Record<ReadingPressureUnit, number> = {
  bar: 100_000,
  mbar: 100,
  psi: (0.45359237 * 9.80665) / (0.0254 * 0.0254),
  kPa: 1000,
  MPa: 1e6,
  Pa: 1,
  atm: 101_325,
}
/** kg per unit; lb: international avoirdupois pound, 0.45359237 kg exactly (1959 agreement). */
export const KG_PER_MASS_UNIT: Record<(typeof READING_MASS_UNITS)[number], number> = { kg: 1, g: 0.001, lb: 0.45359237 }

export function toBar(value: number, unit: ReadingPressureUnit): number {
  return (value * PA_PER_PRESSURE_UNIT[unit]) / PA_PER_PRESSURE_UNIT.bar
}
export function fromBar(bar: number, unit: ReadingPressureUnit): number {
  return (bar * PA_PER_PRESSURE_UNIT.bar) / PA_PER_PRESSURE_UNIT[unit]
}
/** °C from a temperature in C, F or K (SI Brochure §2.3.1: t/°C = T/K − 273.15; °F = 9/5 °C + 32). */
export function toCelsius(value: number, unit: ReadingTemperatureUnit): number {
  if (unit === 'C') return value
  if (unit === 'K') return value - 273.15
  return ((value - 32) * 5) / 9
}
export function fromCelsius(c: number, unit: ReadingTemperatureUnit): number {
  if (unit === 'C') return c
  if (unit === 'K') return c + 273.15
  return (c * 9) / 5 + 32
}

// ---- quantities ---------------------------------------------------------------------------------------------

const finite = () => z.number().refine(Number.isFinite, 'must be a finite number')
const barAbs = z.object({ value: z.number(), unit: z.literal('bar'), reference: z.literal('absolute') })
const barGauge = z.object({ value: z.number(), unit: z.literal('bar'), reference: z.literal('gauge') })
const kg = z.object({ value: z.number(), unit: z.literal('kg') })
const celsius = z.object({ value: z.number(), unit: z.literal('C') })

export const TemperatureRowSchema = z.object({ temperature: celsius, pressure: barAbs, gaugePressure: barGauge })
export type TemperatureRow = z.infer<typeof TemperatureRowSchema>

/**
 * Absolute pressure of the step's contents at a temperature, at the constant density of the plan's step
 * (the plan's temperature table, computed with the plan's equation of state): linear interpolation between
 * rows, linear extrapolation from the two nearest rows outside the table (flagged).
 */
export function pressureAtTemperature(table: readonly TemperatureRow[], temperatureC: number): { pressureBarAbs: number; extrapolated: boolean } | null {
  const rows = [...table].sort((a, b) => a.temperature.value - b.temperature.value)
  if (rows.length === 0 || !Number.isFinite(temperatureC)) return null
  if (rows.length === 1) return { pressureBarAbs: rows[0].pressure.value, extrapolated: temperatureC !== rows[0].temperature.value }
  let i = rows.findIndex((r) => r.temperature.value >= temperatureC)
  const extrapolated = i === -1 || (i === 0 && rows[0].temperature.value > temperatureC)
  if (i <= 0) i = i === -1 ? rows.length - 1 : 1
  const a = rows[i - 1]
  const b = rows[i]
  const t = (temperatureC - a.temperature.value) / (b.temperature.value - a.temperature.value)
  return { pressureBarAbs: a.pressure.value + t * (b.pressure.value - a.pressure.value), extrapolated }
}

// ---- runs ---------------------------------------------------------------------------------------------------

export const RUN_STATUSES = ['ready', 'in-progress', 'paused', 'completed', 'aborted'] as const
export const RunStatusSchema = z.enum(RUN_STATUSES)
export type RunStatus = z.infer<typeof RunStatusSchema>
export const RUN_STATUS_LABEL: Record<RunStatus, string> = {
  ready: 'Not started',
  'in-progress': 'Filling',
  paused: 'Paused',
  completed: 'Finished',
  aborted: 'Stopped',
}

export const REPLAN_OPTION_KINDS = ['continue', 'accept', 'top-up', 'vent', 'remake'] as const
export const ReplanOptionKindSchema = z.enum(REPLAN_OPTION_KINDS)
export type ReplanOptionKind = z.infer<typeof ReplanOptionKindSchema>
/** What the technician's confirm button says for each option. */
export const REPLAN_OPTION_ACTION: Record<ReplanOptionKind, string> = {
  continue: 'Use the new targets',
  accept: 'Accept the fill as it is',
  'top-up': 'Top up to the higher pressure',
  vent: 'Vent part, then refill',
  remake: 'Vent, evacuate and start again',
}

export const CAUTION_KINDS = ['pressure', 'oxygen', 'flammable', 'toxic', 'corrosive', 'fuel-oxidiser', 'vent', 'plan'] as const
export const StepCautionSchema = z.object({ kind: z.enum(CAUTION_KINDS), text: z.string() })
export type StepCaution = z.infer<typeof StepCautionSchema>

export const RunStepSchema = z.object({
  index: z.number().int(),
  /** 'add': connect a source and fill to the target; 'vent': vent down to at most the target; 'evacuate': vent and pump down */
  kind: z.enum(['add', 'vent', 'evacuate']),
  /** gas id of a pure source, or the premix label; 'vent' for vent and evacuate steps */
  gas: z.string(),
  label: z.string(),
  /** chemical formula of a pure source (null for a premix or a vent step) */
  formula: z.string().nullable(),
  sourceComposition: z.array(z.object({ gas: z.string(), formula: z.string().nullable(), fraction: z.number() })),
  cumulativePressure: barAbs,
  cumulativeGaugePressure: barGauge,
  pressureRise: z.object({ value: z.number(), unit: z.literal('bar') }).nullable(),
  massAdded: kg.nullable(),
  cumulativeMass: kg.nullable(),
  toleranceWindow: z.object({
    gaugePressureLow: barGauge.nullable(),
    gaugePressureHigh: barGauge,
    cumulativeMassLow: kg.nullable(),
    cumulativeMassHigh: kg.nullable(),
  }),
  temperatureTable: z.array(TemperatureRowSchema),
  compositionAfter: z.array(z.object({ gas: z.string(), fraction: z.number() })),
  cautions: z.array(StepCautionSchema),
  state: z.enum(['done', 'current', 'pending']),
  /** which plan segment the step belongs to: 0 the approved plan, 1… each confirmed re-plan */
  segment: z.number().int(),
  note: z.string().nullable(),
})
export type RunStep = z.infer<typeof RunStepSchema>

export const ReadingOutcomeSchema = z.enum(['on-target', 'under', 'over'])
export type ReadingOutcome = z.infer<typeof ReadingOutcomeSchema>
export const READING_OUTCOME_LABEL: Record<ReadingOutcome, string> = { 'on-target': 'In window', under: 'Below window', over: 'Above window' }

export const RunReadingSchema = z.object({
  id: z.number().int(),
  stepIndex: z.number().int(),
  gas: z.string(),
  pressureBarAbs: z.number().nullable(),
  pressureBarGauge: z.number().nullable(),
  temperatureC: z.number().nullable(),
  scaleKg: z.number().nullable(),
  outcome: ReadingOutcomeSchema,
  recordedById: z.number().int(),
  recordedBy: z.string().nullable(),
  recordedAt: z.string(),
})
export type RunReading = z.infer<typeof RunReadingSchema>

export const PendingReplanSchema = z.object({
  stepIndex: z.number().int(),
  readingId: z.number().int(),
  status: z.enum(['on-track', 'adjusted', 'cannot-meet', 'failed']),
  verdict: z.string(),
  /** inferred contents of the cylinder now */
  composition: z.array(z.object({ gas: z.string(), formula: z.string().nullable(), fraction: z.number(), target: z.number().nullable() })),
  gaugePressureAtFillTemperature: barGauge.nullable(),
  options: z.array(
    z.object({
      kind: ReplanOptionKindSchema,
      description: z.string(),
      finalGaugePressure: barGauge.nullable(),
      ventToGaugePressure: barGauge.nullable(),
      /** the new targets this option leads to */
      steps: z.array(z.object({ gas: z.string(), label: z.string(), formula: z.string().nullable(), cumulativeGaugePressure: barGauge })),
    }),
  ),
  warnings: z.array(z.object({ code: z.string(), severity: z.enum(['info', 'caution', 'block']), message: z.string() })),
  computedAt: z.string(),
})
export type PendingReplan = z.infer<typeof PendingReplanSchema>

export const RunCylinderSchema = z.object({
  id: z.number().int(),
  serial: z.string(),
  barcode: z.string(),
  waterVolumeL: z.number(),
  servicePressureBar: z.number(),
  testPressureBar: z.number(),
  oxygenClean: z.boolean(),
  valveOutlet: z.string(),
  nextTestDate: z.string(),
  status: z.string(),
})

export const RunDetailSchema = z.object({
  id: z.number().int(),
  status: RunStatusSchema,
  version: z.number().int(),
  currentStep: z.number().int(),
  stepCount: z.number().int(),
  /** every step recorded within its window: the run can be finished */
  allStepsDone: z.boolean(),
  replanCount: z.number().int(),
  method: z.enum(['partial-pressure', 'gravimetric']),
  atmosphericPressure: barAbs,
  fillTemperature: celsius,
  referenceTemperature: celsius,
  finalGaugePressure: barGauge,
  /** smallest readable increment of the plan's gauge, when the plan names one (targets are shown to it) */
  gaugeResolution: z.object({ value: z.number(), unit: z.literal('bar') }).nullable(),
  planId: z.number().int(),
  planVersion: z.number().int(),
  order: z.object({ id: z.number().int(), number: z.string(), status: z.string() }).nullable(),
  description: z.string().nullable(),
  cylinder: RunCylinderSchema,
  technician: z.object({ id: z.number().int(), name: z.string() }).nullable(),
  scheduledFor: z.string(),
  startedAt: z.string().nullable(),
  completedAt: z.string().nullable(),
  steps: z.array(RunStepSchema),
  readings: z.array(RunReadingSchema),
  pendingReplan: PendingReplanSchema.nullable(),
  /** whether the signed-in user may record on this run */
  canRecord: z.boolean(),
  notes: z.string(),
})
export type RunDetail = z.infer<typeof RunDetailSchema>

export const RunSummarySchema = z.object({
  id: z.number().int(),
  status: RunStatusSchema,
  version: z.number().int(),
  scheduledFor: z.string(),
  currentStep: z.number().int(),
  stepCount: z.number().int(),
  cylinder: z.object({ id: z.number().int(), serial: z.string(), barcode: z.string(), waterVolumeL: z.number() }),
  orderNumber: z.string().nullable(),
  description: z.string().nullable(),
  technician: z.object({ id: z.number().int(), name: z.string() }).nullable(),
  /** the next thing to do: source and target gauge pressure */
  next: z.object({ label: z.string(), formula: z.string().nullable(), cumulativeGaugePressure: barGauge }).nullable(),
  needsReplanConfirmation: z.boolean(),
})
export type RunSummary = z.infer<typeof RunSummarySchema>
export const RunSummaryListSchema = z.array(RunSummarySchema)

// ---- requests -----------------------------------------------------------------------------------------------

export const RunIdParamsSchema = z.strictObject({ id: z.coerce.number().int().positive() })

export const MyRunsQuerySchema = z.strictObject({ date: IsoDateSchema.optional() })
export const RunLookupQuerySchema = z.strictObject({ barcode: z.string().trim().min(1).max(64) })
export const RunListQuerySchema = z.strictObject({
  date: IsoDateSchema.optional(),
  status: RunStatusSchema.optional(),
  technicianId: z.coerce.number().int().positive().optional(),
  planId: z.coerce.number().int().positive().optional(),
})

export const CreateRunsInputSchema = z.strictObject({
  planId: z.number().int().positive(),
  cylinderIds: z.array(z.number().int().positive()).min(1, 'Pick at least one cylinder.').max(50),
  technicianId: z.number().int().positive(),
  scheduledFor: IsoDateSchema,
})
export type CreateRunsInput = z.infer<typeof CreateRunsInputSchema>

export const ReassignRunInputSchema = z.strictObject({
  technicianId: z.number().int().positive(),
  scheduledFor: IsoDateSchema,
  expectedVersion: z.number().int().min(1),
})
export type ReassignRunInput = z.infer<typeof ReassignRunInputSchema>

export const RecordReadingInputSchema = z.strictObject({
  stepIndex: z.number().int().min(0),
  pressure: z.strictObject({ value: finite(), unit: z.enum(READING_PRESSURE_UNITS), reference: z.enum(['gauge', 'absolute']) }),
  temperature: z.strictObject({ value: finite(), unit: z.enum(READING_TEMPERATURE_UNITS) }),
  /** cumulative scale reading since the start of the fill (gravimetric plans) */
  scaleMass: z.strictObject({ value: finite().min(0), unit: z.enum(READING_MASS_UNITS) }).optional(),
  /** made by the tablet once per reading; a retry with the same id does not record twice */
  clientRequestId: z
    .string()
    .min(8)
    .max(64)
    .regex(/^[A-Za-z0-9_-]+$/, 'letters, digits, - and _ only'),
  /** the run version the tablet showed; a stale version is 409 with the current state */
  expectedVersion: z.number().int().min(1),
})
export type RecordReadingInput = z.infer<typeof RecordReadingInputSchema>

export const RunVersionInputSchema = z.strictObject({
  expectedVersion: z.number().int().min(1),
  note: z.string().trim().max(500).optional(),
})
export type RunVersionInput = z.infer<typeof RunVersionInputSchema>

export const ConfirmReplanInputSchema = z.strictObject({
  expectedVersion: z.number().int().min(1),
  option: ReplanOptionKindSchema,
})
export type ConfirmReplanInput = z.infer<typeof ConfirmReplanInputSchema>

export const RecordReadingResultSchema = z.object({
  run: RunDetailSchema,
  reading: RunReadingSchema,
  /** true when this clientRequestId had been recorded before (a retry): nothing new was written */
  replayed: z.boolean(),
})
export type RecordReadingResult = z.infer<typeof RecordReadingResultSchema>
