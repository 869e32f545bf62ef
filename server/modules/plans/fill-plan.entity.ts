import { defineEntity, type InferEntity, p } from '@mikro-orm/core'
import { CylinderSchema } from '../cylinders/cylinder.entity.ts'
import { OrderLineSchema } from '../orders/order.entity.ts'

/**
 * A stored fill plan for one order line (and optionally one cylinder), versioned: a new computation is a
 * new row with version + 1; the previous becomes 'superseded'. `request` is the /api/calc/fill-plan
 * request it was computed from, `result` the server's computed response (never the client's numbers).
 */
export const FillPlanSchema = defineEntity({
  name: 'FillPlan',
  tableName: 'fill_plans',
  indexes: [{ properties: ['orderLine', 'planVersion'] }],
  properties: {
    id: p.integer().primary().autoincrement(),
    orderLine: p.manyToOne(OrderLineSchema).ref(false),
    cylinder: p.manyToOne(CylinderSchema).nullable().ref(false),
    planVersion: p.integer(),
    status: p.enum(['draft', 'approved', 'superseded']).default('draft'),
    model: p.string().length(32),
    method: p.string().length(32),
    request: p.json<Record<string, unknown>>(),
    result: p.json<Record<string, unknown>>(),
    blocking: p.boolean().default(false),
    createdById: p.integer().nullable(),
    approvedById: p.integer().nullable(),
    approvedAt: p.datetime().nullable(),
    assignedTechnicianId: p.integer().nullable(),
    version: p.integer().version(),
    createdAt: p.datetime().onCreate(() => new Date()),
  },
})
export type FillPlan = InferEntity<typeof FillPlanSchema>
