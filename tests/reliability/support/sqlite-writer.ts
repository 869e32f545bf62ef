import { initOrm } from '../../../server/db.ts'
import { AuditEventSchema } from '../../../server/modules/audit/audit-event.entity.ts'

/**
 * Child process of sqlite-writers.test.ts: read-then-write transactions (count, then insert) on the
 * shared SQLite file, as the app's services do. Prints {"ok": n, "failed": n, "messages": [...]}.
 */
const [dbPath, name, countArg] = process.argv.slice(2) as [string, string, string]
const orm = await initOrm({ databasePath: dbPath })
let ok = 0
let failed = 0
const messages = new Set<string>()
for (let i = 0; i < Number(countArg); i++) {
  try {
    await orm.em.fork().transactional(async (tx) => {
      const before = await tx.count(AuditEventSchema, { entityType: 'writer' })
      tx.create(AuditEventSchema, { action: 'writer.insert', entityType: 'writer', entityId: `${name}-${i}`, detail: { before } })
    })
    ok++
  } catch (err) {
    failed++
    messages.add(String((err as Error).message).slice(-80))
  }
}
await orm.close()
console.log(JSON.stringify({ ok, failed, messages: [...messages] }))
