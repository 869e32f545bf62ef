import { dirname, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import type { MikroORM } from '@mikro-orm/core'
import { pino } from 'pino'
import { createApp } from './app.ts'
import { initOrm, migrateUp } from './db.ts'
import type { Env } from './env.ts'
import type { AppDeps } from './lib/deps.ts'
import { applyImmutabilityTriggers } from './lib/immutability.ts'
import { createMailer } from './lib/mailer.ts'
import { createPayments } from './lib/payments.ts'
import { seedDemoIfEmpty } from './seed/demo.ts'
import './seed/index.ts'

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..')

export function depsFromEnv(env: Env, orm: MikroORM): AppDeps {
  return {
    orm,
    mailer: createMailer({
      host: env.SMTP_HOST,
      port: env.SMTP_PORT,
      secure: env.SMTP_SECURE === 'true',
      user: env.SMTP_USER || undefined,
      pass: env.SMTP_PASS || undefined,
      from: env.MAIL_FROM,
    }),
    payments: createPayments({ secretKey: env.STRIPE_SECRET_KEY, host: env.STRIPE_API_HOST, port: env.STRIPE_API_PORT, protocol: env.STRIPE_API_PROTOCOL }),
    publicUrl: env.PUBLIC_URL,
    uploadDir: resolve(root, env.UPLOAD_DIR),
    webhookSecret: env.STRIPE_WEBHOOK_SECRET,
  }
}

export function dbSettings(env: Env) {
  return { databasePath: env.DATABASE_PATH, databaseUrl: env.DATABASE_URL || undefined }
}

/** Migrates and seeds once (the primary process does this before workers start). */
export async function prepareDatabase(env: Env, log: pino.Logger): Promise<void> {
  const orm = await initOrm(dbSettings(env))
  try {
    await migrateUp(orm)
    await ensureImmutability(orm, Boolean(env.DATABASE_URL), log)
    if (env.SEED_DEMO === 'true' && (await seedDemoIfEmpty(orm, env.DEMO_PASSWORD))) log.info('seeded the demo scenario')
  } finally {
    await orm.close()
  }
}

const IMMUTABLE_TABLES = ['fill_readings', 'certificates']

/**
 * Evidence tables refuse UPDATE/DELETE whatever the migrations contain: the trigger statements are
 * idempotent and run at every start, after the migrations (a migration that also creates them is fine).
 */
async function ensureImmutability(orm: MikroORM, postgres: boolean, log: pino.Logger): Promise<void> {
  const conn = orm.em.getConnection()
  const rows: { name: string }[] = postgres
    ? await conn.execute<{ name: string }[]>(
        `select table_name as name from information_schema.tables where table_schema = current_schema() and table_name in ('fill_readings', 'certificates')`,
      )
    : await conn.execute<{ name: string }[]>(`select name from sqlite_master where type = 'table' and name in ('fill_readings', 'certificates')`)
  const present = new Set(rows.map((r) => r.name))
  const missing = IMMUTABLE_TABLES.filter((t) => !present.has(t))
  if (missing.length) {
    log.error({ missing }, 'tables missing after the migrations: immutability triggers not installed (run migration:create?)')
    return
  }
  await applyImmutabilityTriggers(orm, postgres)
}

/** Starts one app process: ORM, app, listen; closes cleanly on SIGTERM/SIGINT. */
export async function startApp(env: Env, log: pino.Logger) {
  const orm = await initOrm(dbSettings(env))
  const app = createApp(depsFromEnv(env, orm), {
    sessionSecret: env.SESSION_SECRET,
    cookieSecure: env.COOKIE_SECURE,
    trustProxy: env.TRUST_PROXY,
    logger: log,
    clientDir: resolve(root, 'dist'),
  })
  const server = app.listen(env.PORT, env.HOST)
  await new Promise<void>((res, rej) => {
    server.once('listening', () => res())
    server.once('error', rej)
  })
  const close = async () => {
    await new Promise<void>((res) => server.close(() => res()))
    await orm.close()
  }
  return { server, orm, close }
}

export function createLogger(env: Env) {
  return pino({ level: env.LOG_LEVEL, base: { pid: process.pid } })
}
