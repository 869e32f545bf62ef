import { type ChildProcess, spawn } from 'node:child_process'
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs'
import { createServer } from 'node:net'
import { join } from 'node:path'
import { type DbSettings, initOrm } from '../../server/db.ts'

/**
 * The real server as `npm start` runs it (node --import tsx server/index.ts), on a temporary SQLite
 * file and a free port, without the local fakes. Used by the crash, backup and cluster tests in
 * tests/reliability and by scripts/load.ts.
 */

export const ROOT = process.cwd()
export const SERVER_DEMO_PASSWORD = 'reliability-demo-pw'

export function tempDir(prefix: string): string {
  const base = join(ROOT, 'tests', '.tmp')
  mkdirSync(base, { recursive: true })
  return mkdtempSync(join(base, `${prefix}-`))
}

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer()
    srv.once('error', reject)
    srv.listen(0, '127.0.0.1', () => {
      const addr = srv.address()
      const port = typeof addr === 'object' && addr ? addr.port : 0
      srv.close(() => resolve(port))
    })
  })
}

/**
 * Creates the schema from the entities and records every committed migration as applied, so the
 * server's own start (migrate → immutability triggers → seed) runs on the current entity set whether or
 * not the migrations have been regenerated yet. tests/reliability/migrations.test.ts checks the
 * migrations themselves.
 */
export async function prepareSchemaFromEntities(target: string | DbSettings): Promise<void> {
  const orm = await initOrm(typeof target === 'string' ? { databasePath: target } : target)
  try {
    await orm.schema.createSchema()
    const migrator = orm.getMigrator()
    const storage = migrator.getStorage()
    await storage.ensureTable?.()
    for (const m of await migrator.getPendingMigrations()) await storage.logMigration({ name: m.name, context: null } as never)
  } finally {
    await orm.close()
  }
}

export interface ServerProcess {
  child: ChildProcess
  pid: number
  port: number
  url: string
  /** everything the process printed (JSON log lines) */
  output(): string
  /** resolves with the exit code or signal */
  exited: Promise<{ code: number | null; signal: NodeJS.Signals | null }>
  stop(): Promise<void>
}

export async function startServer(options: { dbPath: string; env?: Record<string, string>; port?: number; timeoutMs?: number }): Promise<ServerProcess> {
  const port = options.port ?? (await freePort())
  const env: Record<string, string> = {
    PATH: process.env.PATH ?? '',
    HOME: process.env.HOME ?? '/tmp',
    NODE_ENV: 'production',
    HOST: '127.0.0.1',
    PORT: String(port),
    DATABASE_PATH: options.dbPath,
    DATABASE_URL: '',
    START_FAKES: 'false',
    SEED_DEMO: 'true',
    DEMO_PASSWORD: SERVER_DEMO_PASSWORD,
    SESSION_SECRET: 'reliability-session-secret-0123456789',
    LOG_LEVEL: 'warn',
    UPLOAD_DIR: join(options.dbPath, '..', 'uploads'),
    SMTP_HOST: '127.0.0.1',
    SMTP_PORT: '9',
    STRIPE_API_PORT: '9',
    WEB_CONCURRENCY: '1',
    ...options.env,
  }
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], { cwd: ROOT, env, stdio: ['ignore', 'pipe', 'pipe'] })
  let out = ''
  child.stdout?.on('data', (d: Buffer) => {
    out += d.toString()
  })
  child.stderr?.on('data', (d: Buffer) => {
    out += d.toString()
  })
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) =>
    child.once('exit', (code, signal) => resolve({ code, signal })),
  )
  const url = `http://127.0.0.1:${port}`
  const deadline = Date.now() + (options.timeoutMs ?? 60_000)
  let dead = false
  void exited.then(() => {
    dead = true
  })
  for (;;) {
    if (dead) throw new Error(`server exited before it was ready:\n${out}`)
    try {
      const r = await fetch(`${url}/api/health`)
      if (r.status === 200) break
    } catch {
      // not listening yet
    }
    if (Date.now() > deadline) {
      child.kill('SIGKILL')
      throw new Error(`server not ready after ${options.timeoutMs ?? 60_000} ms:\n${out}`)
    }
    await new Promise((r) => setTimeout(r, 100))
  }
  return {
    child,
    pid: child.pid as number,
    port,
    url,
    output: () => out,
    exited,
    async stop() {
      if (child.exitCode !== null || child.signalCode !== null) return
      child.kill('SIGTERM')
      const timer = setTimeout(() => child.kill('SIGKILL'), 10_000)
      await exited
      clearTimeout(timer)
    },
  }
}

/** A tiny cookie-keeping HTTP client with the CSRF token, for talking to a real server. */
export class HttpSession {
  cookie = ''
  csrf = ''
  constructor(readonly baseUrl: string) {}

  async request(method: string, path: string, body?: unknown, headers: Record<string, string> = {}): Promise<{ status: number; body: any; headers: Headers }> {
    const h: Record<string, string> = { ...headers }
    if (this.cookie) h.cookie = this.cookie
    if (method !== 'GET' && this.csrf) h['x-csrf-token'] = this.csrf
    if (body !== undefined) h['content-type'] = 'application/json'
    const res = await fetch(this.baseUrl + path, { method, headers: h, body: body === undefined ? undefined : JSON.stringify(body) })
    const set = res.headers.getSetCookie().find((c) => c.startsWith('fillwright.sid='))
    if (set) this.cookie = set.split(';')[0] as string
    const text = await res.text()
    let parsed: unknown = text
    try {
      parsed = text ? JSON.parse(text) : undefined
    } catch {
      // not JSON
    }
    return { status: res.status, body: parsed, headers: res.headers }
  }

  async signIn(email: string, password = SERVER_DEMO_PASSWORD): Promise<void> {
    const c = await this.request('GET', '/api/auth/csrf')
    if (c.status !== 200) throw new Error(`csrf: ${c.status}`)
    this.csrf = c.body.token
    const r = await this.request('POST', '/api/auth/login', { email, password })
    if (r.status !== 200) throw new Error(`sign-in ${email}: ${r.status} ${JSON.stringify(r.body)}`)
    this.csrf = r.body.csrfToken ?? this.csrf
  }
}

export function removeDir(dir: string): void {
  rmSync(dir, { recursive: true, force: true })
}
