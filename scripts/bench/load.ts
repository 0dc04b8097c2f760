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
 * Posts events along each run's happy path: worker i works run i alone, sending the next event
 * with the seq it last saw, as a technician's tablet would (one request in flight per run).
 */
export async function loadPost(base: string, prefix: string, runIds: string[], events: unknown[], cookie: string, origin: string, seconds: number): Promise<LoadResult> {
  const latencies: number[] = [];
  const statuses: Record<string, number> = {};
  const deadline = Date.now() + seconds * 1000;
  await Promise.all(runIds.map(async (runId) => {
    let seq = 0;
    for (let i = 0; i < events.length && Date.now() < deadline; ) {
      const t0 = performance.now();
      const res = await fetch(`${base}${prefix}/runs/${runId}/events`, { method: 'POST', headers: { cookie, origin, 'content-type': 'application/json' }, body: JSON.stringify({ event: events[i], idempotencyKey: randomUUID(), expectedSeq: seq }) });
      const text = await res.text();
      latencies.push(performance.now() - t0);
      const key = res.status === 201 ? '201' : `${res.status} ${(/"code":"([^"]+)"/.exec(text) ?? [])[1] ?? ''}`;
      statuses[key] = (statuses[key] ?? 0) + 1;
      if (res.status !== 201) break; // a refusal would repeat forever; stop this worker and report it
      seq = (JSON.parse(text) as { lastSeq: number }).lastSeq;
      i += 1;
    }
  }));
  latencies.sort((a, b) => a - b);
  const at = (q: number) => Math.round(latencies[Math.min(latencies.length - 1, Math.floor(q * latencies.length))] ?? 0);
  const non2xx = Object.entries(statuses).filter(([k]) => !k.startsWith('2')).reduce((a, [, n]) => a + n, 0);
  return { rps: latencies.length / seconds, p50: at(0.5), p99: at(0.99), non2xx, total: latencies.length, statuses };
}
