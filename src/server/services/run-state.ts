/**
 * The run machine's state for a run, rebuilt from the log at most once per new event: a small
 * in-process cache keyed by the run's lastSeq. The log stays the truth — a cache entry is used
 * only when its seq equals the run row's lastSeq (read under the row lock when posting), so
 * several app servers, restarts and concurrent writers can never see a stale state.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Step } from '../../domain/procedure/schema';
import { replay, restoreRun, storeRun, type RunSnapshot, type StoredRun } from '../../domain/run';
import { RunEvent as RunEventRow } from '../entities';
import type { RunEntity } from '../entities/run.entity';

const LIMIT = 500;
const cache = new Map<string, { seq: number; revisionId: string; stored: StoredRun }>();

/** Remembers the state after `seq` (most recently used entries survive the size limit). */
export function rememberRunState(run: Pick<RunEntity, 'id' | 'revisionId'>, seq: number, snapshot: RunSnapshot): void {
  cache.delete(run.id);
  if (cache.size >= LIMIT) cache.delete(cache.keys().next().value as string);
  cache.set(run.id, { seq, revisionId: run.revisionId, stored: storeRun(snapshot) });
}

/** The state of the run after its lastSeq: from the cache when it is current, else replayed from the log. */
export async function currentRunState(em: EntityManager, run: RunEntity, steps: Step[]): Promise<RunSnapshot> {
  const hit = cache.get(run.id);
  if (hit && hit.seq === run.lastSeq && hit.revisionId === run.revisionId) return restoreRun(steps, hit.stored);
  const rows = await em.find(RunEventRow, { run: run.id }, { orderBy: { seq: 'asc' }, fields: ['payload', 'seq'] });
  const snapshot = replay(steps, rows.map((r) => r.payload));
  rememberRunState(run, rows.at(-1)?.seq ?? 0, snapshot);
  return snapshot;
}

/** Forgets every cached state (tests that rewrite the database). */
export function forgetRunStates(): void {
  cache.clear();
}
