import cluster from 'node:cluster'
import { existsSync } from 'node:fs'
import { resolve } from 'node:path'
import { loadEnv } from './env.ts'
import { createLogger, prepareDatabase, startApp } from './start.ts'

/**
 * Entry point of `npm start`: env → migrate + seed (primary) → fakes (when START_FAKES) → app
 * processes (WEB_CONCURRENCY workers behind one port via node:cluster, or this process alone).
 */
// a line in .env is a setting too (README); variables already in the environment win
const dotEnv = resolve(import.meta.dirname, '..', '.env')
if (existsSync(dotEnv)) process.loadEnvFile(dotEnv)
const env = loadEnv()
const log = createLogger(env)

async function primary() {
  await prepareDatabase(env, log)
  let fakes: { close(): Promise<void> } | undefined
  if (env.START_FAKES === 'true') {
    const { startFakes } = await import('../fakes/index.ts')
    fakes = await startFakes({
      smtpPort: env.FAKE_SMTP_PORT,
      smtpWebPort: env.FAKE_SMTP_WEB_PORT,
      paymentsPort: env.FAKE_PAYMENTS_PORT,
      appUrl: `http://127.0.0.1:${env.PORT}`,
      webhookSecret: env.STRIPE_WEBHOOK_SECRET,
    })
    log.info({ smtp: env.FAKE_SMTP_PORT, inbox: `http://127.0.0.1:${env.FAKE_SMTP_WEB_PORT}/`, payments: env.FAKE_PAYMENTS_PORT }, 'local fakes started')
  }
  let stopApp: (() => Promise<void>) | undefined
  let shuttingDown = false
  if (env.WEB_CONCURRENCY > 1) {
    for (let i = 0; i < env.WEB_CONCURRENCY; i++) cluster.fork()
    cluster.on('exit', (worker, code, signal) => {
      if (!shuttingDown) {
        log.warn({ pid: worker.process.pid, code, signal }, 'app process ended; starting another')
        cluster.fork()
      }
    })
  } else {
    const app = await startApp(env, log)
    stopApp = app.close
  }
  log.info(`Fillwright listening on http://localhost:${env.PORT}`)
  const shutdown = async () => {
    if (shuttingDown) return
    shuttingDown = true
    for (const w of Object.values(cluster.workers ?? {})) w?.kill('SIGTERM')
    await stopApp?.()
    await fakes?.close()
    process.exit(0)
  }
  process.on('SIGTERM', shutdown)
  process.on('SIGINT', shutdown)
}

async function worker() {
  const app = await startApp(env, log)
  process.on('SIGTERM', async () => {
    await app.close()
    process.exit(0)
  })
}

;(cluster.isPrimary ? primary() : worker()).catch((err) => {
  log.fatal({ err }, 'failed to start')
  process.exit(1)
})
