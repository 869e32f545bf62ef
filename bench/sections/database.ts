/**
 * Data at scale: builds the bulk databases (scripts/seed-bulk.ts), then times the orders list service
 * (listOrders, in-process: SQL + ORM mapping, no HTTP) at 10 000 and 100 000 orders for the first page, later pages,
 * filters and text search; checks each statement's query plan (EXPLAIN QUERY PLAN) for index use; and times the
 * readings of one run among 1 000 000 recorded readings.
 */
import { rmSync } from 'node:fs'
import { join } from 'node:path'
import { MikroORM } from '@mikro-orm/core'
import Database from 'better-sqlite3'
import { type BulkResult, seedBulk } from '../../scripts/seed-bulk.ts'
import { ormOptions } from '../../server/db.ts'
import type { SessionUser } from '../../shared/schemas/auth.ts'
import { OrderListQuerySchema } from '../../shared/schemas/order.ts'
import { summarise } from '../lib/micro.ts'
import { ORDERS_COUNT_SQL, ORDERS_LINES_SQL, ORDERS_PAGE_SQL } from '../server/floors.ts'
import { type Report, round, sizeTag } from '../lib/report.ts'

export interface BulkDatabases {
  large: BulkResult
  small: BulkResult
  dir: string
}

export async function buildDatabases(
  report: Report,
  dir: string,
  sizes: { orders: number; readings: number },
  log: (s: string) => void,
): Promise<BulkDatabases> {
  const section = 'bulk data'
  const small = await seedBulk({
    dbPath: join(dir, 'bench-small.sqlite'),
    orders: Math.round(sizes.orders / 10),
    readings: Math.round(sizes.readings / 10),
    log,
  })
  const large = await seedBulk({ dbPath: join(dir, 'bench-large.sqlite'), orders: sizes.orders, readings: sizes.readings, log })
  report.add(section, 'bulk_orders', large.rows.orders ?? 0, 'orders written to the large database (the demo orders come on top)')
  report.add(section, 'bulk_readings', large.rows.fill_readings ?? 0, 'recorded readings written to the large database')
  report.add(section, 'bulk_runs', large.rows.fill_runs ?? 0, 'fill runs in the large database')
  report.add(section, 'bulk_seed_large_s', round(large.seconds, 1), 'seconds to build the large database (schema, demo, raw inserts)')
  report.add(section, 'bulk_seed_small_s', round(small.seconds, 1), 'seconds to build the small database (a tenth of the rows)')
  if (large.genericColumns.length) report.note(`seed-bulk filled columns it does not know with neutral values: ${large.genericColumns.join(', ')}`)
  return { large, small, dir }
}

export function removeDatabases(dbs: BulkDatabases): void {
  for (const r of [dbs.large, dbs.small]) for (const suffix of ['', '-wal', '-shm']) rmSync(r.dbPath + suffix, { force: true })
}

/**
 * Runs for the reading benchmark: copies of one untouched demo run (status ready, no re-plan) of the demo technician,
 * each on its own bulk cylinder, marked in `notes` so the HTTP section finds them. Returns how many were made.
 */
