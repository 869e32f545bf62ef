import { defineEntity, type InferEntity, p } from '@mikro-orm/core'

/**
 * One line of the price book. `kind` says what is priced:
 *  - gas: per standard cubic metre (15 °C, 101.325 kPa) or per kg of a gas id (`key` = gas id)
 *  - rental: cylinder rental per day (`key` = water volume class, e.g. "50L")
 *  - certification: fee per cylinder by accuracy class (`key` = class, e.g. "1 %")
 *  - surcharge: hazardous-material surcharge per cylinder (`key` = hazard flag, e.g. "toxic")
 * Prices are integer minor units (cents) in `currency`.
 */
export const PriceEntrySchema = defineEntity({
  name: 'PriceEntry',
  tableName: 'price_entries',
  uniques: [{ properties: ['kind', 'key'] }],
  properties: {
    id: p.integer().primary().autoincrement(),
    kind: p.enum(['gas', 'rental', 'certification', 'surcharge']),
    key: p.string().length(64),
    label: p.string().length(200),
    unit: p.enum(['m3-15C', 'kg', 'day', 'cylinder']),
    priceMinor: p.integer(),
    currency: p.string().length(3).default('EUR'),
    updatedAt: p
      .datetime()
      .onCreate(() => new Date())
      .onUpdate(() => new Date()),
  },
})
export type PriceEntry = InferEntity<typeof PriceEntrySchema>
