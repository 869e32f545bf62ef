import { defineEntity, type InferEntity, p } from '@mikro-orm/core'
import { CylinderSchema } from '../cylinders/cylinder.entity.ts'
import { FillPlanSchema } from '../plans/fill-plan.entity.ts'

/**
 * One cylinder being filled at the manifold from an approved plan. `targets` holds the current step
 * targets (recomputed after an overshoot: the re-plan), `currentStep` the next step to do.
 */
export const FillRunSchema = defineEntity({
  name: 'FillRun',
  tableName: 'fill_runs',
  indexes: [{ properties: ['technicianId', 'status'] }],
  properties: {
    id: p.integer().primary().autoincrement(),
    plan: p.manyToOne(FillPlanSchema).ref(false).index(),
    cylinder: p.manyToOne(CylinderSchema).ref(false).index(),
    technicianId: p.integer().nullable(),
    scheduledFor: p.string().length(10).index(),
    status: p.enum(['ready', 'in-progress', 'paused', 'completed', 'aborted']).default('ready'),
    currentStep: p.integer().default(0),
    targets: p.json<Record<string, unknown>>(),
    replanCount: p.integer().default(0),
    startedAt: p.datetime().nullable(),
    completedAt: p.datetime().nullable(),
    notes: p.text().default(''),
    version: p.integer().version(),
    createdAt: p.datetime().onCreate(() => new Date()),
    updatedAt: p
      .datetime()
      .onCreate(() => new Date())
      .onUpdate(() => new Date()),
  },
})
export type FillRun = InferEntity<typeof FillRunSchema>

/**
 * A reading the technician recorded for a step. Immutable once written (a database trigger refuses
 * UPDATE and DELETE); a correction is a new reading with `supersedes` set.
 */
export const FillReadingSchema = defineEntity({
  name: 'FillReading',
  tableName: 'fill_readings',
  indexes: [{ properties: ['run', 'stepIndex'] }],
  properties: {
    id: p.integer().primary().autoincrement(),
    run: p.manyToOne(FillRunSchema).ref(false),
    stepIndex: p.integer(),
    gas: p.string().length(64),
    /** absolute pressure in bar read at the manifold gauge (converted from gauge with the stated atmosphere) */
    pressureBarAbs: p.float().columnType('double precision').nullable(),
    pressureBarGauge: p.float().columnType('double precision').nullable(),
    temperatureC: p.float().columnType('double precision').nullable(),
    /** cumulative scale reading, kg (gravimetric) */
    scaleKg: p.float().columnType('double precision').nullable(),
    outcome: p.enum(['on-target', 'under', 'over']),
    supersedes: p.integer().nullable(),
    recordedById: p.integer(),
    clientRequestId: p.string().length(64).unique().nullable(),
    recordedAt: p.datetime().onCreate(() => new Date()),
  },
})
export type FillReading = InferEntity<typeof FillReadingSchema>
