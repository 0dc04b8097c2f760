/**
 * The soak's load and its verdict (started by scripts/soak.mjs over IPC). Several simulated
 * technicians, each on its own run, post the run's happy path one event at a time with an
 * idempotency key and expectedSeq; on a connection error or a 5xx they retry the same key with
 * the same expectedSeq until it is acknowledged. When told to stop, each finishes the event it
 * has in hand, then the log in PostgreSQL is checked against what was acknowledged, and every
 * run's state is rebuilt from the log and compared with GET /api/runs/:id.
 * Invented example data, not a maker's specification.
 */
import { randomUUID } from 'node:crypto';
import pg from 'pg';
import { rowsLayout } from '../../src/domain/fastener-layouts';
import { step as stepSchema, type Step } from '../../src/domain/procedure/schema';
import { nextExpected, replay, runProgress, stepStates } from '../../src/domain/run';
import { happyPath } from '../bench/large-shop';

const APP_URL = process.env.APP_URL!;
const TECHS = Number(process.env.SOAK_TECHS ?? 4);
const PACE_MS = Number(process.env.SOAK_PACE_MS ?? 25);
const DEADLINE = Date.now() + Number(process.env.SOAK_MAX_S ?? 240) * 1000;
const NOTE = "Example data — not a maker's specification";
const PASSWORD = 'torquetrail-demo';

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const send = (m: unknown) => process.send?.(m);
let stopping = false;
process.on('message', (m: { type?: string }) => { if (m?.type === 'stop') stopping = true; });

type Res = { status: number; body: any };
/** One request; a thrown connection error comes back as status 0. */
async function call(cookie: string, method: string, path: string, body?: unknown): Promise<Res> {
  try {
    const res = await fetch(`${APP_URL}${path}`, { method, headers: { cookie, origin: APP_URL, ...(body !== undefined ? { 'content-type': 'application/json' } : {}) }, body: body === undefined ? undefined : JSON.stringify(body), signal: AbortSignal.timeout(15_000) });
    const text = await res.text();
    let parsed: unknown = text;
    try { parsed = JSON.parse(text); } catch { /* not JSON */ }
    return { status: res.status, body: parsed };
  } catch {
    return { status: 0, body: null };
  }
}
/** Setup and checks: retried through restarts until the deadline. */
async function must(cookie: string, method: string, path: string, body?: unknown): Promise<any> {
  for (;;) {
    const r = await call(cookie, method, path, body);
    if (r.status >= 200 && r.status < 300) return r.body;
    if ((r.status !== 0 && r.status < 500) || Date.now() > DEADLINE) throw new Error(`${method} ${path} → ${r.status} ${JSON.stringify(r.body).slice(0, 300)}`);
    await sleep(200);
  }
}
async function signIn(email: string): Promise<string> {
  const res = await fetch(`${APP_URL}/api/auth/sign-in/email`, { method: 'POST', headers: { 'content-type': 'application/json', origin: APP_URL }, body: JSON.stringify({ email, password: PASSWORD }) });
  if (!res.ok) throw new Error(`sign-in ${email}: ${res.status}`);
  return res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
}

function steps(): Step[] {
  const out: Step[] = [];
  for (let i = 0; i < Number(process.env.SOAK_STEPS ?? 300); i++) {
    const id = `k${String(i + 1).padStart(3, '0')}`;
    out.push(i % 150 === 10
      ? stepSchema.parse({ id, kind: 'fastener-sequence', title: `Loosen cap bolts, group ${i}`, body: NOTE, direction: 'loosen', map: { fasteners: rowsLayout(2, 2), order: [], orderMethod: 'reverse-centre-out' }, passes: [{ kind: 'loosen', degrees: 90 }, { kind: 'remove' }] })
      : stepSchema.parse({ id, kind: 'action', title: `Soak bench task ${i + 1}`, body: NOTE }));
  }
  return out;
}

type Ack = { runId: string; key: string; seq: number; status: number };
const acks: Ack[] = [];
const tried = new Map<string, { runId: string; attempts: number }>();
const counts = { attempts: 0, connectionErrors: 0, serverErrors: 0, retriedAcks: 0, refusals: 0 };
const problems: string[] = [];

async function technician(cookie: string, runId: string, events: Array<Record<string, unknown>>) {
  let seq = 0;
  for (const event of events) {
    if (stopping) return;
    const key = randomUUID();
    tried.set(key, { runId, attempts: 0 });
    let attempts = 0;
    for (;;) {
      attempts++;
      counts.attempts++;
      tried.get(key)!.attempts = attempts;
      const r = await call(cookie, 'POST', `/api/runs/${runId}/events`, { event, idempotencyKey: key, expectedSeq: seq, device: 'soak tablet' });
      if (r.status === 201 || r.status === 200) {
        acks.push({ runId, key, seq: r.body.event.seq, status: r.status });
        send({ type: 'acked', total: acks.length }); // the soak paces its kills on these
        if (attempts > 1) counts.retriedAcks++;
        if (r.body.event.seq !== seq + 1) problems.push(`run ${runId}: key ${key} acknowledged as seq ${r.body.event.seq}, expected ${seq + 1}`);
        seq = r.body.lastSeq;
        break;
      }
      if (r.status === 0) counts.connectionErrors++;
      else if (r.status >= 500) counts.serverErrors++;
      else {
        counts.refusals++;
        problems.push(`run ${runId}: ${JSON.stringify(event)} refused with ${r.status} ${JSON.stringify(r.body).slice(0, 300)}`);
        return;
      }
      if (Date.now() > DEADLINE) { problems.push(`run ${runId}: key ${key} never acknowledged before the deadline`); return; }
      await sleep(100 + Math.min(attempts, 10) * 30);
    }
    await sleep(PACE_MS);
  }
}

