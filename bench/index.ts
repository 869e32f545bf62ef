/**
 * `npm run bench`: every Fillwright benchmark in one bounded run (a few minutes on the 2-core reference machine),
 * printed as a table, or with `-- --json` as one JSON object of named figures (the unit is in each key's name).
 *
 *   npm run bench                       table
 *   npm run -s bench -- --json          JSON on stdout (progress on stderr; -s keeps npm's own banner off stdout)
 *   npm run bench -- --out bench.json   the table, and the JSON written to a file
 *   npm run bench -- --quick            shorter timings (a smoke run, figures less steady)
 *   npm run bench -- --only physics,planning,bundle,data,http
 *   npm run bench -- --orders 100000 --readings 1000000 --duration 5 --keep-db --check
 *
 * --check exits with status 1 when a budget is missed. Progress goes to stderr in every mode.
 */
import { cpus, loadavg, tmpdir } from 'node:os'
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { join, resolve, dirname } from 'node:path'
import { fileURLToPath } from 'node:url'
import { parseArgs } from 'node:util'
import { Report, round } from './lib/report.ts'
import { runBundle } from './sections/bundle.ts'
import { buildDatabases, prepareBenchRuns, removeDatabases, runDatabase } from './sections/database.ts'
import { runHttp } from './sections/http.ts'
import { runPhysics } from './sections/physics.ts'
import { runPlanning } from './sections/planning.ts'

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..')
const SECTIONS = ['physics', 'planning', 'bundle', 'data', 'http'] as const
type Section = (typeof SECTIONS)[number]

const { values } = parseArgs({
  options: {
    json: { type: 'boolean', default: false },
    quick: { type: 'boolean', default: false },
    only: { type: 'string' },
    orders: { type: 'string', default: '100000' },
    readings: { type: 'string', default: '1000000' },
    duration: { type: 'string' },
    connections: { type: 'string', default: '10' },
    'keep-db': { type: 'boolean', default: false },
    out: { type: 'string' },
    check: { type: 'boolean', default: false },
  },
})

function positiveInt(name: string, v: string): number {
  const n = Number(v)
  if (!Number.isInteger(n) || n < 1) throw new Error(`--${name} must be a whole number ≥ 1, got "${v}"`)
  return n
}

const only = new Set<Section>(
  values.only
    ? values.only.split(',').map((s) => {
        const t = s.trim() as Section
        if (!SECTIONS.includes(t)) throw new Error(`--only takes ${SECTIONS.join(', ')}; got "${s}"`)
        return t
      })
    : SECTIONS,
)
const quick = values.quick
const orders = positiveInt('orders', values.orders)
const readings = positiveInt('readings', values.readings)
const duration = values.duration ? positiveInt('duration', values.duration) : quick ? 2 : 5
const connections = positiveInt('connections', values.connections)
const password = process.env.DEMO_PASSWORD ?? 'fillwright-demo'
const progress = (line: string) => process.stderr.write(`[bench] ${line}\n`)

async function main(): Promise<number> {
  const report = new Report()
  const started = performance.now()
  const machine = 'machine'
  report.add(machine, 'node_version', process.version, 'Node.js')
  report.add(machine, 'cpu_model', cpus()[0]?.model ?? 'unknown', 'processor')
  report.add(machine, 'cpu_count', cpus().length, 'logical cores')
  report.add(machine, 'load_avg_1m_start', round(loadavg()[0], 2), 'load average when the run started (other work on the machine skews every figure)')

  if (only.has('physics')) {
    progress('equations of state')
    runPhysics(report, { quick })
  }
  if (only.has('planning')) {
    progress('fill planning')
    runPlanning(report, { quick })
  }
  if (only.has('bundle')) {
    progress('client bundle')
    await runBundle(report, root)
  }
  if (only.has('data') || only.has('http')) {
    const dir = mkdtempSync(join(tmpdir(), 'fillwright-bench-db-'))
    progress(`bulk databases in ${dir}: ${orders} and ${Math.round(orders / 10)} orders`)
    const dbs = await buildDatabases(report, dir, { orders, readings }, (l) => progress(l))
    try {
      const runs = prepareBenchRuns(dbs.large, 3000)
      if (runs.made === 0) report.note('no untouched demo fill run to copy for the reading benchmark (the demo scenario has no runs yet)')
      if (only.has('data')) {
        progress('orders list at scale')
        await runDatabase(report, dbs, { quick })
      }
      if (only.has('http')) {
        progress(`API throughput (${duration} s per run, ${connections} connections)`)
        await runHttp(report, {
          dbPath: dbs.large.dbPath,
          smallDbPath: dbs.small.dbPath,
          orders: dbs.large.rows.orders ?? 0,
          smallOrders: dbs.small.rows.orders ?? 0,
          password,
          durationSeconds: duration,
          warmupSeconds: quick ? 1 : 2,
          connections,
        })
      }
    } finally {
      if (values['keep-db']) progress(`kept ${dbs.large.dbPath} and ${dbs.small.dbPath}`)
      else {
        removeDatabases(dbs)
        rmSync(dir, { recursive: true, force: true })
      }
    }
  }
  report.add(machine, 'load_avg_1m_end', round(loadavg()[0], 2), 'load average when the run ended')
  report.add(machine, 'bench_total_s', round((performance.now() - started) / 1000, 1), 'wall time of this bench run')

  const json = `${JSON.stringify(report.toJson(), null, 2)}\n`
  if (values.out) writeFileSync(resolve(values.out), json)
  process.stdout.write(values.json ? json : `${report.toTable()}\n`)
  const missed = report.budgetResults().filter((b) => b.met === false)
  return values.check && missed.length > 0 ? 1 : 0
}

main().then(
  (code) => process.exit(code),
  (err) => {
    console.error(err)
    process.exit(2)
  },
)
