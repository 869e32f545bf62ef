import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { parseArgs } from 'node:util'
import autocannon from 'autocannon'
import Database from 'better-sqlite3'
import { type DbSettings, initOrm } from '../server/db.ts'
import { localIsoDate } from '../shared/schemas/cylinder.ts'
import { HttpSession, prepareSchemaFromEntities, removeDir, type ServerProcess, startServer, tempDir } from './lib/server-process.ts'

/**
 * `npm run load` — load test of the real server (not a test: it measures).
 *
 * Starts `node --import tsx server/index.ts` on a fresh SQLite file with the demo seed, signs in 50
 * users across the roles (one session each, one connection each) and drives them with autocannon for
 * 60 s (`-- --duration 10` for CI): queue and order reads, fill-plan computations (POST
 * /api/calc/fill-plan), fill readings recorded by technicians (POST /api/runs/:id/readings, each
 * technician on a run of their own, with the run version carried from answer to answer). Reports
 * throughput, p50/p99 latency, errors and non-2xx answers (the exit code is 1 when there are any) and the
 * server's peak resident memory (VmHWM of the server process).
 *
 * Each user sends --rate requests per second (default 1: far more than a person at a screen or a
 * manifold does); --rate 0 sends back to back, which finds the throughput at saturation instead (then
 * a saturated Node process serves its connections unevenly and some may wait beyond the 10 s timeout,
 * see docs/RELIABILITY.md).
 *
 * Options: --duration <s> (60), --connections <n> (50), --rate <requests/s per user> (1),
 * --concurrency <processes> (WEB_CONCURRENCY, 1), --database-url <postgres://…> (run on a fresh
 * PostgreSQL database created next to the one named, with the committed server/migrations-pg, and
 * dropped afterwards; default SQLite), --json (print the summary as JSON only).
 */

const { values: args } = parseArgs({
  options: {
    duration: { type: 'string', default: '60' },
    connections: { type: 'string', default: '50' },
    concurrency: { type: 'string', default: '1' },
    'database-url': { type: 'string', default: '' },
    rate: { type: 'string', default: '1' },
    json: { type: 'boolean', default: false },
  },
})
const DURATION = Number(args.duration)
const CONNECTIONS = Number(args.connections)
const WEB_CONCURRENCY = Number(args.concurrency)
const RATE = Number(args.rate)
if (!(DURATION > 0) || !(CONNECTIONS > 0) || !(WEB_CONCURRENCY > 0) || !(RATE >= 0))
  throw new Error('--duration, --connections, --concurrency must be positive and --rate not negative')
const log = (...m: unknown[]) => {
  if (!args.json) console.log(...m)
}

type Role = 'admin' | 'sales' | 'blender' | 'technician' | 'qa' | 'customer'
/** Share of the connections per role (technicians are capped by the runs available). */
const MIX: Record<Role, number> = { technician: 0.24, blender: 0.2, sales: 0.2, customer: 0.16, qa: 0.12, admin: 0.08 }

interface Identity {
  role: Role
  session: HttpSession
  runId?: number
  version?: number
  step?: RunStep
  n: number
}
interface RunStep {
  index: number
  kind: string
  toleranceWindow: { gaugePressureLow: { value: number } | null }
}

const statusByEndpoint = new Map<string, Map<number, number>>()
const failures: string[] = []
function count(endpoint: string, status: number, body?: string) {
  if ((status < 200 || status >= 300) && failures.length < 10) failures.push(`${endpoint} → ${status} ${String(body ?? '').slice(0, 300)}`)
  let m = statusByEndpoint.get(endpoint)
  if (!m) {
    m = new Map()
    statusByEndpoint.set(endpoint, m)
  }
  m.set(status, (m.get(status) ?? 0) + 1)
}

