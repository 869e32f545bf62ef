import { z } from 'zod'

/**
 * The shop's price book as it crosses the wire. Money is in integer minor units (cents) of SHOP_CURRENCY.
 *
 * What each kind prices, and what its key means:
 * - gas: a gas of the library (key = gas id), per standard cubic metre at 15 °C and 101.325 kPa ('m3-15C')
 *   or per kilogram ('kg').
 * - rental: cylinder rental per day (key = water-volume class in litres, e.g. "50L"); a cylinder is charged at
 *   the smallest class that holds it.
 * - certification: fee per cylinder for a certification class (key = the class's relative expanded uncertainty
 *   in %, k = 2, e.g. "1"); a line is charged at the loosest class that still meets the uncertainty asked for.
 * - surcharge: hazardous-material surcharge per cylinder (key = hazard: flammable, oxidising, toxic — the
 *   transport divisions 2.1, 5.1 subsidiary and 2.3 of the finished mixture — or reactive, see below).
 */
export const SHOP_CURRENCY = 'EUR'

export const PRICE_KINDS = ['gas', 'rental', 'certification', 'surcharge'] as const
export const PriceKindSchema = z.enum(PRICE_KINDS)
export type PriceKind = z.infer<typeof PriceKindSchema>

export const PRICE_UNITS = ['m3-15C', 'kg', 'day', 'cylinder'] as const
export const PriceUnitSchema = z.enum(PRICE_UNITS)
export type PriceUnit = z.infer<typeof PriceUnitSchema>

/** Standard conditions of every gas price per cubic metre; printed next to each standard volume. */
export const PRICE_VOLUME_REFERENCE_LABEL = '15 °C, 101.325 kPa'

export const PRICE_UNIT_LABEL: Record<PriceUnit, string> = {
  'm3-15C': `per m³ at ${PRICE_VOLUME_REFERENCE_LABEL}`,
  kg: 'per kg',
  day: 'per cylinder per day',
  cylinder: 'per cylinder',
}

export const PRICE_KIND_LABEL: Record<PriceKind, string> = {
  gas: 'Gases',
  rental: 'Cylinder rental',
  certification: 'Certification',
  surcharge: 'Hazardous-material surcharges',
}

/** The units each kind may use. */
export const UNITS_BY_KIND: Record<PriceKind, readonly PriceUnit[]> = {
  gas: ['m3-15C', 'kg'],
  rental: ['day'],
  certification: ['cylinder'],
  surcharge: ['cylinder'],
}

/**
 * Surcharge keys. The first three follow the transport classification of the finished mixture; 'reactive'
 * covers a toxic or corrosive component in a mixture that is not itself toxic for transport (treated
 * cylinder, conditioning, residual-gas disposal — common practice, no source).
 */
export const HAZARD_SURCHARGE_KEYS = ['flammable', 'oxidising', 'toxic', 'reactive'] as const
export const HazardSurchargeKeySchema = z.enum(HAZARD_SURCHARGE_KEYS)
export type HazardSurchargeKey = z.infer<typeof HazardSurchargeKeySchema>
export const HAZARD_LABEL: Record<HazardSurchargeKey, string> = {
  flammable: 'Flammable mixture (transport division 2.1)',
  oxidising: 'Oxidising mixture (subsidiary hazard 5.1)',
  toxic: 'Toxic mixture (transport division 2.3)',
  reactive: 'Toxic or corrosive component (treated cylinder, residual-gas disposal)',
}

const RENTAL_KEY = /^\d{1,4}(\.\d{1,2})?L$/
const CERTIFICATION_KEY = /^\d{1,2}(\.\d{1,3})?$/

/** Litres of a rental class key ("50L" → 50). */
export function rentalClassLitres(key: string): number {
  return Number(key.slice(0, -1))
}
/** Relative expanded uncertainty (%) of a certification class key ("0.5" → 0.5). */
export function certificationClassPct(key: string): number {
  return Number(key)
}

/**
 * Checks that the key fits its kind. Gas ids are checked by the caller against the gas library (see
 * `isPriceableGas` in quote.ts) so this schema stays free of the physics core.
 */
function checkKey(kind: PriceKind, key: string): string | null {
  switch (kind) {
    case 'gas':
      return /^[a-z0-9-]{1,64}$/.test(key) ? null : 'Use the gas id from the gas library (e.g. carbon-dioxide).'
    case 'rental':
      return RENTAL_KEY.test(key) && rentalClassLitres(key) > 0 ? null : 'Use the cylinder water volume class, e.g. 50L.'
    case 'certification':
      return CERTIFICATION_KEY.test(key) && certificationClassPct(key) > 0 ? null : 'Use the relative expanded uncertainty of the class in %, e.g. 1 or 0.5.'
    case 'surcharge':
      return (HAZARD_SURCHARGE_KEYS as readonly string[]).includes(key) ? null : `Use one of: ${HAZARD_SURCHARGE_KEYS.join(', ')}.`
  }
}

/** 1 000 000.00 in the shop currency: a sanity ceiling for one price-book line. */
export const MAX_PRICE_MINOR = 100_000_000

export const PriceEntryInputSchema = z
  .strictObject({
    kind: PriceKindSchema,
    key: z.string().trim().min(1, 'Enter the key').max(64),
    label: z.string().trim().min(1, 'Enter a label').max(200),
    unit: PriceUnitSchema,
    priceMinor: z.number().int('Whole cents only').min(0, 'A price cannot be negative').max(MAX_PRICE_MINOR),
  })
  .superRefine((entry, ctx) => {
    const keyProblem = checkKey(entry.kind, entry.key)
    if (keyProblem) ctx.addIssue({ code: 'custom', path: ['key'], message: keyProblem })
    if (!UNITS_BY_KIND[entry.kind].includes(entry.unit)) {
      ctx.addIssue({
        code: 'custom',
        path: ['unit'],
        message: `A ${entry.kind} price is ${UNITS_BY_KIND[entry.kind].map((u) => PRICE_UNIT_LABEL[u]).join(' or ')}.`,
      })
    }
  })
export type PriceEntryInput = z.infer<typeof PriceEntryInputSchema>

export const PriceEntrySchema = z.object({
  id: z.number().int(),
  kind: PriceKindSchema,
  key: z.string(),
  label: z.string(),
  unit: PriceUnitSchema,
  priceMinor: z.number().int(),
  currency: z.string(),
  updatedAt: z.string(),
})
export type PriceEntry = z.infer<typeof PriceEntrySchema>

/** The whole book: few dozen lines, fetched at once (the quote screen prices in the browser with it). */
export const PriceBookSchema = z.object({
  currency: z.string(),
  entries: z.array(PriceEntrySchema),
})
export type PriceBook = z.infer<typeof PriceBookSchema>

export const PriceIdParamsSchema = z.strictObject({ id: z.coerce.number().int().positive() })

/** "€1,234.56" — minor units to a display string in the given currency. */
export function formatMoney(minor: number, currency: string = SHOP_CURRENCY): string {
  return new Intl.NumberFormat('en-GB', { style: 'currency', currency, minimumFractionDigits: 2, maximumFractionDigits: 2 }).format(minor / 100)
}

/** "1234.56" → 123456 (minor units); null when not a money amount with at most two decimals. */
export function parseMoneyToMinor(text: string): number | null {
  const t = text.trim().replace(/[,\s]/g, '')
  if (!/^\d+(\.\d{0,2})?$/.test(t)) return null
  const [whole, frac = ''] = t.split('.')
  return Number(whole) * 100 + Number(frac.padEnd(2, '0'))
}
