/** The app's MikroORM instance: created once per process, options overridable for tests. */
import { MikroORM, type Options } from '@mikro-orm/postgresql';
import baseConfig from '../../mikro-orm.config';
import { config } from './config';
import { countStatement, countingSql } from './sql-counter';

let orm: Promise<MikroORM> | undefined;

/** The cached ORM; the first call connects. */
export function initORM(options: Options = {}): Promise<MikroORM> {
  orm ??= MikroORM.init({ ...baseConfig, clientUrl: config().DATABASE_URL, ...options }).then((o) => {
    if (countingSql) o.em.getConnection().getKnex().on('query', countStatement);
    return o;
  });
  return orm;
}

/** Closes the cached ORM (tests and graceful shutdown). */
export async function closeORM(): Promise<void> {
  if (!orm) return;
  const o = await orm;
  orm = undefined;
  await o.close(true);
}
