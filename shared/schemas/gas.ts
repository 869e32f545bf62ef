import { z } from 'zod'

/**
 * The gas library as it crosses the wire (GET /api/gases). Every number carries its unit; every group of
 * values names its source in `sources` (values marked "from memory" or "unverified" there must be checked
 * against the cited document before a safety decision relies on them).
 */

export const MODEL_ID_VALUES = ['ideal', 'van-der-waals', 'srk', 'peng-robinson', 'gerg-2008'] as const
export const ModelIdSchema = z.enum(MODEL_ID_VALUES)
export type ModelIdWire = z.infer<typeof ModelIdSchema>

export const MODEL_LABEL: Record<ModelIdWire, string> = {
  ideal: 'Ideal gas',
  'van-der-waals': 'van der Waals',
  srk: 'Soave–Redlich–Kwong',
  'peng-robinson': 'Peng–Robinson',
  'gerg-2008': 'GERG-2008',
}

const quantity = <U extends string>(unit: U) => z.object({ value: z.number(), unit: z.literal(unit) })

export const DataStatusSchema = z.enum(['definition', 'published', 'unverified'])

export const GasVapourPressureSchema = z.object({
  correlation: z.enum(['dippr-101', 'antoine']),
  /** the equation in words, with its units */
  equation: z.string(),
  coefficients: z.record(z.string(), z.number()),
  validFrom: quantity('K'),
  validTo: quantity('K'),
})

export const GasSchema = z.object({
  id: z.string(),
  name: z.string(),
  formula: z.string(),
  casNumber: z.string(),
  molarMass: quantity('g/mol'),
  criticalTemperature: quantity('K'),
  criticalPressure: quantity('MPa'),
  acentricFactor: z.number(),
  normalBoilingPoint: z.object({ value: z.number(), unit: z.literal('K'), sublimation: z.boolean() }),
  vapourPressure: GasVapourPressureSchema.nullable(),
  flammability: z
    .object({
      lowerLimit: quantity('% vol in air'),
      upperLimit: quantity('% vol in air'),
    })
    .nullable(),
  iso10156: z
    .object({
      /** % of the fuel in N2 at which the mixture becomes flammable in air */
      tci: quantity('% vol').nullable(),
      /** nitrogen-equivalency coefficient of an inert gas (N2 = 1) */
      kEquivalent: z.number().nullable(),
      /** oxygen-equivalency coefficient of an oxidiser (O2 = 1) */
      ci: z.number().nullable(),
      status: DataStatusSchema,
      confidence: z.enum(['normal', 'low']),
    })
    .nullable(),
  toxicity: z
    .object({
      lc50: quantity('ppm V (1 h, rat)'),
      status: DataStatusSchema,
      source: z.string(),
    })
    .nullable(),
  hazards: z.array(z.string()),
  groups: z.array(z.string()),
  /** one of the 21 GERG-2008 components */
  gerg2008: z.boolean(),
  /** the equations of state that evaluate this gas directly (the cubic models cover every gas with critical constants) */
  models: z.array(ModelIdSchema),
  /** pseudo-components (air): the constituents the equations of state see */
  composition: z.array(z.object({ gas: z.string(), fraction: z.number() })).nullable(),
  notes: z.array(z.string()),
  sources: z.record(z.string(), z.string()),
})
export type GasDto = z.infer<typeof GasSchema>

export const GasListSchema = z.object({
  items: z.array(GasSchema),
  /** where the molar masses' atomic weights come from */
  atomicWeights: z.string(),
})
export type GasList = z.infer<typeof GasListSchema>
