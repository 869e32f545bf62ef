import type session from 'express-session'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DatabaseSessionStore, TOUCH_INTERVAL_MS } from '#server/lib/session-store.ts'
import { createTestApp, type TestApp } from '#tests/support/test-app.ts'

let t: TestApp
beforeAll(async () => {
  t = await createTestApp({ seed: false })
})
afterAll(async () => {
  await t.close()
})

function sessionExpiring(at: number): session.SessionData {
  return { cookie: { expires: new Date(at), originalMaxAge: 3_600_000 } } as unknown as session.SessionData
}

function call(fn: (cb: (err?: unknown) => void) => void): Promise<void> {
  return new Promise((resolve, reject) => fn((err) => (err ? reject(err) : resolve())))
}

async function storedExpiry(sid: string): Promise<number | null> {
  const rows = await t.orm.em.getConnection().execute<{ expires_at: number | string }[]>('select expires_at from sessions where sid = ?', [sid])
  return rows[0] ? Number(rows[0].expires_at) : null
}

describe('session store: rolling expiry writes', () => {
  it('moves the stored expiry only when it advanced by the touch interval since this process wrote it', async () => {
    const store = new DatabaseSessionStore(t.orm)
    const sid = 'touch-interval-check'
    const t0 = Date.UTC(2027, 0, 4, 8, 0, 0)
    await call((cb) => store.set(sid, sessionExpiring(t0), cb))
    expect(await storedExpiry(sid)).toBe(t0)

    await call((cb) => store.touch(sid, sessionExpiring(t0 + TOUCH_INTERVAL_MS / 2), cb))
    expect(await storedExpiry(sid)).toBe(t0)

    await call((cb) => store.touch(sid, sessionExpiring(t0 + TOUCH_INTERVAL_MS + 1000), cb))
    expect(await storedExpiry(sid)).toBe(t0 + TOUCH_INTERVAL_MS + 1000)
  })

  it('writes on the first touch of a session this process has not written (another app process made it)', async () => {
    const writer = new DatabaseSessionStore(t.orm)
    const other = new DatabaseSessionStore(t.orm)
    const sid = 'touch-other-process'
    const t0 = Date.UTC(2027, 0, 4, 9, 0, 0)
    await call((cb) => writer.set(sid, sessionExpiring(t0), cb))
    await call((cb) => other.touch(sid, sessionExpiring(t0 + 5000), cb))
    expect(await storedExpiry(sid)).toBe(t0 + 5000)
  })

  it('forgets a destroyed session, so a new session under the same id is written again', async () => {
    const store = new DatabaseSessionStore(t.orm)
    const sid = 'touch-after-destroy'
    const t0 = Date.UTC(2027, 0, 4, 10, 0, 0)
    await call((cb) => store.set(sid, sessionExpiring(t0), cb))
    await call((cb) => store.destroy(sid, cb))
    expect(await storedExpiry(sid)).toBeNull()
    await t.orm.em.getConnection().execute('insert into sessions (sid, data, expires_at) values (?, ?, ?)', [sid, '{}', t0])
    await call((cb) => store.touch(sid, sessionExpiring(t0 + 2000), cb))
    expect(await storedExpiry(sid)).toBe(t0 + 2000)
  })
})
