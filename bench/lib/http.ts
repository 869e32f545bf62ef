/**
 * HTTP helpers for the benchmarks: start the server child process, sign in like the client does (CSRF token, then
 * login, keep the session cookie), and run autocannon against loopback addresses for a bounded time.
 */
import { type ChildProcess, fork } from 'node:child_process'
import { dirname, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import autocannon from 'autocannon'
import type { ChildConfig, ChildPorts } from '../server/child.ts'

const here = dirname(fileURLToPath(import.meta.url))

export interface ServerChild {
  ports: ChildPorts
  url(port: keyof ChildPorts, path: string): string
  /** CPU time (user + system, µs) the server process has used so far */
  cpuMicros(): Promise<number>
  stop(): Promise<void>
}

/** Starts bench/server/child.ts on the database; resolves once every server listens (bounded: 60 s). */
export function startServerChild(config: ChildConfig): Promise<ServerChild> {
  const child: ChildProcess = fork(resolve(here, '../server/child.ts'), [], {
    execArgv: ['--import', 'tsx'],
    env: { ...process.env, FILLWRIGHT_BENCH_CHILD: JSON.stringify(config), NODE_ENV: 'production' },
    stdio: ['ignore', 'ignore', 'pipe', 'ipc'],
  })
  let stderr = ''
  child.stderr?.on('data', (d: Buffer) => {
    stderr += d.toString()
  })
  return new Promise((resolvePromise, reject) => {
    const timer = setTimeout(() => {
      child.kill('SIGKILL')
      reject(new Error(`the bench server did not start within 60 s\n${stderr}`))
    }, 60_000)
    child.once('exit', (code) => {
      clearTimeout(timer)
      reject(new Error(`the bench server exited with ${code}\n${stderr}`))
    })
    child.on('message', (m: { type?: string; ports?: ChildPorts }) => {
      if (m.type !== 'ready' || !m.ports) return
      clearTimeout(timer)
      child.removeAllListeners('exit')
      const ports = m.ports
      let nextId = 1
      resolvePromise({
        ports,
        url: (port, path) => `http://127.0.0.1:${ports[port]}${path}`,
        cpuMicros: () =>
          new Promise<number>((done) => {
            const id = nextId++
            const onMessage = (r: { type?: string; id?: number; micros?: number }) => {
              if (r.type !== 'cpu' || r.id !== id) return
              child.off('message', onMessage)
              done(r.micros ?? 0)
            }
            child.on('message', onMessage)
            child.send({ type: 'cpu', id })
          }),
        stop: () =>
          new Promise<void>((done) => {
            if (child.exitCode !== null) return done()
            const kill = setTimeout(() => child.kill('SIGKILL'), 10_000)
            child.once('exit', () => {
              clearTimeout(kill)
              done()
            })
            child.send({ type: 'stop' })
          }),
      })
    })
  })
}

export interface Session {
  cookie: string
  csrf: string
}

function cookieOf(res: Response, previous = ''): string {
  const set = res.headers.getSetCookie()
  const sid = set.map((c) => c.split(';')[0]).find((c) => c.startsWith('fillwright.sid='))
  return sid ?? previous
}

/** GET /api/auth/csrf, then POST /api/auth/login as the demo account of the role. */
export async function signIn(baseUrl: string, email: string, password: string): Promise<Session> {
  const csrfRes = await fetch(`${baseUrl}/api/auth/csrf`)
  if (!csrfRes.ok) throw new Error(`GET /api/auth/csrf answered ${csrfRes.status}`)
  let cookie = cookieOf(csrfRes)
  const { token } = (await csrfRes.json()) as { token: string }
  const login = await fetch(`${baseUrl}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-csrf-token': token, cookie },
    body: JSON.stringify({ email, password }),
  })
  if (!login.ok) throw new Error(`sign-in as ${email} answered ${login.status}: ${await login.text()}`)
  cookie = cookieOf(login, cookie)
  const body = (await login.json()) as { csrfToken?: string }
  return { cookie, csrf: body.csrfToken ?? token }
}

export interface LoadResult {
  requestsPerSecond: number
  /** server CPU time per request (µs), when the server process was sampled */
  serverCpuMicrosPerRequest: number | null
  latencyP50Ms: number
  latencyP99Ms: number
  latencyMeanMs: number
  requests: number
  non2xx: number
  errors: number
  timeouts: number
}

export interface LoadOptions {
  url: string
  method?: 'GET' | 'POST'
  headers?: Record<string, string>
  body?: string
  /** a fresh body per request (e.g. a new client request id) */
  bodyFactory?: () => string
  /** the server's CPU clock, sampled before and after the run */
  cpuMicros?: () => Promise<number>
  /** autocannon request definitions (setupRequest/onResponse) for stateful sequences */
  requests?: unknown[]
  connections?: number
  durationSeconds: number
}

/** One bounded autocannon run (loopback only). */
export async function load(options: LoadOptions): Promise<LoadResult> {
  const host = new URL(options.url).hostname
  if (host !== '127.0.0.1' && host !== 'localhost' && host !== '[::1]') throw new Error(`load is sent to loopback addresses only, not ${host}`)
  const headers = {
    ...(options.headers ?? {}),
    ...(options.body || options.bodyFactory || options.method === 'POST' ? { 'content-type': 'application/json' } : {}),
  }
  const factory = options.bodyFactory
  const cpuBefore = options.cpuMicros ? await options.cpuMicros() : null
  const result = await autocannon({
    url: options.url,
    method: options.method ?? 'GET',
    headers,
    body: options.body,
    connections: options.connections ?? 10,
    pipelining: 1,
    duration: options.durationSeconds,
    timeout: 10,
    ...(factory ? { requests: [{ setupRequest: (req: Record<string, unknown>) => ({ ...req, body: factory() }) }] } : {}),
    ...(options.requests ? { requests: options.requests } : {}),
  } as autocannon.Options)
  const cpuAfter = options.cpuMicros ? await options.cpuMicros() : null
  const answered = result.requests.total
  return {
    requestsPerSecond: result.requests.average,
    serverCpuMicrosPerRequest: cpuBefore !== null && cpuAfter !== null && answered > 0 ? (cpuAfter - cpuBefore) / answered : null,
    latencyP50Ms: result.latency.p50,
    latencyP99Ms: result.latency.p99,
    latencyMeanMs: result.latency.average,
    requests: result.requests.total,
    non2xx: result.non2xx,
    errors: result.errors,
    timeouts: result.timeouts,
  }
}
