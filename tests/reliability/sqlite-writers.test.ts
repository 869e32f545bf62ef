import { spawn } from 'node:child_process'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { initOrm } from '#server/db.ts'
import { prepareSchemaFromEntities, ROOT, removeDir, tempDir } from '../../scripts/lib/server-process.ts'

/**
 * Two processes on one SQLite file (WEB_CONCURRENCY=2, or the app and a CLI) each run read-then-write
 * transactions. With SQLite's default deferred BEGIN, a transaction that read before the other process
 * committed cannot take the write lock and fails at once with "database is locked" (no waiting is
 * possible there); server/db.ts begins transactions IMMEDIATE, so they wait for the lock instead.
 */

const dir = tempDir('writers')
afterAll(() => removeDir(dir))

function writer(dbPath: string, name: string, count: number): Promise<{ ok: number; failed: number; messages: string[] }> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', 'tsx', 'tests/reliability/support/sqlite-writer.ts', dbPath, name, String(count)], {
      cwd: ROOT,
      stdio: ['ignore', 'pipe', 'inherit'],
    })
    let out = ''
    child.stdout.on('data', (d: Buffer) => {
      out += d.toString()
    })
    child.once('exit', (code) => {
      if (code !== 0) return reject(new Error(`writer ${name} exited with ${code}: ${out}`))
      resolve(JSON.parse(out.trim().split('\n').pop() as string))
    })
  })
}

describe('several processes writing one SQLite file', () => {
  it('read-then-write transactions from two processes all commit (none fails with "database is locked")', async () => {
    const db = join(dir, 'db.sqlite')
    await prepareSchemaFromEntities(db)
    const [a, b] = await Promise.all([writer(db, 'a', 400), writer(db, 'b', 400)])
    console.info(`writers: a ${a.ok} ok / ${a.failed} failed, b ${b.ok} ok / ${b.failed} failed ${[...a.messages, ...b.messages].join('; ')}`)
    expect(a.failed + b.failed, [...a.messages, ...b.messages].join('; ')).toBe(0)
    const orm = await initOrm({ databasePath: db })
    const [row] = (await orm.em.getConnection().execute(`select count(*) as n from audit_events where entity_type = 'writer'`)) as { n: number }[]
    await orm.close()
    expect(Number(row?.n)).toBe(800)
  }, 120_000)
})
