import { Migration } from '@mikro-orm/migrations';

/**
 * Removed parts: photos (attachments), tags with their history, findings and hand-set
 * quantities of the parts list. Foreign keys to better-auth's tables are written by hand with
 * PostgreSQL's default `_fkey` names.
 */
export class Migration20261201300000Parts extends Migration {
  override async up(): Promise<void> {
    const shop = `"shop_id" varchar(64) not null references "organization" ("id") on delete cascade`;
    this.addSql(`create table "attachment" ("id" uuid not null, ${shop}, "job_id" uuid not null, "scope_kind" varchar(16) not null, "run_id" uuid null, "step_id" varchar(40) null, "tag_id" uuid null, "finding_id" uuid null, "key" varchar(300) not null, "thumb_key" varchar(300) null, "filename" varchar(200) not null, "content_type" varchar(40) not null, "size" int not null, "width" int null, "height" int null, "created_by_id" varchar(64) not null references "user" ("id"), "created_at" timestamptz not null, constraint "attachment_pkey" primary key ("id"));`);
    this.addSql(`create index "attachment_shop_id_index" on "attachment" ("shop_id");`);
    this.addSql(`create index "attachment_job_id_index" on "attachment" ("job_id");`);
    this.addSql(`create index "attachment_tag_id_index" on "attachment" ("tag_id");`);
    this.addSql(`create index "attachment_finding_id_index" on "attachment" ("finding_id");`);
    this.addSql(`alter table "attachment" add constraint "attachment_key_unique" unique ("key");`);
    this.addSql(`create index "attachment_run_id_step_id_index" on "attachment" ("run_id", "step_id");`);

    this.addSql(`create table "tag" ("id" uuid not null, ${shop}, "job_id" uuid not null, "run_id" uuid not null, "step_id" varchar(40) not null, "part_name" varchar(120) not null, "position" varchar(40) not null, "code" varchar(64) not null, "bin" varchar(60) not null default '', "disposition" varchar(16) not null, "condition_note" text not null default '', "source_seq" int not null, "created_by_id" varchar(64) not null references "user" ("id"), "created_at" timestamptz not null, "updated_at" timestamptz not null, constraint "tag_pkey" primary key ("id"));`);
    this.addSql(`create index "tag_shop_id_index" on "tag" ("shop_id");`);
    this.addSql(`create index "tag_job_id_index" on "tag" ("job_id");`);
    this.addSql(`alter table "tag" add constraint "tag_shop_id_code_unique" unique ("shop_id", "code");`);
    this.addSql(`alter table "tag" add constraint "tag_run_id_step_id_position_unique" unique ("run_id", "step_id", "position");`);

    this.addSql(`create table "tag_history" ("id" uuid not null, "tag_id" uuid not null, "source" varchar(16) not null, "changes" jsonb not null, "changed_by_id" varchar(64) not null references "user" ("id"), "changed_at" timestamptz not null, constraint "tag_history_pkey" primary key ("id"));`);
    this.addSql(`create index "tag_history_tag_id_index" on "tag_history" ("tag_id");`);

    this.addSql(`create table "finding" ("id" uuid not null, ${shop}, "job_id" uuid not null, "run_id" uuid null, "step_id" varchar(40) null, "what" varchar(300) not null, "where" varchar(200) not null default '', "severity" varchar(16) not null, "send_to_machine_shop" boolean not null default false, "parts_to_replace" jsonb not null, "created_by_id" varchar(64) not null references "user" ("id"), "created_at" timestamptz not null, constraint "finding_pkey" primary key ("id"));`);
    this.addSql(`create index "finding_shop_id_index" on "finding" ("shop_id");`);
    this.addSql(`create index "finding_job_id_index" on "finding" ("job_id");`);

    this.addSql(`create table "parts_list_override" ("id" uuid not null, ${shop}, "job_id" uuid not null, "part_key" varchar(120) not null, "quantity" int not null, "updated_by_id" varchar(64) not null references "user" ("id"), "updated_at" timestamptz not null, constraint "parts_list_override_pkey" primary key ("id"));`);
    this.addSql(`create index "parts_list_override_shop_id_index" on "parts_list_override" ("shop_id");`);
    this.addSql(`alter table "parts_list_override" add constraint "parts_list_override_job_id_part_key_unique" unique ("job_id", "part_key");`);

    this.addSql(`alter table "finding" add constraint "finding_job_id_foreign" foreign key ("job_id") references "job" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "attachment" add constraint "attachment_job_id_foreign" foreign key ("job_id") references "job" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "parts_list_override" add constraint "parts_list_override_job_id_foreign" foreign key ("job_id") references "job" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "tag" add constraint "tag_job_id_foreign" foreign key ("job_id") references "job" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "tag" add constraint "tag_run_id_foreign" foreign key ("run_id") references "run" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "tag_history" add constraint "tag_history_tag_id_foreign" foreign key ("tag_id") references "tag" ("id") on update cascade on delete cascade;`);
  }

  override async down(): Promise<void> {
    for (const t of ['tag_history', 'attachment', 'tag', 'finding', 'parts_list_override']) this.addSql(`drop table if exists "${t}" cascade;`);
  }
}
