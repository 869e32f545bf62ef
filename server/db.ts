import { mkdirSync } from 'node:fs'
import { dirname, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import type { Options } from '@mikro-orm/core'
import { MikroORM } from '@mikro-orm/core'
import { BetterSqliteDriver } from '@mikro-orm/better-sqlite'
import { Migrator } from '@mikro-orm/migrations'
import { entities } from './entities.ts'

const here = dirname(fileURLToPath(import.meta.url))

export interface DbSettings {
  /** SQLite file; ':memory:' for tests that need no file */
  databasePath: string
  /** PostgreSQL URL; when set, PostgreSQL is used instead of SQLite */
  databaseUrl?: string
  debug?: boolean
}

/** MikroORM options for SQLite (default) or PostgreSQL (DATABASE_URL). Shared by the app and the CLI. */
export async function ormOptions(settings: DbSettings): Promise<Options> {
  const common = {
    entities,
    debug: settings.debug ?? false,
    allowGlobalContext: false,
    forceUndefined: false,
    extensions: [Migrator],
    discovery: { warnWhenNoEntities: true },
  } satisfies Partial<Options>
  if (settings.databaseUrl) {
    const { PostgreSqlDriver } = await import('@mikro-orm/postgresql')
    return {
      ...common,
      driver: PostgreSqlDriver,
      clientUrl: settings.databaseUrl,
      migrations: {
        path: resolve(here, 'migrations-pg'),
        pathTs: resolve(here, 'migrations-pg'),
        glob: '!(*.d).{js,ts}',
        silent: true,
        transactional: true,
        snapshot: true,
        snapshotName: '.snapshot',
        emit: 'ts',
      },
    } as Options
  }
  if (settings.databasePath !== ':memory:') mkdirSync(dirname(resolve(settings.databasePath)), { recursive: true })
  return {
    ...common,
    driver: BetterSqliteDriver,
    dbName: settings.databasePath,
    migrations: {
      path: resolve(here, 'migrations'),
      pathTs: resolve(here, 'migrations'),
      glob: '!(*.d).{js,ts}',
      silent: true,
      transactional: true,
      snapshot: true,
      snapshotName: '.snapshot',
      emit: 'ts',
    },
  } as Options
}

/** Opens the ORM; SQLite gets WAL journalling, foreign keys, a busy timeout and immediate transactions. */
export async function initOrm(settings: DbSettings): Promise<MikroORM> {
  const orm = await MikroORM.init(await ormOptions(settings))
  if (!settings.databaseUrl) {
    const conn = orm.em.getConnection()
    if (settings.databasePath !== ':memory:') await conn.execute('pragma journal_mode = WAL')
    await conn.execute('pragma foreign_keys = ON')
    await conn.execute('pragma busy_timeout = 5000')
    await conn.execute('pragma synchronous = NORMAL')
    beginImmediate(orm)
  }
  return orm
}

interface KnexTransactionLike {
  begin(conn: unknown): unknown
  query(conn: unknown, sql: string): unknown
}

/**
 * SQLite transactions take the write lock when they begin (BEGIN IMMEDIATE) instead of at their first
 * write. A deferred transaction that reads and then writes fails at once with "database is locked" when
 * another connection wrote in between — SQLite cannot wait there — which several app processes
 * (WEB_CONCURRENCY > 1), or the app and a CLI, writing to one file turn into 500s. BEGIN IMMEDIATE
 * waits for the lock up to busy_timeout instead. (knex begins SQLite transactions with a plain BEGIN.)
 */
function beginImmediate(orm: MikroORM): void {
  const client = (orm.em.getConnection() as unknown as { getKnex(): { client: { transaction(...args: unknown[]): KnexTransactionLike } } }).getKnex().client
  const create = client.transaction.bind(client)
  client.transaction = (...args: unknown[]) => {
    const trx = create(...args)
    // begin() runs after the pool hands over the connection, so replacing it here is in time
    trx.begin = (conn: unknown) => trx.query(conn, 'BEGIN IMMEDIATE;')
    return trx
  }
}

export async function migrateUp(orm: MikroORM): Promise<void> {
  await orm.getMigrator().up()
}
