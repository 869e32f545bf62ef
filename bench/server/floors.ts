/**
 * The floors the app's endpoints are measured against, each a minimal Express app:
 *  - bare: Express with the JSON body parser and nothing else (the framework floor);
 *  - orders: GET /api/orders?limit=n — the same SQL statements the orders list issues for its first page, run with
 *    prepared statements on the raw better-sqlite3 driver, mapped to the same JSON (no session, no ORM, no logging);
 *  - plan: POST /api/calc/fill-plan — zod parse + the planner, no session or guard;
 *  - reading: POST /api/runs/:id/readings — one prepared INSERT of a reading through the raw driver.
 * The bench checks that the orders floor answers with the same JSON as the app before it trusts the ratio.
 */
import { randomUUID } from 'node:crypto'
import Database from 'better-sqlite3'
import express, { type Express } from 'express'
import { fillPlanFromRequest } from '../../shared/planning/index.ts'
import { FillPlanRequestSchema } from '../../shared/schemas/fill-plan.ts'

export function bareFloor(): Express {
  const app = express()
  app.disable('x-powered-by')
  app.use(express.json({ limit: '1mb' }))
  app.get('/bare', (_req, res) => {
    res.json({ ok: true })
  })
  app.post('/bare', (req, res) => {
    res.json({ ok: true, fields: Object.keys((req.body ?? {}) as object).length })
  })
  return app
}

interface OrderRow {
  id: number
  number: string
  status: string
  reference: string
  needed_by: string | null
  total_minor: number
  currency: string
  created_at: number
  customer_id: number
  code: string
  company: string
}

/**
 * The statements of the first page of GET /api/orders (default sort: newest first), as the app issues them; the
 * bench compares them with the statements it captures from listOrders (figure orders_floor_sql_matches_app).
 */
export const ORDERS_PAGE_SQL =
  'select `o`.`id`, `o`.`number`, `o`.`status`, `o`.`reference`, `o`.`needed_by`, `o`.`total_minor`, `o`.`currency`, `o`.`created_at`, o.customer_id as customer_id, ' +
  '`c`.`code`, `c`.`company` from `orders` as `o` inner join `customers` as `c` on `o`.`customer_id` = `c`.`id` order by `o`.`created_at` desc, `o`.`id` desc limit ?'
export const ORDERS_LINES_SQL = (n: number) =>
  `select \`l\`.\`order_id\`, \`l\`.\`line_no\`, \`l\`.\`description\`, \`l\`.\`quantity\` from \`order_lines\` as \`l\` where \`l\`.\`order_id\` in (${Array.from({ length: n }, () => '?').join(', ')})`
export const ORDERS_COUNT_SQL = 'select count(*) as `count` from `orders` as `o0`'

