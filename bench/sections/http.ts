/**
 * API throughput and latency with autocannon (loopback, bounded time), the app beside its floors, all measured in
 * one run against the server child process (bench/server/child.ts) on the bulk database:
 *  - GET /api/orders?limit=50 (signed in as sales) beside the raw-driver handler running the same SQL, and the bare
 *    Express JSON endpoint; single-connection latency of the list and of text searches (server time + loopback);
 *  - POST /api/calc/fill-plan (5 components, GERG-2008; blender) beside zod + planner without the app's middleware,
 *    and the bare Express endpoint parsing the same body;
 *  - POST /api/runs/:id/readings (technician, on-target readings on prepared runs) beside one raw INSERT.
 * Besides requests/s, the server's CPU time per request is sampled: on a busy machine it moves far less than the
 * throughput does, so the CPU ratios say what the throughput ratios would be on a quiet one.
 */
import { deepStrictEqual } from 'node:assert/strict'
import { randomUUID } from 'node:crypto'
import Database from 'better-sqlite3'
import { planRequest } from '../lib/fixtures.ts'
import { type LoadOptions, type LoadResult, load, type ServerChild, type Session, signIn, startServerChild } from '../lib/http.ts'
import { type Report, round, sizeTag } from '../lib/report.ts'

export interface HttpOptions {
  dbPath: string
  /** orders in the large and the small database (for the figures' names) */
  orders: number
  smallOrders?: number
  /** the smaller database for the growth of the single-connection latency */
  smallDbPath?: string
  password: string
  durationSeconds: number
  warmupSeconds: number
  connections: number
}

const SECTION = 'API throughput (autocannon, loopback)'
const LATENCY = 'server time (single connection, through the app)'

function usable(r: LoadResult): boolean {
  return r.non2xx === 0 && r.errors === 0 && r.timeouts === 0 && r.requests > 0
}

/** A warm-up run, then the measured run; null (with a note) when any request failed. */
async function measured(
  report: Report,
  server: ServerChild,
  label: string,
  options: Omit<LoadOptions, 'durationSeconds'>,
  seconds: { run: number; warm: number },
): Promise<LoadResult | null> {
  if (seconds.warm > 0) await load({ ...options, durationSeconds: seconds.warm })
  const r = await load({ ...options, durationSeconds: seconds.run, cpuMicros: () => server.cpuMicros() })
  if (!usable(r)) {
    report.note(`${label}: ${r.non2xx} non-2xx answers, ${r.errors} errors, ${r.timeouts} timeouts of ${r.requests} requests — figure discarded`)
    return null
  }
  return r
}

function addLoad(report: Report, key: string, r: LoadResult | null, label: string): void {
  report.add(SECTION, `${key}_rps`, r ? round(r.requestsPerSecond, 0) : null, `${label}: requests/s`)
  report.add(SECTION, `${key}_p99_ms`, r ? r.latencyP99Ms : null, `${label}: p99 latency`)
  report.add(
    SECTION,
    `${key}_server_cpu_us_per_req`,
    r?.serverCpuMicrosPerRequest != null ? round(r.serverCpuMicrosPerRequest, 0) : null,
    `${label}: server CPU µs per request`,
  )
}

function ratios(report: Report, key: string, app: LoadResult | null, floor: LoadResult | null, label: string): void {
  report.add(
    SECTION,
    `${key}_ratio`,
    app && floor && floor.requestsPerSecond > 0 ? round(app.requestsPerSecond / floor.requestsPerSecond, 3) : null,
    `${label}: throughput ratio`,
  )
  const a = app?.serverCpuMicrosPerRequest
  const f = floor?.serverCpuMicrosPerRequest
  report.add(SECTION, `${key}_cpu_ratio`, a && f ? round(f / a, 3) : null, `${label}: ratio of server CPU per request (floor/app)`)
}

async function routesOf(server: ServerChild): Promise<Set<string>> {
  const res = await fetch(server.url('app', '/api/openapi.json'))
  if (!res.ok) return new Set()
  const doc = (await res.json()) as { paths?: Record<string, Record<string, unknown>> }
  const out = new Set<string>()
  for (const [path, ops] of Object.entries(doc.paths ?? {})) for (const method of Object.keys(ops)) out.add(`${method.toUpperCase()} ${path}`)
  return out
}

function headersOf(s: Session): Record<string, string> {
  return { cookie: s.cookie, 'x-csrf-token': s.csrf }
}

