import { Migration } from '@mikro-orm/migrations'

/**
 * Recorded readings and released certificates are evidence: the database refuses UPDATE and DELETE on
 * them (hand-written; the same statements as server/lib/immutability.ts, which tests apply after
 * creating the schema from the entities).
 */
export class Migration20261202030100 extends Migration {
  override async up(): Promise<void> {
    this.addSql(`create trigger if not exists fill_readings_no_update before update on fill_readings begin select raise(abort, 'recorded readings are immutable'); end`)
    this.addSql(`create trigger if not exists fill_readings_no_delete before delete on fill_readings begin select raise(abort, 'recorded readings are immutable'); end`)
    this.addSql(`create trigger if not exists certificates_no_update before update on certificates begin select raise(abort, 'released certificates are immutable'); end`)
    this.addSql(`create trigger if not exists certificates_no_delete before delete on certificates begin select raise(abort, 'released certificates are immutable'); end`)
  }

  override async down(): Promise<void> {
    for (const t of ['fill_readings_no_update', 'fill_readings_no_delete', 'certificates_no_update', 'certificates_no_delete']) this.addSql(`drop trigger if exists ${t}`)
  }
}
