import { Migration } from '@mikro-orm/migrations'

/**
 * Recorded readings and released certificates are evidence: the database refuses UPDATE and DELETE on
 * them (hand-written; the same statements as POSTGRES_IMMUTABILITY_TRIGGERS in server/lib/immutability.ts,
 * which the server also runs at every start).
 */
export class Migration20261202031600 extends Migration {
  override async up(): Promise<void> {
    this.addSql(
      `create or replace function fillwright_refuse_change() returns trigger as $$ begin raise exception '% rows are immutable', TG_TABLE_NAME; end; $$ language plpgsql`,
    )
    this.addSql(`drop trigger if exists fill_readings_immutable on fill_readings`)
    this.addSql(`create trigger fill_readings_immutable before update or delete on fill_readings for each row execute function fillwright_refuse_change()`)
    this.addSql(`drop trigger if exists certificates_immutable on certificates`)
    this.addSql(`create trigger certificates_immutable before update or delete on certificates for each row execute function fillwright_refuse_change()`)
  }

  override async down(): Promise<void> {
    this.addSql(`drop trigger if exists fill_readings_immutable on fill_readings`)
    this.addSql(`drop trigger if exists certificates_immutable on certificates`)
    this.addSql(`drop function if exists fillwright_refuse_change()`)
  }
}
