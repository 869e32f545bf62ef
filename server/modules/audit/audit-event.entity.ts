import { defineEntity, type InferEntity, p } from '@mikro-orm/core'

/** Append-only audit trail: who did what to which record, and when. */
export const AuditEventSchema = defineEntity({
  name: 'AuditEvent',
  tableName: 'audit_events',
  indexes: [{ properties: ['entityType', 'entityId'] }],
  properties: {
    id: p.integer().primary().autoincrement(),
    at: p
      .datetime()
      .onCreate(() => new Date())
      .index(),
    actorId: p.integer().nullable(),
    actorEmail: p.string().length(254).nullable(),
    action: p.string().length(64),
    entityType: p.string().length(64),
    entityId: p.string().length(64),
    detail: p.json<Record<string, unknown>>().nullable(),
  },
})
export type AuditEvent = InferEntity<typeof AuditEventSchema>