function readVm(pid: number, field: 'VmHWM' | 'VmRSS'): number {
  try {
    const m = new RegExp(`^${field}:\\s+(\\d+) kB`, 'm').exec(readFileSync(`/proc/${pid}/status`, 'utf8'))
    return m ? Number(m[1]) * 1024 : 0
  } catch {
    return 0
  }
}
/** The server's processes: the primary and, with WEB_CONCURRENCY > 1, its workers. */
function processTree(pid: number): number[] {
  const out = [pid]
  try {
    const children = readFileSync(`/proc/${pid}/task/${pid}/children`, 'utf8').trim().split(/\s+/).filter(Boolean).map(Number)
    for (const c of children) out.push(...processTree(c))
  } catch {
    // no children file
  }
  return out
}

/** Reads from the server's database (SQLite or PostgreSQL) through its own short-lived ORM connection. */
async function query<T>(settings: DbSettings, sql: string, params: unknown[] = []): Promise<T[]> {
  const orm = await initOrm(settings)
  try {
    return (await orm.em.getConnection().execute(sql, params)) as T[]
  } finally {
    await orm.close()
  }
}
const json = (v: unknown) => (typeof v === 'string' ? JSON.parse(v) : v)

/** Books extra runs so that every technician connection has a run of its own (cylinders cloned from a booked one). */
async function prepareRuns(server: ServerProcess, settings: DbSettings, wanted: number): Promise<number[]> {
  const tech = new HttpSession(server.url)
  await tech.signIn('technician@demo.test')
  const usable = async () => {
    const mine = (await tech.request('GET', '/api/runs/mine')).body as { id: number; status: string }[]
    const ids: number[] = []
    for (const r of mine.filter((x) => x.status === 'ready' || x.status === 'in-progress')) {
      const d = (await tech.request('GET', `/api/runs/${r.id}`)).body as { steps: RunStep[]; currentStep: number; pendingReplan: unknown }
      const step = d.steps[d.currentStep]
      if (step && step.kind === 'add' && step.toleranceWindow.gaugePressureLow && !d.pendingReplan) ids.push(r.id)
    }
    return ids
  }
  let ids = await usable()
  if (ids.length >= wanted) return ids.slice(0, wanted)

  // every approved plan with room on its order line: clone the cylinder of one of its booked runs
  const plans = await query<{ plan_id: number; room: number | string; cylinder_id: number | null }>(
    settings,
    `select p.id as plan_id, ol.quantity - (select count(*) from fill_runs x where x.plan_id = p.id) as room,
            (select r.cylinder_id from fill_runs r where r.plan_id = p.id order by r.id limit 1) as cylinder_id
     from fill_plans p join order_lines ol on ol.id = p.order_line_id
     where p.status = 'approved' and p.blocking = false order by p.id`,
  )
  const [tech0] = await query<{ id: number }>(settings, `select id from users where email = 'technician@demo.test'`)
  const techId = Number(tech0?.id)
  const blender = new HttpSession(server.url)
  await blender.signIn('blender@demo.test')
  let missing = wanted - ids.length
  let serial = 0
  for (const p of plans) {
    if (missing <= 0) break
    if (!p.cylinder_id || Number(p.room) <= 0) continue
    const [c] = (await query<Record<string, any>>(settings, 'select * from cylinders where id = ?', [p.cylinder_id])) as [Record<string, any>]
    const cylinderIds: number[] = []
    for (let i = 0; i < Math.min(Number(p.room), missing); i++) {
      serial++
      const r = await blender.request('POST', '/api/cylinders', {
        serial: `LOAD-${process.pid}-${serial}`,
        barcode: `LD${process.pid}X${serial}`,
        waterVolumeL: c.water_volume_l,
        servicePressureBar: c.service_pressure_bar,
        testPressureBar: c.test_pressure_bar,
        material: c.material,
        valveOutlet: c.valve_outlet,
        oxygenClean: Boolean(c.oxygen_clean),
        lastTestDate: c.last_test_date,
        nextTestDate: c.next_test_date,
        residual: json(c.residual),
      })
      if (r.status !== 201) throw new Error(`could not add a load-test cylinder: ${r.status} ${JSON.stringify(r.body)}`)
      cylinderIds.push(r.body.id)
    }
    const runs = await blender.request('POST', '/api/runs', { planId: p.plan_id, cylinderIds, technicianId: techId, scheduledFor: localIsoDate() })
    if (runs.status !== 201) throw new Error(`could not book load-test runs: ${runs.status} ${JSON.stringify(runs.body)}`)
    missing -= cylinderIds.length
  }
  ids = await usable()
  return ids.slice(0, wanted)
}

