/**
 * Wire shapes of the fill planner: requests with units ({value, unit, reference}) and the responses the
 * planner returns (shared/planning/wire.ts maps them to and from the SI engine).
 * Amount fractions are 0..1 everywhere; tolerances and budgets are relative percentages.
 */
import { z } from 'zod'

export const PRESSURE_UNITS = ['Pa', 'kPa', 'MPa', 'bar', 'mbar', 'psi', 'atm'] as const
export const TEMPERATURE_UNITS = ['K', 'C', 'F'] as const
export const VOLUME_UNITS = ['L', 'm3', 'ft3'] as const
export const MASS_UNITS = ['kg', 'g', 'lb'] as const
export const PLAN_MODEL_IDS = ['ideal', 'van-der-waals', 'srk', 'peng-robinson', 'gerg-2008'] as const

export const PressureUnitSchema = z.enum(PRESSURE_UNITS)
export const TemperatureUnitSchema = z.enum(TEMPERATURE_UNITS)
export const MassUnitSchema = z.enum(MASS_UNITS)
export const ModelIdSchema = z.enum(PLAN_MODEL_IDS)

/** A pressure with its unit and whether it is gauge or absolute. */
export const PressureSchema = z.strictObject({
  value: z.number(),
  unit: PressureUnitSchema,
  reference: z.enum(['gauge', 'absolute']),
})
/** A pressure difference or span (no reference). */
export const PressureSpanSchema = z.strictObject({ value: z.number().nonnegative(), unit: PressureUnitSchema })
export const TemperatureSchema = z.strictObject({ value: z.number(), unit: TemperatureUnitSchema })
export const VolumeSchema = z.strictObject({ value: z.number().positive(), unit: z.enum(VOLUME_UNITS) })
export const MassSchema = z.strictObject({ value: z.number().nonnegative(), unit: MassUnitSchema })
const IsoDateSchema = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'date as yyyy-mm-dd')

export const ComponentFractionSchema = z.strictObject({
  gas: z.string().min(1),
  fraction: z.number().min(0).max(1),
  /** standard uncertainty of the fraction (k = 1), amount fraction */
  uncertainty: z.number().nonnegative().optional(),
})

export const TargetComponentSchema = z.strictObject({
  gas: z.string().min(1),
  fraction: z.number().min(0).max(1),
  /** marks the balance (matrix) gas; default the largest fraction */
  balance: z.boolean().optional(),
})

export const ResidualSchema = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('evacuated') }),
  z.strictObject({
    kind: z.literal('residual'),
    pressure: PressureSchema,
    temperature: TemperatureSchema.optional(),
    composition: z.array(ComponentFractionSchema).min(1),
  }),
])

export const CylinderSchema = z.strictObject({
  waterVolume: VolumeSchema,
  servicePressure: PressureSchema,
  testPressure: PressureSchema.optional(),
  material: z.string().optional(),
  oxygenClean: z.boolean().optional(),
  nextTestDate: IsoDateSchema.optional(),
  plusRated: z.boolean().optional(),
  residual: ResidualSchema.optional(),
})

export const SourceSchema = z
  .strictObject({
    /** unique label; default the gas id (pure) or "premix-n" */
    id: z.string().min(1).optional(),
    /** main gas of a pure source */
    gas: z.string().min(1).optional(),
    /** amount fraction of the main gas, 0..1 */
    purity: z.number().gt(0).max(1).optional(),
    impurities: z.array(ComponentFractionSchema).optional(),
    /** certified composition of a premix */
    composition: z.array(ComponentFractionSchema).min(1).optional(),
  })
  .refine((s) => s.gas !== undefined || s.composition !== undefined, { message: 'a source needs a gas or a premix composition' })

export const GaugeSchema = z.strictObject({
  span: PressureSpanSchema,
  /** EN 837-1 accuracy class, % of span */
  accuracyClass: z.number().nonnegative(),
  resolution: PressureSpanSchema,
})

export const ScaleSchema = z.strictObject({
  resolution: MassSchema,
  /** standard uncertainty of one reading beyond resolution */
  uncertainty: MassSchema.optional(),
})

export const DisplayUnitsSchema = z.strictObject({
  pressure: PressureUnitSchema.optional(),
  temperature: TemperatureUnitSchema.optional(),
  mass: MassUnitSchema.optional(),
})