export async function runHttp(report: Report, options: HttpOptions): Promise<void> {
  const seconds = { run: options.durationSeconds, warm: options.warmupSeconds }
  const conns = options.connections
  const server = await startServerChild({ dbPath: options.dbPath })
  try {
    const routes = await routesOf(server)
    const appBase = server.url('app', '')
    report.add(SECTION, 'http_connections', conns, 'autocannon connections per throughput run')
    report.add(SECTION, 'http_duration_s', seconds.run, 'seconds per measured run (after a warm-up run)')

    const bareGet = await measured(report, server, 'bare GET', { url: server.url('bare', '/bare'), connections: conns }, seconds)
    addLoad(report, 'bare_express_get', bareGet, 'bare Express GET returning {ok:true}')

    // ---- orders list
    if (routes.has('GET /api/orders')) {
      const sales = await signIn(appBase, 'sales@demo.test', options.password)
      const appUrl = server.url('app', '/api/orders?limit=50')
      const floorUrl = server.url('orders', '/api/orders?limit=50')
      const [appBody, floorBody] = await Promise.all([
        fetch(appUrl, { headers: headersOf(sales) }).then((r) => r.json()),
        fetch(floorUrl).then((r) => r.json()),
      ])
      let same = true
      try {
        deepStrictEqual(floorBody, appBody)
      } catch (err) {
        same = false
        report.note(
          `the raw-driver orders floor no longer answers like GET /api/orders (update bench/server/floors.ts): ${String(err).split('\n').slice(0, 6).join(' ')}`,
        )
      }
      report.add(SECTION, 'orders_floor_json_matches_app', same, 'raw-driver floor answers with the same JSON as GET /api/orders?limit=50')
      const floor = await measured(report, server, 'orders raw floor', { url: floorUrl, connections: conns }, seconds)
      const app = await measured(report, server, 'orders app', { url: appUrl, headers: headersOf(sales), connections: conns }, seconds)
      addLoad(report, 'orders_list_raw_floor', floor, 'orders list, raw better-sqlite3 handler, same SQL')
      addLoad(report, 'orders_list_app', app, 'GET /api/orders?limit=50 through the app (signed in)')
      ratios(report, 'orders_list_app_vs_raw_floor', same ? app : null, floor, 'orders list app / raw-driver floor')
      ratios(report, 'orders_list_app_vs_bare', app, bareGet, 'orders list app / bare Express GET')
      // what the app's stack costs before any handler work: a signed-in GET that reads nothing more
      if (routes.has('GET /api/auth/me')) {
        const me = await measured(report, server, 'auth/me', { url: server.url('app', '/api/auth/me'), headers: headersOf(sales), connections: conns }, seconds)
        addLoad(report, 'signed_in_me', me, 'GET /api/auth/me (session + user lookup, no further work)')
      }
      await singleConnection(report, server, sales, 'orders_list', '/api/orders?limit=50', seconds, sizeTag(options.orders))
      await singleConnection(report, server, sales, 'orders_search', '/api/orders?limit=50&q=tallowmere', seconds, sizeTag(options.orders))
      await singleConnection(report, server, sales, 'orders_search_miss', '/api/orders?limit=50&q=quartz-lantern', seconds, sizeTag(options.orders))
      await singleConnection(
        report,
        server,
        sales,
        'orders_search_rare',
        `/api/orders?limit=50&q=${encodeURIComponent(rareNumber(options.dbPath))}`,
        seconds,
        sizeTag(options.orders),
      )
    } else {
      report.note('GET /api/orders is not registered (server/routes.ts): orders list throughput not measured')
    }
    report.budget({
      key: 'orders_list_vs_raw_floor',
      label: 'orders list through the app vs raw-driver handler (throughput ratio)',
      figure: 'orders_list_app_vs_raw_floor_ratio',
      limit: 0.5,
      kind: 'min',
    })
    report.budget({
      key: 'orders_list_server_time',
      label: 'orders list at 100 000 orders, single-connection median latency, ms',
      figure: 'orders_list_c1_100k_p50_ms',
      limit: 30,
      kind: 'max',
    })

    // ---- plan computation
    const planBody = JSON.stringify(planRequest(5, 'gerg-2008'))
    const barePost = await measured(
      report,
      server,
      'bare POST',
      { url: server.url('bare', '/bare'), method: 'POST', body: planBody, connections: conns },
      seconds,
    )
    addLoad(report, 'bare_express_post', barePost, 'bare Express POST parsing the plan request body')
    const planFloor = await measured(
      report,
      server,
      'plan floor',
      { url: server.url('plan', '/api/calc/fill-plan'), method: 'POST', body: planBody, connections: conns },
      seconds,
    )
    addLoad(report, 'plan_5c_floor', planFloor, 'zod parse + fillPlanFromRequest, no app middleware (5 components, GERG-2008)')
    if (routes.has('POST /api/calc/fill-plan')) {
      const blender = await signIn(appBase, 'blender@demo.test', options.password)
      const url = server.url('app', '/api/calc/fill-plan')
      const probe = await fetch(url, { method: 'POST', headers: { ...headersOf(blender), 'content-type': 'application/json' }, body: planBody })
      if (!probe.ok) report.note(`POST /api/calc/fill-plan answered ${probe.status}: ${(await probe.text()).slice(0, 300)}`)
      const app = await measured(report, server, 'plan app', { url, method: 'POST', headers: headersOf(blender), body: planBody, connections: conns }, seconds)
      addLoad(report, 'plan_5c_app', app, 'POST /api/calc/fill-plan through the app (5 components, GERG-2008)')
      ratios(report, 'plan_5c_app_vs_floor', app, planFloor, 'plan app / zod + planner floor')
      ratios(report, 'plan_5c_app_vs_bare', app, barePost, 'plan app / bare Express POST')
    } else {
      report.note('POST /api/calc/fill-plan is not registered: plan throughput through the app not measured')
    }

    // ---- recorded readings
    await readings(report, server, routes, options, barePost)
  } finally {
    await server.stop()
  }

  if (options.smallDbPath) {
    const small = await startServerChild({ dbPath: options.smallDbPath })
    try {
      const routes = await routesOf(small)
      if (routes.has('GET /api/orders')) {
        const sales = await signIn(small.url('app', ''), 'sales@demo.test', options.password)
        await singleConnection(report, small, sales, 'orders_list', '/api/orders?limit=50', seconds, sizeTag(options.smallOrders ?? 0))
        await singleConnection(report, small, sales, 'orders_search', '/api/orders?limit=50&q=tallowmere', seconds, sizeTag(options.smallOrders ?? 0))
        await singleConnection(report, small, sales, 'orders_search_miss', '/api/orders?limit=50&q=quartz-lantern', seconds, sizeTag(options.smallOrders ?? 0))
      }
    } finally {
      await small.stop()
    }
  }
}

