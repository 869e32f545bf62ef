import { mkdirSync, rmSync } from 'node:fs'
import { join } from 'node:path'
import type { MikroORM } from '@mikro-orm/core'
import { pino } from 'pino'
import request from 'supertest'
import type TestAgent from 'supertest/lib/agent.js'
import { createApp } from '#server/app.ts'
import { initOrm } from '#server/db.ts'
import type { AppDeps } from '#server/lib/deps.ts'
import { applyImmutabilityTriggers } from '#server/lib/immutability.ts'
import type { Mailer, MailMessage } from '#server/lib/mailer.ts'
import { createPayments } from '#server/lib/payments.ts'
import { seedDemoIfEmpty } from '#server/seed/demo.ts'
import '#server/seed/index.ts'
import type { Role } from '#shared/schemas/auth.ts'

export const DEMO_PASSWORD = 'test-demo-password'

export interface TestApp {
  app: ReturnType<typeof createApp>
  orm: MikroORM
  deps: AppDeps
  /** e-mails the app sent during the test */
  sentMail: MailMessage[]
  dbPath: string
  /** PostgreSQL URL of this app's own database when TEST_DATABASE_URL is set (else undefined: SQLite) */
  databaseUrl?: string
  /** a supertest agent signed in as the demo account of the role, with its CSRF token */
  signIn(role: Role): Promise<SignedInAgent>
  /** a signed-out agent with a CSRF token */
  anonymous(): Promise<SignedInAgent>
  close(): Promise<void>
}

export interface SignedInAgent {
  agent: InstanceType<typeof TestAgent>
  csrf: string
}

let counter = 0

/**
 * A fresh app on a real SQLite file in tests/.tmp (schema created from the entities — schema sync is
 * used only in tests; the app itself runs the committed migrations), seeded with the demo scenario.
 */
export async function createTestApp(options: { payments?: AppDeps['payments']; seed?: boolean } = {}): Promise<TestApp> {
  const dir = join(process.cwd(), 'tests', '.tmp')
  mkdirSync(dir, { recursive: true })
  const dbPath = join(dir, `api-${process.pid}-${Date.now()}-${counter++}.sqlite`)
  // TEST_DATABASE_URL (a PostgreSQL role allowed to create databases): each test app gets its own database
  const pg = process.env.TEST_DATABASE_URL ? await createPgTestDatabase(process.env.TEST_DATABASE_URL) : undefined
  const orm = await initOrm({ databasePath: dbPath, databaseUrl: pg?.url })
  await orm.schema.createSchema()
  await applyImmutabilityTriggers(orm, Boolean(pg))
  if (options.seed !== false) await seedDemoIfEmpty(orm, DEMO_PASSWORD)
  const sentMail: MailMessage[] = []
  const mailer: Mailer = {
    async send(message) {
      sentMail.push(message)
      return { messageId: `<test-${sentMail.length}@fillwright.test>` }
    },
  }
  const deps: AppDeps = {
    orm,
    mailer,
    payments: options.payments ?? createPayments({ secretKey: 'sk_test_unused', host: '127.0.0.1', port: 9, protocol: 'http' }),
    publicUrl: 'http://localhost:3000',
    uploadDir: join(dir, `uploads-${process.pid}-${counter}`),
    webhookSecret: 'whsec_test_secret',
  }
  const app = createApp(deps, {
    sessionSecret: 'test-session-secret-0123456789',
    cookieSecure: 'false',
    trustProxy: 'loopback',
    logger: pino({ level: 'silent' }),
  })

  async function anonymous(): Promise<SignedInAgent> {
    const agent = request.agent(app)
    const res = await agent.get('/api/auth/csrf').expect(200)
    return { agent, csrf: res.body.token as string }
  }
  async function signIn(role: Role): Promise<SignedInAgent> {
    const a = await anonymous()
    await a.agent
      .post('/api/auth/login')
      .set('x-csrf-token', a.csrf)
      .send({ email: `${role}@demo.test`, password: DEMO_PASSWORD })
      .expect(200)
    return a
  }
  return {
    app,
    orm,
    deps,
    sentMail,
    dbPath,
    databaseUrl: pg?.url,
    signIn,
    anonymous,
    async close() {
      await orm.close()
      if (pg) await pg.drop()
      else for (const suffix of ['', '-wal', '-shm']) rmSync(dbPath + suffix, { force: true })
    },
  }
}

/** Creates an empty PostgreSQL database next to the one in `baseUrl`; `drop()` removes it. */
async function createPgTestDatabase(baseUrl: string): Promise<{ url: string; drop(): Promise<void> }> {
  const name = `fw_test_${process.pid}_${Date.now()}_${counter}`
  const admin = async (sql: string) => {
    const orm = await initOrm({ databasePath: ':memory:', databaseUrl: baseUrl })
    try {
      await orm.em.getConnection().execute(sql)
    } finally {
      await orm.close()
    }
  }
  await admin(`create database "${name}"`)
  const url = new URL(baseUrl)
  url.pathname = `/${name}`
  return { url: url.toString(), drop: () => admin(`drop database if exists "${name}" with (force)`) }
}
