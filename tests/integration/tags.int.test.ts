/** Tags projected from tag-part steps, their edits and history, and the QR label sheet. */
import { beforeAll, describe, expect, it } from 'vitest';
import type { MikroORM } from '@mikro-orm/postgresql';
import { expectedModules, readLabels } from '../support/labels-pdf';
import { freshDatabase } from './support/db';
import { createShop, type TestShop } from './support/shops';
import { callRoute } from './support/routes';
import { CAPS, as, jobWithRun, partsRevision, record, throughCaps } from './parts.fixtures';
import { Tag, TagHistory } from '../../src/server/entities';
import { syncTags } from '../../src/server/services/tags.service';
import * as jobTagsRoute from '../../src/pages/api/jobs/[id]/tags';
import * as tagRoute from '../../src/pages/api/tags/[id]';
import * as labelsRoute from '../../src/pages/api/jobs/[id]/labels.pdf';

let orm: MikroORM;
let a: TestShop;
let b: TestShop;
let job: { jobId: string; jobCode: string; runId: string };

beforeAll(async () => {
  orm = await freshDatabase();
  a = await createShop('Tags A');
  b = await createShop('Tags B');
  job = await jobWithRun(a, await partsRevision(orm, a));
  await record(a, job.runId, throughCaps([
    { position: 'Main 1', disposition: 'reuse', bin: 'B-1' },
    { position: 'Main 2', disposition: 'machine-shop', bin: 'B-1' },
    { position: 'Main 3', disposition: 'reuse' },
  ]));
}, 90_000);

describe('tags from a tag-part step', () => {
  it('are created when the step is marked done, one per position, with readable codes', async () => {
    const tags = await orm.em.fork().find(Tag, { run: job.runId }, { orderBy: { position: 'asc' } });
    expect(tags.map((t) => [t.code, t.position, t.bin, t.disposition])).toEqual([
      [`${job.jobCode}-MAIN-BEARING-CAP-MAIN-1`, 'Main 1', 'B-1', 'reuse'],
      [`${job.jobCode}-MAIN-BEARING-CAP-MAIN-2`, 'Main 2', 'B-1', 'machine-shop'],
      [`${job.jobCode}-MAIN-BEARING-CAP-MAIN-3`, 'Main 3', '', 'reuse'],
    ]);
    expect(tags.every((t) => t.createdById === a.members.technician.userId && t.partName === 'Main bearing cap' && t.stepId === 's-caps')).toBe(true);
  });

  it('syncing again changes nothing', async () => {
    const em = orm.em.fork();
    const before = [await em.count(Tag, { run: job.runId }), await em.count(TagHistory, {})];
    await syncTags(orm.em.fork(), a.id, job.runId);
    await Promise.all([syncTags(orm.em.fork(), a.id, job.runId), syncTags(orm.em.fork(), a.id, job.runId)]);
    const em2 = orm.em.fork();
    expect([await em2.count(Tag, { run: job.runId }), await em2.count(TagHistory, {})]).toEqual(before);
  });

  it('the board lists them by part and position; another shop gets 404', async () => {
    const r = await callRoute(jobTagsRoute.GET, { params: { id: job.jobId }, as: as(a, 'reviewer') });
    expect(r.status).toBe(200);
    expect(r.body.tags.map((t: { position: string }) => t.position)).toEqual(CAPS);
    expect(r.body.tags[0]).toMatchObject({ stepTitle: 'Tag the main caps', partName: 'Main bearing cap', photos: [] });
    expect((await callRoute(jobTagsRoute.GET, { params: { id: job.jobId }, as: as(b, 'lead') })).status).toBe(404);
  });
});

