import { z } from 'zod'
import type { ComponentUnit } from './order.ts'
import { HazardSurchargeKeySchema } from './pricing.ts'

/**
 * The wire shape of a priced order line, and the unit conversion the order schemas share with the pricing. Kept
 * apart from quote.ts (which computes the prices with the equation-of-state core) so that screens which only show
 * or validate orders do not load the physics core.
 */

/** Amount in the customer's unit → mole fraction 0..1. */
export function toMoleFraction(amount: number, unit: ComponentUnit): number {
  return unit === 'percent' ? amount / 100 : unit === 'ppm' ? amount / 1e6 : amount
}

// ---- wire shape of a priced line --------------------------------------------------------------------------

export const GasUseSchema = z.object({
  gas: z.string(),
  formula: z.string(),
  /** mole fraction in the mixture */
  fraction: z.number(),
  amountMol: z.number(),
  massKg: z.number(),
  /** standard volume at 15 °C, 101.325 kPa (real gas), m³ */
  standardVolumeM3: z.number(),
  unit: z.enum(['m3-15C', 'kg']),
  unitPriceMinor: z.number().int(),
  costMinor: z.number().int(),
})
export type GasUse = z.infer<typeof GasUseSchema>

export const LinePricingSchema = z.object({
  currency: z.string(),
  /** equation of state used for the filled cylinder */
  model: z.string(),
  temperatureC: z.number(),
  pressureBarAbsolute: z.number(),
  compressibility: z.number(),
  amountMolPerCylinder: z.number(),
  massKgPerCylinder: z.number(),
  referenceLabel: z.string(),
  gases: z.array(GasUseSchema),
  gasMinor: z.number().int(),
  rental: z.object({ key: z.string(), days: z.number().int(), unitPriceMinor: z.number().int(), costMinor: z.number().int() }).nullable(),
  certification: z.object({ key: z.string(), label: z.string(), costMinor: z.number().int() }),
  surcharges: z.array(z.object({ key: HazardSurchargeKeySchema, label: z.string(), costMinor: z.number().int() })),
  perCylinderMinor: z.number().int(),
  quantity: z.number().int(),
  totalMinor: z.number().int(),
  hazards: z.array(HazardSurchargeKeySchema),
  /** safety cautions for this mixture, in plain words */
  cautions: z.array(z.string()),
  /** findings of the physics core (fallback model, condensation risk, …) */
  notes: z.array(z.string()),
})
export type LinePricing = z.infer<typeof LinePricingSchema>
