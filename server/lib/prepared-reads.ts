import type { EntityManager } from '@mikro-orm/core'
import type { AbstractSqlConnection } from '@mikro-orm/knex'

/** A value bound to a `?` placeholder. */
export type SqlParam = string | number | boolean | null | Date

interface Statement {
  all(...params: unknown[]): unknown[]
  get(...params: unknown[]): unknown
}
interface SqliteConnection {
  prepare(sql: string): Statement
}
interface ConnectionPool {
  driverName?: string
  acquireConnection(): Promise<SqliteConnection>
  releaseConnection(connection: SqliteConnection): Promise<unknown>
}
/** Connection#executeQuery: times the query and writes it to the ORM's query log (protected in the typings). */
interface QueryLogging {
  executeQuery<T>(query: string, run: () => Promise<T>, context?: { query: string; params: unknown[] }): Promise<T>
}

/** Compiled statements per pooled SQLite connection, by SQL text. The callers' SQL has a bounded set of shapes. */
const statements = new WeakMap<SqliteConnection, Map<string, Statement>>()
/** Beyond this many shapes on one connection the cache starts again (a safety net, not a working set). */
const MAX_STATEMENTS = 500

function statementOf(connection: SqliteConnection, sql: string): Statement {
  let cache = statements.get(connection)
  if (!cache) {
    cache = new Map()
    statements.set(connection, cache)
  }
  let statement = cache.get(sql)
  if (!statement) {
    if (cache.size >= MAX_STATEMENTS) cache.clear()
    statement = connection.prepare(sql)
    cache.set(sql, statement)
  }
  return statement
}

/** better-sqlite3 binds numbers, strings and null: dates as epoch milliseconds (how the ORM stores datetimes in SQLite). */
const bindable = (v: SqlParam) => (v instanceof Date ? v.getTime() : typeof v === 'boolean' ? Number(v) : v)

async function read(em: EntityManager, sql: string, params: readonly SqlParam[], one: boolean): Promise<unknown> {
  const connection = em.getConnection() as AbstractSqlConnection
  const transaction = em.getTransactionContext()
  const pool = connection.getKnex().client as unknown as ConnectionPool
  if (transaction || pool.driverName !== 'better-sqlite3') {
    const rows = (await connection.execute(sql, [...params], 'all', transaction)) as unknown[]
    return one ? rows[0] : rows
  }
  const text = em.config.get('onQuery')(sql, [...params])
  return (connection as unknown as QueryLogging).executeQuery(
    text,
    async () => {
      const db = await pool.acquireConnection()
      try {
        const statement = statementOf(db, text)
        const values = params.map(bindable)
        return one ? statement.get(...values) : statement.all(...values)
      } finally {
        await pool.releaseConnection(db)
      }
    },
    { query: text, params: [...params] },
  )
}

/**
 * Read-only SQL for hot paths (the orders table, the session and the signed-in user of every request), values always
 * as `?` parameters. On SQLite (better-sqlite3) the statement is compiled once per connection and kept, and runs on a
 * connection taken from the ORM's pool like any other query: it waits for a transaction in progress exactly as a query
 * through the ORM would, reads what is committed, passes through the ORM's `onQuery` hook and query log. Inside a
 * transaction, and on other databases (PostgreSQL), it runs through the ORM connection's `execute`. Nothing is cached
 * but the compiled statement.
 */
export function readRows<T>(em: EntityManager, sql: string, params: readonly SqlParam[]): Promise<T[]> {
  return read(em, sql, params, false) as Promise<T[]>
}

/** The first row of `readRows`, undefined when there is none. */
export function readRow<T>(em: EntityManager, sql: string, params: readonly SqlParam[]): Promise<T | undefined> {
  return read(em, sql, params, true) as Promise<T | undefined>
}