export function ordersFloor(dbPath: string): { app: Express; close(): void } {
  const db = new Database(dbPath, { fileMustExist: true })
  db.pragma('journal_mode = WAL')
  db.pragma('busy_timeout = 5000')
  const page = db.prepare<[number], OrderRow>(ORDERS_PAGE_SQL)
  const count = db.prepare<[], { count: number }>(ORDERS_COUNT_SQL)
  const linesByCount = new Map<number, Database.Statement<number[], { order_id: number; line_no: number; description: string; quantity: number }>>()
  const app = express()
  app.disable('x-powered-by')
  app.get('/api/orders', (req, res) => {
    const limit = req.query.limit === undefined ? 50 : Number(req.query.limit)
    if (!Number.isInteger(limit) || limit < 1 || limit > 200) {
      res.status(400).json({ title: 'limit must be 1..200' })
      return
    }
    const rows = page.all(limit + 1)
    const pageRows = rows.slice(0, limit)
    const ids = pageRows.map((r) => r.id)
    let lines = linesByCount.get(ids.length)
    if (!lines && ids.length > 0) {
      lines = db.prepare(ORDERS_LINES_SQL(ids.length))
      linesByCount.set(ids.length, lines)
    }
    const lineRows = ids.length > 0 && lines ? lines.all(...ids) : []
    lineRows.sort((a, b) => a.order_id - b.order_id || a.line_no - b.line_no)
    const byOrder = new Map<number, { description: string; quantity: number }[]>()
    for (const l of lineRows) {
      const list = byOrder.get(l.order_id) ?? []
      list.push({ description: l.description, quantity: l.quantity })
      byOrder.set(l.order_id, list)
    }
    const total = count.get()!.count
    const last = pageRows.at(-1)
    const nextCursor =
      rows.length > limit && last ? Buffer.from(JSON.stringify({ id: last.id, v: new Date(last.created_at).toISOString() })).toString('base64url') : null
    res.json({
      items: pageRows.map((o) => {
        const ls = byOrder.get(o.id) ?? []
        return {
          id: o.id,
          number: o.number,
          status: o.status,
          customer: { id: o.customer_id, code: o.code, company: o.company },
          reference: o.reference,
          neededBy: o.needed_by ?? null,
          totalMinor: o.total_minor,
          currency: o.currency,
          createdAt: new Date(o.created_at).toISOString(),
          lineSummary: ls.length === 0 ? '' : ls.length === 1 ? ls[0].description : `${ls[0].description} + ${ls.length - 1} more`,
          cylinders: ls.reduce((s, l) => s + l.quantity, 0),
        }
      }),
      nextCursor,
      total,
    })
  })
  return { app, close: () => db.close() }
}

export function planFloor(): Express {
  const app = express()
  app.disable('x-powered-by')
  app.use(express.json({ limit: '1mb', strict: true }))
  app.post('/api/calc/fill-plan', (req, res) => {
    res.json(fillPlanFromRequest(FillPlanRequestSchema.parse(req.body)))
  })
  return app
}

interface ReadingBody {
  stepIndex?: number
  pressure?: { value: number; unit: string; reference: string }
  temperature?: { value: number; unit: string }
  clientRequestId?: string
}

/** One prepared INSERT per reading on the raw driver (bar and °C only: the floor's own request bodies); ?by= names the recorder. */
export function readingFloor(dbPath: string): { app: Express; close(): void } {
  const db = new Database(dbPath, { fileMustExist: true })
  db.pragma('journal_mode = WAL')
  db.pragma('synchronous = NORMAL')
  db.pragma('busy_timeout = 5000')
  const insert = db.prepare(
    'insert into `fill_readings` (`run_id`, `step_index`, `gas`, `pressure_bar_abs`, `pressure_bar_gauge`, `temperature_c`, `scale_kg`, `outcome`, `supersedes`, `recorded_by_id`, `client_request_id`, `recorded_at`) ' +
      'values (?, ?, ?, ?, ?, ?, null, ?, null, ?, ?, ?)',
  )
  const app = express()
  app.disable('x-powered-by')
  app.use(express.json({ limit: '64kb', strict: true }))
  app.post('/api/runs/:id/readings', (req, res) => {
    const runId = Number(req.params.id)
    const recordedById = Number(req.query.by ?? 0)
    const body = req.body as ReadingBody
    const gauge = body.pressure?.reference === 'gauge' ? body.pressure.value : (body.pressure?.value ?? 0) - 1.01325
    const recordedAt = Date.now()
    const clientRequestId = body.clientRequestId ?? randomUUID()
    const info = insert.run(
      runId,
      body.stepIndex ?? 0,
      'nitrogen',
      gauge + 1.01325,
      gauge,
      body.temperature?.value ?? null,
      'on-target',
      recordedById,
      clientRequestId,
      recordedAt,
    )
    res.status(201).json({
      id: Number(info.lastInsertRowid),
      runId,
      stepIndex: body.stepIndex ?? 0,
      pressureBarGauge: gauge,
      clientRequestId,
      recordedAt: new Date(recordedAt).toISOString(),
    })
  })
  return { app, close: () => db.close() }
}
