/**
 * The server side of the HTTP benchmarks, run as a child process so the load generator (autocannon, in the parent)
 * does not share an event loop with the server. Starts, on 127.0.0.1 and free ports:
 *  - the Fillwright app (createApp with its real middleware: pino request logs at 'info' written to /dev/null,
 *    helmet, sessions in the database, passport, CSRF) on the bulk database;
 *  - the floors of bench/server/floors.ts.
 * Reports the ports to the parent over IPC and stops when told to, or when the parent goes away.
 */
import type { AddressInfo } from 'node:net'
import type { Server } from 'node:http'
import type { Express } from 'express'
import { pino } from 'pino'
import { createApp } from '../../server/app.ts'
import { initOrm } from '../../server/db.ts'
import type { AppDeps } from '../../server/lib/deps.ts'
import type { Mailer } from '../../server/lib/mailer.ts'
import { createPayments } from '../../server/lib/payments.ts'
import '../../server/routes.ts'
import { bareFloor, ordersFloor, planFloor, readingFloor } from './floors.ts'

export interface ChildConfig {
  dbPath: string
}

export interface ChildPorts {
  app: number
  bare: number
  orders: number
  plan: number
  reading: number
}

function listen(app: Express): Promise<Server> {
  return new Promise((resolve, reject) => {
    const server = app.listen(0, '127.0.0.1')
    server.once('listening', () => resolve(server))
    server.once('error', reject)
  })
}

async function main(): Promise<void> {
  const config = JSON.parse(process.env.FILLWRIGHT_BENCH_CHILD ?? '{}') as ChildConfig
  if (!config.dbPath) throw new Error('FILLWRIGHT_BENCH_CHILD must name dbPath')
  const orm = await initOrm({ databasePath: config.dbPath })
  const mailer: Mailer = {
    async send() {
      return { messageId: '<bench@fillwright.test>' }
    },
  }
  const deps: AppDeps = {
    orm,
    mailer,
    payments: createPayments({ secretKey: 'sk_test_bench_unused', host: '127.0.0.1', port: 9, protocol: 'http' }),
    publicUrl: 'http://127.0.0.1',
    uploadDir: `${config.dbPath}.uploads`,
    webhookSecret: 'whsec_bench_unused',
  }
  const logger = pino({ level: 'info' }, pino.destination({ dest: '/dev/null', sync: true }))
  const app = createApp(deps, { sessionSecret: 'bench-session-secret-0123456789abcdef', cookieSecure: 'false', trustProxy: 'loopback', logger })
  const orders = ordersFloor(config.dbPath)
  const reading = readingFloor(config.dbPath)
  const servers = {
    app: await listen(app),
    bare: await listen(bareFloor()),
    orders: await listen(orders.app),
    plan: await listen(planFloor()),
    reading: await listen(reading.app),
  }
  const ports = Object.fromEntries(Object.entries(servers).map(([k, s]) => [k, (s.address() as AddressInfo).port])) as unknown as ChildPorts
  let stopping = false
  const stop = async () => {
    if (stopping) return
    stopping = true
    await Promise.all(
      Object.values(servers).map(
        (s) =>
          new Promise<void>((resolve) => {
            s.closeAllConnections()
            s.close(() => resolve())
          }),
      ),
    )
    orders.close()
    reading.close()
    await orm.close()
    process.exit(0)
  }
  process.on('message', (m: { type?: string; id?: number }) => {
    if (m?.type === 'stop') void stop()
    // CPU time of this process so far (µs): the parent takes the difference over a load run
    if (m?.type === 'cpu') {
      const u = process.cpuUsage()
      process.send?.({ type: 'cpu', id: m.id, micros: u.user + u.system })
    }
  })
  process.on('disconnect', () => void stop())
  process.send?.({ type: 'ready', ports })
}

main().catch((err) => {
  console.error(err)
  process.exit(1)
})
