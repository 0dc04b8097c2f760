/** The one pg pool that better-auth uses for its tables (MikroORM has its own connections). */
import pg from 'pg';
import { config } from './config';
import { countStatement, countingSql } from './sql-counter';

let pool: pg.Pool | undefined;

export function pgPool(): pg.Pool {
  if (!pool) {
    pool = new pg.Pool({ connectionString: config().DATABASE_URL, max: 10 });
    // An idle connection that PostgreSQL closes (a restart, a failover) is reported here; without
    // a listener node would end the whole server. The pool drops it and connects anew on demand.
    pool.on('error', (e) => console.error('[db] an idle connection was lost:', e.message));
    if (countingSql) {
      const query = pool.query.bind(pool) as (...a: unknown[]) => unknown;
      (pool as unknown as { query: (...a: unknown[]) => unknown }).query = (...a: unknown[]) => (countStatement(), query(...a));
    }
  }
  return pool;
}
