/** Jobs against the real PostgreSQL: who may open them, assignments, list filters, the status flow. */
import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import type { MikroORM } from '@mikro-orm/postgresql';
import { freshDatabase } from './support/db';
import { createShop, type TestShop } from './support/shops';
import { callRoute } from './support/routes';
import { releasedRevision } from './runs.fixtures';
import { Job } from '../../src/server/entities';
import * as jobsRoute from '../../src/pages/api/jobs/index';
import * as jobRoute from '../../src/pages/api/jobs/[id]/index';
import * as statusRoute from '../../src/pages/api/jobs/[id]/status';
import * as jobRunsRoute from '../../src/pages/api/jobs/[id]/runs';

let orm: MikroORM;
let a: TestShop;
let b: TestShop;

type Role = keyof TestShop['members'];
const as = (shop: TestShop, role: Role) => ({ shop, member: shop.members[role] });

beforeAll(async () => {
  orm = await freshDatabase();
  a = await createShop('Shop A');
  b = await createShop('Shop B');
}, 60_000);

const unit = (extra: Record<string, unknown> = {}) => ({ unitDescription: 'Invented 4-cylinder test unit', serial: 'XS-0001', hoursOrOdometer: '8 412 h', customer: 'Invented Farms (test)', ...extra });
const create = (body: unknown, role: Role = 'lead', shop = a) => callRoute(jobsRoute.POST, { method: 'POST', body, as: as(shop, role) });
const move = (id: string, to: string, role: Role) => callRoute(statusRoute.POST, { method: 'POST', params: { id }, body: { to }, as: as(a, role) });

describe('opening a job', () => {
  it('a lead opens a job with technicians and a reviewer; it reads back with names', async () => {
    const r = await create(unit({ technicianIds: [a.members.technician.userId], reviewerId: a.members.reviewer.userId, notes: 'Came in with low compression on 3' }));
    expect(r.status).toBe(201);
    expect(r.body).toMatchObject({
      code: expect.stringMatching(/^J-\d{4}$/), status: 'open', serial: 'XS-0001', hoursOrOdometer: '8 412 h', notes: 'Came in with low compression on 3',
      technicians: [{ id: a.members.technician.userId, name: a.members.technician.name }],
      reviewer: { id: a.members.reviewer.userId, name: a.members.reviewer.name }, runs: [], ageDays: 0, nextStatuses: ['teardown'],
    });
    const again = await callRoute(jobRoute.GET, { params: { id: r.body.id }, as: as(a, 'technician') });
    expect(again.body).toEqual({ ...r.body, nextStatuses: ['teardown'] });
  });

  it('a technician or reviewer may not open a job (403)', async () => {
    for (const role of ['technician', 'reviewer'] as const) {
      const r = await create(unit(), role);
      expect(r.status).toBe(403);
      expect(r.body.error.code).toBe('forbidden');
    }
  });

  it('refuses assignees from another shop or with the wrong role, with fields, and stores nothing', async () => {
    const before = await orm.em.fork().count(Job, { shopId: a.id });
    const r = await create(unit({ technicianIds: [a.members.technician.userId, b.members.technician.userId, a.members.reviewer.userId], reviewerId: a.members.technician.userId }));
    expect(r.status).toBe(400);
    expect(r.body.error.fields).toEqual({
      'technicianIds.1': 'This person is not a member of the shop.',
      'technicianIds.2': expect.stringContaining('cannot work steps'),
      reviewerId: expect.stringContaining('cannot sign off'),
    });
    const blank = await create({ unitDescription: '  ' });
    expect(blank.status).toBe(400);
    expect(Object.keys(blank.body.error.fields)).toEqual(['unitDescription']);
    expect(await orm.em.fork().count(Job, { shopId: a.id })).toBe(before);
  });

  it('gives concurrent jobs distinct, consecutive codes', async () => {
    const results = await Promise.all(Array.from({ length: 5 }, () => create(unit())));
    expect(results.map((r) => r.status)).toEqual([201, 201, 201, 201, 201]);
    const numbers = results.map((r) => Number(r.body.code.slice(2))).sort((x, y) => x - y);
    expect(new Set(numbers).size).toBe(5);
    expect(numbers[4]! - numbers[0]!).toBe(4);
  });
});

