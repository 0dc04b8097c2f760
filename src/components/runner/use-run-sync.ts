/**
 * The runner's state: the server's log replayed through the run machine, with the events this
 * device has recorded but not yet delivered (the outbox) applied on top. Every new event is
 * checked by the same machine first, queued in IndexedDB with an idempotency key and the seq it
 * was recorded against, then sent in order; conflicts and refusals bring the log up to date.
 */
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
// Straight from the modules, not the barrel: the runner has no use for the event schema (the
// server parses every event it receives) and must not carry the schema library.
import { applyRunEvent, refusalFor, replayEvents, type RunSnapshot } from '../../domain/run/run-apply';
import type { RunEvent } from '../../domain/run/run-events';
import { api, isApiError, type ApiError } from '../../lib/api-client';
import { createOutbox, type Outbox, type OutboxEntry, type OutboxEvent, type SendOutcome } from '../../lib/outbox';
import type { Status } from '../ui/StatusRegion';
import { describeEvent } from './describe-event';
import { deviceName } from './device';
import type { RecordedDto, RunDto, StoredEventDto, Viewer } from './types';
import { useOnline } from './use-online';
import { usePoll } from './use-poll';
import { uuid } from './uuid';

const POLL_MS = 3000;

type DistributiveOmit<T, K extends PropertyKey> = T extends unknown ? Omit<T, K> : never;
/** An event as the runner builds it: the actor is filled in here (and again by the server). */
export type RunEventDraft = DistributiveOmit<RunEvent, 'actor'>;
/** Server log entries were parsed when they were stored; queued ones were built by this code. */
const asEvents = (payloads: readonly unknown[]) => payloads as readonly RunEvent[];
const RETRY_MS = 5000;

/** Server events merged by seq: each seq once, in order. */
function merge(a: readonly StoredEventDto[], b: readonly StoredEventDto[]): StoredEventDto[] {
  const bySeq = new Map<number, StoredEventDto>();
  for (const e of [...a, ...b]) bySeq.set(e.seq, e);
  return [...bySeq.values()].sort((x, y) => x.seq - y.seq);
}