export const FillPlanRequestSchema = z.strictObject({
  target: z.array(TargetComponentSchema).min(1),
  finalPressure: PressureSchema,
  referenceTemperature: TemperatureSchema,
  fillTemperature: TemperatureSchema,
  atmosphericPressure: PressureSchema.optional(),
  cylinder: CylinderSchema,
  minimumTemperature: TemperatureSchema.optional(),
  maximumTemperature: TemperatureSchema.optional(),
  sources: z.array(SourceSchema).min(1),
  order: z.enum(['as-given', 'auto']),
  model: ModelIdSchema,
  method: z.enum(['partial-pressure', 'gravimetric']),
  gauge: GaugeSchema.optional(),
  scale: ScaleSchema.optional(),
  /** allowed relative deviation of each component from target, % (e.g. 5 = ±5 % relative) */
  blendTolerancePercent: z.number().gt(0).lt(100).optional(),
  /** largest acceptable expanded (k = 2) relative uncertainty, %, before a premix is proposed */
  uncertaintyBudgetPercent: z.number().gt(0).optional(),
  cylinderRules: z.enum(['eu', 'us']).optional(),
  /** plan date, compared with the cylinder's next test date; default today */
  asOfDate: IsoDateSchema.optional(),
  /** standard uncertainty of each gas-temperature reading, K (default 1) */
  temperatureUncertaintyK: z.number().nonnegative().optional(),
  proposePremix: z.boolean().optional(),
  displayUnits: DisplayUnitsSchema.optional(),
})
export type FillPlanRequest = z.infer<typeof FillPlanRequestSchema>

// ---- response -------------------------------------------------------------------------------------------

const Quantity = <U extends z.ZodType>(unit: U) => z.object({ value: z.number(), unit })
const AbsolutePressureOut = z.object({ value: z.number(), unit: PressureUnitSchema, reference: z.literal('absolute') })
const GaugePressureOut = z.object({ value: z.number(), unit: PressureUnitSchema, reference: z.literal('gauge') })
const MassOut = Quantity(MassUnitSchema)
const MolesOut = Quantity(z.literal('mol'))
const TemperatureOut = Quantity(TemperatureUnitSchema)
const CompositionOut = z.array(z.object({ gas: z.string(), fraction: z.number(), uncertainty: z.number().optional() }))

export const PlanWarningSchema = z.object({
  code: z.string(),
  severity: z.enum(['info', 'caution', 'block']),
  message: z.string(),
  caution: z.string().optional(),
  step: z.number().int().optional(),
})

export const PlanStepSchema = z.object({
  index: z.number().int(),
  gas: z.string(),
  source: z.string(),
  sourceComposition: CompositionOut,
  cumulativePressure: AbsolutePressureOut,
  cumulativeGaugePressure: GaugePressureOut,
  pressureRise: Quantity(PressureUnitSchema),
  massAdded: MassOut,
  molesAdded: MolesOut,
  cumulativeMass: MassOut,
  cumulativeMoles: MolesOut,
  compressibility: z.number(),
  toleranceWindow: z.object({
    gaugePressureLow: GaugePressureOut,
    gaugePressureHigh: GaugePressureOut,
    cumulativeMassLow: MassOut,
    cumulativeMassHigh: MassOut,
  }),
  temperatureTable: z.array(z.object({ temperature: TemperatureOut, pressure: AbsolutePressureOut, gaugePressure: GaugePressureOut })),
  compositionAfter: CompositionOut,
})

export const PredictedComponentSchema = z.object({
  gas: z.string(),
  fraction: z.number(),
  /** standard uncertainty (k = 1), amount fraction */
  uncertainty: z.number(),
  expandedUncertainty: z.number(),
  coverageFactor: z.literal(2),
  target: z.number(),
  deviationRelative: z.number().nullable(),
})

export const ClassificationSchema = z.object({
  flammable: z.boolean().nullable(),
  flammabilityIndex: z.number().nullable(),
  oxidisingPower: z.number().nullable(),
  oxidising: z.boolean(),
  lc50MixPpm: z.number().nullable(),
  toxic: z.boolean(),
  division: z.enum(['2.1', '2.2', '2.3']),
  subsidiary: z.array(z.string()),
  notes: z.array(z.string()),
})

export const FillPlanCoreResponseSchema = z.object({
  method: z.enum(['partial-pressure', 'gravimetric']),
  model: ModelIdSchema,
  modelNotes: z.array(z.string()),
  finalPressure: AbsolutePressureOut,
  finalGaugePressure: GaugePressureOut,
  referenceTemperature: TemperatureOut,
  fillTemperature: TemperatureOut,
  atmosphericPressure: AbsolutePressureOut,
  totalMoles: MolesOut,
  totalMass: MassOut,
  initial: z.object({ moles: MolesOut, pressure: AbsolutePressureOut, composition: CompositionOut }),
  steps: z.array(PlanStepSchema),
  predictedComposition: z.array(PredictedComponentSchema),
  uncertaintyMethod: z.string(),
  uncertaintyBudget: z.array(z.object({ input: z.string(), gas: z.string(), contribution: z.number() })),
  solution: z.object({ method: z.enum(['direct', 'nnls']), maxRelativeDeviation: z.number(), note: z.string() }),
  orderRules: z.array(z.string()),
  pressureChecks: z.array(
    z.object({
      label: z.string(),
      temperature: TemperatureOut,
      gaugePressure: GaugePressureOut,
      gaugeLimit: GaugePressureOut.nullable(),
      rule: z.string(),
      pass: z.boolean(),
    }),
  ),
  classification: ClassificationSchema,
  minimumSafeTemperature: TemperatureOut.nullable(),
  warnings: z.array(PlanWarningSchema),
  approvable: z.boolean(),
  assumptions: z.array(z.string()),
})
export type FillPlanCoreResponse = z.infer<typeof FillPlanCoreResponseSchema>

