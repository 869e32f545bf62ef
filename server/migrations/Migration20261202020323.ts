import { Migration } from '@mikro-orm/migrations';

export class Migration20261202020323 extends Migration {

  override async up(): Promise<void> {
    this.addSql(`create table \`audit_events\` (\`id\` integer not null primary key autoincrement, \`at\` datetime not null, \`actor_id\` integer null, \`actor_email\` text null, \`action\` text not null, \`entity_type\` text not null, \`entity_id\` text not null, \`detail\` json null);`);
    this.addSql(`create index \`audit_events_at_index\` on \`audit_events\` (\`at\`);`);
    this.addSql(`create index \`audit_events_entity_type_entity_id_index\` on \`audit_events\` (\`entity_type\`, \`entity_id\`);`);

    this.addSql(`create table \`customers\` (\`id\` integer not null primary key autoincrement, \`code\` text not null, \`company\` text not null, \`contact_name\` text not null, \`contact_email\` text not null, \`phone\` text not null default '', \`billing_address\` text not null default '', \`payment_provider_id\` text null, \`created_at\` datetime not null, \`updated_at\` datetime not null);`);
    this.addSql(`create unique index \`customers_code_unique\` on \`customers\` (\`code\`);`);

    this.addSql(`create table \`cylinders\` (\`id\` integer not null primary key autoincrement, \`serial\` text not null, \`barcode\` text not null, \`water_volume_l\` real not null, \`service_pressure_bar\` real not null, \`test_pressure_bar\` real not null, \`material\` text check (\`material\` in ('steel', 'aluminium', 'composite')) not null, \`valve_outlet\` text not null, \`oxygen_clean\` integer not null default false, \`owner_id\` integer null, \`last_test_date\` text not null, \`next_test_date\` text not null, \`status\` text check (\`status\` in ('available', 'reserved', 'filling', 'awaiting-analysis', 'full', 'shipped', 'quarantine', 'retired')) not null default 'available', \`residual\` json not null, \`notes\` text not null default '', \`version\` integer not null default 1, \`created_at\` datetime not null, \`updated_at\` datetime not null, constraint \`cylinders_owner_id_foreign\` foreign key(\`owner_id\`) references \`customers\`(\`id\`) on delete set null on update cascade);`);
    this.addSql(`create unique index \`cylinders_serial_unique\` on \`cylinders\` (\`serial\`);`);
    this.addSql(`create unique index \`cylinders_barcode_unique\` on \`cylinders\` (\`barcode\`);`);
    this.addSql(`create index \`cylinders_owner_id_index\` on \`cylinders\` (\`owner_id\`);`);
    this.addSql(`create index \`cylinders_next_test_date_index\` on \`cylinders\` (\`next_test_date\`);`);

    this.addSql(`create table \`sessions\` (\`sid\` text not null, \`data\` text not null, \`expires_at\` bigint not null, primary key (\`sid\`));`);
    this.addSql(`create index \`sessions_expires_at_index\` on \`sessions\` (\`expires_at\`);`);

    this.addSql(`create table \`users\` (\`id\` integer not null primary key autoincrement, \`email\` text not null, \`name\` text not null, \`password_hash\` text not null, \`roles\` json not null, \`active\` integer not null default true, \`customer_id\` integer null, \`created_at\` datetime not null, \`updated_at\` datetime not null, constraint \`users_customer_id_foreign\` foreign key(\`customer_id\`) references \`customers\`(\`id\`) on delete set null on update cascade);`);
    this.addSql(`create unique index \`users_email_unique\` on \`users\` (\`email\`);`);
    this.addSql(`create index \`users_customer_id_index\` on \`users\` (\`customer_id\`);`);
  }

}
