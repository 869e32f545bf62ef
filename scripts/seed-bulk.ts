/**
 * Bulk data for benchmarks: a fresh SQLite database with the app's real schema (created from the entities in
 * server/entities.ts, plus the immutability triggers), the demo scenario (so the demo accounts can sign in), and
 * then many invented orders, order lines, fill plans, fill runs and recorded readings written with raw SQL through
 * better-sqlite3, one transaction per batch.
 *
 *   npm run seed:bulk -- --orders 100000 --readings 1000000 --db /tmp/fillwright-bulk.sqlite
 *
 * Column lists come from the ORM metadata, so a column another module adds is filled with its default (or a neutral
 * value, reported) instead of breaking the seed. Data is deterministic (seeded pseudo-random numbers) and invented:
 * the shop is the demo's Kestrel Ridge Gas Blending; customers are made-up place names with a trade.
 */
import { randomUUID } from 'node:crypto'
import { existsSync, rmSync } from 'node:fs'
import { resolve } from 'node:path'
import { pathToFileURL } from 'node:url'
import { parseArgs } from 'node:util'
import type { EntityMetadata, EntityProperty, MikroORM } from '@mikro-orm/core'
import Database from 'better-sqlite3'
import { initOrm } from '../server/db.ts'
import { applyImmutabilityTriggers } from '../server/lib/immutability.ts'
import { seedDemoIfEmpty } from '../server/seed/demo.ts'
import '../server/seed/index.ts'
import { getGas } from '../shared/physics/index.ts'

export interface BulkOptions {
  /** SQLite file to create (an existing file is replaced) */
  dbPath: string
  orders: number
  readings: number
  /** password of the demo accounts (default: DEMO_PASSWORD or 'fillwright-demo') */
  demoPassword?: string
  /** rows per transaction (default 20 000) */
  batchSize?: number
  /** pseudo-random seed (default 20261202) */
  seed?: number
  log?: (line: string) => void
}

export interface BulkResult {
  dbPath: string
  rows: Record<string, number>
  seconds: number
  /** columns the seed did not know and filled with a neutral value */
  genericColumns: string[]
  users: Record<string, number>
  /** runs with a smaller id come from the demo scenario */
  firstBulkRunId: number
}

// ---- deterministic pseudo-random numbers ---------------------------------------------------------------------