function jsonRequest(id: Identity, method: string, path: string, label: string, extra: Partial<autocannon.Request> = {}): autocannon.Request {
  return {
    method: method as autocannon.Request['method'],
    path,
    headers: { cookie: id.session.cookie, 'x-csrf-token': id.session.csrf, 'content-type': 'application/json' },
    onResponse: (status: number, body: string) => count(label, status, body),
    ...extra,
  }
}

function requestsFor(id: Identity, planRequest: string): autocannon.Request[] {
  switch (id.role) {
    case 'technician':
      return [
        jsonRequest(id, 'GET', '/api/runs/mine', 'GET /api/runs/mine'),
        jsonRequest(id, 'POST', `/api/runs/${id.runId}/readings`, 'POST /api/runs/:id/readings', {
          // a reading below the step's window (the gauge on its way up): recorded, the run stays on the step
          setupRequest: (req) => {
            id.n++
            const low = id.step?.toleranceWindow.gaugePressureLow?.value ?? 1
            return {
              ...req,
              body: JSON.stringify({
                stepIndex: id.step?.index ?? 0,
                pressure: { value: Math.max(0, low - 1 - (id.n % 5) * 0.1), unit: 'bar', reference: 'gauge' },
                temperature: { value: 18 + (id.n % 4), unit: 'C' },
                clientRequestId: `load-${process.pid}-${id.runId}-${id.n}`,
                expectedVersion: id.version,
              }),
            }
          },
          onResponse: (status: number, body: string) => {
            count('POST /api/runs/:id/readings', status, body)
            if (status === 201) id.version = (JSON.parse(body) as { run: { version: number } }).run.version
          },
        }),
        jsonRequest(id, 'GET', `/api/runs/${id.runId}`, 'GET /api/runs/:id'),
      ]
    case 'blender':
      return [
        jsonRequest(id, 'GET', '/api/plans/queue', 'GET /api/plans/queue'),
        jsonRequest(id, 'POST', '/api/calc/fill-plan', 'POST /api/calc/fill-plan', { body: planRequest }),
        jsonRequest(id, 'GET', '/api/cylinders?limit=25', 'GET /api/cylinders'),
      ]
    case 'sales':
      return [
        jsonRequest(id, 'GET', '/api/orders', 'GET /api/orders'),
        jsonRequest(id, 'GET', '/api/orders/counts', 'GET /api/orders/counts'),
        jsonRequest(id, 'GET', '/api/orders/1', 'GET /api/orders/:id'),
      ]
    case 'customer':
      return [jsonRequest(id, 'GET', '/api/orders', 'GET /api/orders (customer)'), jsonRequest(id, 'GET', '/api/certificates', 'GET /api/certificates')]
    case 'qa':
      return [jsonRequest(id, 'GET', '/api/quality/queue', 'GET /api/quality/queue'), jsonRequest(id, 'GET', '/api/runs?status=completed', 'GET /api/runs')]
    case 'admin':
      return [jsonRequest(id, 'GET', '/api/users', 'GET /api/users'), jsonRequest(id, 'GET', '/api/orders', 'GET /api/orders (admin)')]
  }
}

