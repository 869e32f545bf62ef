import type { MikroORM } from '@mikro-orm/core'
import session from 'express-session'
import { readRow } from './prepared-reads.ts'

/** A session's stored expiry is moved forward at most this often (per process), not on every request. */
export const TOUCH_INTERVAL_MS = 60_000
/** Sessions whose last write this process remembers (beyond it the memory is cleared: one extra write each). */
const TOUCH_MEMORY = 10_000

/**
 * express-session store on the app's own database (SQLite or PostgreSQL through MikroORM), so
 * sessions survive a restart and are shared by every app process. Expired rows are purged lazily.
 * With a rolling session every request touches the session; the store writes the new expiry only when it
 * moved by TOUCH_INTERVAL_MS or more since this process last wrote it, so a signed-in read is no database write.
 */
export class DatabaseSessionStore extends session.Store {
  private lastPurgeMs = 0
  /** sid → expiry (ms) this process last wrote */
  private readonly written = new Map<string, number>()

  constructor(private readonly orm: MikroORM) {
    super()
  }

  private conn() {
    return this.orm.em.getConnection()
  }

  private expiry(sess: session.SessionData): number {
    const exp = sess.cookie?.expires ? new Date(sess.cookie.expires).getTime() : Date.now() + 24 * 3600_000
    return exp
  }

  override get(sid: string, cb: (err: unknown, session?: session.SessionData | null) => void): void {
    // read on every request: a prepared statement (server/lib/prepared-reads.ts)
    readRow<{ data: string; expires_at: number | string }>(this.orm.em, 'select data, expires_at from sessions where sid = ?', [sid])
      .then((row) => {
        if (!row || Number(row.expires_at) < Date.now()) return cb(null, null)
        cb(null, JSON.parse(row.data) as session.SessionData)
      })
      .catch((err) => cb(err))
  }

  override set(sid: string, sess: session.SessionData, cb?: (err?: unknown) => void): void {
    const data = JSON.stringify(sess)
    this.conn()
      .execute(
        'insert into sessions (sid, data, expires_at) values (?, ?, ?) on conflict (sid) do update set data = excluded.data, expires_at = excluded.expires_at',
        [sid, data, this.expiry(sess)],
      )
      .then(() => this.remember(sid, this.expiry(sess)))
      .then(() => this.maybePurge())
      .then(() => cb?.())
      .catch((err) => cb?.(err))
  }

  override touch(sid: string, sess: session.SessionData, cb?: (err?: unknown) => void): void {
    const expires = this.expiry(sess)
    const last = this.written.get(sid)
    if (last !== undefined && expires - last < TOUCH_INTERVAL_MS) {
      cb?.()
      return
    }
    this.conn()
      .execute('update sessions set expires_at = ? where sid = ?', [expires, sid])
      .then(() => this.remember(sid, expires))
      .then(() => cb?.())
      .catch((err) => cb?.(err))
  }

  override destroy(sid: string, cb?: (err?: unknown) => void): void {
    this.written.delete(sid)
    this.conn()
      .execute('delete from sessions where sid = ?', [sid])
      .then(() => cb?.())
      .catch((err) => cb?.(err))
  }

  private remember(sid: string, expires: number): void {
    if (this.written.size >= TOUCH_MEMORY && !this.written.has(sid)) this.written.clear()
    this.written.set(sid, expires)
  }

  private async maybePurge(): Promise<void> {
    const now = Date.now()
    if (now - this.lastPurgeMs < 10 * 60_000) return
    this.lastPurgeMs = now
    await this.conn().execute('delete from sessions where expires_at < ?', [now])
  }
}
