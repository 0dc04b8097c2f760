/**
 * MikroORM configuration, shared by the app (src/server/db.ts), the migration/seed script and
 * the CLI. Entities are listed explicitly (no folder globs: they break after a build).
 */
import { defineConfig } from '@mikro-orm/postgresql';
import { Migrator } from '@mikro-orm/migrations';
import { SeedManager } from '@mikro-orm/seeder';
import { entities } from './src/server/entities/index';
import { AUTH_TABLES } from './src/server/auth-tables';
import { migrationsList } from './src/server/migrations/index';

export default defineConfig({
  clientUrl: process.env.DATABASE_URL ?? 'postgres://postgres@127.0.0.1:54329/torquetrail',
  entities,
  extensions: [Migrator, SeedManager],
  migrations: {
    path: './src/server/migrations',
    pathTs: './src/server/migrations',
    migrationsList,
    transactional: true,
    allOrNothing: true,
    snapshot: false,
  },
  seeder: { path: './src/server/seeders', pathTs: './src/server/seeders' },
  // better-auth owns its tables through its own pool; the schema diff must leave them alone.
  schemaGenerator: { skipTables: [...AUTH_TABLES] },
  pool: { min: 0, max: 10 },
  debug: false,
});
