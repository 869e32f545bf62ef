import { z } from 'zod'
import { ModelIdSchema } from './gas.ts'

/**
 * POST /api/calc/state — the state of a gas mixture at a given temperature and pressure under one equation of
 * state. Units are explicit on every number; pressure says whether it is absolute or gauge.
 */

/** 'C' and 'F' are accepted as aliases of 'degC' and 'degF' (the fill-plan requests use them) */
export const TEMPERATURE_UNITS = ['K', 'degC', 'degF', 'C', 'F'] as const
export const PRESSURE_UNITS = ['Pa', 'kPa', 'MPa', 'bar', 'mbar', 'psi', 'atm'] as const
export const TemperatureUnitSchema = z.enum(TEMPERATURE_UNITS)
export const PressureUnitSchema = z.enum(PRESSURE_UNITS)
export type TemperatureUnit = z.infer<typeof TemperatureUnitSchema>
export type PressureUnit = z.infer<typeof PressureUnitSchema>

const finite = () => z.number().refine(Number.isFinite, 'must be a finite number')

export const TemperatureInputSchema = z.strictObject({ value: finite(), unit: TemperatureUnitSchema })
export const PressureInputSchema = z.strictObject({
  value: finite(),
  unit: PressureUnitSchema,
  reference: z.enum(['absolute', 'gauge']),
})
/** an absolute pressure without a gauge/absolute choice (atmospheric pressure is absolute by nature) */
export const AbsolutePressureInputSchema = z.strictObject({ value: finite(), unit: PressureUnitSchema })

export const MixtureRowSchema = z.strictObject({
  gas: z.string().min(1).max(64),
  /** mole (amount) fraction 0..1, never a percentage */
  fraction: finite().min(0, 'a mole fraction cannot be negative').max(1, 'a mole fraction is at most 1 (not a percentage)'),
})
export type MixtureRow = z.infer<typeof MixtureRowSchema>

export const StateRequestSchema = z.strictObject({
  mixture: z.array(MixtureRowSchema).min(1, 'add at least one gas').max(30),
  temperature: TemperatureInputSchema,
  pressure: PressureInputSchema,
  model: ModelIdSchema,
  /** local atmospheric pressure for gauge readings; default 101.325 kPa */
  atmosphericPressure: AbsolutePressureInputSchema.optional(),
  /** let a cubic model stand in when GERG-2008 does not cover a gas (default false: 400 naming the gas) */
  allowCubicFallback: z.boolean().optional(),
})
export type StateRequest = z.infer<typeof StateRequestSchema>

const q = <U extends string>(unit: U) => z.object({ value: z.number(), unit: z.literal(unit) })

export const CalcWarningSchema = z.object({
  code: z.string(),
  severity: z.enum(['info', 'caution', 'block']),
  message: z.string(),
})

export const StateResponseSchema = z.object({
  /** the model that was evaluated (differs from requestedModel only after an allowed fallback) */
  model: ModelIdSchema,
  requestedModel: ModelIdSchema,
  compressibility: z.number(),
  molarVolume: q('L/mol'),
  density: q('kg/m³'),
  molarDensity: q('mol/L'),
  molarMass: q('g/mol'),
  temperature: q('K'),
  absolutePressure: q('bar'),
  /** Dalton partial pressures x_i·p of each mixture row as given (ideal-gas concept: see warnings), absolute */
  partialPressures: z.array(z.object({ gas: z.string(), value: z.number(), unit: z.literal('bar') })),
  warnings: z.array(CalcWarningSchema),
})
export type StateResponse = z.infer<typeof StateResponseSchema>
