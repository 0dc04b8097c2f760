import { Migration } from '@mikro-orm/migrations';

/**
 * Jobs, their assignments, runs and the append-only run log. Foreign keys to better-auth's
 * tables and the run's pinned revision are written by hand with PostgreSQL's default `_fkey`
 * names. A trigger refuses any update or delete of a logged event.
 */
export class Migration20261201200000Jobs extends Migration {
  override async up(): Promise<void> {
    this.addSql(`create table "job" ("id" uuid not null, "shop_id" varchar(64) not null references "organization" ("id") on delete cascade, "code" varchar(16) not null, "unit_description" varchar(200) not null, "serial" varchar(80) not null default '', "hours_or_odometer" varchar(40) not null default '', "customer" varchar(160) not null default '', "notes" text not null default '', "status" varchar(20) not null default 'open', "reviewer_id" varchar(64) null references "user" ("id") on delete set null, "created_by_id" varchar(64) not null references "user" ("id"), "created_at" timestamptz not null, "updated_at" timestamptz not null, constraint "job_pkey" primary key ("id"));`);
    this.addSql(`create index "job_shop_id_index" on "job" ("shop_id");`);
    this.addSql(`alter table "job" add constraint "job_shop_id_code_unique" unique ("shop_id", "code");`);

    this.addSql(`create table "job_assignment" ("id" uuid not null, "job_id" uuid not null, "user_id" varchar(64) not null references "user" ("id") on delete cascade, "created_at" timestamptz not null, constraint "job_assignment_pkey" primary key ("id"));`);
    this.addSql(`create index "job_assignment_user_id_index" on "job_assignment" ("user_id");`);
    this.addSql(`alter table "job_assignment" add constraint "job_assignment_job_id_user_id_unique" unique ("job_id", "user_id");`);

    this.addSql(`create table "run" ("id" uuid not null, "shop_id" varchar(64) not null references "organization" ("id") on delete cascade, "job_id" uuid not null, "revision_id" uuid not null references "procedure_revision" ("id"), "procedure_name" varchar(120) not null, "revision_number" int not null, "status" varchar(16) not null default 'active', "last_seq" int not null default 0, "done_steps" int not null default 0, "total_steps" int not null default 0, "next_description" varchar(300) null, "created_by_id" varchar(64) not null references "user" ("id"), "created_at" timestamptz not null, "updated_at" timestamptz not null, constraint "run_pkey" primary key ("id"));`);
    this.addSql(`create index "run_shop_id_index" on "run" ("shop_id");`);
    this.addSql(`create index "run_job_id_index" on "run" ("job_id");`);
    this.addSql(`create index "run_revision_id_index" on "run" ("revision_id");`);

    this.addSql(`create table "run_event" ("id" bigserial primary key, "run_id" uuid not null, "seq" int not null, "type" varchar(40) not null, "payload" jsonb not null, "actor_id" varchar(64) not null references "user" ("id"), "actor_role" varchar(16) not null, "device" varchar(120) null, "idempotency_key" uuid not null, "recorded_at" timestamptz not null, "client_at" timestamptz null);`);
    this.addSql(`alter table "run_event" add constraint "run_event_run_id_seq_unique" unique ("run_id", "seq");`);
    this.addSql(`alter table "run_event" add constraint "run_event_run_id_idempotency_key_unique" unique ("run_id", "idempotency_key");`);

    this.addSql(`alter table "job_assignment" add constraint "job_assignment_job_id_foreign" foreign key ("job_id") references "job" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "run" add constraint "run_job_id_foreign" foreign key ("job_id") references "job" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "run_event" add constraint "run_event_run_id_foreign" foreign key ("run_id") references "run" ("id") on update cascade on delete cascade;`);

    // The log is the record of who did what: once written, an event never changes.
    this.addSql(`create function "run_event_append_only"() returns trigger language plpgsql as $$ begin raise exception 'run_event rows are append-only (% refused)', tg_op; end $$;`);
    this.addSql(`create trigger "run_event_append_only" before update or delete on "run_event" for each row execute function "run_event_append_only"();`);
  }

  override async down(): Promise<void> {
    for (const t of ['run_event', 'run', 'job_assignment', 'job']) this.addSql(`drop table if exists "${t}" cascade;`);
    this.addSql(`drop function if exists "run_event_append_only"();`);
  }
}
