/** A fresh, migrated schema in the integration database (scripts/test.mjs provides DATABASE_URL). */
import { MikroORM } from '@mikro-orm/postgresql';
import baseConfig from '../../../mikro-orm.config';
import { closeORM, initORM } from '../../../src/server/db';

if (!process.env.DATABASE_URL?.includes('_it')) {
  throw new Error('Integration tests need the throwaway database that `npm test` creates (DATABASE_URL ending in _it).');
}

/** Drops every table, applies the committed migrations from empty, returns the app's ORM. */
export async function freshDatabase(): Promise<MikroORM> {
  await closeORM();
  const admin = await MikroORM.init({ ...baseConfig, clientUrl: process.env.DATABASE_URL });
  await admin.em.getConnection().execute('drop schema public cascade; create schema public;');
  await admin.migrator.up();
  await admin.close(true);
  return initORM();
}
