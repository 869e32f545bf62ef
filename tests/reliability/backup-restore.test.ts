import { execFile, spawn } from 'node:child_process'
import { existsSync } from 'node:fs'
import { join } from 'node:path'
import { promisify } from 'node:util'
import Database from 'better-sqlite3'
import { afterAll, describe, expect, it } from 'vitest'
import { HttpSession, prepareSchemaFromEntities, ROOT, removeDir, type ServerProcess, startServer, tempDir } from '../../scripts/lib/server-process.ts'

/**
 * Online backup while the app runs and another process keeps writing, restore into a new file, and the
 * app starts on the restore with the data in it. The writer numbers its rows 1, 2, 3…; a consistent
 * snapshot holds exactly rows 1..K with no gap, K at least what was written before the backup began.
 */

const run = promisify(execFile)
const dir = tempDir('backup')
const live = join(dir, 'live.sqlite')
const servers: ServerProcess[] = []

afterAll(async () => {
  for (const s of servers) await s.stop()
  removeDir(dir)
})

/** A second process that inserts numbered audit rows, one transaction each, until it is told to stop. */
function startWriter(dbPath: string) {
  const code = `
    const Database = require(${JSON.stringify(join(ROOT, 'node_modules', 'better-sqlite3'))})
    const db = new Database(process.argv[1], { timeout: 5000 })
    db.pragma('journal_mode = WAL')
    const ins = db.prepare("insert into audit_events (at, action, entity_type, entity_id, detail) values (?, 'reliability.write', 'probe', ?, null)")
    let n = 0, stop = false
    process.on('SIGTERM', () => { stop = true })
    const tick = () => {
      for (let i = 0; i < 20 && !stop; i++) { n++; ins.run(Date.now(), String(n)) }
      process.stdout.write(n + '\\n')
      if (stop) { db.close(); process.exit(0) } else setImmediate(tick)
    }
    tick()
  `
  const child = spawn(process.execPath, ['-e', code, dbPath], { stdio: ['ignore', 'pipe', 'inherit'] })
  let last = 0
  child.stdout.on('data', (d: Buffer) => {
    const lines = d.toString().trim().split('\n')
    last = Number(lines[lines.length - 1])
  })
  const exited = new Promise<number | null>((r) => child.once('exit', (c) => r(c)))
  return {
    written: () => last,
    async stop() {
      child.kill('SIGTERM')
      return exited
    },
  }
}

function probeRows(file: string): number[] {
  const db = new Database(file, { readonly: true })
  try {
    return (db.prepare(`select cast(entity_id as integer) from audit_events where action = 'reliability.write' order by 1`).pluck().all() as number[]).map(
      Number,
    )
  } finally {
    db.close()
  }
}

const waitFor = async (cond: () => boolean, ms: number) => {
  const end = Date.now() + ms
  while (!cond()) {
    if (Date.now() > end) throw new Error('timed out')
    await new Promise((r) => setTimeout(r, 20))
  }
}

describe('online backup and restore (SQLite backup API)', () => {
  it('backs up the live database while the app runs and a writer keeps writing; the restore starts and holds the data', async () => {
    await prepareSchemaFromEntities(live)
    const app = await startServer({ dbPath: live })
    servers.push(app)
    const s = new HttpSession(app.url)
    await s.signIn('admin@demo.test')

    const writer = startWriter(live)
    await waitFor(() => writer.written() >= 2000, 20_000)
    const beforeBackup = writer.written()
    const backupFile = join(dir, 'backup.sqlite')
    const out = await run(process.execPath, ['--import', 'tsx', 'scripts/db-backup.ts', backupFile], {
      cwd: ROOT,
      env: { ...process.env, DATABASE_URL: '', DATABASE_PATH: live },
    })
    const afterBackup = writer.written()
    await waitFor(() => writer.written() >= afterBackup + 500, 20_000)
    expect(await writer.stop()).toBe(0)
    const finalCount = writer.written()
    // the app kept serving during the backup
    expect((await s.request('GET', '/api/auth/me')).status).toBe(200)

    const report = JSON.parse(out.stdout) as { pages: number; tables: Record<string, number>; ms: number }
    expect(report.pages).toBeGreaterThan(0)
    expect(existsSync(`${backupFile}.partial`)).toBe(false)
    const inBackup = probeRows(backupFile)
    const k = inBackup.length
    expect(k).toBeGreaterThanOrEqual(beforeBackup)
    expect(k).toBeLessThanOrEqual(afterBackup)
    expect(k).toBeLessThan(finalCount) // the writer went on after the snapshot
    expect(inBackup).toEqual(Array.from({ length: k }, (_, i) => i + 1)) // 1..K, no gap: one consistent snapshot
    console.info(`backup: ${report.pages} pages in ${report.ms} ms; writer rows before/at/after: ${beforeBackup}/${k}/${finalCount}`)

    // a backup never overwrites
    await expect(
      run(process.execPath, ['--import', 'tsx', 'scripts/db-backup.ts', backupFile], {
        cwd: ROOT,
        env: { ...process.env, DATABASE_URL: '', DATABASE_PATH: live },
      }),
    ).rejects.toMatchObject({ code: 1 })

    // restoring over the live database is refused while the app has it open (exit 3), and changes nothing
    const liveRowsBefore = probeRows(live).length
    await expect(
      run(process.execPath, ['--import', 'tsx', 'scripts/db-restore.ts', backupFile], {
        cwd: ROOT,
        env: { ...process.env, DATABASE_URL: '', DATABASE_PATH: live },
      }),
    ).rejects.toMatchObject({ code: 3 })
    expect(probeRows(live).length).toBe(liveRowsBefore)

    // restore into a new file and start the app on it
    const restored = join(dir, 'restored.sqlite')
    const r = await run(process.execPath, ['--import', 'tsx', 'scripts/db-restore.ts', backupFile], {
      cwd: ROOT,
      env: { ...process.env, DATABASE_URL: '', DATABASE_PATH: restored },
    })
    expect(JSON.parse(r.stdout).tables.audit_events).toBeGreaterThanOrEqual(k)
    const app2 = await startServer({ dbPath: restored })
    servers.push(app2)
    const s2 = new HttpSession(app2.url)
    await s2.signIn('qa@demo.test')
    expect((await s2.request('GET', '/api/auth/me')).body.email).toBe('qa@demo.test')
    // the admin session created before the backup is in the restored database: the same cookie works
    const carried = new HttpSession(app2.url)
    carried.cookie = s.cookie
    expect((await carried.request('GET', '/api/auth/me')).status).toBe(200)
    await app2.stop()
    expect(probeRows(restored)).toEqual(inBackup)

    // restoring over a stopped database keeps the replaced file beside it
    await app.stop()
    const r2 = await run(process.execPath, ['--import', 'tsx', 'scripts/db-restore.ts', backupFile], {
      cwd: ROOT,
      env: { ...process.env, DATABASE_URL: '', DATABASE_PATH: live },
    })
    const rep2 = JSON.parse(r2.stdout) as { previous: string }
    expect(existsSync(rep2.previous)).toBe(true)
    expect(probeRows(rep2.previous).length).toBe(finalCount)
    expect(probeRows(live)).toEqual(inBackup)
  }, 180_000)
})