describe('changing a tag', () => {
  it('keeps who changed what in the history', async () => {
    const tag = await orm.em.fork().findOneOrFail(Tag, { run: job.runId, position: 'Main 3' });
    const r = await callRoute(tagRoute.PATCH, { method: 'PATCH', params: { id: tag.id }, body: { bin: 'B-7', disposition: 'replace', conditionNote: 'Fretting on the parting face' }, as: as(a) });
    expect(r.status).toBe(200);
    expect(r.body.tag).toMatchObject({ bin: 'B-7', disposition: 'replace', conditionNote: 'Fretting on the parting face' });
    expect(r.body.history.map((h: { source: string }) => h.source)).toEqual(['created', 'edit']);
    expect(r.body.history[1]).toMatchObject({
      by: { id: a.members.technician.userId, name: a.members.technician.name },
      changes: [{ field: 'bin', from: '', to: 'B-7' }, { field: 'disposition', from: 'reuse', to: 'replace' }, { field: 'conditionNote', from: '', to: 'Fretting on the parting face' }],
    });
    const same = await callRoute(tagRoute.PATCH, { method: 'PATCH', params: { id: tag.id }, body: { bin: 'B-7' }, as: as(a) });
    expect(same.body.history).toHaveLength(2);
  });

  it.each([
    ['an unknown disposition', { disposition: 'keep' }, 400],
    ['nothing to change', {}, 400],
    ['an unknown field', { colour: 'red' }, 400],
  ])('refuses %s', async (_n, body, status) => {
    const tag = await orm.em.fork().findOneOrFail(Tag, { run: job.runId, position: 'Main 1' });
    const r = await callRoute(tagRoute.PATCH, { method: 'PATCH', params: { id: tag.id }, body, as: as(a) });
    expect(r.status).toBe(status);
    expect(r.body.error.code).toBe('bad-request');
  });

  it('a reviewer may not (403); another shop gets 404', async () => {
    const tag = await orm.em.fork().findOneOrFail(Tag, { run: job.runId, position: 'Main 1' });
    expect((await callRoute(tagRoute.PATCH, { method: 'PATCH', params: { id: tag.id }, body: { bin: 'X' }, as: as(a, 'reviewer') })).status).toBe(403);
    expect((await callRoute(tagRoute.PATCH, { method: 'PATCH', params: { id: tag.id }, body: { bin: 'X' }, as: as(b) })).status).toBe(404);
    expect((await callRoute(tagRoute.GET, { params: { id: tag.id }, as: as(b) })).status).toBe(404);
    expect((await callRoute(tagRoute.GET, { params: { id: 'not-a-uuid' }, as: as(a) })).status).toBe(404);
  });
});

describe('the label sheet', () => {
  it('has one QR per tag encoding the tag page, with code, part, position and bin', async () => {
    const r = await callRoute(labelsRoute.GET, { params: { id: job.jobId }, path: `/api/jobs/${job.jobId}/labels.pdf`, as: as(a) });
    expect(r.status).toBe(200);
    expect(r.headers.get('content-type')).toBe('application/pdf');
    // callRoute reads the body as text; fetch the bytes again through the handler.
    const res = await callBytes(job.jobId);
    const { pages, texts, qrs } = await readLabels(res);
    expect(pages).toBe(1);
    const tags = await orm.em.fork().find(Tag, { run: job.runId }, { orderBy: { partName: 'asc', createdAt: 'asc', position: 'asc' } });
    expect(qrs).toHaveLength(tags.length);
    const base = process.env.PUBLIC_URL!.replace(/\/+$/, '');
    tags.forEach((t, i) => {
      expect(qrs[i]).toEqual(expectedModules(`${base}/tags/${t.id}`));
      expect(texts[0]).toContain(t.code);
      expect(texts[0]).toContain(`${base}/tags/${t.id}`);
    });
    expect(texts[0]).toContain('Position Main 2');
    expect(texts[0]).toContain('Bin B-1');
    expect(texts[0]).toContain('Main bearing cap');
  });

  it('only one step with ?stepId=, and 404 for another shop', async () => {
    const none = await callBytes(job.jobId, 'no-such-step');
    expect((await readLabels(none)).qrs).toHaveLength(0);
    expect((await callRoute(labelsRoute.GET, { params: { id: job.jobId }, path: `/api/jobs/${job.jobId}/labels.pdf`, as: as(b) })).status).toBe(404);
  });
});

async function callBytes(jobId: string, stepId?: string): Promise<Uint8Array> {
  const { RequestContext } = await import('@mikro-orm/core');
  const url = new URL(`http://127.0.0.1/api/jobs/${jobId}/labels.pdf${stepId ? `?stepId=${stepId}` : ''}`);
  const m = a.members.technician;
  const ctx = { request: new Request(url), url, params: { id: jobId }, locals: { user: { id: m.userId, name: m.name, email: m.email }, session: null, shop: { id: a.id, name: a.name, slug: '' }, role: m.role } };
  const res = await RequestContext.create(orm.em, async () => (await labelsRoute.GET(ctx as never)) as Response);
  expect(res.status).toBe(200);
  return new Uint8Array(await res.arrayBuffer());
}