export const FillPlanResponseSchema = FillPlanCoreResponseSchema.extend({
  premixProposal: z
    .object({
      reason: z.string(),
      stages: z.array(z.object({ label: z.string(), gas: z.string(), reason: z.string(), plan: FillPlanCoreResponseSchema })),
      productPlan: FillPlanCoreResponseSchema,
    })
    .optional(),
})
export type FillPlanResponse = z.infer<typeof FillPlanResponseSchema>

// ---- re-planning ----------------------------------------------------------------------------------------

export const StepActualSchema = z
  .strictObject({
    stepIndex: z.number().int().nonnegative(),
    pressure: PressureSchema.optional(),
    temperature: TemperatureSchema.optional(),
    /** cumulative scale reading since the start of the fill */
    scaleMass: MassSchema.optional(),
  })
  .refine((a) => a.pressure !== undefined || a.scaleMass !== undefined, { message: 'a reading needs a pressure or a scale mass' })

export const ReplanRequestSchema = z.strictObject({
  plan: FillPlanRequestSchema,
  actuals: z.array(StepActualSchema).min(1),
})
export type ReplanRequest = z.infer<typeof ReplanRequestSchema>

export const ReplanResponseSchema = z.object({
  status: z.enum(['on-track', 'adjusted', 'cannot-meet']),
  verdict: z.string(),
  completedSteps: z.number().int(),
  inferredSteps: z.array(
    z.object({
      index: z.number().int(),
      source: z.string(),
      plannedMoles: MolesOut,
      actualMoles: MolesOut,
      deviationRelative: z.number(),
      measured: z.boolean(),
    }),
  ),
  composition: CompositionOut,
  moles: MolesOut,
  pressureAtFillTemperature: AbsolutePressureOut,
  gaugePressureAtFillTemperature: GaugePressureOut,
  remainingPlan: FillPlanCoreResponseSchema.nullable(),
  options: z.array(
    z.object({
      kind: z.enum(['continue', 'accept', 'top-up', 'vent', 'remake']),
      description: z.string(),
      finalGaugePressure: GaugePressureOut.optional(),
      ventToGaugePressure: GaugePressureOut.optional(),
      plan: FillPlanCoreResponseSchema.optional(),
    }),
  ),
  warnings: z.array(PlanWarningSchema),
})
export type ReplanResponse = z.infer<typeof ReplanResponseSchema>

// ---- model comparison and batches -------------------------------------------------------------------------

export const CompareModelsRequestSchema = FillPlanRequestSchema.extend({
  models: z.array(ModelIdSchema).min(1).optional(),
})
export type CompareModelsRequest = z.infer<typeof CompareModelsRequestSchema>

export const CompareModelsResponseSchema = z.object({
  reference: ModelIdSchema,
  referenceNote: z.string(),
  entries: z.array(
    z.object({
      model: ModelIdSchema,
      plan: FillPlanCoreResponseSchema.nullable(),
      error: z.string().nullable(),
      realised: z.array(
        z.object({
          gas: z.string(),
          target: z.number(),
          planned: z.number(),
          realised: z.number(),
          deviation: z.number(),
          deviationRelative: z.number().nullable(),
          toleranceUsed: z.number().nullable(),
        }),
      ),
      realisedFinalGaugePressure: GaugePressureOut.nullable(),
      worstDeviationRelative: z.number().nullable(),
      withinTolerance: z.boolean().nullable(),
    }),
  ),
})
export type CompareModelsResponse = z.infer<typeof CompareModelsResponseSchema>

export const BatchRequestSchema = z.strictObject({
  plan: FillPlanRequestSchema,
  cylinderCount: z.number().int().min(1).max(10_000),
})
export type BatchRequest = z.infer<typeof BatchRequestSchema>

export const BatchResponseSchema = z.object({
  cylinderCount: z.number().int(),
  plan: FillPlanResponseSchema,
  sources: z.array(
    z.object({
      source: z.string(),
      gas: z.string(),
      molesPerCylinder: MolesOut,
      massPerCylinder: MassOut,
      moles: MolesOut,
      mass: MassOut,
      standardVolume: z.object({ value: z.number(), unit: z.literal('m3'), reference: z.string() }),
    }),
  ),
  notes: z.array(z.string()),
})
export type BatchResponse = z.infer<typeof BatchResponseSchema>