function mulberry32(seed: number): () => number {
  let a = seed >>> 0
  return () => {
    a = (a + 0x6d2b79f5) >>> 0
    let t = a
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

// ---- invented vocabulary ------------------------------------------------------------------------------------

const PLACES = [
  'Tallowmere',
  'Brackenford',
  'Quillhaven',
  'Marrowdale',
  'Sedgecombe',
  'Thornwick Vale',
  'Ashgrove Reach',
  'Lindle Cross',
  'Pellham Moor',
  'Orrin Bay',
  'Caskwell',
  'Fennick Hollow',
  'Rudderby',
  'Sallow Point',
  'Gorsebridge',
  'Wrenfold',
  'Hobbin Green',
  'Kettering Fold',
  'Mistlecombe',
  'Ostry Mill',
  'Pannock Ridge',
  'Vell Harbour',
  'Yarrow Heath',
  'Dunlin Flats',
]
const TRADES = [
  'Calibration Laboratory',
  'Welding Supply',
  'Fresh Foods',
  'Detector Service',
  'Laser Works',
  'Research Institute',
  'Brewing Company',
  'Environmental Monitoring',
  'Dive Centre',
  'Hospital Engineering',
  'Fabrication',
  'Semiconductor Pilot Line',
]
const FIRST = ['Ada', 'Bram', 'Cleo', 'Dario', 'Elin', 'Faisal', 'Greta', 'Hugo', 'Iris', 'Joss', 'Kaia', 'Lorcan', 'Mina', 'Nils', 'Oona', 'Pavel']
const LAST = ['Ashby', 'Brill', 'Corran', 'Dewhurst', 'Ellery', 'Fane', 'Garlick', 'Hollis', 'Ingram', 'Jessop', 'Kember', 'Lowther']

interface Template {
  description: string
  minors: { gas: string; amount: number; unit: 'percent' | 'ppm' }[]
  balanceGas: string
  method: 'partial-pressure' | 'gravimetric'
}
const TEMPLATES: Template[] = [
  {
    description: 'Welding shield gas Ar + 18 % CO2',
    minors: [{ gas: 'carbon-dioxide', amount: 18, unit: 'percent' }],
    balanceGas: 'argon',
    method: 'partial-pressure',
  },
  {
    description: 'Food packaging N2 + 30 % CO2',
    minors: [{ gas: 'carbon-dioxide', amount: 30, unit: 'percent' }],
    balanceGas: 'nitrogen',
    method: 'partial-pressure',
  },
  {
    description: 'Four-gas detector check',
    minors: [
      { gas: 'methane', amount: 2.5, unit: 'percent' },
      { gas: 'oxygen', amount: 18, unit: 'percent' },
      { gas: 'carbon-monoxide', amount: 100, unit: 'ppm' },
    ],
    balanceGas: 'nitrogen',
    method: 'gravimetric',
  },
  {
    description: 'CO2 5 % in nitrogen calibration standard',
    minors: [{ gas: 'carbon-dioxide', amount: 5, unit: 'percent' }],
    balanceGas: 'nitrogen',
    method: 'gravimetric',
  },
  {
    description: 'Laser gas He/N2/CO2',
    minors: [
      { gas: 'carbon-dioxide', amount: 8, unit: 'percent' },
      { gas: 'nitrogen', amount: 16, unit: 'percent' },
    ],
    balanceGas: 'helium',
    method: 'partial-pressure',
  },
  { description: 'Methane 2.2 % in air, LEL check', minors: [{ gas: 'methane', amount: 2.2, unit: 'percent' }], balanceGas: 'air', method: 'gravimetric' },
  { description: 'Ar + 2 % O2 shield gas', minors: [{ gas: 'oxygen', amount: 2, unit: 'percent' }], balanceGas: 'argon', method: 'partial-pressure' },
  {
    description: 'Hydrogen 5 % in nitrogen forming gas',
    minors: [{ gas: 'hydrogen', amount: 5, unit: 'percent' }],
    balanceGas: 'nitrogen',
    method: 'partial-pressure',
  },
]

const STATUS_ORDER = ['draft', 'quoted', 'accepted', 'planned', 'filling', 'analysis', 'released', 'shipped', 'invoiced', 'paid', 'cancelled'] as const
type Status = (typeof STATUS_ORDER)[number]
const PLANNED_OR_LATER = new Set<Status>(['planned', 'filling', 'analysis', 'released', 'shipped', 'invoiced', 'paid'])
const FILLED = new Set<Status>(['analysis', 'released', 'shipped', 'invoiced', 'paid'])

// ---- metadata-driven inserts ----------------------------------------------------------------------------------

type Row = Record<string, unknown>

interface TableWriter {
  table: string
  insert(row: Row): void
}

function parseDefaultRaw(raw: string): unknown {
  const t = raw.trim()
  if (/^'.*'$/.test(t)) return t.slice(1, -1).replaceAll("''", "'")
  if (t === 'true') return 1
  if (t === 'false') return 0
  if (t.toLowerCase() === 'null') return null
  const n = Number(t)
  return Number.isFinite(n) ? n : t
}

function toDb(value: unknown): unknown {
  if (value === undefined || value === null) return null
  if (value instanceof Date) return value.getTime()
  if (typeof value === 'boolean') return value ? 1 : 0
  if (typeof value === 'object') return JSON.stringify(value)
  return value
}

function storedColumns(meta: EntityMetadata): EntityProperty[] {
  return meta.props.filter(
    (p) => p.persist !== false && !p.formula && p.fieldNames?.length === 1 && (p.kind === 'scalar' || p.kind === 'm:1' || (p.kind === '1:1' && p.owner)),
  )
}

/** A prepared INSERT for one entity; rows are keyed by property name, missing properties get their default. */
function tableWriter(db: Database.Database, orm: MikroORM, entity: string, generic: Set<string>): TableWriter {
  const meta = orm.getMetadata().get(entity)
  const props = storedColumns(meta)
  const sql = `insert into \`${meta.tableName}\` (${props.map((p) => `\`${p.fieldNames[0]}\``).join(', ')}) values (${props.map(() => '?').join(', ')})`
  const stmt = db.prepare(sql)
  const fallback = props.map((p): (() => unknown) => {
    if (p.version) return () => 1
    if (p.default !== undefined && p.default !== null) {
      const v = toDb(p.default)
      return () => v
    }
    if (p.defaultRaw !== undefined && p.defaultRaw !== null) {
      const v = parseDefaultRaw(p.defaultRaw)
      return () => v
    }
    if (p.nullable) return () => null
    if (p.onCreate) return () => toDb(p.onCreate!({} as never, orm.em as never))
    if (p.primary) return () => null
    // a required column the seed does not know: a neutral value, reported once it is used
    const column = `${meta.tableName}.${p.fieldNames[0]}`
    const t = String(p.runtimeType ?? p.type).toLowerCase()
    const neutral = (): unknown => {
      if (t.includes('date')) return Date.now()
      if (t.includes('number') || t.includes('int') || t.includes('float') || t.includes('double') || t.includes('decimal')) return 0
      if (t.includes('boolean')) return 0
      if (t.includes('json') || t.includes('object') || t.includes('array') || t === 'any') return '{}'
      return ''
    }
    return () => {
      generic.add(column)
      return neutral()
    }
  })
  const names = props.map((p) => p.name)
  const values: unknown[] = new Array(props.length)
  return {
    table: meta.tableName,
    insert(row: Row) {
      for (let i = 0; i < names.length; i++) {
        const v = row[names[i]]
        values[i] = v === undefined ? fallback[i]() : toDb(v)
      }
      stmt.run(values)
    },
  }
}

// ---- the seed ----------------------------------------------------------------------------------------------

export async function seedBulk(options: BulkOptions): Promise<BulkResult> {
  const started = performance.now()
  const log = options.log ?? (() => {})
  const dbPath = resolve(options.dbPath)
  const batchSize = options.batchSize ?? 20_000
  const rnd = mulberry32(options.seed ?? 20261202)
  const pick = <T>(list: readonly T[]): T => list[Math.floor(rnd() * list.length)]
  const int = (lo: number, hi: number) => lo + Math.floor(rnd() * (hi - lo + 1))
  for (const suffix of ['', '-wal', '-shm']) rmSync(dbPath + suffix, { force: true })

  // 1. the real schema and the demo scenario, through the ORM
  const orm = await initOrm({ databasePath: dbPath })
  let generic: string[] = []
  let result: BulkResult
  try {
    await orm.schema.createSchema()
    await applyImmutabilityTriggers(orm)
    await seedDemoIfEmpty(orm, options.demoPassword ?? process.env.DEMO_PASSWORD ?? 'fillwright-demo')
    log(`schema and demo scenario: ${((performance.now() - started) / 1000).toFixed(1)} s`)

    // 2. raw inserts through the driver
    const db = new Database(dbPath)
    try {
      db.pragma('journal_mode = WAL')
      db.pragma('synchronous = OFF')
      db.pragma('foreign_keys = ON')
      db.pragma('cache_size = -262144')
      const genericSet = new Set<string>()
      const w = {
        customer: tableWriter(db, orm, 'Customer', genericSet),
        user: tableWriter(db, orm, 'User', genericSet),
        cylinder: tableWriter(db, orm, 'Cylinder', genericSet),
        order: tableWriter(db, orm, 'Order', genericSet),
        line: tableWriter(db, orm, 'OrderLine', genericSet),
        plan: tableWriter(db, orm, 'FillPlan', genericSet),
        run: tableWriter(db, orm, 'FillRun', genericSet),
        reading: tableWriter(db, orm, 'FillReading', genericSet),
      }
      const maxId = (table: string) => (db.prepare(`select coalesce(max(id), 0) as m from \`${table}\``).get() as { m: number }).m
      const userId = (email: string) => (db.prepare('select id from users where email = ?').get(email) as { id: number } | undefined)?.id
      const users: Record<string, number> = {}
      for (const role of ['admin', 'sales', 'blender', 'technician', 'qa', 'customer']) {
        const id = userId(`${role}@demo.test`)
        if (id === undefined) throw new Error(`the demo scenario has no ${role}@demo.test`)
        users[role] = id
      }
      const rows: Record<string, number> = {}
      const count = (table: string, n = 1) => {
        rows[table] = (rows[table] ?? 0) + n
      }

      // batches: each callback call inserts one unit; a transaction is committed every `batchSize` rows
      let pending = 0
      db.exec('begin')
      const tick = (n = 1) => {
        pending += n
        if (pending >= batchSize) {
          db.exec('commit')
          db.exec('begin')
          pending = 0
        }
      }

      const now = Date.now()
      const years = Math.max(1, Math.ceil(options.orders / 60_000))
      const spanMs = years * 365 * 86_400_000
      const startMs = now - spanMs

      // customers
      const nCustomers = Math.max(20, Math.round(options.orders / 250))
      const firstCustomer = maxId('customers') + 1
      const customers: { id: number; code: string; company: string }[] = []
      for (let i = 0; i < nCustomers; i++) {
        const id = firstCustomer + i
        const place = PLACES[i % PLACES.length]
        const trade = TRADES[Math.floor(i / PLACES.length) % TRADES.length]
        const round = Math.floor(i / (PLACES.length * TRADES.length))
        const company = `${place} ${trade}${round > 0 ? ` ${round + 1}` : ''}`
        const code = `B${String(i + 1).padStart(5, '0')}`
        const contact = `${pick(FIRST)} ${pick(LAST)}`
        w.customer.insert({
          id,
          code,
          company,
          contactName: contact,
          contactEmail: `${contact.toLowerCase().replace(/[^a-z]+/g, '.')}@${code.toLowerCase()}.bulk.test`,
          phone: `+00 555 ${String(1000 + (i % 9000)).padStart(4, '0')}`,
          billingAddress: `${int(1, 200)} ${pick(LAST)} Street\n${place}`,
          paymentProviderId: null,
          createdAt: new Date(startMs - 86_400_000),
          updatedAt: new Date(startMs - 86_400_000),
        })
        customers.push({ id, code, company })
        count('customers')
        tick()
      }

      // extra technicians (same password as the demo accounts), so the demo technician holds a realistic share of runs
      const technicians = [users.technician]
      const techHash = (db.prepare('select password_hash as h from users where id = ?').get(users.technician) as { h: string }).h
      const firstUser = maxId('users') + 1
      for (let i = 0; i < 5; i++) {
        const id = firstUser + i
        w.user.insert({
          id,
          email: `technician${i + 2}@bulk.test`,
          name: `${FIRST[(i * 3) % FIRST.length]} ${LAST[(i * 5) % LAST.length]} (technician)`,
          passwordHash: techHash,
          roles: ['technician'],
          active: true,
          customer: null,
          createdAt: new Date(startMs),
          updatedAt: new Date(startMs),
        })
        technicians.push(id)
        count('users')
      }

      // cylinders
      const nCylinders = Math.max(100, Math.round(options.orders / 50))
      const firstCylinder = maxId('cylinders') + 1
      for (let i = 0; i < nCylinders; i++) {
        const big = rnd() < 0.7
        const last = new Date(now - int(30, 3000) * 86_400_000)
        const next = new Date(last.getTime() + 10 * 365 * 86_400_000)
        w.cylinder.insert({
          id: firstCylinder + i,
          serial: `KR-BULK-${String(i + 1).padStart(6, '0')}`,
          barcode: `KRB${String(i + 1).padStart(9, '0')}`,
          waterVolumeL: big ? 50 : 10,
          servicePressureBar: big ? 200 : 150,
          testPressureBar: big ? 300 : 250,
          material: big ? 'steel' : 'aluminium',
          valveOutlet: big ? 'DIN 477 No. 10' : 'DIN 477 No. 14',
          oxygenClean: rnd() < 0.3,
          owner: null,
          lastTestDate: last.toISOString().slice(0, 10),
          nextTestDate: next.toISOString().slice(0, 10),
          status: 'available',
          residual: { kind: 'evacuated' },
          createdAt: new Date(startMs),
          updatedAt: new Date(startMs),
        })
        count('cylinders')
        tick()
      }

      // orders, lines, plans, runs (readings afterwards, spread over the runs)
      const firstOrder = maxId('orders') + 1
      let lineId = maxId('order_lines') + 1
      let planId = maxId('fill_plans') + 1
      let runId = maxId('fill_runs') + 1
      const firstBulkRun = runId
      // runs carry their step state in `targets`; reuse a demo run's state (the real shape) when the demo has runs
      const demoTargets = (
        db.prepare("select targets from fill_runs where json_type(targets, '$.steps') = 'array' order by id limit 1").get() as { targets: string } | undefined
      )?.targets
      const runsForReadings: { id: number; gases: string[]; atMs: number; technician: number; method: string; finalBar: number }[] = []
      // continue each year's numbering after the demo orders (FW-yyyy-nnnnn is unique)
      const seqByYear = new Map<number, number>()
      for (const { number } of db.prepare('select number from orders').all() as { number: string }[]) {
        const m = /^FW-(\d{4})-(\d+)$/.exec(number)
        if (m) seqByYear.set(Number(m[1]), Math.max(seqByYear.get(Number(m[1])) ?? 0, Number(m[2])))
      }
      const templateGasFormulas = TEMPLATES.map((t) =>
        [...new Set([...t.minors.map((m) => m.gas), t.balanceGas])].map((g) => (g === 'air' ? 'air' : getGas(g).formula)),
      )

      for (let i = 0; i < options.orders; i++) {
        const id = firstOrder + i
        const age = i / Math.max(1, options.orders - 1) // 0 oldest … 1 newest
        const createdMs = Math.round(startMs + age * spanMs - rnd() * 3_600_000)
        const created = new Date(createdMs)
        const year = created.getUTCFullYear()
        const seq = (seqByYear.get(year) ?? 0) + 1
        seqByYear.set(year, seq)
        const number = `FW-${year}-${String(seq).padStart(5, '0')}`
        const customer = customers[Math.floor(rnd() ** 1.6 * customers.length)]
        let status: Status
        if (age < 0.97) {
          const r = rnd()
          status = r < 0.8 ? 'paid' : r < 0.88 ? 'cancelled' : r < 0.95 ? 'invoiced' : 'shipped'
        } else status = STATUS_ORDER[int(0, 8)]
        const reference = rnd() < 0.7 ? `PO ${int(1000, 999999)}` : `Project ${pick(PLACES)} ${int(1, 99)}`
        const neededBy = rnd() < 0.8 ? new Date(createdMs + int(7, 40) * 86_400_000).toISOString().slice(0, 10) : null
        const nLines = rnd() < 0.7 ? 1 : rnd() < 0.67 ? 2 : 3
        const lineTemplates = Array.from({ length: nLines }, () => int(0, TEMPLATES.length - 1))
        const formulas = new Set<string>()
        for (const t of lineTemplates) for (const f of templateGasFormulas[t]) formulas.add(f)
        let total = 0
        const lineRows: Row[] = []
        for (let l = 0; l < nLines; l++) {
          const t = TEMPLATES[lineTemplates[l]]
          const quantity = rnd() < 0.75 ? 1 : int(2, 4)
          const price = int(40, 600) * 100 * quantity
          total += price
          const minors = t.minors.map((m) => ({ gas: m.gas, fraction: m.unit === 'percent' ? m.amount / 100 : m.amount / 1e6, amount: m.amount, unit: m.unit }))
          const balance = 1 - minors.reduce((s, m) => s + m.fraction, 0)
          const big = rnd() < 0.7
          lineRows.push({
            id: lineId++,
            order: id,
            lineNo: l + 1,
            description: t.description,
            components: [...minors, { gas: t.balanceGas, fraction: balance }],
            balanceGas: t.balanceGas,
            blendTolerancePct: pick([2, 5, 10]),
            certificationUncertaintyPct: pick([1, 2]),
            waterVolumeL: big ? 50 : 10,
            valveOutlet: big ? 'DIN 477 No. 10' : 'DIN 477 No. 14',
            quantity,
            finalPressureBarGauge: big ? 200 : 150,
            method: t.method,
            priceMinor: price,
            pricing: null,
          })
        }
        const quoted = status !== 'draft'
        const accepted = quoted && status !== 'quoted' && status !== 'cancelled'
        w.order.insert({
          id,
          number,
          customer: customer.id,
          status,
          reference,
          neededBy,
          currency: 'EUR',
          totalMinor: total,
          quoteValidUntil: quoted ? new Date(createdMs + 30 * 86_400_000).toISOString().slice(0, 10) : null,
          quoteSentAt: quoted ? new Date(createdMs + 3_600_000) : null,
          acceptedAt: accepted ? new Date(createdMs + 2 * 86_400_000) : null,
          notes: '',
          searchText: [number, customer.code, customer.company, reference, ...formulas].join(' ').toLowerCase(),
          createdById: users.sales,
          version: 1,
          createdAt: created,
          updatedAt: created,
        })
        count('orders')
        tick()
        for (const line of lineRows) {
          w.line.insert(line)
          count('order_lines')
          tick()
          if (!PLANNED_OR_LATER.has(status)) continue
          const components = line.components as { gas: string; fraction: number }[]
          const plannedAt = createdMs + 3 * 86_400_000
          const thisPlan = planId++
          w.plan.insert({
            id: thisPlan,
            orderLine: line.id,
            cylinder: null,
            planVersion: 1,
            status: 'approved',
            model: pick(['peng-robinson', 'gerg-2008', 'srk']),
            method: line.method,
            request: {
              target: components.map((c) => ({ gas: c.gas, fraction: c.fraction })),
              finalPressure: { value: line.finalPressureBarGauge, unit: 'bar', reference: 'gauge' },
            },
            result: {
              steps: components.map((c, k) => ({
                index: k,
                gas: c.gas,
                cumulativeGaugePressure: { value: Number((((k + 1) / components.length) * (line.finalPressureBarGauge as number)).toFixed(2)), unit: 'bar' },
              })),
            },
            blocking: false,
            createdById: users.blender,
            approvedById: users.blender,
            approvedAt: new Date(plannedAt),
            assignedTechnicianId: technicians[0],
            version: 1,
            createdAt: new Date(plannedAt),
          })
          count('fill_plans')
          tick()
          for (let c = 0; c < (line.quantity as number); c++) {
            const technician = technicians[int(0, technicians.length - 1)]
            const runAt = plannedAt + 86_400_000 + c * 1_800_000
            const done = FILLED.has(status)
            const thisRun = runId++
            const runStatus = done ? 'completed' : status === 'filling' ? (c === 0 ? 'in-progress' : 'ready') : 'ready'
            w.run.insert({
              id: thisRun,
              plan: thisPlan,
              cylinder: firstCylinder + int(0, nCylinders - 1),
              technicianId: technician,
              scheduledFor: new Date(runAt).toISOString().slice(0, 10),
              status: runStatus,
              currentStep: done ? components.length : 0,
              targets: demoTargets ?? { steps: components.map((x, k) => ({ index: k, gas: x.gas })) },
              replanCount: 0,
              startedAt: done || runStatus === 'in-progress' ? new Date(runAt) : null,
              completedAt: done ? new Date(runAt + 3_600_000) : null,
              notes: '',
              version: 1,
              createdAt: new Date(plannedAt),
              updatedAt: new Date(done ? runAt + 3_600_000 : plannedAt),
            })
            count('fill_runs')
            tick()
            if (done)
              runsForReadings.push({
                id: thisRun,
                gases: components.map((x) => x.gas),
                atMs: runAt,
                technician,
                method: line.method as string,
                finalBar: line.finalPressureBarGauge as number,
              })
          }
        }
      }

      // recorded readings: spread evenly over the completed runs (one per step, corrections beyond that)
      if (options.readings > 0 && runsForReadings.length === 0) log('no completed runs to hold readings: none written')
      if (runsForReadings.length > 0) {
        const per = Math.floor(options.readings / runsForReadings.length)
        const extra = options.readings % runsForReadings.length
        let readingId = maxId('fill_readings') + 1
        for (let r = 0; r < runsForReadings.length; r++) {
          const run = runsForReadings[r]
          const n = per + (r < extra ? 1 : 0)
          const steps = run.gases.length
          for (let k = 0; k < n; k++) {
            const step = k % steps
            const gauge = ((step + 1) / steps) * run.finalBar + (rnd() - 0.5) * 0.4
            const outcome = rnd() < 0.9 ? 'on-target' : rnd() < 0.5 ? 'under' : 'over'
            w.reading.insert({
              id: readingId,
              run: run.id,
              stepIndex: step,
              gas: run.gases[step],
              pressureBarAbs: gauge + 1.013,
              pressureBarGauge: gauge,
              temperatureC: 18 + rnd() * 6,
              scaleKg: run.method === 'gravimetric' ? Number((gauge * 0.06).toFixed(3)) : null,
              outcome,
              supersedes: k >= steps ? readingId - steps : null,
              recordedById: run.technician,
              clientRequestId: randomUUID(),
              recordedAt: new Date(run.atMs + k * 240_000),
            })
            readingId++
            count('fill_readings')
            tick()
          }
        }
      }
      db.exec('commit')
      db.pragma('wal_checkpoint(TRUNCATE)')
      generic = [...genericSet]
      if (generic.length) log(`columns unknown to the seed, filled with neutral values: ${generic.join(', ')}`)
      result = { dbPath, rows, seconds: (performance.now() - started) / 1000, genericColumns: generic, users, firstBulkRunId: firstBulkRun }
    } finally {
      db.close()
    }
  } finally {
    await orm.close()
  }
  log(
    `seeded ${Object.entries(result.rows)
      .map(([t, n]) => `${n} ${t}`)
      .join(', ')} in ${result.seconds.toFixed(1)} s → ${dbPath}`,
  )
  return result
}

// ---- command line ----------------------------------------------------------------------------------------------

async function main(): Promise<void> {
  const { values } = parseArgs({
    options: {
      orders: { type: 'string', default: '100000' },
      readings: { type: 'string', default: '1000000' },
      db: { type: 'string', default: './data/bulk.sqlite' },
      'batch-size': { type: 'string', default: '20000' },
      seed: { type: 'string', default: '20261202' },
      force: { type: 'boolean', default: false },
    },
  })
  const count = (name: string, v: string) => {
    const n = Number(v)
    if (!Number.isInteger(n) || n < 0) throw new Error(`--${name} must be a whole number ≥ 0, got "${v}"`)
    return n
  }
  const dbPath = resolve(values.db)
  if (existsSync(dbPath) && !values.force) {
    throw new Error(`${dbPath} exists; pass --force to replace it`)
  }
  await seedBulk({
    dbPath,
    orders: count('orders', values.orders),
    readings: count('readings', values.readings),
    batchSize: count('batch-size', values['batch-size']),
    seed: count('seed', values.seed),
    log: (line) => console.log(line),
  })
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  main().catch((err) => {
    console.error(err instanceof Error ? err.message : err)
    process.exit(1)
  })
}
