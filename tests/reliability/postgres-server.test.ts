import { request as httpRequest } from 'node:http'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { initOrm } from '#server/db.ts'
import { HttpSession, removeDir, type ServerProcess, startServer, tempDir } from '../../scripts/lib/server-process.ts'

/**
 * The scale path end to end (runs when TEST_DATABASE_URL names a PostgreSQL role that may create
 * databases; .ci/run sets it): the real server on a fresh PostgreSQL database — the committed
 * server/migrations-pg, the immutability triggers and the demo seed at start — with two app processes
 * behind one port. Both serve one session; a reading recorded through the API survives SIGKILL of the
 * whole server and a restart, and the database refuses to change it.
 */

const base = process.env.TEST_DATABASE_URL
const servers: ServerProcess[] = []
const cleanups: (() => Promise<void> | void)[] = []
afterAll(async () => {
  for (const s of servers) await s.stop()
  for (const c of cleanups.reverse()) await c()
})

function freshGet(url: string, cookie: string): Promise<number> {
  return new Promise((resolve, reject) => {
    const req = httpRequest(url, { agent: false, headers: { cookie, connection: 'close' } }, (res) => {
      res.resume()
      res.on('end', () => resolve(res.statusCode ?? 0))
    })
    req.on('error', reject)
    req.setTimeout(5000, () => req.destroy(new Error('timeout')))
    req.end()
  })
}

function pidsByProbe(output: string): Map<string, number> {
  const out = new Map<string, number>()
  for (const line of output.split('\n')) {
    const m = /"url":"[^"]*probe=([\w-]+)/.exec(line)
    const p = /"pid":(\d+)/.exec(line)
    if (m && p) out.set(m[1] as string, Number(p[1]))
  }
  return out
}

describe.runIf(Boolean(base))('the real server on PostgreSQL', () => {
  it('migrates, seeds, serves one session from two processes, and keeps a reading across SIGKILL', async () => {
    const dir = tempDir('pgserver')
    cleanups.push(() => removeDir(dir))
    const name = `fw_server_${process.pid}_${Date.now()}`
    const admin = async (sql: string) => {
      const o = await initOrm({ databasePath: ':memory:', databaseUrl: base })
      await o.em.getConnection().execute(sql)
      await o.close()
    }
    await admin(`create database "${name}"`)
    cleanups.push(() => admin(`drop database if exists "${name}" with (force)`))
    const url = new URL(base as string)
    url.pathname = `/${name}`
    const env = { DATABASE_URL: url.toString(), WEB_CONCURRENCY: '2', LOG_LEVEL: 'info' }

    const first = await startServer({ dbPath: join(dir, 'unused.sqlite'), env, timeoutMs: 120_000 })
    servers.push(first)
    const tech = new HttpSession(first.url)
    await tech.signIn('technician@demo.test')

    // both processes answer the one session
    const seen = new Map<string, number>()
    const deadline = Date.now() + 90_000
    for (let i = 0; Date.now() < deadline; i++) {
      expect(await freshGet(`${first.url}/api/auth/me?probe=p${i}`, tech.cookie)).toBe(200)
      for (const [k, v] of pidsByProbe(first.output())) seen.set(k, v)
      if (new Set(seen.values()).size >= 2) break
      await new Promise((r) => setTimeout(r, 100))
    }
    expect(new Set(seen.values()).size).toBe(2)

    // a reading on a seeded run, on target
    const mine = (await tech.request('GET', '/api/runs/mine')).body as { id: number; status: string; currentStep: number; stepCount: number }[]
    const open = mine.find((r) => (r.status === 'ready' || r.status === 'in-progress') && r.currentStep < r.stepCount)
    expect(open, 'the demo seed books runs for the technician today').toBeDefined()
    const run = (await tech.request('GET', `/api/runs/${open?.id}`)).body
    const step = run.steps[run.currentStep]
    const recorded = await tech.request('POST', `/api/runs/${run.id}/readings`, {
      stepIndex: run.currentStep,
      pressure: { value: step.cumulativePressure.value, unit: 'bar', reference: 'absolute' },
      temperature: { value: run.fillTemperature.value, unit: 'C' },
      ...(run.method === 'gravimetric' && step.cumulativeMass ? { scaleMass: { value: step.cumulativeMass.value, unit: 'kg' } } : {}),
      clientRequestId: `pg-server-${run.id}-${run.currentStep}`,
      expectedVersion: run.version,
    })
    expect(recorded.status, JSON.stringify(recorded.body)).toBe(201)
    const readingId = recorded.body.reading.id as number

    // the whole server dies at once; a new one on the same database has the reading and the session
    first.child.kill('SIGKILL')
    await first.exited
    for (const pid of new Set(seen.values())) {
      // the workers leave when their primary is gone
      for (let i = 0; i < 50; i++) {
        try {
          process.kill(pid, 0)
        } catch {
          break
        }
        await new Promise((r) => setTimeout(r, 100))
      }
    }
    const second = await startServer({ dbPath: join(dir, 'unused.sqlite'), env, port: first.port, timeoutMs: 120_000 })
    servers.push(second)
    expect((await tech.request('GET', '/api/auth/me')).status).toBe(200)
    const again = (await tech.request('GET', `/api/runs/${run.id}`)).body as { readings: { id: number; pressureBarAbs: number }[] }
    const kept = again.readings.find((r) => r.id === readingId)
    expect(kept).toBeDefined()
    // within 0.5 mbar: the value kept is the value recorded (p.float() columns are `real` on PostgreSQL,
    // about 7 significant digits; see docs/RELIABILITY.md)
    expect(kept?.pressureBarAbs).toBeCloseTo(step.cumulativePressure.value, 3)

    // and the database refuses to change it
    const orm = await initOrm({ databasePath: ':memory:', databaseUrl: url.toString() })
    cleanups.push(() => orm.close())
    await expect(orm.em.getConnection().execute('update fill_readings set pressure_bar_abs = 1 where id = ?', [readingId])).rejects.toThrow(/immutable/)
    await expect(orm.em.getConnection().execute('delete from fill_readings where id = ?', [readingId])).rejects.toThrow(/immutable/)
  }, 300_000)
})