async function verify(lead: string, runIds: string[]) {
  const db = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await db.connect();
  try {
    const ackByKey = new Map(acks.map((a) => [a.key, a]));
    let logged = 0;
    for (const runId of runIds) {
      const { rows } = await db.query<{ seq: number; idempotency_key: string; payload: unknown }>('select seq, idempotency_key, payload from run_event where run_id = $1 order by seq', [runId]);
      logged += rows.length;
      rows.forEach((r, i) => { if (r.seq !== i + 1) problems.push(`run ${runId}: seq ${r.seq} at position ${i + 1} (gap or duplicate)`); });
      const keys = new Map<string, number>();
      for (const r of rows) keys.set(r.idempotency_key, (keys.get(r.idempotency_key) ?? 0) + 1);
      for (const [k, n] of keys) {
        if (n > 1) problems.push(`run ${runId}: key ${k} stored ${n} times`);
        if (!tried.has(k)) problems.push(`run ${runId}: key ${k} in the log was never sent`);
        else if (!ackByKey.has(k)) problems.push(`run ${runId}: key ${k} stored but never acknowledged`);
      }
      for (const a of acks.filter((x) => x.runId === runId)) {
        const row = rows.find((r) => r.idempotency_key === a.key);
        if (!row) problems.push(`run ${runId}: acknowledged key ${a.key} (seq ${a.seq}) is not in the log`);
        else if (row.seq !== a.seq) problems.push(`run ${runId}: acknowledged key ${a.key} as seq ${a.seq} but the log has seq ${row.seq}`);
      }
      const api = await must(lead, 'GET', `/api/runs/${runId}`);
      const rebuilt = replay(api.steps, rows.map((r) => r.payload));
      const same = (what: string, a: unknown, b: unknown) => { if (JSON.stringify(a) !== JSON.stringify(b)) problems.push(`run ${runId}: ${what} differs between GET and replay of the log`); };
      same('stepStates', api.stepStates, stepStates(rebuilt));
      same('progress', api.progress, runProgress(rebuilt));
      same('next', api.next, nextExpected(rebuilt));
      if (api.events.length !== rows.length) problems.push(`run ${runId}: GET lists ${api.events.length} events, the log has ${rows.length}`);
    }
    return logged;
  } finally {
    await db.end();
  }
}

async function main() {
  const lead = await signIn('lars.lead@demo.torquetrail.test');
  const techEmail = 'tess.tech@demo.torquetrail.test';
  const techCookies = await Promise.all(Array.from({ length: TECHS }, () => signIn(techEmail)));
  const me = await must(techCookies[0]!, 'GET', '/api/auth/get-session');
  const s = steps();
  const created = await must(lead, 'POST', '/api/procedures', { name: `Soak teardown ${randomUUID().slice(0, 6)}`, kind: 'teardown', engineFamily: 'Soak family', description: NOTE });
  const draft = await must(lead, 'PUT', `/api/revisions/${created.draft.id}/content`, { steps: s, version: created.draft.version });
  const released = await must(lead, 'POST', `/api/revisions/${draft.id}/release`, { note: 'soak' });
  const runIds: string[] = [];
  for (let i = 0; i < TECHS; i++) {
    const job = await must(lead, 'POST', '/api/jobs', { unitDescription: `Soak unit ${i + 1}`, serial: `SK-${i + 1}`, technicianIds: [me.user.id] });
    runIds.push((await must(techCookies[i]!, 'POST', `/api/jobs/${job.id}/runs`, { revisionId: released.id })).run.id);
  }
  const events = happyPath(s) as unknown as Array<Record<string, unknown>>;
  send({ type: 'ready', runs: runIds.length, eventsPerRun: events.length });
  const t0 = Date.now();
  await Promise.all(runIds.map((id, i) => technician(techCookies[i]!, id, events)));
  const loadSeconds = (Date.now() - t0) / 1000;
  const logged = await verify(lead, runIds);
  send({ type: 'done', ok: problems.length === 0, problems: problems.slice(0, 30), problemCount: problems.length, summary: { technicians: TECHS, keys: tried.size, acknowledged: acks.length, logged, acknowledgedAfterRetry: acks.filter((a) => a.status === 200).length, ...counts, loadSeconds } });
}

main().catch((e) => {
  send({ type: 'done', ok: false, problems: [e instanceof Error ? e.stack ?? e.message : String(e)], problemCount: 1, summary: { acknowledged: acks.length, ...counts } });
}).finally(() => setTimeout(() => process.exit(0), 200));
