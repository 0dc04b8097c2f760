/** The request's EntityManager (the global one resolves to the RequestContext's fork). */
import type { EntityManager } from '@mikro-orm/postgresql';
import { initORM } from './db';

export async function em(): Promise<EntityManager> {
  return (await initORM()).em;
}
