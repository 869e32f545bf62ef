import { Migration } from '@mikro-orm/migrations';

export class Migration20261202030009 extends Migration {

  override async up(): Promise<void> {
    this.addSql(`create table \`audit_events\` (\`id\` integer not null primary key autoincrement, \`at\` datetime not null, \`actor_id\` integer null, \`actor_email\` text null, \`action\` text not null, \`entity_type\` text not null, \`entity_id\` text not null, \`detail\` json null);`);
    this.addSql(`create index \`audit_events_at_index\` on \`audit_events\` (\`at\`);`);
    this.addSql(`create index \`audit_events_entity_type_entity_id_index\` on \`audit_events\` (\`entity_type\`, \`entity_id\`);`);

    this.addSql(`create table \`customers\` (\`id\` integer not null primary key autoincrement, \`code\` text not null, \`company\` text not null, \`contact_name\` text not null, \`contact_email\` text not null, \`phone\` text not null default '', \`billing_address\` text not null default '', \`payment_provider_id\` text null, \`created_at\` datetime not null, \`updated_at\` datetime not null);`);
    this.addSql(`create unique index \`customers_code_unique\` on \`customers\` (\`code\`);`);

    this.addSql(`create table \`cylinders\` (\`id\` integer not null primary key autoincrement, \`serial\` text not null, \`barcode\` text not null, \`water_volume_l\` double precision not null, \`service_pressure_bar\` double precision not null, \`test_pressure_bar\` double precision not null, \`material\` text check (\`material\` in ('steel', 'aluminium', 'composite')) not null, \`valve_outlet\` text not null, \`oxygen_clean\` integer not null default false, \`owner_id\` integer null, \`last_test_date\` text not null, \`next_test_date\` text not null, \`status\` text check (\`status\` in ('available', 'reserved', 'filling', 'awaiting-analysis', 'full', 'shipped', 'quarantine', 'retired')) not null default 'available', \`residual\` json not null, \`notes\` text not null default '', \`version\` integer not null default 1, \`created_at\` datetime not null, \`updated_at\` datetime not null, constraint \`cylinders_owner_id_foreign\` foreign key(\`owner_id\`) references \`customers\`(\`id\`) on delete set null on update cascade);`);
    this.addSql(`create unique index \`cylinders_serial_unique\` on \`cylinders\` (\`serial\`);`);
    this.addSql(`create unique index \`cylinders_barcode_unique\` on \`cylinders\` (\`barcode\`);`);
    this.addSql(`create index \`cylinders_owner_id_index\` on \`cylinders\` (\`owner_id\`);`);
    this.addSql(`create index \`cylinders_next_test_date_index\` on \`cylinders\` (\`next_test_date\`);`);

    this.addSql(`create table \`orders\` (\`id\` integer not null primary key autoincrement, \`number\` text not null, \`customer_id\` integer not null, \`status\` text check (\`status\` in ('draft', 'quoted', 'accepted', 'planned', 'filling', 'analysis', 'released', 'shipped', 'invoiced', 'paid', 'cancelled')) not null default 'draft', \`reference\` text not null default '', \`needed_by\` text null, \`currency\` text not null default 'EUR', \`total_minor\` integer not null default 0, \`quote_valid_until\` text null, \`rental_days\` integer not null default 30, \`quote_sent_at\` datetime null, \`accepted_at\` datetime null, \`notes\` text not null default '', \`search_text\` text not null default '', \`created_by_id\` integer null, \`version\` integer not null default 1, \`created_at\` datetime not null, \`updated_at\` datetime not null, constraint \`orders_customer_id_foreign\` foreign key(\`customer_id\`) references \`customers\`(\`id\`) on update cascade);`);
    this.addSql(`create unique index \`orders_number_unique\` on \`orders\` (\`number\`);`);
    this.addSql(`create index \`orders_customer_id_index\` on \`orders\` (\`customer_id\`);`);
    this.addSql(`create index \`orders_created_at_id_index\` on \`orders\` (\`created_at\`, \`id\`);`);
    this.addSql(`create index \`orders_status_created_at_id_index\` on \`orders\` (\`status\`, \`created_at\`, \`id\`);`);
    this.addSql(`create index \`orders_customer_id_created_at_id_index\` on \`orders\` (\`customer_id\`, \`created_at\`, \`id\`);`);
    this.addSql(`create index \`orders_needed_by_id_index\` on \`orders\` (\`needed_by\`, \`id\`);`);
    this.addSql(`create index \`orders_total_minor_id_index\` on \`orders\` (\`total_minor\`, \`id\`);`);

    this.addSql(`create table \`invoices\` (\`id\` integer not null primary key autoincrement, \`order_id\` integer not null, \`customer_id\` integer not null, \`provider_invoice_id\` text not null, \`number\` text null, \`status\` text check (\`status\` in ('draft', 'open', 'paid', 'void', 'uncollectible')) not null default 'draft', \`amount_minor\` integer not null, \`currency\` text not null, \`hosted_url\` text null, \`paid_at\` datetime null, \`created_at\` datetime not null, \`updated_at\` datetime not null, constraint \`invoices_order_id_foreign\` foreign key(\`order_id\`) references \`orders\`(\`id\`) on update cascade);`);
    this.addSql(`create index \`invoices_order_id_index\` on \`invoices\` (\`order_id\`);`);
    this.addSql(`create unique index \`invoices_order_id_unique\` on \`invoices\` (\`order_id\`);`);
    this.addSql(`create index \`invoices_customer_id_index\` on \`invoices\` (\`customer_id\`);`);
    this.addSql(`create unique index \`invoices_provider_invoice_id_unique\` on \`invoices\` (\`provider_invoice_id\`);`);

    this.addSql(`create table \`order_lines\` (\`id\` integer not null primary key autoincrement, \`order_id\` integer not null, \`line_no\` integer not null, \`description\` text not null, \`components\` json not null, \`balance_gas\` text not null, \`blend_tolerance_pct\` double precision not null, \`certification_uncertainty_pct\` double precision not null, \`water_volume_l\` double precision not null, \`valve_outlet\` text not null, \`quantity\` integer not null, \`final_pressure_bar_gauge\` double precision not null, \`method\` text check (\`method\` in ('partial-pressure', 'gravimetric')) not null default 'partial-pressure', \`price_minor\` integer not null default 0, \`pricing\` json null, constraint \`order_lines_order_id_foreign\` foreign key(\`order_id\`) references \`orders\`(\`id\`) on update cascade);`);
    this.addSql(`create index \`order_lines_order_id_index\` on \`order_lines\` (\`order_id\`);`);

    this.addSql(`create table \`fill_plans\` (\`id\` integer not null primary key autoincrement, \`order_line_id\` integer not null, \`cylinder_id\` integer null, \`plan_version\` integer not null, \`status\` text check (\`status\` in ('draft', 'approved', 'superseded')) not null default 'draft', \`model\` text not null, \`method\` text not null, \`request\` json not null, \`result\` json not null, \`blocking\` integer not null default false, \`created_by_id\` integer null, \`approved_by_id\` integer null, \`approved_at\` datetime null, \`assigned_technician_id\` integer null, \`version\` integer not null default 1, \`created_at\` datetime not null, constraint \`fill_plans_order_line_id_foreign\` foreign key(\`order_line_id\`) references \`order_lines\`(\`id\`) on update cascade, constraint \`fill_plans_cylinder_id_foreign\` foreign key(\`cylinder_id\`) references \`cylinders\`(\`id\`) on delete set null on update cascade);`);
    this.addSql(`create index \`fill_plans_order_line_id_index\` on \`fill_plans\` (\`order_line_id\`);`);
    this.addSql(`create index \`fill_plans_cylinder_id_index\` on \`fill_plans\` (\`cylinder_id\`);`);
    this.addSql(`create index \`fill_plans_order_line_id_plan_version_index\` on \`fill_plans\` (\`order_line_id\`, \`plan_version\`);`);

    this.addSql(`create table \`fill_runs\` (\`id\` integer not null primary key autoincrement, \`plan_id\` integer not null, \`cylinder_id\` integer not null, \`technician_id\` integer null, \`scheduled_for\` text not null, \`status\` text check (\`status\` in ('ready', 'in-progress', 'paused', 'completed', 'aborted')) not null default 'ready', \`current_step\` integer not null default 0, \`targets\` json not null, \`replan_count\` integer not null default 0, \`started_at\` datetime null, \`completed_at\` datetime null, \`notes\` text not null default '', \`version\` integer not null default 1, \`created_at\` datetime not null, \`updated_at\` datetime not null, constraint \`fill_runs_plan_id_foreign\` foreign key(\`plan_id\`) references \`fill_plans\`(\`id\`) on update cascade, constraint \`fill_runs_cylinder_id_foreign\` foreign key(\`cylinder_id\`) references \`cylinders\`(\`id\`) on update cascade);`);
    this.addSql(`create index \`fill_runs_plan_id_index\` on \`fill_runs\` (\`plan_id\`);`);
    this.addSql(`create index \`fill_runs_cylinder_id_index\` on \`fill_runs\` (\`cylinder_id\`);`);
    this.addSql(`create index \`fill_runs_scheduled_for_index\` on \`fill_runs\` (\`scheduled_for\`);`);
    this.addSql(`create index \`fill_runs_technician_id_status_index\` on \`fill_runs\` (\`technician_id\`, \`status\`);`);

    this.addSql(`create table \`fill_readings\` (\`id\` integer not null primary key autoincrement, \`run_id\` integer not null, \`step_index\` integer not null, \`gas\` text not null, \`pressure_bar_abs\` double precision null, \`pressure_bar_gauge\` double precision null, \`temperature_c\` double precision null, \`scale_kg\` double precision null, \`outcome\` text check (\`outcome\` in ('on-target', 'under', 'over')) not null, \`supersedes\` integer null, \`recorded_by_id\` integer not null, \`client_request_id\` text null, \`recorded_at\` datetime not null, constraint \`fill_readings_run_id_foreign\` foreign key(\`run_id\`) references \`fill_runs\`(\`id\`) on update cascade);`);
    this.addSql(`create index \`fill_readings_run_id_index\` on \`fill_readings\` (\`run_id\`);`);
    this.addSql(`create unique index \`fill_readings_client_request_id_unique\` on \`fill_readings\` (\`client_request_id\`);`);
    this.addSql(`create index \`fill_readings_run_id_step_index_index\` on \`fill_readings\` (\`run_id\`, \`step_index\`);`);

    this.addSql(`create table \`analyses\` (\`id\` integer not null primary key autoincrement, \`run_id\` integer not null, \`results\` json not null, \`verdict\` text check (\`verdict\` in ('pending', 'within-tolerance', 'out-of-tolerance', 'rejected', 'released')) not null default 'pending', \`reject_reason\` text null, \`report_stored_name\` text null, \`report_original_name\` text null, \`report_content_type\` text null, \`report_size_bytes\` integer null, \`analysed_by_id\` integer null, \`analysed_at\` datetime null, \`version\` integer not null default 1, \`created_at\` datetime not null, constraint \`analyses_run_id_foreign\` foreign key(\`run_id\`) references \`fill_runs\`(\`id\`) on update cascade);`);
    this.addSql(`create index \`analyses_run_id_index\` on \`analyses\` (\`run_id\`);`);
    this.addSql(`create unique index \`analyses_run_id_unique\` on \`analyses\` (\`run_id\`);`);

    this.addSql(`create table \`certificates\` (\`id\` integer not null primary key autoincrement, \`number\` text not null, \`revision\` integer not null, \`replaces_id\` integer null, \`order_line_id\` integer not null, \`cylinder_id\` integer not null, \`analysis_id\` integer not null, \`customer_id\` integer not null, \`content\` json not null, \`signatory_id\` integer not null, \`signatory_name\` text not null, \`released_at\` datetime not null, \`valid_until\` text not null, \`correction_reason\` text null, constraint \`certificates_order_line_id_foreign\` foreign key(\`order_line_id\`) references \`order_lines\`(\`id\`) on update cascade, constraint \`certificates_cylinder_id_foreign\` foreign key(\`cylinder_id\`) references \`cylinders\`(\`id\`) on update cascade, constraint \`certificates_analysis_id_foreign\` foreign key(\`analysis_id\`) references \`analyses\`(\`id\`) on update cascade);`);
    this.addSql(`create index \`certificates_order_line_id_index\` on \`certificates\` (\`order_line_id\`);`);
    this.addSql(`create index \`certificates_cylinder_id_index\` on \`certificates\` (\`cylinder_id\`);`);
    this.addSql(`create index \`certificates_analysis_id_index\` on \`certificates\` (\`analysis_id\`);`);
    this.addSql(`create index \`certificates_customer_id_index\` on \`certificates\` (\`customer_id\`);`);
    this.addSql(`create unique index \`certificates_number_revision_unique\` on \`certificates\` (\`number\`, \`revision\`);`);

    this.addSql(`create table \`price_entries\` (\`id\` integer not null primary key autoincrement, \`kind\` text check (\`kind\` in ('gas', 'rental', 'certification', 'surcharge')) not null, \`key\` text not null, \`label\` text not null, \`unit\` text check (\`unit\` in ('m3-15C', 'kg', 'day', 'cylinder')) not null, \`price_minor\` integer not null, \`currency\` text not null default 'EUR', \`updated_at\` datetime not null);`);
    this.addSql(`create unique index \`price_entries_kind_key_unique\` on \`price_entries\` (\`kind\`, \`key\`);`);

    this.addSql(`create table \`sessions\` (\`sid\` text not null, \`data\` text not null, \`expires_at\` bigint not null, primary key (\`sid\`));`);
    this.addSql(`create index \`sessions_expires_at_index\` on \`sessions\` (\`expires_at\`);`);

    this.addSql(`create table \`users\` (\`id\` integer not null primary key autoincrement, \`email\` text not null, \`name\` text not null, \`password_hash\` text not null, \`roles\` json not null, \`active\` integer not null default true, \`customer_id\` integer null, \`created_at\` datetime not null, \`updated_at\` datetime not null, constraint \`users_customer_id_foreign\` foreign key(\`customer_id\`) references \`customers\`(\`id\`) on delete set null on update cascade);`);
    this.addSql(`create unique index \`users_email_unique\` on \`users\` (\`email\`);`);
    this.addSql(`create index \`users_customer_id_index\` on \`users\` (\`customer_id\`);`);

    this.addSql(`create table \`webhook_events\` (\`id\` text not null, \`type\` text not null, \`received_at\` datetime not null, primary key (\`id\`));`);
  }

}
