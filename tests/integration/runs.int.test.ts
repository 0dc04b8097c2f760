/** Runs and their event log against the real PostgreSQL: order, idempotency, concurrency, replay, scoping. */
import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import type { MikroORM } from '@mikro-orm/postgresql';
import { freshDatabase } from './support/db';
import { createShop, type TestShop } from './support/shops';
import { callRoute } from './support/routes';
import { ORDER, releasedRevision, retire } from './runs.fixtures';
import { applyEvent, replay, runProgress, startRun, stepStates, storeRun, nextExpected, type RunSnapshot } from '../../src/domain/run';
import { getReleasedRevisionContent } from '../../src/server/services/procedures.service';
import { RunEvent } from '../../src/server/entities';
import * as jobsRoute from '../../src/pages/api/jobs/index';
import * as jobRoute from '../../src/pages/api/jobs/[id]/index';
import * as jobRunsRoute from '../../src/pages/api/jobs/[id]/runs';
import * as runRoute from '../../src/pages/api/runs/[id]/index';
import * as eventsRoute from '../../src/pages/api/runs/[id]/events';
import * as historyRoute from '../../src/pages/api/runs/[id]/history';
import * as signoffsRoute from '../../src/pages/api/runs/[id]/signoffs';

let orm: MikroORM;
let a: TestShop;
let b: TestShop;
let revisionId: string;
let draftId: string;

type Role = keyof TestShop['members'];
const as = (shop: TestShop, role: Role) => ({ shop, member: shop.members[role] });

beforeAll(async () => {
  orm = await freshDatabase();
  a = await createShop('Shop A');
  b = await createShop('Shop B');
  ({ revisionId, draftId } = await releasedRevision(orm, a));
}, 60_000);

async function newJob(shop = a): Promise<string> {
  const r = await callRoute(jobsRoute.POST, { method: 'POST', body: { unitDescription: 'Invented test unit', technicianIds: [shop.members.technician.userId], reviewerId: shop.members.reviewer.userId }, as: as(shop, 'lead') });
  expect(r.status).toBe(201);
  return r.body.id;
}

async function newRun(shop = a, rev = revisionId): Promise<string> {
  const jobId = await newJob(shop);
  const r = await callRoute(jobRunsRoute.POST, { method: 'POST', params: { id: jobId }, body: { revisionId: rev }, as: as(shop, 'technician') });
  expect(r.status).toBe(201);
  return r.body.run.id;
}

const post = (runId: string, event: Record<string, unknown>, expectedSeq: number, role: Role = 'technician', idempotencyKey: string = randomUUID(), shop = a) =>
  callRoute(eventsRoute.POST, { method: 'POST', params: { id: runId }, body: { event, idempotencyKey, expectedSeq, device: 'bench tablet 2' }, as: as(shop, role) });

/** Hold points are signed on the sign-off route, with the signer's password (tests/integration/support/shops.ts). */
const sign = (runId: string, stepId: string, role: Role = 'reviewer', shop = a, password = 'integration-pass-1') =>
  callRoute(signoffsRoute.POST, { method: 'POST', params: { id: runId }, body: { meaning: 'approved-for-assembly', password, stepId }, as: as(shop, role) });

/** Posts FULL[i]: work through the events route, the hold point's signature through the sign-off route. */
const send = (runId: string, i: number) => {
  const [role, ev] = FULL[i]!;
  return ev.type === 'hold.sign' ? sign(runId, String(ev.stepId), role) : post(runId, ev, i, role);
};

/** The whole small run, in order, with the role that sends each event. */
const FULL: Array<[Role, Record<string, unknown>]> = [
  ['technician', { type: 'step.start', stepId: 's-clean' }],
  ['technician', { type: 'step.complete', stepId: 's-clean', note: 'Degreased' }],
  ['technician', { type: 'step.start', stepId: 's-bolts' }],
  ...[1, 2].flatMap((pass) => ORDER.map((fastenerId): [Role, Record<string, unknown>] => ['technician', { type: 'fastener.confirm', stepId: 's-bolts', pass, fastenerId }])),
  // What the sign-off route posts for meaning 'approved-for-assembly'.
  ['reviewer', { type: 'hold.sign', stepId: 's-review', meaning: 'Approved for assembly' }],
];