/** One connection, one request at a time: the latency is the server's time for the request plus loopback. */
async function singleConnection(
  report: Report,
  server: ServerChild,
  session: Session,
  key: string,
  path: string,
  seconds: { run: number; warm: number },
  size: string,
): Promise<void> {
  const r = await measured(
    report,
    server,
    `${key} ${size} single connection`,
    { url: server.url('app', path), headers: headersOf(session), connections: 1 },
    { run: Math.max(2, Math.round(seconds.run / 2)), warm: 1 },
  )
  const what = `${path.length > 40 ? `${path.slice(0, 40)}…` : path} at ${size} orders, 1 connection`
  report.add(LATENCY, `${key}_c1_${size}_p50_ms`, r ? r.latencyP50Ms : null, `${what}: median latency`)
  report.add(LATENCY, `${key}_c1_${size}_p99_ms`, r ? r.latencyP99Ms : null, `${what}: p99 latency`)
  report.add(
    LATENCY,
    `${key}_c1_${size}_server_cpu_ms_per_req`,
    r?.serverCpuMicrosPerRequest != null ? round(r.serverCpuMicrosPerRequest / 1000, 2) : null,
    `${what}: server CPU ms per request`,
  )
}

/** An order number from the middle of the bulk data: a search that matches one order. */
function rareNumber(dbPath: string): string {
  const db = new Database(dbPath, { readonly: true, fileMustExist: true })
  try {
    const row = db.prepare('select number from orders order by id limit 1 offset (select count(*) / 2 from orders)').get() as { number: string } | undefined
    return (row?.number ?? 'FW-0000-00000').toLowerCase()
  } finally {
    db.close()
  }
}

// ---- readings -------------------------------------------------------------------------------------------------------

interface RunCursor {
  id: number
  version: number
  step: number
  gaugeBar: number
  temperatureC: number
}

interface RunDetailLike {
  id: number
  version: number
  currentStep: number
  status: string
  fillTemperature: { value: number }
  steps: { index: number; kind: string; cumulativeGaugePressure: { value: number } }[]
}

/** The next reading a technician takes on the run: the current step's target at the fill temperature. */
function cursorOf(run: RunDetailLike): RunCursor | null {
  if (run.status === 'completed' || run.status === 'aborted' || run.status === 'paused') return null
  const step = run.steps[run.currentStep]
  if (step?.kind !== 'add') return null
  return { id: run.id, version: run.version, step: run.currentStep, gaugeBar: step.cumulativeGaugePressure.value, temperatureC: run.fillTemperature.value }
}