async function main() {
  const dir = tempDir('load')
  const dbPath = join(dir, 'load.sqlite')
  let server: ServerProcess | undefined
  let exitCode = 0
  let dropPg: (() => Promise<void>) | undefined
  try {
    let settings: DbSettings = { databasePath: dbPath }
    const baseUrl = args['database-url']
    if (baseUrl) {
      // a fresh database next to the one named; the server migrates it with server/migrations-pg
      const name = `fw_load_${process.pid}_${Date.now()}`
      const admin = (sql: string) => query({ databasePath: ':memory:', databaseUrl: baseUrl }, sql)
      await admin(`create database "${name}"`)
      dropPg = async () => {
        await admin(`drop database if exists "${name}" with (force)`)
      }
      const url = new URL(baseUrl)
      url.pathname = `/${name}`
      settings = { databasePath: ':memory:', databaseUrl: url.toString() }
    } else {
      // SQLite: the schema from the entities (as the tests do), the server's own start does the rest
      await prepareSchemaFromEntities(dbPath)
    }
    server = await startServer({
      dbPath,
      env: { WEB_CONCURRENCY: String(WEB_CONCURRENCY), LOG_LEVEL: 'warn', ...(settings.databaseUrl ? { DATABASE_URL: settings.databaseUrl } : {}) },
      timeoutMs: 120_000,
    })
    log(`server ${server.url} (pid ${server.pid}, WEB_CONCURRENCY=${WEB_CONCURRENCY}) on ${settings.databaseUrl ? 'PostgreSQL' : dbPath}`)

    const [plan] = await query<{ request: unknown }>(
      settings,
      `select request from fill_plans where status = 'approved' and blocking = false order by id limit 1`,
    )
    if (!plan) throw new Error('the demo seed has no approved plan to compute')
    const planRequest = JSON.stringify(json(plan.request))

    // the connections per role
    const roles: Role[] = []
    for (const [role, share] of Object.entries(MIX) as [Role, number][]) for (let i = 0; i < Math.round(share * CONNECTIONS); i++) roles.push(role)
    while (roles.length < CONNECTIONS) roles.push('sales')
    roles.length = CONNECTIONS
    const techWanted = roles.filter((r) => r === 'technician').length
    const runIds = await prepareRuns(server, settings, techWanted)
    if (runIds.length < techWanted) {
      log(`only ${runIds.length} runs available: ${techWanted - runIds.length} technician connections become sales connections`)
      let extra = techWanted - runIds.length
      for (let i = roles.length - 1; i >= 0 && extra > 0; i--)
        if (roles[i] === 'technician') {
          roles[i] = 'sales'
          extra--
        }
    }

    const identities: Identity[] = []
    let techIndex = 0
    for (const role of roles) {
      const session = new HttpSession(server.url)
      await session.signIn(`${role}@demo.test`)
      const id: Identity = { role, session, n: 0 }
      if (role === 'technician') {
        id.runId = runIds[techIndex++]
        const d = (await session.request('GET', `/api/runs/${id.runId}`)).body as { version: number; currentStep: number; steps: RunStep[] }
        id.version = d.version
        id.step = d.steps[d.currentStep]
      }
      identities.push(id)
    }
    const perRole = Object.fromEntries((Object.keys(MIX) as Role[]).map((r) => [r, roles.filter((x) => x === r).length]))
    log(
      `signed in ${identities.length} users: ${JSON.stringify(perRole)}; running ${DURATION} s at ${RATE > 0 ? `${RATE} request/s per user` : 'full speed (no pause between requests)'}`,
    )

    let next = 0
    const rssSamples: number[] = []
    const sampler = setInterval(() => {
      const pids = processTree(server!.pid)
      rssSamples.push(pids.reduce((s, p) => s + readVm(p, 'VmRSS'), 0))
    }, 500)
    const result = await autocannon({
      url: server.url,
      connections: CONNECTIONS,
      duration: DURATION,
      pipelining: 1,
      timeout: 10,
      ...(RATE > 0 ? { connectionRate: RATE } : {}),
      requests: requestsFor(identities[0] as Identity, planRequest),
      setupClient: (client) => {
        const id = identities[next++ % identities.length] as Identity
        client.setRequests(requestsFor(id, planRequest))
      },
    })
    clearInterval(sampler)
    const pids = processTree(server.pid)
    const peakRss = Math.max(...pids.map((p) => readVm(p, 'VmHWM')))
    const peakRssTotal = pids.reduce((s, p) => s + readVm(p, 'VmHWM'), 0)

    // stop the server (SIGTERM, clean close) before counting, so readings in flight have settled
    await server.stop()
    const readingsRecorded = statusByEndpoint.get('POST /api/runs/:id/readings')?.get(201) ?? 0
    const [rowCount] = await query<{ n: number | string }>(settings, `select count(*) as n from fill_readings where client_request_id like 'load-%'`)
    const readingRows = Number(rowCount?.n)
    let integrity: unknown = 'ok (PostgreSQL)'
    if (!settings.databaseUrl) {
      const check = new Database(dbPath, { readonly: true })
      integrity = check.pragma('integrity_check', { simple: true })
      check.close()
    }

    const summary = {
      durationS: DURATION,
      connections: CONNECTIONS,
      database: settings.databaseUrl ? 'postgresql' : 'sqlite',
      ratePerUser: RATE > 0 ? RATE : 'unpaced',
      webConcurrency: WEB_CONCURRENCY,
      users: perRole,
      requests: result.requests.total,
      throughputRps: Math.round(result.requests.average),
      latencyMs: { p50: result.latency.p50, p90: result.latency.p90, p99: result.latency.p99, max: result.latency.max },
      errors: result.errors,
      timeouts: result.timeouts,
      non2xx: result.non2xx,
      readingsRecorded,
      readingRowsInDatabase: readingRows,
      databaseIntegrity: integrity,
      peakRssMiB: Math.round(peakRss / 1048576),
      peakRssAllProcessesMiB: Math.round(peakRssTotal / 1048576),
      meanRssMiB: rssSamples.length ? Math.round(rssSamples.reduce((a, b) => a + b, 0) / rssSamples.length / 1048576) : null,
      /** resident memory of the server every 10 s (MiB) */
      rssTimelineMiB: rssSamples.filter((_, i) => i % 20 === 19).map((b) => Math.round(b / 1048576)),
      failureSamples: failures,
      byEndpoint: Object.fromEntries([...statusByEndpoint].map(([k, m]) => [k, Object.fromEntries(m)])),
      node: process.version,
    }
    if (args.json) console.log(JSON.stringify(summary))
    else {
      log('')
      log(`requests        ${summary.requests} in ${DURATION} s`)
      log(`throughput      ${summary.throughputRps} req/s`)
      log(`latency         p50 ${summary.latencyMs.p50} ms, p90 ${summary.latencyMs.p90} ms, p99 ${summary.latencyMs.p99} ms, max ${summary.latencyMs.max} ms`)
      log(`errors          ${summary.errors} errors, ${summary.timeouts} timeouts, ${summary.non2xx} non-2xx`)
      log(
        `readings        ${readingsRecorded} acknowledged (201), ${readingRows} rows in fill_readings (the difference is readings in flight at the end); integrity ${integrity}`,
      )
      log(
        `peak RSS        ${summary.peakRssMiB} MiB (VmHWM${pids.length > 1 ? `, largest of ${pids.length} processes; ${summary.peakRssAllProcessesMiB} MiB together` : ''})`,
      )
      for (const f of failures) log(`failed          ${f}`)
      log(`RSS every 10 s  ${summary.rssTimelineMiB.join(', ')} MiB`)
      log(`by endpoint     ${JSON.stringify(summary.byEndpoint)}`)
      console.log(`LOAD_SUMMARY ${JSON.stringify(summary)}`)
    }
    // every acknowledged reading is in the table; a reading in flight when the clock stopped may be there too
    const techs = identities.filter((i) => i.role === 'technician').length
    const lost = readingRows < readingsRecorded || readingRows > readingsRecorded + techs
    const failed = result.errors + result.timeouts + result.non2xx > 0 || lost || !String(integrity).startsWith('ok')
    if (failed) {
      console.error('load: FAILED — errors, non-2xx answers, lost readings or an unsound database (see above)')
      exitCode = 1
    }
  } finally {
    await server?.stop()
    await dropPg?.()
    removeDir(dir)
  }
  process.exit(exitCode)
}

main().catch((err) => {
  console.error(err)
  process.exit(1)
})