describe('starting a run', () => {
  it('pins the released revision and answers the runner state', async () => {
    const jobId = await newJob();
    const r = await callRoute(jobRunsRoute.POST, { method: 'POST', params: { id: jobId }, body: { revisionId }, as: as(a, 'technician') });
    expect(r.status).toBe(201);
    expect(r.body.run).toMatchObject({ jobId, revisionId, revisionNumber: 1, status: 'active', lastSeq: 0 });
    expect(r.body.steps.map((s: { id: string }) => s.id)).toEqual(['s-clean', 's-bolts', 's-review']);
    expect(r.body.next).toMatchObject({ stepId: 's-clean', description: 'Next: start the step' });
    expect(r.body.progress).toEqual({ done: 0, total: 3, complete: false });
    const job = await callRoute(jobRoute.GET, { params: { id: jobId }, as: as(a, 'lead') });
    expect(job.body.status).toBe('teardown');
    expect(job.body.runs).toEqual([expect.objectContaining({ id: r.body.run.id, progress: { done: 0, total: 3 }, next: 'Next: start the step' })]);
  });

  it('refuses a draft (409), a retired revision (409) and another shop’s revision (404)', async () => {
    const jobId = await newJob();
    const draft = await callRoute(jobRunsRoute.POST, { method: 'POST', params: { id: jobId }, body: { revisionId: draftId }, as: as(a, 'lead') });
    expect(draft.status).toBe(409);
    expect(draft.body.error.message).toMatch(/draft/);

    const other = await releasedRevision(orm, a);
    await retire(orm, a, other.revisionId);
    const retired = await callRoute(jobRunsRoute.POST, { method: 'POST', params: { id: jobId }, body: { revisionId: other.revisionId }, as: as(a, 'lead') });
    expect(retired.status).toBe(409);
    expect(retired.body.error.message).toMatch(/retired/);

    const bJob = await newJob(b);
    const foreign = await callRoute(jobRunsRoute.POST, { method: 'POST', params: { id: bJob }, body: { revisionId }, as: as(b, 'lead') });
    expect(foreign.status).toBe(404);
    expect((await callRoute(jobRoute.GET, { params: { id: jobId }, as: as(a, 'lead') })).body.runs).toEqual([]);
  });

  it('keeps a run readable after its revision is retired', async () => {
    const rev = await releasedRevision(orm, a);
    const runId = await newRun(a, rev.revisionId);
    await retire(orm, a, rev.revisionId);
    const r = await callRoute(runRoute.GET, { params: { id: runId }, as: as(a, 'technician') });
    expect(r.status).toBe(200);
    expect(r.body.steps).toHaveLength(3);
  });

  it('needs run:start (a reviewer gets 403) and a uuid revision (400)', async () => {
    const jobId = await newJob();
    expect((await callRoute(jobRunsRoute.POST, { method: 'POST', params: { id: jobId }, body: { revisionId }, as: as(a, 'reviewer') })).status).toBe(403);
    const bad = await callRoute(jobRunsRoute.POST, { method: 'POST', params: { id: jobId }, body: { revisionId: 'rev-1' }, as: as(a, 'lead') });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toEqual(['revisionId']);
  });
});

