import { existsSync, renameSync, rmSync } from 'node:fs'
import { dirname, resolve } from 'node:path'
import Database from 'better-sqlite3'

/**
 * Online backup and restore of the SQLite database with SQLite's backup API (better-sqlite3's
 * `.backup()`), used by `npm run db:backup` and `npm run db:restore`.
 *
 * Backup copies every page in one step from a read-only connection: in WAL mode that one step reads a
 * consistent snapshot while the app keeps writing (writers are not blocked by a WAL reader, and a
 * single-step backup is never restarted by their commits). The copy is written to `<dest>.partial`,
 * checked with `pragma integrity_check`, then renamed into place, so a half-written file never carries
 * the final name.
 */

export interface BackupReport {
  source: string
  destination: string
  pages: number
  bytes: number
  ms: number
  tables: Record<string, number>
}

/** Largest page count better-sqlite3 accepts for one step: copy everything at once. */
const ALL_PAGES = 0x7fffffff

export function tableCounts(db: Database.Database): Record<string, number> {
  const names = db.prepare(`select name from sqlite_master where type = 'table' and name not like 'sqlite_%' order by name`).pluck().all() as string[]
  const out: Record<string, number> = {}
  for (const n of names)
    out[n] = Number(
      db
        .prepare(`select count(*) from "${n.replace(/"/g, '""')}"`)
        .pluck()
        .get(),
    )
  return out
}

export function checkIntegrity(file: string): void {
  const db = new Database(file, { readonly: true, fileMustExist: true })
  try {
    const result = db.pragma('integrity_check', { simple: true })
    if (result !== 'ok') throw new Error(`${file}: integrity check failed: ${String(result)}`)
    const fk = db.pragma('foreign_key_check') as unknown[]
    if (fk.length) throw new Error(`${file}: ${fk.length} foreign key violations`)
  } finally {
    db.close()
  }
}

export async function backupSqlite(sourcePath: string, destPath: string): Promise<BackupReport> {
  const source = resolve(sourcePath)
  const destination = resolve(destPath)
  if (!existsSync(source)) throw new Error(`No database at ${source}.`)
  if (existsSync(destination)) throw new Error(`${destination} exists; choose a new file name (a backup never overwrites).`)
  if (!existsSync(dirname(destination))) throw new Error(`The folder ${dirname(destination)} does not exist.`)
  const partial = `${destination}.partial`
  rmSync(partial, { force: true })
  const started = performance.now()
  const db = new Database(source, { readonly: true, fileMustExist: true, timeout: 5000 })
  let pages = 0
  try {
    const r = await db.backup(partial, { progress: () => ALL_PAGES })
    pages = r.totalPages
  } finally {
    db.close()
  }
  checkIntegrity(partial)
  const copy = new Database(partial, { readonly: true })
  const tables = tableCounts(copy)
  const pageSize = Number(copy.pragma('page_size', { simple: true }))
  copy.close()
  renameSync(partial, destination)
  return { source, destination, pages, bytes: pages * pageSize, ms: Math.round(performance.now() - started), tables }
}

export class DatabaseInUseError extends Error {}

/**
 * True when another connection (a running app, a CLI) has the database open. Switching a WAL database
 * to another journal mode needs the only connection; SQLite answers SQLITE_BUSY otherwise.
 */
export function assertNotInUse(file: string): void {
  if (!existsSync(file)) return
  const db = new Database(file, { fileMustExist: true, timeout: 0 })
  try {
    const mode = String(db.pragma('journal_mode', { simple: true }))
    if (mode === 'wal') {
      try {
        db.pragma('journal_mode = DELETE')
      } catch (err) {
        if ((err as { code?: string }).code === 'SQLITE_BUSY')
          throw new DatabaseInUseError(`${file} is open in another process (is the app running?). Stop it first.`)
        throw err
      }
    } else {
      // rollback journal: an exclusive transaction succeeds only without other readers or writers
      try {
        db.exec('begin exclusive; commit')
      } catch (err) {
        if ((err as { code?: string }).code === 'SQLITE_BUSY') throw new DatabaseInUseError(`${file} is in use by another process. Stop it first.`)
        throw err
      }
    }
  } finally {
    db.close()
  }
}

export interface RestoreReport {
  source: string
  target: string
  /** where the database that was replaced now is (undefined when there was none) */
  previous?: string
  tables: Record<string, number>
}

/**
 * Replaces the database at `targetPath` with the backup at `sourcePath`. Refuses while another process
 * has the target open. The replaced database is kept beside it as `<target>.before-restore-<time>`.
 */
export async function restoreSqlite(sourcePath: string, targetPath: string, now = new Date()): Promise<RestoreReport> {
  const source = resolve(sourcePath)
  const target = resolve(targetPath)
  if (!existsSync(source)) throw new Error(`No backup at ${source}.`)
  checkIntegrity(source)
  const probe = new Database(source, { readonly: true })
  const tables = tableCounts(probe)
  probe.close()
  if (!('users' in tables)) throw new Error(`${source} does not look like a Fillwright database (no users table).`)
  assertNotInUse(target)
  const incoming = `${target}.restoring`
  rmSync(incoming, { force: true })
  const src = new Database(source, { readonly: true })
  try {
    await src.backup(incoming, { progress: () => ALL_PAGES })
  } finally {
    src.close()
  }
  checkIntegrity(incoming)
  let previous: string | undefined
  if (existsSync(target)) {
    previous = `${target}.before-restore-${now.toISOString().replace(/[:.]/g, '-')}`
    renameSync(target, previous)
  }
  // a stale -wal/-shm of the replaced database must never be applied to the restored one
  for (const suffix of ['-wal', '-shm']) rmSync(target + suffix, { force: true })
  renameSync(incoming, target)
  const db = new Database(target)
  db.pragma('journal_mode = WAL')
  db.close()
  checkIntegrity(target)
  return { source, target, previous, tables }
}
