import { request as httpRequest } from 'node:http'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { HttpSession, prepareSchemaFromEntities, removeDir, type ServerProcess, startServer, tempDir } from '../../scripts/lib/server-process.ts'

/**
 * Several app processes behind one port (WEB_CONCURRENCY=2 → node:cluster in server/index.ts): a
 * session made on one process is valid on the other (sessions live in the database), both processes
 * serve, and when one is killed the primary starts another while the survivor keeps serving.
 * Which process answered is read from the request log lines (pino, with pid) by a unique probe number.
 */

const dir = tempDir('cluster')
let server: ServerProcess | undefined
afterAll(async () => {
  await server?.stop()
  removeDir(dir)
})

/** One request on a fresh TCP connection (no keep-alive), so the cluster can hand it to any worker. */
function freshGet(url: string, cookie: string): Promise<{ status: number; body: string }> {
  return new Promise((resolve, reject) => {
    const req = httpRequest(url, { agent: false, headers: { cookie, connection: 'close' } }, (res) => {
      let body = ''
      res.on('data', (d: Buffer) => {
        body += d.toString()
      })
      res.on('end', () => resolve({ status: res.statusCode ?? 0, body }))
    })
    req.on('error', reject)
    req.setTimeout(5000, () => req.destroy(new Error('timeout')))
    req.end()
  })
}

function pidsByProbe(output: string): Map<string, number> {
  const out = new Map<string, number>()
  for (const line of output.split('\n')) {
    if (!line.includes('probe=')) continue
    try {
      const j = JSON.parse(line) as { pid: number; req?: { url?: string } }
      const m = /probe=([\w-]+)/.exec(j.req?.url ?? '')
      if (m) out.set(m[1] as string, j.pid)
    } catch {
      // not a log line
    }
  }
  return out
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms))

describe('WEB_CONCURRENCY=2 (node:cluster)', () => {
  it('serves from both processes with one shared session, and survives a killed process', async () => {
    const db = join(dir, 'db.sqlite')
    await prepareSchemaFromEntities(db)
    server = await startServer({ dbPath: db, env: { WEB_CONCURRENCY: '2', LOG_LEVEL: 'info' } })
    const s = new HttpSession(server.url)
    await s.signIn('admin@demo.test')

    // both workers up (each compiles the server on start, so the second may lag): probe until two pids answered
    const seen = new Map<string, number>()
    const deadline = Date.now() + 90_000
    let n = 0
    while (Date.now() < deadline) {
      const r = await freshGet(`${server.url}/api/auth/me?probe=a${n++}`, s.cookie)
      expect(r.status, r.body).toBe(200)
      expect(JSON.parse(r.body).email).toBe('admin@demo.test')
      for (const [k, v] of pidsByProbe(server.output())) seen.set(k, v)
      if (new Set(seen.values()).size >= 2) break
      await sleep(100)
    }
    // then a burst on fresh connections: every one answered, by both processes
    for (let i = 0; i < 40; i++) {
      const r = await freshGet(`${server.url}/api/auth/me?probe=burst${i}`, s.cookie)
      expect(r.status).toBe(200)
    }
    await sleep(200)
    const burst = [...pidsByProbe(server.output())].filter(([k]) => k.startsWith('burst')).map(([, v]) => v)
    expect(burst.length).toBe(40)
    const workerPids = new Set(burst)
    expect(workerPids.size).toBe(2)
    expect(workerPids.has(server.pid)).toBe(false) // the primary does not serve
    const perPid = [...workerPids].map((p) => burst.filter((x) => x === p).length)
    console.info(`cluster: 40 signed-in requests on fresh connections, per worker ${perPid.join(' / ')}`)

    // kill one worker: once the primary has seen it go, the survivor serves everything, the primary
    // starts a replacement, and the session is valid on it (a request already handed to the killed
    // process when it died is lost: that one the client has to retry)
    const [victim] = [...workerPids] as [number]
    process.kill(victim, 'SIGKILL')
    const noticed = Date.now() + 10_000
    while (!server.output().includes('starting another') && Date.now() < noticed) await sleep(20)
    expect(server.output()).toContain('starting another')
    const after = new Map<string, number>()
    let failures = 0
    let requests = 0
    const until = Date.now() + 90_000
    while (Date.now() < until) {
      const r = await freshGet(`${server.url}/api/auth/me?probe=k${requests++}`, s.cookie).catch(() => ({ status: 0, body: '' }))
      if (r.status !== 200) failures++
      for (const [k, v] of pidsByProbe(server.output())) if (k.startsWith('k')) after.set(k, v)
      const pids = new Set(after.values())
      if (pids.size >= 2) break
      await sleep(100)
    }
    const afterPids = new Set(after.values())
    expect(afterPids.has(victim)).toBe(false)
    expect(afterPids.size).toBe(2) // the survivor and the replacement
    expect(failures).toBe(0)
    console.info(`cluster: after killing ${victim}, ${requests} requests until the replacement served, ${failures} failed`)

    // sign-out on whichever process ends the session on every process
    const out = await s.request('POST', '/api/auth/logout')
    expect(out.status).toBe(200)
    for (let i = 0; i < 10; i++) expect((await freshGet(`${server.url}/api/auth/me?probe=c${i}`, s.cookie)).status).toBe(401)
  }, 240_000)
})