describe('recording events', () => {
  it('refuses an out-of-order event with 409 and the machine’s message, storing nothing', async () => {
    const runId = await newRun();
    for (const [i, [role, ev]] of FULL.slice(0, 3).entries()) expect((await post(runId, ev, i, role)).status).toBe(201);
    // The first fastener of pass 1 is b2 (label "2"); b1 is out of order.
    const wrong = await post(runId, { type: 'fastener.confirm', stepId: 's-bolts', pass: 1, fastenerId: 'b1' }, 3);
    expect(wrong.status).toBe(409);
    expect(wrong.body.error).toMatchObject({ code: 'out-of-order', message: 'Next: pass 1, fastener 2', next: { stepId: 's-bolts' } });
    const skipAhead = await post(runId, { type: 'step.start', stepId: 's-review' }, 3);
    expect(skipAhead.status).toBe(409);
    expect(skipAhead.body.error.message).toBe('Next: pass 1, fastener 2');
    const log = await callRoute(eventsRoute.GET, { params: { id: runId }, as: as(a, 'technician') });
    expect(log.body.lastSeq).toBe(3);
    expect(log.body.events.map((e: { seq: number }) => e.seq)).toEqual([1, 2, 3]);
  });

  it('fills the actor from the session, whatever the body claims, and keeps the device', async () => {
    const runId = await newRun();
    const r = await post(runId, { type: 'step.start', stepId: 's-clean', actor: { userId: a.members.owner.userId, role: 'owner' } }, 0);
    expect(r.status).toBe(201);
    expect(r.body.event).toMatchObject({ seq: 1, type: 'step.start', device: 'bench tablet 2', actor: { id: a.members.technician.userId, name: a.members.technician.name, role: 'technician' } });
    expect(r.body.event.payload.actor).toEqual({ userId: a.members.technician.userId, role: 'technician' });
    expect(r.body).toMatchObject({ lastSeq: 1, next: { description: 'Next: complete the step' }, progress: { done: 0, total: 3 } });
    // The read paths (run view, poll, history) give the very entry the post answered with.
    const view = await callRoute(runRoute.GET, { params: { id: runId }, as: as(a, 'technician') });
    const poll = await callRoute(eventsRoute.GET, { path: '/api/runs/x/events?after=0', params: { id: runId }, as: as(a, 'technician') });
    const history = await callRoute(historyRoute.GET, { params: { id: runId }, as: as(a, 'technician') });
    expect(view.body.events).toEqual([r.body.event]);
    expect(poll.body.events).toEqual([r.body.event]);
    expect(history.body.events).toEqual([r.body.event]);
    expect(r.body.event.recordedAt).toMatch(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z$/);
  });

  it('answers a bad event with 400 and a stale expectedSeq with 409 conflict and the missing events', async () => {
    const runId = await newRun();
    const bad = await post(runId, { type: 'fastener.confirm', stepId: 's-bolts', pass: 'one' }, 0);
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('bad-request');
    expect((await post(runId, FULL[0]![1], 0)).status).toBe(201);
    expect((await post(runId, FULL[1]![1], 1)).status).toBe(201);
    const stale = await post(runId, FULL[2]![1], 0);
    expect(stale.status).toBe(409);
    expect(stale.body.error).toMatchObject({ code: 'conflict', message: 'Someone else recorded on this run first; here is the fresh state.', lastSeq: 2 });
    expect(stale.body.error.events.map((e: { seq: number; type: string }) => [e.seq, e.type])).toEqual([[1, 'step.start'], [2, 'step.complete']]);
  });

  it('stores one event for one idempotency key and answers the original to a retry, even when stale', async () => {
    const runId = await newRun();
    const key = randomUUID();
    const first = await post(runId, FULL[0]![1], 0, 'technician', key);
    expect(first.status).toBe(201);
    const again = await post(runId, FULL[0]![1], 0, 'technician', key);
    expect(again.status).toBe(200);
    expect(again.body.event).toEqual(first.body.event);
    expect(again.body.lastSeq).toBe(1);
    expect((await post(runId, FULL[1]![1], 1)).status).toBe(201);
    const late = await post(runId, FULL[0]![1], 0, 'technician', key);
    expect(late.status).toBe(200);
    expect(late.body.event.seq).toBe(1);
    expect(await orm.em.fork().count(RunEvent, { run: runId })).toBe(2);
    const reused = await post(runId, FULL[2]![1], 2, 'technician', key);
    expect(reused.status).toBe(409);
    expect(reused.body.error.message).toMatch(/already used for a different event/);
  });

  it('never forks the log under 10 concurrent submissions with the same expectedSeq', async () => {
    const runId = await newRun();
    expect((await post(runId, FULL[0]![1], 0)).status).toBe(201);
    const results = await Promise.all(Array.from({ length: 10 }, () => post(runId, FULL[1]![1], 1)));
    const statuses = results.map((r) => r.status).sort();
    expect(statuses).toEqual([201, ...Array(9).fill(409)]);
    for (const r of results.filter((x) => x.status === 409)) expect(r.body.error.code).toBe('conflict');
    const rows = await orm.em.fork().find(RunEvent, { run: runId }, { orderBy: { seq: 'asc' } });
    expect(rows.map((r) => r.seq)).toEqual([1, 2]);
    expect((await callRoute(runRoute.GET, { params: { id: runId }, as: as(a, 'technician') })).body.run.lastSeq).toBe(2);
  });

  it('refuses hold.sign on the plain events route (403, nothing stored); the sign-off route signs, for the hold point’s roles only', async () => {
    const runId = await newRun();
    const byReviewer = await post(runId, FULL[0]![1], 0, 'reviewer');
    expect(byReviewer.status).toBe(403);
    expect(byReviewer.body.error.code).toBe('forbidden');
    for (const [i, [role, ev]] of FULL.slice(0, -1).entries()) expect((await post(runId, ev, i, role)).status).toBe(201);
    for (const role of ['reviewer', 'technician', 'lead', 'owner'] as const) {
      const plain = await post(runId, FULL.at(-1)![1], FULL.length - 1, role);
      expect(plain.status, role).toBe(403);
      expect(plain.body.error).toMatchObject({ code: 'forbidden', message: 'Sign hold points on the sign-off page, with your password.' });
    }
    expect(await orm.em.fork().count(RunEvent, { run: runId })).toBe(FULL.length - 1);
    // The hold point lists reviewer as its signer (the machine's own isSigner rule is pinned in run-refusals.test.ts).
    const techSign = await sign(runId, 's-review', 'technician');
    expect(techSign.status).toBe(403);
    expect(techSign.body.error).toMatchObject({ code: 'forbidden', message: expect.stringContaining('may not sign this hold point') });
    expect(await orm.em.fork().count(RunEvent, { run: runId })).toBe(FULL.length - 1);
    const signed = await sign(runId, 's-review');
    expect(signed.status, JSON.stringify(signed.body)).toBe(201);
    expect(signed.body).toMatchObject({ stepId: 's-review', signerRole: 'reviewer', runSeq: FULL.length });
  });
});

