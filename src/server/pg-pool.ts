/** The one pg pool that better-auth uses for its tables (MikroORM has its own connections). */
import pg from 'pg';
import { config } from './config';
import { countStatement, countingSql } from './sql-counter';

let pool: pg.Pool | undefined;

export function pgPool(): pg.Pool {
  if (!pool) {
    pool = new pg.Pool({ connectionString: config().DATABASE_URL, max: 10 });
    // A connection that PostgreSQL closes (a restart, a failover) reports an 'error' event; with
    // no listener node would end the whole server. Idle ones are reported by the pool; one that
    // is checked out but between queries (the auth library holds them so) by the client itself.
    // Either way the pool drops the broken connection and connects anew on demand.
    pool.on('error', (e) => console.error('[db] an idle connection was lost:', e.message));
    pool.on('connect', (client) => client.on('error', (e) => console.error('[db] a connection in use was lost:', e.message)));
    if (countingSql) {
      const query = pool.query.bind(pool) as (...a: unknown[]) => unknown;
      (pool as unknown as { query: (...a: unknown[]) => unknown }).query = (...a: unknown[]) => (countStatement(), query(...a));
    }
  }
  return pool;
}
