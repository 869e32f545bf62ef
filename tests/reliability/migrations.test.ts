import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import type { MikroORM } from '@mikro-orm/core'
import { initOrm, migrateUp } from '#server/db.ts'
import { removeDir, tempDir } from '../../scripts/lib/server-process.ts'

/**
 * The committed migrations build the schema the entities describe: after `migration:up` on an empty
 * database, the schema diff against server/entities.ts is empty, and the immutability triggers exist. The server runs these migrations at
 * start (the tests elsewhere create the schema from the entities), so a stale migration would break
 * `npm start` on a fresh machine. Fix: `npm run migration:create` (and with DATABASE_URL for
 * server/migrations-pg), review, commit.
 */

async function sqliteStructure(orm: MikroORM): Promise<Record<string, unknown>> {
  const conn = orm.em.getConnection()
  const q = async <T>(sql: string): Promise<T[]> => (await conn.execute(sql)) as T[]
  const tables = await q<{ name: string }>(
    `select name from sqlite_master where type = 'table' and name not like 'sqlite_%' and name <> 'mikro_orm_migrations' order by name`,
  )
  const out: Record<string, unknown> = {}
  for (const { name } of tables) {
    const columns = (await q<{ name: string; type: string; notnull: number; dflt_value: unknown; pk: number }>(`pragma table_xinfo("${name}")`)).map(
      (c) =>
        `${c.name} ${c.type.toLowerCase()}${c.notnull ? ' not null' : ''}${c.pk ? ' pk' : ''}${c.dflt_value != null ? ` default ${String(c.dflt_value)}` : ''}`,
    )
    const indexes: string[] = []
    for (const ix of await q<{ name: string; unique: number }>(`pragma index_list("${name}")`)) {
      const cols = (await q<{ name: string }>(`pragma index_info("${ix.name}")`)).map((c) => c.name)
      indexes.push(`${ix.unique ? 'unique ' : ''}(${cols.join(', ')})`)
    }
    const fks = (await q<{ from: string; table: string; to: string; on_delete: string }>(`pragma foreign_key_list("${name}")`)).map(
      (f) => `${f.from} → ${f.table}.${f.to} on delete ${f.on_delete}`,
    )
    out[name] = { columns, indexes: indexes.sort(), foreignKeys: fks.sort() }
  }
  return out
}

const cleanups: (() => Promise<void> | void)[] = []
afterAll(async () => {
  for (const c of cleanups.reverse()) await c()
})

describe('committed migrations match the entities', () => {
  it('SQLite (server/migrations): same tables, columns, indexes and foreign keys as the entities', async () => {
    // MikroORM's SQLite schema diff reports every table with an enum CHECK as changed even when it is
    // not, so the two schemas are compared structurally instead (pragma table_xinfo, index_list,
    // index_info, foreign_key_list)
    const dir = tempDir('migr')
    cleanups.push(() => removeDir(dir))
    const migrated = await initOrm({ databasePath: join(dir, 'migrated.sqlite') })
    cleanups.push(() => migrated.close())
    await migrateUp(migrated)
    const fromEntities = await initOrm({ databasePath: join(dir, 'entities.sqlite') })
    cleanups.push(() => fromEntities.close())
    await fromEntities.schema.createSchema()
    const a = await sqliteStructure(migrated)
    const b = await sqliteStructure(fromEntities)
    expect(Object.keys(b).length).toBeGreaterThan(5)
    expect(a, 'schema built by the committed migrations').toEqual(b)
    // the migrations themselves install the immutability triggers (the server also does at start)
    const triggers = (await migrated.em.getConnection().execute(`select name from sqlite_master where type = 'trigger' order by name`)) as { name: string }[]
    expect(triggers.map((t) => t.name)).toEqual(['certificates_no_delete', 'certificates_no_update', 'fill_readings_no_delete', 'fill_readings_no_update'])
  })

  it.runIf(Boolean(process.env.TEST_DATABASE_URL))('PostgreSQL (server/migrations-pg)', async () => {
    const base = process.env.TEST_DATABASE_URL as string
    const name = `fw_migr_${process.pid}_${Date.now()}`
    const admin = async (sql: string) => {
      const o = await initOrm({ databasePath: ':memory:', databaseUrl: base })
      await o.em.getConnection().execute(sql)
      await o.close()
    }
    await admin(`create database "${name}"`)
    cleanups.push(() => admin(`drop database if exists "${name}" with (force)`))
    const url = new URL(base)
    url.pathname = `/${name}`
    const orm = await initOrm({ databasePath: ':memory:', databaseUrl: url.toString() })
    cleanups.push(() => orm.close())
    await migrateUp(orm)
    const diff = (await orm.schema.getUpdateSchemaSQL({ wrap: false })).trim()
    expect(diff, 'schema changes the migrations do not make').toBe('')
    const triggers = (await orm.em.getConnection().execute(`select tgname from pg_trigger where not tgisinternal order by tgname`)) as { tgname: string }[]
    expect(triggers.map((t) => t.tgname)).toEqual(['certificates_immutable', 'fill_readings_immutable'])
  })
})