describe('a full run', () => {
  it('replays from the database log to the same state as the live one, completes the run and moves nothing else', async () => {
    const runId = await newRun();
    const steps = (await getReleasedRevisionContent(orm.em.fork(), a.id, revisionId)).steps;
    let live: RunSnapshot = startRun(steps);
    for (const [i, [role, ev]] of FULL.entries()) {
      const r = await send(runId, i);
      expect(r.status, JSON.stringify(r.body)).toBe(201);
      expect(ev.type === 'hold.sign' ? r.body.runSeq : r.body.event.seq).toBe(i + 1);
      const applied = applyEvent(steps, storeRun(live), { ...ev, actor: { userId: a.members[role].userId, role } });
      if (!applied.ok) throw new Error(applied.message);
      live = applied.snapshot;
    }
    expect(runProgress(live)).toEqual({ done: 3, total: 3, complete: true });
    expect(nextExpected(live)).toBeNull();

    const rows = await orm.em.fork().find(RunEvent, { run: runId }, { orderBy: { seq: 'asc' } });
    const fromDb = replay(steps, rows.map((r) => r.payload));
    expect(storeRun(fromDb)).toEqual(storeRun(live));

    const got = await callRoute(runRoute.GET, { params: { id: runId }, as: as(a, 'reviewer') });
    expect(got.body.run.status).toBe('complete');
    expect(got.body.progress).toEqual(runProgress(live));
    expect(got.body.stepStates).toEqual(stepStates(live));
    expect(got.body.next).toEqual(nextExpected(live));
    expect(got.body.events).toHaveLength(FULL.length);

    const done = await post(runId, { type: 'step.start', stepId: 's-clean' }, FULL.length);
    expect(done.status).toBe(409);
    expect(done.body.error.message).toBe('The run is complete');

    const history = await callRoute(historyRoute.GET, { params: { id: runId }, as: as(a, 'lead') });
    expect(history.status).toBe(200);
    expect(history.body.revision).toMatchObject({ id: revisionId, number: 1, procedureName: expect.stringContaining('Demo cover teardown') });
    expect(history.body.events.at(-2)).toMatchObject({ type: 'fastener.confirm', device: 'bench tablet 2' });
    expect(history.body.events.at(-1)).toMatchObject({ type: 'hold.sign', actor: { name: a.members.reviewer.name, role: 'reviewer' }, device: 'sign-off' });

    const after = await callRoute(eventsRoute.GET, { path: `/api/runs/${runId}/events?after=7`, params: { id: runId }, as: as(a, 'technician') });
    expect(after.body).toMatchObject({ lastSeq: FULL.length });
    expect(after.body.events.map((e: { seq: number }) => e.seq)).toEqual([8, 9, 10]);
  });

  it('refuses to change or delete a logged event in the database itself', async () => {
    const runId = await newRun();
    expect((await post(runId, FULL[0]![1], 0)).status).toBe(201);
    const conn = orm.em.fork().getConnection();
    await expect(conn.execute(`update run_event set type = 'step.complete' where run_id = ?`, [runId])).rejects.toThrow(/append-only/);
    await expect(conn.execute(`delete from run_event where run_id = ?`, [runId])).rejects.toThrow(/append-only/);
  });
});

