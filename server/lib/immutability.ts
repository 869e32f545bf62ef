import type { MikroORM } from '@mikro-orm/core'

/**
 * Records that are evidence never change: recorded readings and released certificates. Besides the
 * services never updating them, the database itself refuses UPDATE and DELETE on those tables.
 * SQLite triggers here; the same statements are in the migrations.
 */
export const SQLITE_IMMUTABILITY_TRIGGERS = [
  `create trigger if not exists fill_readings_no_update before update on fill_readings begin select raise(abort, 'recorded readings are immutable'); end`,
  `create trigger if not exists fill_readings_no_delete before delete on fill_readings begin select raise(abort, 'recorded readings are immutable'); end`,
  `create trigger if not exists certificates_no_update before update on certificates begin select raise(abort, 'released certificates are immutable'); end`,
  `create trigger if not exists certificates_no_delete before delete on certificates begin select raise(abort, 'released certificates are immutable'); end`,
]

export const POSTGRES_IMMUTABILITY_TRIGGERS = [
  `create or replace function fillwright_refuse_change() returns trigger as $$ begin raise exception '% rows are immutable', TG_TABLE_NAME; end; $$ language plpgsql`,
  `drop trigger if exists fill_readings_immutable on fill_readings`,
  `create trigger fill_readings_immutable before update or delete on fill_readings for each row execute function fillwright_refuse_change()`,
  `drop trigger if exists certificates_immutable on certificates`,
  `create trigger certificates_immutable before update or delete on certificates for each row execute function fillwright_refuse_change()`,
]

/** Used by tests after creating the schema from the entities. */
export async function applyImmutabilityTriggers(orm: MikroORM, postgres = false): Promise<void> {
  const conn = orm.em.getConnection()
  for (const sql of postgres ? POSTGRES_IMMUTABILITY_TRIGGERS : SQLITE_IMMUTABILITY_TRIGGERS) await conn.execute(sql)
}