async function readings(report: Report, server: ServerChild, routes: Set<string>, options: HttpOptions, barePost: LoadResult | null): Promise<void> {
  const seconds = { run: options.durationSeconds, warm: options.warmupSeconds }
  const conns = options.connections
  const technicianId = technicianOf(options.dbPath)
  const floorBody = () =>
    JSON.stringify({
      stepIndex: 0,
      pressure: { value: 12.5, unit: 'bar', reference: 'gauge' },
      temperature: { value: 20, unit: 'C' },
      clientRequestId: randomUUID(),
      expectedVersion: 1,
    })
  const floor = await measured(
    report,
    server,
    'reading floor',
    {
      url: server.url('reading', `/api/runs/${lastRunId(options.dbPath)}/readings?by=${technicianId}`),
      method: 'POST',
      bodyFactory: floorBody,
      connections: conns,
    },
    seconds,
  )
  addLoad(report, 'reading_raw_floor', floor, 'one prepared INSERT of a reading on the raw driver')

  const label = 'POST /api/runs/:id/readings through the app (on-target reading, technician)'
  if (!routes.has('POST /api/runs/{id}/readings')) {
    report.note('POST /api/runs/:id/readings is not registered: reading throughput through the app not measured')
    addLoad(report, 'reading_app', null, label)
    return
  }
  const ids = benchRunIds(options.dbPath)
  if (ids.length === 0) {
    report.note('no bench runs were prepared for the technician: reading throughput through the app not measured')
    addLoad(report, 'reading_app', null, label)
    return
  }
  const tech = await signIn(server.url('app', ''), 'technician@demo.test', options.password)
  // the current step and version of each prepared run, read through the API as the tablet does
  const pool: RunCursor[] = []
  for (const id of ids) {
    const res = await fetch(server.url('app', `/api/runs/${id}`), { headers: headersOf(tech) })
    if (!res.ok) {
      report.note(`GET /api/runs/${id} answered ${res.status}: ${(await res.text()).slice(0, 200)}`)
      addLoad(report, 'reading_app', null, label)
      return
    }
    const c = cursorOf((await res.json()) as RunDetailLike)
    if (c) pool.push(c)
  }
  let exhausted = 0
  // each request takes a run from the pool and gives it back with its next step once answered
  const requests = [
    {
      method: 'POST',
      setupRequest: (req: Record<string, unknown>, context: Record<string, unknown>) => {
        const run = pool.shift()
        if (!run) {
          exhausted++
          return { ...req, path: '/api/runs/0/readings', body: '{}' }
        }
        context.run = run
        return {
          ...req,
          path: `/api/runs/${run.id}/readings`,
          body: JSON.stringify({
            stepIndex: run.step,
            pressure: { value: run.gaugeBar, unit: 'bar', reference: 'gauge' },
            temperature: { value: run.temperatureC, unit: 'C' },
            clientRequestId: randomUUID(),
            expectedVersion: run.version,
          }),
        }
      },
      onResponse: (status: number, body: string, context: Record<string, unknown>) => {
        if (!context.run || (status !== 200 && status !== 201)) return
        const next = cursorOf((JSON.parse(body) as { run: RunDetailLike }).run)
        if (next) pool.push(next)
      },
    },
  ]
  const app = await measured(
    report,
    server,
    'reading app',
    { url: server.url('app', '/api/runs/0/readings'), method: 'POST', headers: headersOf(tech), requests, connections: conns },
    seconds,
  )
  if (exhausted > 0) report.note(`the reading benchmark ran out of open run steps ${exhausted} times: prepare more bench runs`)
  const good = exhausted === 0 ? app : null
  addLoad(report, 'reading_app', good, label)
  ratios(report, 'reading_app_vs_raw_floor', good, floor, 'reading app / raw INSERT floor')
  ratios(report, 'reading_app_vs_bare', good, barePost, 'reading app / bare Express POST')
}

/** Runs prepared for the reading benchmark (prepareBenchRuns in sections/database.ts). */
function benchRunIds(dbPath: string): number[] {
  const db = new Database(dbPath, { readonly: true, fileMustExist: true })
  try {
    return (db.prepare("select id from fill_runs where notes = 'bench: reading throughput' order by id").all() as { id: number }[]).map((r) => r.id)
  } finally {
    db.close()
  }
}

function lastRunId(dbPath: string): number {
  const db = new Database(dbPath, { readonly: true, fileMustExist: true })
  try {
    return (db.prepare('select max(id) as id from fill_runs').get() as { id: number | null }).id ?? 0
  } finally {
    db.close()
  }
}

function technicianOf(dbPath: string): number {
  const db = new Database(dbPath, { readonly: true, fileMustExist: true })
  try {
    return (db.prepare("select id from users where email = 'technician@demo.test'").get() as { id: number } | undefined)?.id ?? 0
  } finally {
    db.close()
  }
}