describe('shop scoping', () => {
  it("a technician of shop B gets 404 on shop A's job and run, in every route", async () => {
    const runId = await newRun();
    const jobId = (await callRoute(runRoute.GET, { params: { id: runId }, as: as(a, 'technician') })).body.run.jobId;
    const bTech = as(b, 'technician');
    const answers = [
      await callRoute(jobRoute.GET, { params: { id: jobId }, as: bTech }),
      await callRoute(jobRunsRoute.POST, { method: 'POST', params: { id: jobId }, body: { revisionId }, as: bTech }),
      await callRoute(runRoute.GET, { params: { id: runId }, as: bTech }),
      await callRoute(eventsRoute.GET, { params: { id: runId }, as: bTech }),
      await callRoute(historyRoute.GET, { params: { id: runId }, as: bTech }),
      await post(runId, FULL[0]![1], 0, 'technician', randomUUID(), b),
    ];
    expect(answers.map((r) => r.status)).toEqual([404, 404, 404, 404, 404, 404]);
    for (const r of answers) expect(r.body.error.code).toBe('not-found');
    expect((await callRoute(eventsRoute.GET, { params: { id: runId }, as: as(a, 'technician') })).body.lastSeq).toBe(0);
    expect((await callRoute(runRoute.GET, { params: { id: 'not-a-uuid' }, as: bTech })).status).toBe(404);
  });
});

describe('demo seed', () => {
  it('seeds a job part-way through its teardown and one waiting only for the final sign-off, both replayable', async () => {
    const { DemoSeeder } = await import('../../src/server/seeders/demo.seeder');
    const { DEMO_SHOP, DEMO_MEMBERS, DEMO_PASSWORD } = await import('../../src/server/seeders/demo-people');
    await orm.seeder.seed(DemoSeeder);
    const [shop] = await orm.em.fork().getConnection().execute<Array<{ id: string; name: string }>>(`select id, name from organization where slug = ?`, [DEMO_SHOP.slug]);
    const users = await orm.em.fork().getConnection().execute<Array<{ id: string; email: string }>>(`select id, email from "user" where email like '%@demo.torquetrail.test'`);
    const members = Object.fromEntries(DEMO_MEMBERS.map((m) => [m.role, { userId: users.find((u) => u.email === m.email)!.id, name: m.name, email: m.email, role: m.role, headers: new Headers() }])) as TestShop['members'];
    const demo: TestShop = { id: shop!.id, name: shop!.name, members };

    const jobs = (await callRoute(jobsRoute.GET, { path: `/api/jobs?technician=me`, as: as(demo, 'technician') })).body.jobs;
    expect(jobs.map((j: { status: string }) => j.status).sort()).toEqual(['awaiting-signoff', 'teardown']);
    for (const j of jobs) expect(j).toMatchObject({ technicians: [{ name: members.technician.name }], reviewer: { name: members.reviewer.name } });

    const partWay = await callRoute(jobRoute.GET, { params: { id: jobs.find((j: { status: string }) => j.status === 'teardown').id }, as: as(demo, 'technician') });
    expect(partWay.body.runs).toHaveLength(1);
    expect(partWay.body.runs[0].next).toMatch(/^Next: pass 1, fastener /);
    const run = await callRoute(runRoute.GET, { params: { id: partWay.body.runs[0].id }, as: as(demo, 'technician') });
    expect(run.status).toBe(200);
    expect(run.body.next.stepId).toBe('td-11-rocker-pedestal-bolts');
    expect(run.body.progress.done).toBe(10);
    expect(run.body.events.map((e: { seq: number }) => e.seq)).toEqual(run.body.events.map((_: unknown, i: number) => i + 1));

    const waiting = await callRoute(jobRoute.GET, { params: { id: jobs.find((j: { status: string }) => j.status === 'awaiting-signoff').id }, as: as(demo, 'reviewer') });
    expect(waiting.body.runs.map((r: { status: string }) => r.status)).toEqual(['complete', 'active']);
    const build = waiting.body.runs[1];
    expect(build.progress.done).toBe(build.progress.total - 1);
    expect(build.next).toBe('Waiting for a reviewer to sign the hold point');
    const { body: state } = await callRoute(runRoute.GET, { params: { id: build.id }, as: as(demo, 'reviewer') });
    const plain = await post(build.id, { type: 'hold.sign', stepId: 'as-33-build-sign-off', meaning: 'Build checked against the procedure' }, state.run.lastSeq, 'reviewer', randomUUID(), demo);
    expect(plain.status).toBe(403);
    const signed = await sign(build.id, 'as-33-build-sign-off', 'reviewer', demo, DEMO_PASSWORD);
    expect(signed.status, JSON.stringify(signed.body)).toBe(201);
    expect(signed.body.runSeq).toBe(state.run.lastSeq + 1);
    expect((await callRoute(runRoute.GET, { params: { id: build.id }, as: as(demo, 'reviewer') })).body.progress.complete).toBe(true);
  });
});