export function prepareBenchRuns(bulk: BulkResult, count: number): { made: number; stepCount: number | null } {
  const { dbPath } = bulk
  const technicianId = bulk.users.technician
  const db = new Database(dbPath, { fileMustExist: true })
  try {
    const template = db
      .prepare(
        "select * from fill_runs where id < ? and status in ('ready', 'in-progress') and replan_count = 0 and json_extract(targets, '$.pending') is null and json_type(targets, '$.steps') = 'array' order by (technician_id = ?) desc, (status = 'ready') desc, id limit 1",
      )
      .get(bulk.firstBulkRunId, technicianId) as Record<string, unknown> | undefined
    if (!template) return { made: 0, stepCount: null }
    const steps = (JSON.parse(String(template.targets)) as { steps: unknown[] }).steps.length
    const cylinders = (db.prepare("select id from cylinders where serial like 'KR-BULK-%' order by id").all() as { id: number }[]).map((c) => c.id)
    if (cylinders.length === 0) return { made: 0, stepCount: steps }
    const columns = Object.keys(template).filter((c) => c !== 'id')
    const insert = db.prepare(`insert into fill_runs (${columns.map((c) => `\`${c}\``).join(', ')}) values (${columns.map((c) => `@${c}`).join(', ')})`)
    const now = Date.now()
    const today = new Date().toISOString().slice(0, 10)
    db.transaction(() => {
      for (let i = 0; i < count; i++) {
        insert.run({
          ...Object.fromEntries(columns.map((c) => [c, template[c]])),
          cylinder_id: cylinders[i % cylinders.length],
          technician_id: technicianId,
          scheduled_for: today,
          status: 'ready',
          current_step: 0,
          replan_count: 0,
          started_at: null,
          completed_at: null,
          notes: 'bench: reading throughput',
          version: 1,
          created_at: now,
          updated_at: now,
        })
      }
    })()
    return { made: count, stepCount: steps }
  } finally {
    db.close()
  }
}

interface Scenario {
  key: string
  label: string
  query: Record<string, unknown>
  /** full scans are expected (a substring search cannot use a b-tree index) */
  scanExpected?: boolean
}

function cursorFor(db: Database.Database, offset: number): string {
  const row = db.prepare('select id, created_at from orders order by created_at desc, id desc limit 1 offset ?').get(offset) as {
    id: number
    created_at: number
  }
  return Buffer.from(JSON.stringify({ id: row.id, v: new Date(row.created_at).toISOString() })).toString('base64url')
}

function scenarios(dbPath: string): Scenario[] {
  const db = new Database(dbPath, { readonly: true, fileMustExist: true })
  try {
    const n = (db.prepare('select count(*) as n from orders').get() as { n: number }).n
    const busiest = db.prepare('select customer_id as id from orders group by customer_id order by count(*) desc limit 1').get() as { id: number }
    const middle = db.prepare('select number from orders order by id limit 1 offset ?').get(Math.floor(n / 2)) as { number: string }
    return [
      { key: 'list', label: 'first page, newest first', query: { limit: 50 } },
      { key: 'page2', label: 'second page (keyset cursor)', query: { limit: 50, cursor: cursorFor(db, 49) } },
      { key: 'deep_page', label: 'a page half-way down (keyset cursor)', query: { limit: 50, cursor: cursorFor(db, Math.floor(n / 2)) } },
      { key: 'status', label: "status 'filling'", query: { limit: 50, status: 'filling' } },
      { key: 'customer', label: 'the busiest customer', query: { limit: 50, customerId: busiest.id } },
      { key: 'sort_total', label: 'sorted by total, largest first', query: { limit: 50, sort: '-total' } },
      { key: 'search', label: "text search 'tallowmere' (a customer place, ~7 % of orders)", query: { limit: 50, q: 'tallowmere' }, scanExpected: true },
      { key: 'search_rare', label: 'text search for one order number', query: { limit: 50, q: middle.number.toLowerCase() }, scanExpected: true },
      { key: 'search_miss', label: 'text search that matches no order (reads every row)', query: { limit: 50, q: 'quartz-lantern' }, scanExpected: true },
    ]
  } finally {
    db.close()
  }
}

/** Times listOrders (the GET /api/orders service) in-process, median of `repeats` calls; returns the captured SQL. */
async function timeListOrders(
  dbPath: string,
  user: SessionUser,
  list: Scenario[],
  repeats: number,
): Promise<Map<string, { ms: number; wallMs: number; sql: string[]; rawSql: string[] }>> {
  const { listOrders } = await import('../../server/modules/orders/orders.service.ts')
  let capture: { raw: string; formatted: string }[] | null = null
  const options = await ormOptions({ databasePath: dbPath })
  const orm = await MikroORM.init({
    ...options,
    onQuery: (sql: string, params: readonly unknown[]) => {
      capture?.push({ raw: sql, formatted: orm.em.getPlatform().formatQuery(sql, params as unknown[]) })
      return sql
    },
  } as typeof options)
  const out = new Map<string, { ms: number; wallMs: number; sql: string[]; rawSql: string[] }>()
  try {
    for (const s of list) {
      const query = OrderListQuerySchema.parse(s.query)
      // warm (the first call also runs the ORM's one-off start-up queries), then capture one call's statements
      for (let i = 0; i < 3; i++) await listOrders(orm.em.fork(), user, query as never)
      capture = []
      await listOrders(orm.em.fork(), user, query as never)
      const captured: { raw: string; formatted: string }[] = capture
      capture = null
      // CPU time of the process per call (time spent waiting for a core on a busy machine does not count), and wall time
      const cpu: number[] = []
      const wall: number[] = []
      for (let i = 0; i < repeats; i++) {
        const c0 = process.cpuUsage()
        const t0 = performance.now()
        await listOrders(orm.em.fork(), user, query as never)
        wall.push(performance.now() - t0)
        const c = process.cpuUsage(c0)
        cpu.push((c.user + c.system) / 1000)
      }
      out.set(s.key, { ms: summarise(cpu).median, wallMs: summarise(wall).median, sql: captured.map((c) => c.formatted), rawSql: captured.map((c) => c.raw) })
    }
  } finally {
    await orm.close()
  }
  return out
}

interface PlanCheck {
  ok: boolean
  lines: string[]
}

function explain(db: Database.Database, sql: string, scanExpected: boolean): PlanCheck {
  const rows = db.prepare(`explain query plan ${sql}`).all() as { detail: string }[]
  const lines = rows.map((r) => r.detail)
  const fullScan = lines.some(
    (l) => /^SCAN \S+( AS \S+)?$/.test(l.trim()) || (/^SCAN /.test(l) && !/USING (COVERING )?INDEX|USING INTEGER PRIMARY KEY/.test(l)),
  )
  const tempSort = lines.some((l) => l.includes('USE TEMP B-TREE FOR ORDER BY'))
  return { ok: scanExpected ? true : !fullScan && !tempSort, lines }
}

export async function runDatabase(report: Report, dbs: BulkDatabases, options: { quick: boolean }): Promise<void> {
  const section = 'orders list at scale (listOrders in-process, median CPU ms per call)'
  const repeats = options.quick ? 8 : 30
  const small = sizeTag(dbs.small.rows.orders ?? 0)
  const big = sizeTag(dbs.large.rows.orders ?? 0)
  const sizes: [string, BulkResult][] = [
    [small, dbs.small],
    [big, dbs.large],
  ]
  const user: SessionUser = { id: dbs.large.users.sales, email: 'sales@demo.test', name: 'Jonah Pell', roles: ['sales'], customerId: null }
  const results = new Map<string, Map<string, { ms: number; wallMs: number; sql: string[]; rawSql: string[] }>>()
  let list: Scenario[] = []
  for (const [size, db] of sizes) {
    list = scenarios(db.dbPath)
    try {
      results.set(size, await timeListOrders(db.dbPath, { ...user, id: db.users.sales }, list, repeats))
    } catch (err) {
      report.note(`listOrders could not be timed at ${size}: ${String(err).slice(0, 300)}`)
    }
  }
  for (const s of list) {
    for (const [size] of sizes) {
      const r = results.get(size)?.get(s.key)
      report.add(section, `orders_${s.key}_service_${size}_ms`, r ? round(r.ms, 2) : null, `${s.label}, ${size} orders`)
      if (s.key === 'list' || s.key === 'search')
        report.add(section, `orders_${s.key}_service_${size}_wall_ms`, r ? round(r.wallMs, 2) : null, `${s.label}, ${size} orders, wall-clock median`)
    }
    const a = results.get(small)?.get(s.key)
    const b = results.get(big)?.get(s.key)
    report.add(section, `orders_${s.key}_growth_10x_ratio`, a && b ? round(b.ms / a.ms, 2) : null, `${s.label}: time at ${big} / time at ${small}`)
  }

  // query plans at 100k
  const planSection = `query plans at ${big} orders (EXPLAIN QUERY PLAN)`
  const large = results.get(big)
  const db = new Database(dbs.large.dbPath, { readonly: true, fileMustExist: true })
  try {
    let allIndexed = true
    for (const s of list) {
      const r = large?.get(s.key)
      if (!r) continue
      for (const [i, sql] of r.sql.entries()) {
        const check = explain(db, sql, Boolean(s.scanExpected))
        if (!check.ok) allIndexed = false
        report.note(`plan ${s.key}#${i + 1}${check.ok ? '' : ' (NOT INDEXED)'}: ${sql.replace(/\s+/g, ' ').slice(0, 160)}… → ${check.lines.join(' | ')}`)
      }
    }
    report.add(
      planSection,
      'orders_list_queries_use_indexes',
      large ? allIndexed : null,
      'every list/page/filter/sort statement reads an index (no full scan, no temp sort)',
    )
    // the raw-driver floor of the HTTP section must run the statements the app runs
    const appList = large?.get('list')?.rawSql
    if (appList) {
      const normal = (q: string) =>
        q
          .replace(/\s+/g, ' ')
          .replace(/in \((\?, )*\?\)/g, 'in (…)')
          .trim()
      const idCount = (appList.find((q) => q.includes('`order_lines`'))?.match(/\?/g) ?? []).length
      const floor = [ORDERS_PAGE_SQL, ORDERS_LINES_SQL(Math.max(1, idCount)), ORDERS_COUNT_SQL].map(normal)
      const same = appList.length === floor.length && appList.every((q, i) => normal(q) === floor[i])
      if (!same) report.note(`GET /api/orders now runs other statements than the raw-driver floor (bench/server/floors.ts): ${appList.map(normal).join(' ; ')}`)
      report.add(planSection, 'orders_floor_sql_matches_app', same, 'the raw-driver floor runs the same statements as listOrders (first page)')
    }
    const indexes = db.prepare("select name from sqlite_master where type = 'index' and tbl_name = 'orders' order by name").all() as { name: string }[]
    report.add(planSection, 'orders_indexes', indexes.map((x) => x.name).join(', '), 'indexes on orders')

    // raw statement timings: the first-page count and the readings of one run among 1M
    const timeSql = (sql: string, params: unknown[], n: number) => {
      const st = db.prepare(sql)
      for (let i = 0; i < 3; i++) st.all(...params)
      const t: number[] = []
      for (let i = 0; i < n; i++) {
        const t0 = performance.now()
        st.all(...params)
        t.push(performance.now() - t0)
      }
      return summarise(t).median
    }
    const rawSection = 'raw SQL at scale (better-sqlite3, median ms)'
    for (const [size, bulk] of sizes) {
      const d = size === big ? db : new Database(bulk.dbPath, { readonly: true, fileMustExist: true })
      try {
        const st = d.prepare('select count(*) as `count` from `orders` as `o0`')
        for (let i = 0; i < 3; i++) st.get()
        const t: number[] = []
        for (let i = 0; i < repeats; i++) {
          const t0 = performance.now()
          st.get()
          t.push(performance.now() - t0)
        }
        report.add(rawSection, `orders_count_${size}_ms`, round(summarise(t).median, 3), `count(*) of all orders (the first page's total), ${size} orders`)
      } finally {
        if (d !== db) d.close()
      }
    }
    const run = db.prepare('select run_id as id from fill_readings order by id desc limit 1').get() as { id: number } | undefined
    if (run) {
      const sql = 'select * from `fill_readings` where `run_id` = ? order by `id` asc'
      const readings = sizeTag(dbs.large.rows.fill_readings ?? 0)
      report.add(
        rawSection,
        `readings_of_run_${readings}_ms`,
        round(timeSql(sql, [run.id], repeats), 3),
        `one run's readings among ${dbs.large.rows.fill_readings ?? 0} (the run screen)`,
      )
      const plan = explain(db, sql.replace('?', String(run.id)), false)
      report.add(planSection, 'readings_of_run_uses_index', plan.ok, `readings of a run: ${plan.lines.join(' | ')}`)
      const reading = db.prepare('select client_request_id as c from fill_readings where client_request_id is not null limit 1 offset 500000').get() as
        | { c: string }
        | undefined
      if (reading) {
        report.add(
          rawSection,
          `reading_by_client_request_id_${readings}_ms`,
          round(timeSql('select * from `fill_readings` where `client_request_id` = ? limit 1', [reading.c], repeats), 3),
          'the retry check of a recorded reading (unique index)',
        )
      }
    }
  } finally {
    db.close()
  }
  report.budget({
    key: 'orders_list_service',
    label: 'orders list service time at 100 000 orders (listOrders in-process), ms',
    figure: 'orders_list_service_100k_ms',
    limit: 30,
    kind: 'max',
  })
}