export function useRunSync(initial: RunDto, viewer: Viewer) {
  const runId = initial.run.id;
  const steps = initial.steps;
  const actor = useMemo(() => ({ userId: viewer.userId, role: viewer.role }), [viewer.userId, viewer.role]);
  const [events, setEvents] = useState<StoredEventDto[]>(() => merge([], initial.events));
  const [pending, setPending] = useState<OutboxEntry[]>([]);
  const [status, setStatus] = useState<Status>(null);
  const [sending, setSending] = useState(false);
  const eventsRef = useRef(events);
  const pendingRef = useRef(pending);
  const outboxRef = useRef<Outbox | null>(null);
  const online = useOnline();

  const outbox = useCallback(() => (outboxRef.current ??= createOutbox()), []);
  const lastSeq = () => eventsRef.current.at(-1)?.seq ?? initial.run.lastSeq ?? 0;
  const nameOf = useCallback((userId: string) => eventsRef.current.find((e) => e.actor.id === userId)?.actor.name ?? (userId === viewer.userId ? viewer.name : 'Someone'), [viewer]);

  const setServer = (next: StoredEventDto[]) => {
    eventsRef.current = next;
    setEvents(next);
  };
  const setQueue = (next: OutboxEntry[]) => {
    pendingRef.current = next;
    setPending(next);
  };

  const serverSnapshot = useMemo<{ snap: RunSnapshot | null; error: string | null }>(() => {
    try {
      return { snap: replayEvents(steps, asEvents(events.map((e) => e.payload))), error: null };
    } catch (e) {
      return { snap: null, error: e instanceof Error ? e.message : 'The run log could not be read' };
    }
  }, [steps, events]);

  /** Applies queued events on top of a snapshot; those the machine refuses now are left out. */
  const withQueue = useCallback(
    (base: RunSnapshot, queue: readonly OutboxEntry[]) => {
      let snap = base;
      const applied: OutboxEntry[] = [];
      const refused: OutboxEntry[] = [];
      for (const entry of queue) {
        const r = applyRunEvent(steps, snap, { ...entry.event, actor } as unknown as RunEvent);
        if (r.ok) {
          snap = r.snapshot;
          applied.push(entry);
        } else refused.push(entry);
      }
      return { snap, applied, refused };
    },
    [steps, actor],
  );

  const snapshot = useMemo(() => (serverSnapshot.snap ? withQueue(serverSnapshot.snap, pending).snap : null), [serverSnapshot, pending, withQueue]);
  const snapshotRef = useRef(snapshot);
  snapshotRef.current = snapshot;

  /** Renumbers the queue against the current server log; drops entries the run no longer accepts. */
  const rebase = useCallback(async (): Promise<OutboxEntry[]> => {
    let dropped: OutboxEntry[] = [];
    const kept = await outbox().rewrite(runId, (queue) => {
      const base = replayEvents(steps, asEvents(eventsRef.current.map((e) => e.payload)));
      const { applied, refused } = withQueue(base, queue);
      dropped = refused;
      const from = lastSeq();
      return applied.map((e, i) => ({ ...e, expectedSeq: from + i }));
    });
    setQueue(kept);
    return dropped;
  }, [outbox, runId, steps, withQueue]);

  const fetchNewer = useCallback(async () => {
    const r = await api<{ events: StoredEventDto[]; lastSeq: number }>(`/api/runs/${runId}/events?after=${lastSeq()}`);
    if (r.events.length) setServer(merge(eventsRef.current, r.events));
    return r.events;
  }, [runId]);

  const flushRef = useRef<() => Promise<void>>(async () => {});
  const problemRef = useRef<ApiError | null>(null);

  const send = useCallback(
    async (entry: OutboxEntry): Promise<SendOutcome> => {
      try {
        const res = await api<RecordedDto>(`/api/runs/${runId}/events`, {
          body: { event: entry.event, idempotencyKey: entry.key, expectedSeq: entry.expectedSeq, clientAt: entry.queuedAt, ...(entry.device ? { device: entry.device } : {}) },
        });
        setServer(merge(eventsRef.current, [res.event]));
        setQueue(pendingRef.current.filter((p) => p.key !== entry.key));
        return { kind: 'sent', lastSeq: res.lastSeq };
      } catch (e) {
        if (!isApiError(e)) return { kind: 'offline' };
        if (e.isNetwork || e.status >= 500 || e.status === 401 || e.status === 429) {
          problemRef.current = e;
          return { kind: 'offline' };
        }
        if (e.status === 409 && e.code === 'conflict') {
          const fresh = Array.isArray(e.body['events']) ? (e.body['events'] as StoredEventDto[]) : [];
          const before = new Set(eventsRef.current.map((x) => x.seq));
          if (fresh.length) setServer(merge(eventsRef.current, fresh));
          else await fetchNewer();
          // Only news is worth a message; an answer that raced a poll of our own events is not.
          const theirs = eventsRef.current.filter((x) => !before.has(x.seq));
          const first = theirs[0];
          const more = theirs.length > 1 ? ` (and ${theirs.length - 1} more)` : '';
          if (first) setStatus({ kind: 'info', message: `${first.actor.name} ${describeEvent(first.payload, steps)}${more} first — you are up to date.` });
          return { kind: 'conflict' };
        }
        setQueue(pendingRef.current.filter((p) => p.key !== entry.key));
        return { kind: 'refused', message: e.message };
      }
    },
    [runId, steps, fetchNewer],
  );

  const flush = useCallback(async () => {
    if (pendingRef.current.length === 0 && (await outbox().count(runId)) === 0) return;
    setSending(true);
    problemRef.current = null;
    try {
      const result = await outbox().flush(runId, send);
      if (result.stoppedBy === 'offline') {
        const p = problemRef.current as ApiError | null;
        if (p?.status === 401) setStatus({ kind: 'error', message: `Your session has ended. Sign in again; ${result.remaining} events are kept on this device and will be sent.` });
        return;
      }
      if (result.stoppedBy === 'refused') {
        setStatus({ kind: 'error', message: `Not recorded: ${result.message ?? 'the server refused it'}` });
        await fetchNewer().catch(() => []);
      }
      if (result.stoppedBy === 'conflict' || result.stoppedBy === 'refused') {
        const dropped = await rebase();
        if (dropped.length > 0)
          setStatus((s) => ({ kind: 'info', message: `${s?.message ?? ''} ${dropped.length === 1 ? 'One of your entries was' : `${dropped.length} of your entries were`} already covered and not sent again.`.trim() }));
      }
      if ((await outbox().count(runId)) > 0) await flushRef.current();
    } finally {
      setSending(false);
    }
  }, [outbox, runId, send, rebase, fetchNewer]);
  flushRef.current = flush;

  /** Keeps a queued entry in IndexedDB, then sends the queue; without storage it is sent straight away. */
  const persistAndSend = useCallback(
    async (entry: OutboxEntry) => {
      try {
        await outbox().add(entry);
      } catch {
        setStatus({ kind: 'error', message: 'This device could not keep the entry for later; it is sent now and lost if the connection drops. Check the browser storage settings.' });
        const outcome = await send(entry);
        if (outcome.kind === 'refused') setStatus({ kind: 'error', message: `Not recorded: ${outcome.message}` });
        return;
      }
      await flush();
    },
    [outbox, send, flush],
  );

  /**
   * Checks an event with the run machine and, when it is accepted, applies it at once and queues
   * it for sending; false (with a message in the status region) when the run refuses it.
   */
  const record = useCallback(
    (event: RunEventDraft): boolean => {
      const current = snapshotRef.current;
      if (!current) return false;
      const refusal = refusalFor(current, { ...event, actor } as RunEvent);
      if (refusal) {
        setStatus({ kind: 'error', message: refusal.message });
        return false;
      }
      const body: OutboxEvent = { ...event };
      const entry: OutboxEntry = { key: uuid(), runId, event: body, expectedSeq: lastSeq() + pendingRef.current.length, queuedAt: new Date().toISOString(), device: deviceName() };
      setQueue([...pendingRef.current, entry]);
      snapshotRef.current = withQueue(current, [entry]).snap;
      setStatus(null);
      void persistAndSend(entry);
      return true;
    },
    [actor, runId, withQueue, persistAndSend],
  );

  // Events this device queued before a reload or while offline: show them and send them.
  useEffect(() => {
    let live = true;
    outbox()
      .list(runId)
      .then(async (queued) => {
        if (!live || queued.length === 0) return;
        setQueue(queued);
        await rebase();
        await flushRef.current();
      })
      .catch(() => setStatus({ kind: 'error', message: 'This device’s offline storage is not available; events are sent straight away.' }));
    return () => {
      live = false;
    };
  }, [outbox, runId, rebase]);

  useEffect(() => {
    if (online) void flushRef.current();
  }, [online]);

  useEffect(() => {
    if (!online || pending.length === 0) return;
    const t = setInterval(() => void flushRef.current(), RETRY_MS);
    return () => clearInterval(t);
  }, [online, pending.length]);

  // Other people's events (a lead's approval, a reviewer's signature) arrive by polling.
  // Offline, the poll rests: the outbox and the online event bring the log up to date on return.
  const poll = usePoll(fetchNewer, POLL_MS, online);

  /** Whether the run accepts this event from this viewer now (the machine's own `can`). */
  const can = useCallback(
    (event: RunEventDraft): boolean => {
      if (!snapshot) return false;
      try {
        return snapshot.can({ ...event, actor } as RunEvent);
      } catch {
        return false; // a guard that cannot even judge the event (a malformed value) refuses it
      }
    },
    [snapshot, actor],
  );

  return {
    runId,
    can,
    steps,
    snapshot,
    logError: serverSnapshot.error,
    events,
    pending,
    online,
    sending,
    status,
    setStatus,
    record,
    actor,
    nameOf,
    pollError: poll.error,
  };
}
export type RunSync = ReturnType<typeof useRunSync>;
