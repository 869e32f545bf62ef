import type { EntityManager } from '@mikro-orm/core'
import type { SessionUser } from '#shared/schemas/auth.ts'
import { AuditEventSchema } from '../modules/audit/audit-event.entity.ts'

/**
 * Appends an audit event in the caller's unit of work (it is flushed with the change it describes,
 * inside the same transaction).
 */
export function audit(
  em: EntityManager,
  actor: SessionUser | null,
  action: string,
  entityType: string,
  entityId: string | number,
  detail?: Record<string, unknown>,
): void {
  em.create(AuditEventSchema, {
    actorId: actor?.id ?? null,
    actorEmail: actor?.email ?? null,
    action,
    entityType,
    entityId: String(entityId),
    detail: detail ?? null,
  })
}
