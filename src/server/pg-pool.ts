/** The one pg pool that better-auth uses for its tables (MikroORM has its own connections). */
import pg from 'pg';
import { config } from './config';

let pool: pg.Pool | undefined;

export function pgPool(): pg.Pool {
  pool ??= new pg.Pool({ connectionString: config().DATABASE_URL, max: 10 });
  return pool;
}
