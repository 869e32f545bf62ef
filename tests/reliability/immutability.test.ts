import { join } from 'node:path'
import type { EntityManager, EntityMetadata, MikroORM } from '@mikro-orm/core'
import { pino } from 'pino'
import { afterAll, describe, expect, it } from 'vitest'
import { type DbSettings, initOrm } from '#server/db.ts'
import { loadEnv } from '#server/env.ts'
import { prepareDatabase } from '#server/start.ts'
import { prepareSchemaFromEntities, removeDir, tempDir } from '../../scripts/lib/server-process.ts'

/**
 * Recorded readings and released certificates are evidence: the database itself refuses UPDATE and
 * DELETE on fill_readings and certificates, whatever code (or person with a SQL prompt) tries it. The
 * database is prepared the way the server starts (server/start.ts prepareDatabase: migrations, then the
 * immutability triggers, then the seed), so the test proves the start-up path installs the triggers.
 * With TEST_DATABASE_URL the same runs on PostgreSQL.
 */

const cleanups: (() => Promise<void> | void)[] = []
afterAll(async () => {
  for (const c of cleanups.reverse()) await c()
})

let seq = 0
/** A minimal valid row of an entity, with minimal parent rows for its required references. */
async function minimalRow(em: EntityManager, meta: EntityMetadata, depth = 0): Promise<object> {
  if (depth > 8) throw new Error(`reference chain too deep at ${meta.className}`)
  const data: Record<string, unknown> = {}
  for (const prop of meta.props) {
    if (prop.primary && prop.autoincrement) continue
    if (prop.version || prop.onCreate || prop.default !== undefined || prop.defaultRaw !== undefined || prop.nullable) continue
    if (prop.kind === 'm:1' || (prop.kind === '1:1' && prop.owner)) {
      data[prop.name] = await minimalRow(em, em.getMetadata().get(prop.type), depth + 1)
      continue
    }
    if (prop.kind !== 'scalar') continue
    seq++
    if (prop.enum && prop.items?.length) data[prop.name] = prop.items[0]
    else {
      switch (String(prop.runtimeType).toLowerCase()) {
        case 'string':
          data[prop.name] = `r${seq}`.slice(0, prop.length ?? 64)
          break
        case 'number':
        case 'bigint':
          data[prop.name] = seq
          break
        case 'boolean':
          data[prop.name] = false
          break
        case 'date':
          data[prop.name] = new Date()
          break
        default:
          data[prop.name] = {}
      }
    }
  }
  const entity = em.create(meta.class ?? meta.className, data as never)
  await em.flush()
  return entity
}

async function checkImmutable(orm: MikroORM) {
  const em = orm.em.fork()
  const conn = em.getConnection()
  const results: Record<string, { updateRefused: boolean; deleteRefused: boolean }> = {}
  for (const entityName of ['FillReading', 'Certificate']) {
    const meta = orm.getMetadata().get(entityName)
    const table = meta.tableName
    const row = (await minimalRow(em, meta)) as { id: number }
    expect(row.id).toBeGreaterThan(0)
    const [count0] = await conn.execute<{ n: number | string }[]>(`select count(*) as n from ${table}`)
    const scalar = meta.props.find((p) => p.kind === 'scalar' && !p.primary && (p.runtimeType === 'number' || p.runtimeType === 'string') && p.fieldNames?.[0])!
    let updateRefused = false
    let deleteRefused = false
    try {
      await conn.execute(`update ${table} set ${scalar.fieldNames[0]} = ${scalar.runtimeType === 'number' ? '99' : `'changed'`} where id = ?`, [row.id])
    } catch (e) {
      updateRefused = /immutable/i.test(String((e as Error).message))
    }
    try {
      await conn.execute(`delete from ${table} where id = ?`, [row.id])
    } catch (e) {
      deleteRefused = /immutable/i.test(String((e as Error).message))
    }
    try {
      await conn.execute(`delete from ${table}`)
    } catch {
      // refused as well: checked by the count below
    }
    const [count1] = await conn.execute<{ n: number | string }[]>(`select count(*) as n from ${table}`)
    if (updateRefused && deleteRefused) expect(Number(count1?.n), `${table} rows after delete attempts`).toBe(Number(count0?.n))
    results[table] = { updateRefused, deleteRefused }
  }
  return results
}

function envFor(settings: DbSettings) {
  return loadEnv({
    DATABASE_PATH: settings.databasePath,
    DATABASE_URL: settings.databaseUrl ?? '',
    SEED_DEMO: 'true',
    DEMO_PASSWORD: 'immutability-pw',
    LOG_LEVEL: 'silent',
  })
}

describe('immutability of evidence (database triggers installed at start-up)', () => {
  it('SQLite: UPDATE and DELETE on fill_readings and certificates fail; INSERT works (row created through the ORM)', async () => {
    const dir = tempDir('immut')
    cleanups.push(() => removeDir(dir))
    const settings = { databasePath: join(dir, 'db.sqlite') }
    await prepareSchemaFromEntities(settings)
    await prepareDatabase(envFor(settings), pino({ level: 'silent' }))
    const orm = await initOrm(settings)
    cleanups.push(() => orm.close())
    const triggers: { name: string }[] = await orm.em.getConnection().execute(`select name from sqlite_master where type = 'trigger' order by name`)
    expect(triggers.map((t) => t.name)).toEqual(
      expect.arrayContaining(['certificates_no_delete', 'certificates_no_update', 'fill_readings_no_delete', 'fill_readings_no_update']),
    )
    const r = await checkImmutable(orm)
    expect(r).toEqual({
      fill_readings: { updateRefused: true, deleteRefused: true },
      certificates: { updateRefused: true, deleteRefused: true },
    })
  })

  it('control: without the start-up step the same statements go through (so the check above can fail)', async () => {
    const dir = tempDir('immut-control')
    cleanups.push(() => removeDir(dir))
    const settings = { databasePath: join(dir, 'db.sqlite') }
    await prepareSchemaFromEntities(settings)
    const orm = await initOrm(settings)
    cleanups.push(() => orm.close())
    expect(await checkImmutable(orm)).toEqual({
      fill_readings: { updateRefused: false, deleteRefused: false },
      certificates: { updateRefused: false, deleteRefused: false },
    })
  })

  it.runIf(Boolean(process.env.TEST_DATABASE_URL))(
    'PostgreSQL: UPDATE and DELETE on fill_readings and certificates fail; INSERT works (row created through the ORM)',
    async () => {
      const base = process.env.TEST_DATABASE_URL as string
      const name = `fw_immut_${process.pid}_${Date.now()}`
      const admin = async (sql: string) => {
        const o = await initOrm({ databasePath: ':memory:', databaseUrl: base })
        await o.em.getConnection().execute(sql)
        await o.close()
      }
      await admin(`create database "${name}"`)
      cleanups.push(() => admin(`drop database if exists "${name}" with (force)`))
      const url = new URL(base)
      url.pathname = `/${name}`
      const settings = { databasePath: ':memory:', databaseUrl: url.toString() }
      await prepareSchemaFromEntities(settings)
      await prepareDatabase(envFor(settings), pino({ level: 'silent' }))
      const orm = await initOrm(settings)
      cleanups.push(() => orm.close())
      const r = await checkImmutable(orm)
      expect(r).toEqual({
        fill_readings: { updateRefused: true, deleteRefused: true },
        certificates: { updateRefused: true, deleteRefused: true },
      })
    },
  )
})
