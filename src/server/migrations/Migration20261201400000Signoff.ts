import { Migration } from '@mikro-orm/migrations';

/**
 * Sign-offs, read-only links and their view log, and the outgoing mail the queue delivers.
 * Foreign keys are written by hand with PostgreSQL's default `_fkey` names.
 */
export class Migration20261201400000Signoff extends Migration {
  override async up(): Promise<void> {
    this.addSql(`create table "signature" ("id" uuid not null, "shop_id" varchar(64) not null references "organization" ("id") on delete cascade, "run_id" uuid not null references "run" ("id") on delete cascade, "step_id" varchar(40) null, "signer_id" varchar(64) not null references "user" ("id"), "signer_name" varchar(200) not null, "signer_role" varchar(16) not null, "meaning" varchar(40) not null, "signed_at" timestamptz not null, "run_seq" int not null, "record_hash" varchar(64) not null, "record" jsonb not null, constraint "signature_pkey" primary key ("id"));`);
    this.addSql(`create index "signature_shop_id_index" on "signature" ("shop_id");`);
    this.addSql(`create index "signature_run_id_index" on "signature" ("run_id");`);
    // A signature is a record of its moment: never updated or deleted (except with its run).
    this.addSql(`create function "signature_immutable"() returns trigger language plpgsql as $$ begin raise exception 'signature rows cannot be changed'; end $$;`);
    this.addSql(`create trigger "signature_immutable" before update on "signature" for each row execute function "signature_immutable"();`);

    this.addSql(`create table "share_link" ("id" uuid not null, "shop_id" varchar(64) not null references "organization" ("id") on delete cascade, "job_id" uuid not null references "job" ("id") on delete cascade, "run_id" uuid not null references "run" ("id") on delete cascade, "token_hash" varchar(64) not null, "expires_at" timestamptz not null, "revoked_at" timestamptz null, "created_by" varchar(64) not null references "user" ("id"), "created_at" timestamptz not null, constraint "share_link_pkey" primary key ("id"));`);
    this.addSql(`create index "share_link_shop_id_index" on "share_link" ("shop_id");`);
    this.addSql(`create index "share_link_job_id_index" on "share_link" ("job_id");`);
    this.addSql(`alter table "share_link" add constraint "share_link_token_hash_unique" unique ("token_hash");`);

    this.addSql(`create table "share_view" ("id" uuid not null, "link_id" uuid not null references "share_link" ("id") on delete cascade, "what" varchar(16) not null, "at" timestamptz not null, "ip" varchar(80) not null default '', "user_agent" varchar(300) not null default '', constraint "share_view_pkey" primary key ("id"));`);
    this.addSql(`create index "share_view_link_id_index" on "share_view" ("link_id");`);

    this.addSql(`create table "outgoing_message" ("id" uuid not null, "shop_id" varchar(64) not null references "organization" ("id") on delete cascade, "job_id" uuid null references "job" ("id") on delete cascade, "run_id" uuid null references "run" ("id") on delete set null, "kind" varchar(16) not null, "report_kind" varchar(16) null, "to" varchar(320) not null, "subject" varchar(300) not null, "body" text not null, "status" varchar(12) not null default 'queued', "attempts" int not null default 0, "last_error" text null, "sent_at" timestamptz null, "created_by" varchar(64) null references "user" ("id") on delete set null, "created_at" timestamptz not null, "updated_at" timestamptz not null, constraint "outgoing_message_pkey" primary key ("id"));`);
    this.addSql(`create index "outgoing_message_shop_id_index" on "outgoing_message" ("shop_id");`);
    this.addSql(`create index "outgoing_message_job_id_index" on "outgoing_message" ("job_id");`);
  }

  override async down(): Promise<void> {
    for (const t of ['outgoing_message', 'share_view', 'share_link', 'signature']) this.addSql(`drop table if exists "${t}" cascade;`);
    this.addSql(`drop function if exists "signature_immutable"();`);
  }
}