describe('editing and listing', () => {
  it('PATCH changes fields and reassigns; another shop gets 404; a technician gets 403', async () => {
    const { body: job } = await create(unit({ technicianIds: [a.members.technician.userId] }));
    const r = await callRoute(jobRoute.PATCH, { method: 'PATCH', params: { id: job.id }, body: { customer: 'Another invented customer', technicianIds: [a.members.lead.userId], reviewerId: null }, as: as(a, 'lead') });
    expect(r.status).toBe(200);
    expect(r.body).toMatchObject({ customer: 'Another invented customer', technicians: [{ id: a.members.lead.userId }], reviewer: null, serial: 'XS-0001' });
    expect((await callRoute(jobRoute.PATCH, { method: 'PATCH', params: { id: job.id }, body: { customer: 'x' }, as: as(b, 'lead') })).status).toBe(404);
    expect((await callRoute(jobRoute.PATCH, { method: 'PATCH', params: { id: job.id }, body: { customer: 'x' }, as: as(a, 'technician') })).status).toBe(403);
    expect((await callRoute(jobRoute.GET, { params: { id: job.id }, as: as(b, 'technician') })).status).toBe(404);
  });

  it('filters by status, technician ("me" too) and age, and never lists another shop’s jobs', async () => {
    const shop = await createShop('Listing shop');
    const mine = await create(unit({ technicianIds: [shop.members.technician.userId] }), 'lead', shop);
    const other = await create(unit(), 'lead', shop);
    await create(unit(), 'lead', b);
    await orm.em.fork().nativeUpdate(Job, { id: other.body.id }, { createdAt: new Date(Date.now() - 10 * 86_400_000), status: 'teardown' });
    const list = async (query: string, role: Role = 'lead') => (await callRoute(jobsRoute.GET, { path: `/api/jobs?${query}`, as: as(shop, role) })).body.jobs.map((j: { id: string }) => j.id).sort();

    expect(await list('')).toEqual([mine.body.id, other.body.id].sort());
    expect(await list('status=teardown')).toEqual([other.body.id]);
    expect(await list(`technician=${shop.members.technician.userId}`)).toEqual([mine.body.id]);
    expect(await list('technician=me', 'technician')).toEqual([mine.body.id]);
    expect(await list('olderThanDays=7')).toEqual([other.body.id]);
    expect(await list('status=&olderThanDays=')).toHaveLength(2);
    const all = await callRoute(jobsRoute.GET, { as: as(shop, 'lead') });
    expect(all.body.jobs.find((j: { id: string }) => j.id === other.body.id)).toMatchObject({ ageDays: 10, runs: 0, status: 'teardown', technicians: [] });

    const bad = await callRoute(jobsRoute.GET, { path: '/api/jobs?status=finished&olderThanDays=soon', as: as(shop, 'lead') });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['olderThanDays', 'status']);
  });
});

describe('status flow', () => {
  it('walks open → teardown → at machine shop → assembly → awaiting sign-off → closed with the right roles', async () => {
    const { body: job } = await create(unit());
    const steps: Array<[string, Role]> = [['teardown', 'technician'], ['at-machine-shop', 'lead'], ['assembly', 'lead'], ['awaiting-signoff', 'technician'], ['closed', 'reviewer']];
    for (const [to, role] of steps) {
      const r = await move(job.id, to, role);
      expect(r.status, JSON.stringify(r.body)).toBe(200);
      expect(r.body.status).toBe(to);
    }
  });

  it('answers 409 with a clear message for a move outside the flow, 403 for the wrong role', async () => {
    const { body: job } = await create(unit());
    const skip = await move(job.id, 'assembly', 'lead');
    expect(skip.status).toBe(409);
    expect(skip.body.error).toMatchObject({ code: 'out-of-order', message: 'A job cannot go from open to assembly; from open it can go to teardown.', status: 'open' });
    expect((await move(job.id, 'teardown', 'technician')).status).toBe(200);
    const techToShop = await move(job.id, 'at-machine-shop', 'technician');
    expect(techToShop.status).toBe(403);
    expect(techToShop.body.error).toMatchObject({ code: 'not-allowed', message: 'Only a lead or an owner may move a job from teardown to at machine shop.' });
    const unknown = await move(job.id, 'finished', 'lead');
    expect(unknown.status).toBe(400);
    expect((await callRoute(statusRoute.POST, { method: 'POST', params: { id: job.id }, body: { to: 'open' }, as: as(b, 'lead') })).status).toBe(404);
    expect((await callRoute(jobRoute.GET, { params: { id: job.id }, as: as(a, 'lead') })).body.status).toBe('teardown');
  });

  it('refuses to close a job whose runs are unfinished, and new runs once it waits for sign-off', async () => {
    const { revisionId } = await releasedRevision(orm, a);
    const { body: job } = await create(unit());
    const run = await callRoute(jobRunsRoute.POST, { method: 'POST', params: { id: job.id }, body: { revisionId }, as: as(a, 'technician') });
    expect(run.status).toBe(201);
    for (const [to, role] of [['assembly', 'lead'], ['awaiting-signoff', 'technician']] as Array<[string, Role]>) expect((await move(job.id, to, role)).status).toBe(200);
    const close = await move(job.id, 'closed', 'reviewer');
    expect(close.status).toBe(409);
    expect(close.body.error.message).toMatch(/1 unfinished run; finish it before closing/);
    const late = await callRoute(jobRunsRoute.POST, { method: 'POST', params: { id: job.id }, body: { revisionId }, as: as(a, 'lead') });
    expect(late.status).toBe(409);
    expect(late.body.error.message).toMatch(/waiting for sign-off/);
  });

  it('an unknown job id answers 404, also when it is not a uuid', async () => {
    expect((await move(randomUUID(), 'teardown', 'lead')).status).toBe(404);
    expect((await move('J-0001', 'teardown', 'lead')).status).toBe(404);
  });
});
