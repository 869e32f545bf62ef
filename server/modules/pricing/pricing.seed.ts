import type { EntityManager } from '@mikro-orm/core'
import { type PriceEntryInput, SHOP_CURRENCY } from '#shared/schemas/pricing.ts'
import { PriceEntrySchema } from './price-entry.entity.ts'

/**
 * The demo shop's price book. All prices are invented for the demo (euro cents); gas prices per standard cubic
 * metre are at 15 °C, 101.325 kPa.
 */
export const DEMO_PRICE_BOOK: readonly PriceEntryInput[] = [
  { kind: 'gas', key: 'nitrogen', label: 'Nitrogen 5.0', unit: 'm3-15C', priceMinor: 420 },
  { kind: 'gas', key: 'argon', label: 'Argon 5.0', unit: 'm3-15C', priceMinor: 680 },
  { kind: 'gas', key: 'oxygen', label: 'Oxygen 5.0', unit: 'm3-15C', priceMinor: 550 },
  { kind: 'gas', key: 'helium', label: 'Helium 5.0', unit: 'm3-15C', priceMinor: 3800 },
  { kind: 'gas', key: 'air', label: 'Synthetic air (zero grade)', unit: 'm3-15C', priceMinor: 600 },
  { kind: 'gas', key: 'hydrogen', label: 'Hydrogen 5.0', unit: 'm3-15C', priceMinor: 1800 },
  { kind: 'gas', key: 'methane', label: 'Methane 4.5', unit: 'm3-15C', priceMinor: 2400 },
  { kind: 'gas', key: 'carbon-dioxide', label: 'Carbon dioxide 4.5 (food grade)', unit: 'kg', priceMinor: 340 },
  { kind: 'gas', key: 'carbon-monoxide', label: 'Carbon monoxide 4.7', unit: 'm3-15C', priceMinor: 9500 },
  { kind: 'gas', key: 'hydrogen-sulfide', label: 'Hydrogen sulfide 2.5', unit: 'kg', priceMinor: 38000 },
  { kind: 'gas', key: 'nitric-oxide', label: 'Nitric oxide 2.5', unit: 'kg', priceMinor: 65000 },
  { kind: 'gas', key: 'sulfur-dioxide', label: 'Sulfur dioxide 3.8', unit: 'kg', priceMinor: 16000 },
  { kind: 'gas', key: 'propane', label: 'Propane 3.5', unit: 'kg', priceMinor: 1200 },
  { kind: 'gas', key: 'isobutane', label: 'Isobutane 3.5', unit: 'kg', priceMinor: 9000 },
  { kind: 'gas', key: 'nitrous-oxide', label: 'Nitrous oxide 2.5', unit: 'kg', priceMinor: 900 },
  { kind: 'rental', key: '1L', label: 'Cylinder up to 1 L', unit: 'day', priceMinor: 12 },
  { kind: 'rental', key: '5L', label: 'Cylinder up to 5 L', unit: 'day', priceMinor: 18 },
  { kind: 'rental', key: '10L', label: 'Cylinder up to 10 L', unit: 'day', priceMinor: 22 },
  { kind: 'rental', key: '20L', label: 'Cylinder up to 20 L', unit: 'day', priceMinor: 28 },
  { kind: 'rental', key: '50L', label: 'Cylinder up to 50 L', unit: 'day', priceMinor: 35 },
  { kind: 'certification', key: '10', label: 'Production grade, batch analysis (10 % rel.)', unit: 'cylinder', priceMinor: 1500 },
  { kind: 'certification', key: '5', label: 'Analysed, single-point check (5 % rel.)', unit: 'cylinder', priceMinor: 4500 },
  { kind: 'certification', key: '2', label: 'Certified calibration gas (2 % rel., k = 2)', unit: 'cylinder', priceMinor: 9500 },
  { kind: 'certification', key: '1', label: 'Certified calibration gas (1 % rel., k = 2)', unit: 'cylinder', priceMinor: 16000 },
  { kind: 'certification', key: '0.5', label: 'Gravimetric standard (0.5 % rel., k = 2)', unit: 'cylinder', priceMinor: 29000 },
  { kind: 'surcharge', key: 'flammable', label: 'Flammable mixture (2.1): handling and dangerous-goods papers', unit: 'cylinder', priceMinor: 1800 },
  { kind: 'surcharge', key: 'oxidising', label: 'Oxidising mixture (5.1): oxygen-clean cylinder and papers', unit: 'cylinder', priceMinor: 1200 },
  { kind: 'surcharge', key: 'toxic', label: 'Toxic mixture (2.3): gas cabinet, road-only transport, papers', unit: 'cylinder', priceMinor: 6500 },
  { kind: 'surcharge', key: 'reactive', label: 'Toxic or corrosive component: treated cylinder, heel disposal', unit: 'cylinder', priceMinor: 3500 },
]

export function seedPriceBook(em: EntityManager): void {
  for (const e of DEMO_PRICE_BOOK) em.create(PriceEntrySchema, { ...e, currency: SHOP_CURRENCY })
}
