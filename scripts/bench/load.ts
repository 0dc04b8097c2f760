/** HTTP load with autocannon: 32 connections on loopback, per-connection state for posts. */
import { randomUUID } from 'node:crypto';
import autocannon from 'autocannon';

export type LoadResult = { rps: number; p50: number; p99: number; non2xx: number; total: number; statuses?: Record<string, number> };

const summarise = (r: autocannon.Result): LoadResult => ({ rps: r.requests.average, p50: r.latency.p50, p99: r.latency.p99, non2xx: r.non2xx, total: r.requests.total });

export async function loadGet(url: string, cookie: string, seconds: number): Promise<LoadResult> {
  const r = await autocannon({ url, connections: 32, duration: seconds, headers: { cookie } });
  return summarise(r);
}

/**
 * Posts events along each run's happy path: connection i works run i, sending the next event
 * with the seq it last saw, as a technician's tablet would.
 */
export async function loadPost(base: string, prefix: string, runIds: string[], events: unknown[], cookie: string, origin: string, seconds: number): Promise<LoadResult> {
  let nextRun = 0;
  const statuses: Record<string, number> = {};
  const r = await autocannon({
    url: base,
    connections: runIds.length,
    duration: seconds,
    headers: { cookie, origin, 'content-type': 'application/json' },
    requests: [
      {
        method: 'POST',
        setupRequest: (req: any, ctx: any) => {
          if (ctx.runId === undefined) { ctx.runId = runIds[nextRun++ % runIds.length]; ctx.i = 0; ctx.seq = 0; }
          const event = events[ctx.i % events.length];
          return { ...req, path: `${prefix}/runs/${ctx.runId}/events`, body: JSON.stringify({ event, idempotencyKey: randomUUID(), expectedSeq: ctx.seq }) };
        },
        onResponse: (status: number, body: string, ctx: any) => {
          const key = status === 409 || status === 400 ? `${status} ${(/"code":"([^"]+)"/.exec(body) ?? [])[1] ?? ''}` : String(status);
          statuses[key] = (statuses[key] ?? 0) + 1;
          // Each connection owns its run, so a stored event moves its seq on by exactly one.
          if (status === 201) { ctx.i += 1; ctx.seq += 1; }
          else if (status === 409) { try { const b = JSON.parse(body); if (typeof b.error?.lastSeq === 'number') ctx.seq = b.error.lastSeq; } catch { /* keep */ } }
        },
      },
    ],
  } as autocannon.Options);
  return { ...summarise(r), statuses };
}
