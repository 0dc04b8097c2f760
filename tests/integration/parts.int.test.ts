/** Findings and the job's parts to replace: merge from steps, tags and findings, overrides, CSV. */
import { beforeAll, describe, expect, it } from 'vitest';
import type { MikroORM } from '@mikro-orm/postgresql';
import { freshDatabase } from './support/db';
import { createShop, type TestShop } from './support/shops';
import { callRoute } from './support/routes';
import { as, jobWithRun, partsRevision, record, throughCaps } from './parts.fixtures';
import { Finding, PartsListOverride, Tag } from '../../src/server/entities';
import * as findingsRoute from '../../src/pages/api/jobs/[id]/findings';
import * as partsRoute from '../../src/pages/api/jobs/[id]/parts';
import * as csvRoute from '../../src/pages/api/jobs/[id]/parts.csv';
import * as tagRoute from '../../src/pages/api/tags/[id]';

let orm: MikroORM;
let a: TestShop;
let b: TestShop;
let job: { jobId: string; jobCode: string; runId: string };

beforeAll(async () => {
  orm = await freshDatabase();
  a = await createShop('Parts A');
  b = await createShop('Parts B');
  job = await jobWithRun(a, await partsRevision(orm, a));
  await record(a, job.runId, throughCaps([
    { position: 'Main 1', disposition: 'reuse', bin: 'B-1' },
    { position: 'Main 2', disposition: 'replace', bin: 'B-1' },
    { position: 'Main 3', disposition: 'reuse', bin: 'B-1' },
  ]));
}, 90_000);

const finding = (body: Record<string, unknown>, shop = a, role: keyof TestShop['members'] = 'technician') =>
  callRoute(findingsRoute.POST, { method: 'POST', params: { id: job.jobId }, body, as: as(shop, role) });

describe('findings', () => {
  it('are recorded on a run step and listed', async () => {
    const r = await finding({ what: 'Seal lip torn, "badly"', where: 'Rear main, 6 o’clock', severity: 'major', sendToMachineShop: false, partsToReplace: [{ part: 'Rear oil seal, lip type', quantity: 1 }], runId: job.runId, stepId: 's-caps' });
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    expect(r.body).toMatchObject({ severity: 'major', stepTitle: 'Tag the main caps', createdBy: { id: a.members.technician.userId }, photos: [] });
    const list = await callRoute(findingsRoute.GET, { params: { id: job.jobId }, as: as(a, 'reviewer') });
    expect(list.body.findings.map((f: { what: string }) => f.what)).toEqual(['Seal lip torn, "badly"']);
  });

  it.each([
    ['no description', { what: ' ', severity: 'minor' }, 'what'],
    ['an unknown severity', { what: 'Crack', severity: 'bad' }, 'severity'],
    ['a zero quantity', { what: 'Crack', severity: 'minor', partsToReplace: [{ part: 'Liner', quantity: 0 }] }, 'partsToReplace.0.quantity'],
    ['a step without its run', { what: 'Crack', severity: 'minor', stepId: 's-caps' }, 'runId'],
    ['a step not in the run', { what: 'Crack', severity: 'minor', runId: '00000000-0000-4000-8000-000000000000' }, 'runId'],
  ])('refuses %s (400) and stores nothing', async (_n, body, field) => {
    const before = await orm.em.fork().count(Finding, {});
    const r = await finding(body);
    expect(r.status).toBe(400);
    expect(r.body.error.fields).toHaveProperty(field);
    expect(await orm.em.fork().count(Finding, {})).toBe(before);
  });

  it('another shop gets 404; a reviewer may not record (403)', async () => {
    expect((await finding({ what: 'Crack', severity: 'minor' }, b)).status).toBe(404);
    expect((await callRoute(findingsRoute.GET, { params: { id: job.jobId }, as: as(b) })).status).toBe(404);
    expect((await finding({ what: 'Crack', severity: 'minor' }, a, 'reviewer')).status).toBe(403);
  });
});

