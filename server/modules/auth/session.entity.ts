import { defineEntity, type InferEntity, p } from '@mikro-orm/core'

/** A persisted express-session record (see server/lib/session-store.ts). */
export const SessionSchema = defineEntity({
  name: 'Session',
  tableName: 'sessions',
  properties: {
    sid: p.string().length(128).primary(),
    data: p.text(),
    expiresAt: p.bigint('number').index(),
  },
})
