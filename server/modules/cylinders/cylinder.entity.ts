import { defineEntity, type InferEntity, p } from '@mikro-orm/core'
import { CustomerSchema } from '../customers/customer.entity.ts'

export interface CylinderResidual {
  /** 'evacuated' or a residual gauge pressure with its composition */
  kind: 'evacuated' | 'residual'
  pressureBarGauge?: number
  composition?: { gas: string; fraction: number }[]
}

/**
 * A high-pressure cylinder in the shop's inventory (shop-owned or customer-owned).
 * Pressures are stored in bar gauge at 15 °C, volumes in litres of water capacity.
 */
export const CylinderSchema = defineEntity({
  name: 'Cylinder',
  tableName: 'cylinders',
  properties: {
    id: p.integer().primary().autoincrement(),
    serial: p.string().length(64).unique(),
    barcode: p.string().length(64).unique(),
    waterVolumeL: p.float().columnType('double precision'),
    servicePressureBar: p.float().columnType('double precision'),
    testPressureBar: p.float().columnType('double precision'),
    material: p.enum(['steel', 'aluminium', 'composite']),
    valveOutlet: p.string().length(64),
    oxygenClean: p.boolean().default(false),
    owner: p.manyToOne(CustomerSchema).nullable().ref(false),
    lastTestDate: p.string().length(10),
    nextTestDate: p.string().length(10).index(),
    status: p.enum(['available', 'reserved', 'filling', 'awaiting-analysis', 'full', 'shipped', 'quarantine', 'retired']).default('available'),
    residual: p.json<CylinderResidual>(),
    notes: p.text().default(''),
    version: p.integer().version(),
    createdAt: p.datetime().onCreate(() => new Date()),
    updatedAt: p
      .datetime()
      .onCreate(() => new Date())
      .onUpdate(() => new Date()),
  },
})
export type Cylinder = InferEntity<typeof CylinderSchema>