describe('the parts list', () => {
  const rowsOf = (body: { rows: Array<{ part: string; quantity: number; computed: number; overridden: boolean }> }) => body.rows.map((r) => [r.part, r.quantity, r.computed, r.overridden]);

  it('merges the replace step, torque-to-yield bolts, the tag set to replace and the finding', async () => {
    const r = await callRoute(partsRoute.GET, { params: { id: job.jobId }, as: as(a) });
    expect(r.status).toBe(200);
    expect(rowsOf(r.body)).toEqual([
      ['Cover bolt M8', 3, 3, false],
      ['Cover gasket', 1, 1, false],
      ['Main bearing cap', 1, 1, false],
      ['Rear oil seal, lip type', 1, 1, false],
    ]);
  });

  it('follows a tag changed to replace', async () => {
    const t = await orm.em.fork().findOneOrFail(Tag, { run: job.runId, position: 'Main 3' });
    await callRoute(tagRoute.PATCH, { method: 'PATCH', params: { id: t.id }, body: { disposition: 'replace' }, as: as(a) });
    const r = await callRoute(partsRoute.GET, { params: { id: job.jobId }, as: as(a) });
    expect(r.body.rows.find((x: { part: string }) => x.part === 'Main bearing cap')).toMatchObject({ quantity: 2, sources: [expect.objectContaining({ kind: 'tag' }), expect.objectContaining({ kind: 'tag' })] });
  });

  it('keeps a lead’s quantity, and goes back to the computed one on null', async () => {
    const set = await callRoute(partsRoute.PUT, { method: 'PUT', params: { id: job.jobId }, body: { part: 'cover bolt m8', quantity: 4 }, as: as(a, 'lead') });
    expect(set.status).toBe(200);
    expect(rowsOf(set.body)[0]).toEqual(['Cover bolt M8', 4, 3, true]);
    expect(await orm.em.fork().count(PartsListOverride, { job: job.jobId })).toBe(1);
    const back = await callRoute(partsRoute.PUT, { method: 'PUT', params: { id: job.jobId }, body: { part: 'Cover bolt M8', quantity: null }, as: as(a, 'lead') });
    expect(rowsOf(back.body)[0]).toEqual(['Cover bolt M8', 3, 3, false]);
  });

  it.each([
    ['a technician', 'technician', { part: 'Cover gasket', quantity: 2 }, 403],
    ['a part not on the list', 'lead', { part: 'Flux capacitor', quantity: 2 }, 404],
    ['a negative quantity', 'lead', { part: 'Cover gasket', quantity: -1 }, 400],
    ['a fraction', 'lead', { part: 'Cover gasket', quantity: 1.5 }, 400],
  ] as const)('refuses %s', async (_n, role, body, status) => {
    const r = await callRoute(partsRoute.PUT, { method: 'PUT', params: { id: job.jobId }, body, as: as(a, role) });
    expect(r.status).toBe(status);
  });

  it('exports CSV with escaped cells', async () => {
    await callRoute(partsRoute.PUT, { method: 'PUT', params: { id: job.jobId }, body: { part: 'Cover gasket', quantity: 2 }, as: as(a, 'lead') });
    const r = await callRoute(csvRoute.GET, { params: { id: job.jobId }, as: as(a, 'reviewer') });
    expect(r.status).toBe(200);
    expect(r.headers.get('content-type')).toBe('text/csv; charset=utf-8');
    expect(r.headers.get('content-disposition')).toBe(`attachment; filename="${job.jobCode}-parts-to-replace.csv"`);
    const lines = (r.body as string).replace(/^\uFEFF/, '').split('\r\n');
    expect(lines[0]).toBe('Part,Quantity,Computed,Reasons');
    expect(lines[1]).toBe('Cover bolt M8,3,3,"Torque-to-yield: 3 fasteners, never reused — Remove the cover bolts"');
    expect(lines[2]).toBe('Cover gasket,2,1 (set by hand to 2),Replace step — Parts always renewed');
    expect(lines[4]).toBe('"Rear oil seal, lip type",1,1,"Finding: Seal lip torn, ""badly"""');
    expect(lines.at(-1)).toBe('');
    expect((await callRoute(csvRoute.GET, { params: { id: job.jobId }, as: as(b) })).status).toBe(404);
  });
});
