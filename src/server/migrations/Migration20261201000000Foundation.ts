import { Migration } from '@mikro-orm/migrations';

/**
 * better-auth's tables (users, sessions, accounts, verifications, shops as organizations,
 * members, invitations), as its schema for our configuration compiles them, and the
 * per-shop settings. tests/integration/auth-schema.int.test.ts checks that better-auth finds
 * nothing missing after this runs.
 */
export class Migration20261201000000Foundation extends Migration {
  override async up(): Promise<void> {
    this.addSql(`create table "user" ("id" text not null primary key, "name" text not null, "email" text not null unique, "emailVerified" boolean not null, "image" text, "createdAt" timestamptz default CURRENT_TIMESTAMP not null, "updatedAt" timestamptz default CURRENT_TIMESTAMP not null);`);
    this.addSql(`create table "session" ("id" text not null primary key, "expiresAt" timestamptz not null, "token" text not null unique, "createdAt" timestamptz default CURRENT_TIMESTAMP not null, "updatedAt" timestamptz not null, "ipAddress" text, "userAgent" text, "userId" text not null references "user" ("id") on delete cascade, "activeOrganizationId" text);`);
    this.addSql(`create table "account" ("id" text not null primary key, "accountId" text not null, "providerId" text not null, "userId" text not null references "user" ("id") on delete cascade, "accessToken" text, "refreshToken" text, "idToken" text, "accessTokenExpiresAt" timestamptz, "refreshTokenExpiresAt" timestamptz, "scope" text, "password" text, "createdAt" timestamptz default CURRENT_TIMESTAMP not null, "updatedAt" timestamptz not null);`);
    this.addSql(`create table "verification" ("id" text not null primary key, "identifier" text not null, "value" text not null, "expiresAt" timestamptz not null, "createdAt" timestamptz default CURRENT_TIMESTAMP not null, "updatedAt" timestamptz default CURRENT_TIMESTAMP not null);`);
    this.addSql(`create table "organization" ("id" text not null primary key, "name" text not null, "slug" text not null unique, "logo" text, "createdAt" timestamptz not null, "metadata" text);`);
    this.addSql(`create table "member" ("id" text not null primary key, "organizationId" text not null references "organization" ("id") on delete cascade, "userId" text not null references "user" ("id") on delete cascade, "role" text not null, "createdAt" timestamptz not null);`);
    this.addSql(`create table "invitation" ("id" text not null primary key, "organizationId" text not null references "organization" ("id") on delete cascade, "email" text not null, "role" text, "status" text not null, "expiresAt" timestamptz not null, "createdAt" timestamptz default CURRENT_TIMESTAMP not null, "inviterId" text not null references "user" ("id") on delete cascade);`);
    this.addSql(`create index "session_userId_idx" on "session" ("userId");`);
    this.addSql(`create index "account_userId_idx" on "account" ("userId");`);
    this.addSql(`create index "verification_identifier_idx" on "verification" ("identifier");`);
    this.addSql(`create index "member_organizationId_idx" on "member" ("organizationId");`);
    this.addSql(`create index "member_userId_idx" on "member" ("userId");`);
    this.addSql(`create index "invitation_organizationId_idx" on "invitation" ("organizationId");`);
    this.addSql(`create index "invitation_email_idx" on "invitation" ("email");`);
    this.addSql(`create table "shop_settings" ("shop_id" varchar(64) not null primary key references "organization" ("id") on delete cascade, "preferred_torque_unit" varchar(16) not null default 'N·m', "preferred_length_unit" varchar(16) not null default 'mm', "allow_self_signoff" boolean not null default false, "updated_at" timestamptz not null);`);
  }

  override async down(): Promise<void> {
    for (const t of ['shop_settings', 'invitation', 'member', 'organization', 'verification', 'account', 'session', 'user']) this.addSql(`drop table if exists "${t}" cascade;`);
  }
}
