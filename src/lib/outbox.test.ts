import 'fake-indexeddb/auto';
import { describe, expect, it } from 'vitest';
import { createStore } from 'idb-keyval';
import { createOutbox, type OutboxEntry, type SendOutcome } from './outbox';

let n = 0;
/** A fresh database per test so queues never leak between them. */
const fresh = () => createOutbox(createStore(`outbox-test-${++n}`, 'queues'));
const entry = (key: string, expectedSeq: number, runId = 'run-1'): OutboxEntry => ({
  key,
  runId,
  event: { type: 'fastener.confirm', stepId: 's1', pass: 1, fastenerId: key },
  expectedSeq,
  queuedAt: '2026-01-01T00:00:00.000Z',
});

/** A fake server: applies each key once, in order, and answers like the API. */
function fakeServer(opts: { offlineAfter?: number; refuse?: string; conflictOn?: string } = {}) {
  const log: string[] = [];
  let calls = 0;
  const send = async (e: OutboxEntry): Promise<SendOutcome> => {
    calls++;
    if (opts.offlineAfter !== undefined && calls > opts.offlineAfter) return { kind: 'offline' };
    if (e.key === opts.conflictOn) return { kind: 'conflict' };
    if (e.key === opts.refuse) return { kind: 'refused', message: 'Next: pass 1, fastener 2' };
    if (!log.includes(e.key)) log.push(e.key);
    return { kind: 'sent', lastSeq: log.length };
  };
  return { log, send, calls: () => calls };
}

describe('outbox', () => {
  it('keeps entries in the order they were added, per run', async () => {
    const box = fresh();
    await box.add(entry('a', 4));
    await box.add(entry('x', 0, 'run-2'));
    await box.add(entry('b', 5));
    await box.add(entry('c', 6));
    expect((await box.list('run-1')).map((e) => e.key)).toEqual(['a', 'b', 'c']);
    expect((await box.list('run-2')).map((e) => e.key)).toEqual(['x']);
    expect(await box.count('run-3')).toBe(0);
  });

  it('ignores an entry whose idempotency key is already queued', async () => {
    const box = fresh();
    expect(await box.add(entry('a', 4))).toBe(true);
    expect(await box.add({ ...entry('a', 9) })).toBe(false);
    const q = await box.list('run-1');
    expect(q).toHaveLength(1);
    expect(q[0]!.expectedSeq).toBe(4);
  });

  it('survives a new outbox over the same database (a reload)', async () => {
    const store = createStore('outbox-reload', 'queues');
    await createOutbox(store).add(entry('a', 1));
    await createOutbox(store).add(entry('b', 2));
    expect((await createOutbox(store).list('run-1')).map((e) => e.key)).toEqual(['a', 'b']);
  });

  it('flushes in order and empties the queue', async () => {
    const box = fresh();
    for (const [k, s] of [['a', 0], ['b', 1], ['c', 2]] as const) await box.add(entry(k, s));
    const server = fakeServer();
    const r = await box.flush('run-1', server.send);
    expect(server.log).toEqual(['a', 'b', 'c']);
    expect(r).toMatchObject({ stoppedBy: null, remaining: 0 });
    expect(r.sent.map((e) => e.key)).toEqual(['a', 'b', 'c']);
    expect(await box.count('run-1')).toBe(0);
  });

  it('stops when the connection drops and resumes where it stopped', async () => {
    const box = fresh();
    for (const [k, s] of [['a', 0], ['b', 1], ['c', 2]] as const) await box.add(entry(k, s));
    const first = fakeServer({ offlineAfter: 1 });
    const r1 = await box.flush('run-1', first.send);
    expect(r1).toMatchObject({ stoppedBy: 'offline', remaining: 2 });
    expect(r1.at?.key).toBe('b');
    const again = fakeServer();
    again.log.push(...first.log);
    await box.flush('run-1', again.send);
    expect(again.log).toEqual(['a', 'b', 'c']);
  });

  it('two flushes at once send each entry once', async () => {
    const box = fresh();
    for (const [k, s] of [['a', 0], ['b', 1]] as const) await box.add(entry(k, s));
    const server = fakeServer();
    const [r1, r2] = await Promise.all([box.flush('run-1', server.send), box.flush('run-1', server.send)]);
    expect(server.calls()).toBe(2);
    expect(r1).toBe(r2);
  });

  it('drops a refused entry and stops; keeps the queue on a conflict for the caller to rebase', async () => {
    const box = fresh();
    for (const [k, s] of [['a', 0], ['b', 1], ['c', 2]] as const) await box.add(entry(k, s));
    const r = await box.flush('run-1', fakeServer({ refuse: 'b' }).send);
    expect(r).toMatchObject({ stoppedBy: 'refused', message: 'Next: pass 1, fastener 2', remaining: 1 });
    expect((await box.list('run-1')).map((e) => e.key)).toEqual(['c']);

    const box2 = fresh();
    for (const [k, s] of [['a', 0], ['b', 1]] as const) await box2.add(entry(k, s));
    const c = await box2.flush('run-1', fakeServer({ conflictOn: 'a' }).send);
    expect(c).toMatchObject({ stoppedBy: 'conflict', remaining: 2 });
    const rebased = await box2.rewrite('run-1', (q) => q.slice(1).map((e, i) => ({ ...e, expectedSeq: 7 + i })));
    expect(rebased.map((e) => [e.key, e.expectedSeq])).toEqual([['b', 7]]);
  });

  it('rewrite never keeps a key twice', async () => {
    const box = fresh();
    await box.add(entry('a', 0));
    const out = await box.rewrite('run-1', (q) => [...q, ...q]);
    expect(out).toHaveLength(1);
  });
});
