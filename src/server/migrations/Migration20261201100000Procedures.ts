import { Migration } from '@mikro-orm/migrations';

/**
 * Procedures and their revisions. Foreign keys to better-auth's tables and the plain uuid
 * links between revisions are written by hand with PostgreSQL's default `_fkey` names.
 * The partial unique index allows at most one draft per procedure.
 */
export class Migration20261201100000Procedures extends Migration {
  override async up(): Promise<void> {
    this.addSql(`create table "procedure" ("id" uuid not null, "shop_id" varchar(64) not null references "organization" ("id") on delete cascade, "key" varchar(80) not null, "name" varchar(120) not null, "kind" varchar(16) not null, "engine_family" varchar(120) not null default '', "description" text not null default '', "derived_from_revision_id" uuid null, "created_at" timestamptz not null, "updated_at" timestamptz not null, constraint "procedure_pkey" primary key ("id"));`);
    this.addSql(`create index "procedure_shop_id_index" on "procedure" ("shop_id");`);
    this.addSql(`alter table "procedure" add constraint "procedure_shop_id_key_unique" unique ("shop_id", "key");`);
    this.addSql(`create table "procedure_revision" ("id" uuid not null, "procedure_id" uuid not null, "shop_id" varchar(64) not null references "organization" ("id") on delete cascade, "number" int null, "status" varchar(16) not null default 'draft', "content" jsonb not null, "note" text not null default '', "version" int not null default 1, "based_on_id" uuid null, "content_hash" varchar(64) not null, "created_by_id" varchar(64) null references "user" ("id") on delete set null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "released_by_id" varchar(64) null references "user" ("id") on delete set null, "released_at" timestamptz null, "retired_by_id" varchar(64) null references "user" ("id") on delete set null, "retired_at" timestamptz null, constraint "procedure_revision_pkey" primary key ("id"));`);
    this.addSql(`create index "procedure_revision_shop_id_index" on "procedure_revision" ("shop_id");`);
    this.addSql(`create unique index "procedure_revision_one_draft" on "procedure_revision" ("procedure_id") where "status" = 'draft';`);
    this.addSql(`alter table "procedure_revision" add constraint "procedure_revision_procedure_id_number_unique" unique ("procedure_id", "number");`);
    this.addSql(`alter table "procedure_revision" add constraint "procedure_revision_procedure_id_foreign" foreign key ("procedure_id") references "procedure" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "procedure_revision" add constraint "procedure_revision_based_on_id_fkey" foreign key ("based_on_id") references "procedure_revision" ("id") on delete set null;`);
    this.addSql(`alter table "procedure" add constraint "procedure_derived_from_revision_id_fkey" foreign key ("derived_from_revision_id") references "procedure_revision" ("id") on delete set null;`);
  }

  override async down(): Promise<void> {
    this.addSql(`alter table "procedure" drop constraint if exists "procedure_derived_from_revision_id_fkey";`);
    this.addSql(`drop table if exists "procedure_revision" cascade;`);
    this.addSql(`drop table if exists "procedure" cascade;`);
  }
}
