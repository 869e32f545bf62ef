import { defineEntity, type InferEntity, p } from '@mikro-orm/core'
import { CylinderSchema } from '../cylinders/cylinder.entity.ts'
import { OrderLineSchema } from '../orders/order.entity.ts'
import { FillRunSchema } from '../runs/fill-run.entity.ts'

export interface AnalysisResult {
  gas: string
  /** measured mole fraction (0..1) */
  value: number
  /** expanded uncertainty, same unit as value */
  expandedUncertainty: number
  coverageFactor: number
  instrument: string
  method: string
  /** the unit QA entered the value in (display only; value and uncertainty are stored as mole fractions) */
  unit?: 'percent' | 'ppm' | 'mol/mol'
}

/** QA's analysis of a filled cylinder, with an optional uploaded report (stored outside served folders). */
export const AnalysisSchema = defineEntity({
  name: 'Analysis',
  tableName: 'analyses',
  properties: {
    id: p.integer().primary().autoincrement(),
    run: p.manyToOne(FillRunSchema).ref(false).unique(),
    results: p.json<AnalysisResult[]>(),
    verdict: p.enum(['pending', 'within-tolerance', 'out-of-tolerance', 'rejected', 'released']).default('pending'),
    rejectReason: p.text().nullable(),
    reportStoredName: p.string().length(128).nullable(),
    reportOriginalName: p.string().length(255).nullable(),
    reportContentType: p.string().length(64).nullable(),
    reportSizeBytes: p.integer().nullable(),
    analysedById: p.integer().nullable(),
    analysedAt: p.datetime().nullable(),
    version: p.integer().version(),
    createdAt: p.datetime().onCreate(() => new Date()),
  },
})
export type Analysis = InferEntity<typeof AnalysisSchema>

/**
 * A released certificate of composition. Immutable (a database trigger refuses UPDATE and DELETE): a
 * correction is a new revision whose `replacesId` names the certificate it replaces.
 */
export const CertificateSchema = defineEntity({
  name: 'Certificate',
  tableName: 'certificates',
  uniques: [{ properties: ['number', 'revision'] }],
  properties: {
    id: p.integer().primary().autoincrement(),
    number: p.string().length(32),
    revision: p.integer(),
    replacesId: p.integer().nullable(),
    orderLine: p.manyToOne(OrderLineSchema).ref(false).index(),
    cylinder: p.manyToOne(CylinderSchema).ref(false).index(),
    analysis: p.manyToOne(AnalysisSchema).ref(false),
    customerId: p.integer().index(),
    /** everything printed on the certificate, frozen at release */
    content: p.json<Record<string, unknown>>(),
    signatoryId: p.integer(),
    signatoryName: p.string().length(200),
    releasedAt: p.datetime(),
    validUntil: p.string().length(10),
    correctionReason: p.text().nullable(),
  },
})
export type Certificate = InferEntity<typeof CertificateSchema>
