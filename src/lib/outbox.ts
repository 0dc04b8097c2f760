/**
 * The runner's outbox: run events recorded while the server cannot be reached wait here, in
 * IndexedDB, in the order they were recorded, each with its idempotency key and the log
 * position (`expectedSeq`) it was recorded against. `flush` sends them one at a time, in order,
 * and stops at the first that does not go through; the server applies each key once, so an
 * entry sent twice (a lost answer, two tabs) is harmless.
 *
 * The store is injectable (idb-keyval's `UseStore`) so tests run against fake-indexeddb.
 * Nothing touches IndexedDB until an outbox is created.
 */
import { createStore, get, update, type UseStore } from 'idb-keyval';

/** A run event as the client sends it: the server adds the actor from the session. */
export type OutboxEvent = { type: string; stepId: string; [field: string]: unknown };

export type OutboxEntry = {
  /** The idempotency key (a UUID); unique within a run's queue. */
  key: string;
  runId: string;
  event: OutboxEvent;
  /** The server log's last seq this event was recorded against (earlier queued events included). */
  expectedSeq: number;
  queuedAt: string;
  device?: string;
};

/** What happened when one entry was sent. */
export type SendOutcome =
  | { kind: 'sent'; lastSeq: number }
  /** No answer (offline, server down): keep it and try later. */
  | { kind: 'offline' }
  /** Someone else recorded first: the caller applies their events and rebases the queue. */
  | { kind: 'conflict' }
  /** The server refused it for good (rule, role, bad input): it leaves the queue. */
  | { kind: 'refused'; message: string };

export type FlushResult = {
  sent: OutboxEntry[];
  /** Why flushing stopped before the queue was empty; null when it emptied. */
  stoppedBy: Exclude<SendOutcome['kind'], 'sent'> | null;
  /** The entry that stopped it (still queued unless it was refused). */
  at: OutboxEntry | null;
  message?: string;
  remaining: number;
};

const queueKey = (runId: string) => `run:${runId}`;

/** A run's queue in IndexedDB, with in-order, once-only sending. */
export type Outbox = ReturnType<typeof createOutbox>;

/** An outbox over the given store (default: the browser's `torquetrail-outbox` database). */
export function createOutbox(store: UseStore = createStore('torquetrail-outbox', 'queues')) {
  const flushing = new Map<string, Promise<FlushResult>>();

  const list = async (runId: string): Promise<OutboxEntry[]> => (await get<OutboxEntry[]>(queueKey(runId), store)) ?? [];

  /** Appends an entry; an entry whose key is already queued is ignored (returns false). */
  async function add(entry: OutboxEntry): Promise<boolean> {
    let added = false;
    await update<OutboxEntry[]>(
      queueKey(entry.runId),
      (old) => {
        const q = old ?? [];
        if (q.some((e) => e.key === entry.key)) return q;
        added = true;
        return [...q, entry];
      },
      store,
    );
    return added;
  }

  async function remove(runId: string, key: string): Promise<void> {
    await update<OutboxEntry[]>(queueKey(runId), (old) => (old ?? []).filter((e) => e.key !== key), store);
  }

  /** Rewrites the queue (e.g. new expectedSeq after a conflict); order and keys come from `change`. */
  async function rewrite(runId: string, change: (entries: OutboxEntry[]) => OutboxEntry[]): Promise<OutboxEntry[]> {
    let result: OutboxEntry[] = [];
    await update<OutboxEntry[]>(
      queueKey(runId),
      (old) => {
        const seen = new Set<string>();
        result = change(old ?? []).filter((e) => !seen.has(e.key) && seen.add(e.key));
        return result;
      },
      store,
    );
    return result;
  }

  async function flushOnce(runId: string, send: (entry: OutboxEntry) => Promise<SendOutcome>): Promise<FlushResult> {
    const sent: OutboxEntry[] = [];
    for (;;) {
      const [entry] = await list(runId);
      if (!entry) return { sent, stoppedBy: null, at: null, remaining: 0 };
      const outcome = await send(entry);
      if (outcome.kind === 'sent') {
        await remove(runId, entry.key);
        sent.push(entry);
        continue;
      }
      if (outcome.kind === 'refused') await remove(runId, entry.key);
      const remaining = (await list(runId)).length;
      return { sent, stoppedBy: outcome.kind, at: entry, remaining, ...(outcome.kind === 'refused' ? { message: outcome.message } : {}) };
    }
  }

  /** Sends the run's queue in order; a second call while one is running joins it instead of sending twice. */
  function flush(runId: string, send: (entry: OutboxEntry) => Promise<SendOutcome>): Promise<FlushResult> {
    const running = flushing.get(runId);
    if (running) return running;
    const p = flushOnce(runId, send).finally(() => flushing.delete(runId));
    flushing.set(runId, p);
    return p;
  }

  return { list, add, remove, rewrite, flush, count: async (runId: string) => (await list(runId)).length };
}
