import { Migration } from '@mikro-orm/migrations';

export class Migration20261202031534 extends Migration {

  override async up(): Promise<void> {
    this.addSql(`create table "audit_events" ("id" serial primary key, "at" timestamptz not null, "actor_id" int null, "actor_email" varchar(254) null, "action" varchar(64) not null, "entity_type" varchar(64) not null, "entity_id" varchar(64) not null, "detail" jsonb null);`);
    this.addSql(`create index "audit_events_at_index" on "audit_events" ("at");`);
    this.addSql(`create index "audit_events_entity_type_entity_id_index" on "audit_events" ("entity_type", "entity_id");`);

    this.addSql(`create table "customers" ("id" serial primary key, "code" varchar(16) not null, "company" varchar(200) not null, "contact_name" varchar(200) not null, "contact_email" varchar(254) not null, "phone" varchar(64) not null default '', "billing_address" text not null default '', "payment_provider_id" varchar(64) null, "created_at" timestamptz not null, "updated_at" timestamptz not null);`);
    this.addSql(`alter table "customers" add constraint "customers_code_unique" unique ("code");`);

    this.addSql(`create table "cylinders" ("id" serial primary key, "serial" varchar(64) not null, "barcode" varchar(64) not null, "water_volume_l" double precision not null, "service_pressure_bar" double precision not null, "test_pressure_bar" double precision not null, "material" text check ("material" in ('steel', 'aluminium', 'composite')) not null, "valve_outlet" varchar(64) not null, "oxygen_clean" boolean not null default false, "owner_id" int null, "last_test_date" varchar(10) not null, "next_test_date" varchar(10) not null, "status" text check ("status" in ('available', 'reserved', 'filling', 'awaiting-analysis', 'full', 'shipped', 'quarantine', 'retired')) not null default 'available', "residual" jsonb not null, "notes" text not null default '', "version" int not null default 1, "created_at" timestamptz not null, "updated_at" timestamptz not null);`);
    this.addSql(`alter table "cylinders" add constraint "cylinders_serial_unique" unique ("serial");`);
    this.addSql(`alter table "cylinders" add constraint "cylinders_barcode_unique" unique ("barcode");`);
    this.addSql(`create index "cylinders_next_test_date_index" on "cylinders" ("next_test_date");`);

    this.addSql(`create table "orders" ("id" serial primary key, "number" varchar(32) not null, "customer_id" int not null, "status" text check ("status" in ('draft', 'quoted', 'accepted', 'planned', 'filling', 'analysis', 'released', 'shipped', 'invoiced', 'paid', 'cancelled')) not null default 'draft', "reference" varchar(120) not null default '', "needed_by" varchar(10) null, "currency" varchar(3) not null default 'EUR', "total_minor" int not null default 0, "quote_valid_until" varchar(10) null, "rental_days" int not null default 30, "quote_sent_at" timestamptz null, "accepted_at" timestamptz null, "notes" text not null default '', "search_text" text not null default '', "created_by_id" int null, "version" int not null default 1, "created_at" timestamptz not null, "updated_at" timestamptz not null);`);
    this.addSql(`alter table "orders" add constraint "orders_number_unique" unique ("number");`);
    this.addSql(`create index "orders_created_at_id_index" on "orders" ("created_at", "id");`);
    this.addSql(`create index "orders_status_created_at_id_index" on "orders" ("status", "created_at", "id");`);
    this.addSql(`create index "orders_customer_id_created_at_id_index" on "orders" ("customer_id", "created_at", "id");`);
    this.addSql(`create index "orders_needed_by_id_index" on "orders" ("needed_by", "id");`);
    this.addSql(`create index "orders_total_minor_id_index" on "orders" ("total_minor", "id");`);

    this.addSql(`create table "invoices" ("id" serial primary key, "order_id" int not null, "customer_id" int not null, "provider_invoice_id" varchar(64) not null, "number" varchar(64) null, "status" text check ("status" in ('draft', 'open', 'paid', 'void', 'uncollectible')) not null default 'draft', "amount_minor" int not null, "currency" varchar(3) not null, "hosted_url" text null, "paid_at" timestamptz null, "created_at" timestamptz not null, "updated_at" timestamptz not null);`);
    this.addSql(`alter table "invoices" add constraint "invoices_order_id_unique" unique ("order_id");`);
    this.addSql(`create index "invoices_customer_id_index" on "invoices" ("customer_id");`);
    this.addSql(`alter table "invoices" add constraint "invoices_provider_invoice_id_unique" unique ("provider_invoice_id");`);

    this.addSql(`create table "order_lines" ("id" serial primary key, "order_id" int not null, "line_no" int not null, "description" varchar(200) not null, "components" jsonb not null, "balance_gas" varchar(64) not null, "blend_tolerance_pct" double precision not null, "certification_uncertainty_pct" double precision not null, "water_volume_l" double precision not null, "valve_outlet" varchar(64) not null, "quantity" int not null, "final_pressure_bar_gauge" double precision not null, "method" text check ("method" in ('partial-pressure', 'gravimetric')) not null default 'partial-pressure', "price_minor" int not null default 0, "pricing" jsonb null);`);
    this.addSql(`create index "order_lines_order_id_index" on "order_lines" ("order_id");`);

    this.addSql(`create table "fill_plans" ("id" serial primary key, "order_line_id" int not null, "cylinder_id" int null, "plan_version" int not null, "status" text check ("status" in ('draft', 'approved', 'superseded')) not null default 'draft', "model" varchar(32) not null, "method" varchar(32) not null, "request" jsonb not null, "result" jsonb not null, "blocking" boolean not null default false, "created_by_id" int null, "approved_by_id" int null, "approved_at" timestamptz null, "assigned_technician_id" int null, "version" int not null default 1, "created_at" timestamptz not null);`);
    this.addSql(`create index "fill_plans_order_line_id_plan_version_index" on "fill_plans" ("order_line_id", "plan_version");`);

    this.addSql(`create table "fill_runs" ("id" serial primary key, "plan_id" int not null, "cylinder_id" int not null, "technician_id" int null, "scheduled_for" varchar(10) not null, "status" text check ("status" in ('ready', 'in-progress', 'paused', 'completed', 'aborted')) not null default 'ready', "current_step" int not null default 0, "targets" jsonb not null, "replan_count" int not null default 0, "started_at" timestamptz null, "completed_at" timestamptz null, "notes" text not null default '', "version" int not null default 1, "created_at" timestamptz not null, "updated_at" timestamptz not null);`);
    this.addSql(`create index "fill_runs_plan_id_index" on "fill_runs" ("plan_id");`);
    this.addSql(`create index "fill_runs_cylinder_id_index" on "fill_runs" ("cylinder_id");`);
    this.addSql(`create index "fill_runs_scheduled_for_index" on "fill_runs" ("scheduled_for");`);
    this.addSql(`create index "fill_runs_technician_id_status_index" on "fill_runs" ("technician_id", "status");`);

    this.addSql(`create table "fill_readings" ("id" serial primary key, "run_id" int not null, "step_index" int not null, "gas" varchar(64) not null, "pressure_bar_abs" double precision null, "pressure_bar_gauge" double precision null, "temperature_c" double precision null, "scale_kg" double precision null, "outcome" text check ("outcome" in ('on-target', 'under', 'over')) not null, "supersedes" int null, "recorded_by_id" int not null, "client_request_id" varchar(64) null, "recorded_at" timestamptz not null);`);
    this.addSql(`alter table "fill_readings" add constraint "fill_readings_client_request_id_unique" unique ("client_request_id");`);
    this.addSql(`create index "fill_readings_run_id_step_index_index" on "fill_readings" ("run_id", "step_index");`);

    this.addSql(`create table "analyses" ("id" serial primary key, "run_id" int not null, "results" jsonb not null, "verdict" text check ("verdict" in ('pending', 'within-tolerance', 'out-of-tolerance', 'rejected', 'released')) not null default 'pending', "reject_reason" text null, "report_stored_name" varchar(128) null, "report_original_name" varchar(255) null, "report_content_type" varchar(64) null, "report_size_bytes" int null, "analysed_by_id" int null, "analysed_at" timestamptz null, "version" int not null default 1, "created_at" timestamptz not null);`);
    this.addSql(`alter table "analyses" add constraint "analyses_run_id_unique" unique ("run_id");`);

    this.addSql(`create table "certificates" ("id" serial primary key, "number" varchar(32) not null, "revision" int not null, "replaces_id" int null, "order_line_id" int not null, "cylinder_id" int not null, "analysis_id" int not null, "customer_id" int not null, "content" jsonb not null, "signatory_id" int not null, "signatory_name" varchar(200) not null, "released_at" timestamptz not null, "valid_until" varchar(10) not null, "correction_reason" text null);`);
    this.addSql(`create index "certificates_order_line_id_index" on "certificates" ("order_line_id");`);
    this.addSql(`create index "certificates_cylinder_id_index" on "certificates" ("cylinder_id");`);
    this.addSql(`create index "certificates_customer_id_index" on "certificates" ("customer_id");`);
    this.addSql(`alter table "certificates" add constraint "certificates_number_revision_unique" unique ("number", "revision");`);

    this.addSql(`create table "price_entries" ("id" serial primary key, "kind" text check ("kind" in ('gas', 'rental', 'certification', 'surcharge')) not null, "key" varchar(64) not null, "label" varchar(200) not null, "unit" text check ("unit" in ('m3-15C', 'kg', 'day', 'cylinder')) not null, "price_minor" int not null, "currency" varchar(3) not null default 'EUR', "updated_at" timestamptz not null);`);
    this.addSql(`alter table "price_entries" add constraint "price_entries_kind_key_unique" unique ("kind", "key");`);

    this.addSql(`create table "sessions" ("sid" varchar(128) not null, "data" text not null, "expires_at" bigint not null, constraint "sessions_pkey" primary key ("sid"));`);
    this.addSql(`create index "sessions_expires_at_index" on "sessions" ("expires_at");`);

    this.addSql(`create table "users" ("id" serial primary key, "email" varchar(254) not null, "name" varchar(200) not null, "password_hash" varchar(255) not null, "roles" jsonb not null, "active" boolean not null default true, "customer_id" int null, "created_at" timestamptz not null, "updated_at" timestamptz not null);`);
    this.addSql(`alter table "users" add constraint "users_email_unique" unique ("email");`);

    this.addSql(`create table "webhook_events" ("id" varchar(64) not null, "type" varchar(64) not null, "received_at" timestamptz not null, constraint "webhook_events_pkey" primary key ("id"));`);

    this.addSql(`alter table "cylinders" add constraint "cylinders_owner_id_foreign" foreign key ("owner_id") references "customers" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "orders" add constraint "orders_customer_id_foreign" foreign key ("customer_id") references "customers" ("id") on update cascade;`);

    this.addSql(`alter table "invoices" add constraint "invoices_order_id_foreign" foreign key ("order_id") references "orders" ("id") on update cascade;`);

    this.addSql(`alter table "order_lines" add constraint "order_lines_order_id_foreign" foreign key ("order_id") references "orders" ("id") on update cascade;`);

    this.addSql(`alter table "fill_plans" add constraint "fill_plans_order_line_id_foreign" foreign key ("order_line_id") references "order_lines" ("id") on update cascade;`);
    this.addSql(`alter table "fill_plans" add constraint "fill_plans_cylinder_id_foreign" foreign key ("cylinder_id") references "cylinders" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "fill_runs" add constraint "fill_runs_plan_id_foreign" foreign key ("plan_id") references "fill_plans" ("id") on update cascade;`);
    this.addSql(`alter table "fill_runs" add constraint "fill_runs_cylinder_id_foreign" foreign key ("cylinder_id") references "cylinders" ("id") on update cascade;`);

    this.addSql(`alter table "fill_readings" add constraint "fill_readings_run_id_foreign" foreign key ("run_id") references "fill_runs" ("id") on update cascade;`);

    this.addSql(`alter table "analyses" add constraint "analyses_run_id_foreign" foreign key ("run_id") references "fill_runs" ("id") on update cascade;`);

    this.addSql(`alter table "certificates" add constraint "certificates_order_line_id_foreign" foreign key ("order_line_id") references "order_lines" ("id") on update cascade;`);
    this.addSql(`alter table "certificates" add constraint "certificates_cylinder_id_foreign" foreign key ("cylinder_id") references "cylinders" ("id") on update cascade;`);
    this.addSql(`alter table "certificates" add constraint "certificates_analysis_id_foreign" foreign key ("analysis_id") references "analyses" ("id") on update cascade;`);

    this.addSql(`alter table "users" add constraint "users_customer_id_foreign" foreign key ("customer_id") references "customers" ("id") on update cascade on delete set null;`);
  }

}
