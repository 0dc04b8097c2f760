/** Procedures and revisions against the real PostgreSQL: immutability, concurrency, roles, shops, files. */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import type { MikroORM } from '@mikro-orm/postgresql';
import { freshDatabase } from './support/db';
import { createShop, type TestMember, type TestShop } from './support/shops';
import { callRoute } from './support/routes';
import * as proceduresRoute from '../../src/pages/api/procedures/index';
import * as importRoute from '../../src/pages/api/procedures/import';
import * as procedureRoute from '../../src/pages/api/procedures/[id]/index';
import * as draftsRoute from '../../src/pages/api/procedures/[id]/drafts';
import * as exportRoute from '../../src/pages/api/procedures/[id]/export';
import * as revisionRoute from '../../src/pages/api/revisions/[id]/index';
import * as contentRoute from '../../src/pages/api/revisions/[id]/content';
import * as releaseRoute from '../../src/pages/api/revisions/[id]/release';
import * as retireRoute from '../../src/pages/api/revisions/[id]/retire';
import * as deriveRoute from '../../src/pages/api/revisions/[id]/derive-assembly';
import * as compareRoute from '../../src/pages/api/revisions/compare';
import { getReleasedRevisionContent } from '../../src/server/services/procedures.service';
import { AppError } from '../../src/server/http';
import type { Step } from '../../src/domain/procedure/schema';

const teardownFile = JSON.parse(readFileSync(join(import.meta.dirname, '../../procedures/teardown-demo-diesel.json'), 'utf8'));
const clone = <T>(v: T): T => structuredClone(v);

let orm: MikroORM;
let a: TestShop;
let b: TestShop;
const as = (shop: TestShop, member: TestMember) => ({ shop, member });

beforeAll(async () => {
  orm = await freshDatabase();
  a = await createShop('Procedures A');
  b = await createShop('Procedures B');
});

async function counts(): Promise<{ procedures: number; revisions: number }> {
  const n = async (table: string) => ((await orm.em.getConnection().execute<Array<{ n: number }>>(`select count(*)::int as n from "${table}"`))[0]?.n ?? -1);
  return { procedures: await n('procedure'), revisions: await n('procedure_revision') };
}

async function importAs(shop: TestShop, file: unknown = teardownFile, member = shop.members.lead) {
  const res = await callRoute(importRoute.POST, { method: 'POST', body: file, as: as(shop, member) });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as { procedure: { id: string; key: string }; draft: { id: string; version: number; content: { steps: Step[] } } };
}

const release = (shop: TestShop, id: string, note?: string, member = shop.members.lead) =>
  callRoute(releaseRoute.POST, { method: 'POST', params: { id }, ...(note !== undefined ? { body: { note } } : {}), as: as(shop, member) });
const getRevision = (shop: TestShop, id: string, member = shop.members.lead) => callRoute(revisionRoute.GET, { params: { id }, as: as(shop, member) });
const putContent = (shop: TestShop, id: string, body: unknown, member = shop.members.lead) => callRoute(contentRoute.PUT, { method: 'PUT', params: { id }, body, as: as(shop, member) });
const startDraft = (shop: TestShop, procedureId: string, fromRevisionId: string) => callRoute(draftsRoute.POST, { method: 'POST', params: { id: procedureId }, body: { fromRevisionId }, as: as(shop, shop.members.lead) });

describe('creating and reading', () => {
  it('a lead creates a procedure with an empty draft; the list shows it to authors only', async () => {
    const res = await callRoute(proceduresRoute.POST, { method: 'POST', body: { name: 'Oil pump check', kind: 'inspection', engineFamily: 'Bench family', description: '' }, as: as(a, a.members.lead) });
    expect(res.status).toBe(201);
    expect(res.body.procedure).toMatchObject({ key: 'oil-pump-check', name: 'Oil pump check', kind: 'inspection', latestReleased: null, revisionCount: 1 });
    expect(res.body.draft).toMatchObject({ status: 'draft', number: null, version: 1, content: { steps: [] }, createdBy: { id: a.members.lead.userId, name: a.members.lead.name } });
    expect(res.body.procedure.draft.id).toBe(res.body.draft.id);

    const lead = await callRoute(proceduresRoute.GET, { path: '/api/procedures?search=pump', as: as(a, a.members.lead) });
    expect(lead.body.procedures.map((p: { id: string }) => p.id)).toEqual([res.body.procedure.id]);
    // Technicians and reviewers never see drafts: the draft itself and a draft-only procedure answer 404.
    for (const member of [a.members.technician, a.members.reviewer]) {
      const list = await callRoute(proceduresRoute.GET, { as: as(a, member) });
      expect(list.body.procedures.map((p: { id: string }) => p.id)).not.toContain(res.body.procedure.id);
      expect((await getRevision(a, res.body.draft.id, member)).status).toBe(404);
      expect((await callRoute(procedureRoute.GET, { params: { id: res.body.procedure.id }, as: as(a, member) })).status).toBe(404);
    }
  });

  it('refuses bad input with fields, and writes by technicians and reviewers with 403', async () => {
    const bad = await callRoute(proceduresRoute.POST, { method: 'POST', body: { name: '  ', kind: 'overhaul', engineFamily: '', description: '' }, as: as(a, a.members.owner) });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['kind', 'name']);
    for (const member of [a.members.technician, a.members.reviewer]) {
      const res = await callRoute(proceduresRoute.POST, { method: 'POST', body: { name: 'Sneaky', kind: 'teardown', engineFamily: '', description: '' }, as: as(a, member) });
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
    }
    const { draft } = await importAs(a);
    const tech = await putContent(a, draft.id, { steps: [], version: 1 }, a.members.technician);
    expect(tech.status).toBe(403);
    expect((await release(a, draft.id, undefined, a.members.technician)).status).toBe(403);
    expect((await getRevision(a, draft.id)).body.content.steps).toHaveLength(30);
  });

  it('filters the list by status and engine family', async () => {
    const { draft, procedure } = await importAs(a);
    expect((await release(a, draft.id)).status).toBe(200);
    const released = await callRoute(proceduresRoute.GET, { path: `/api/procedures?status=released&engineFamily=${encodeURIComponent(teardownFile.procedure.engineFamily)}`, as: as(a, a.members.technician) });
    expect(released.body.procedures.map((p: { id: string }) => p.id)).toContain(procedure.id);
    expect(released.body.procedures.every((p: { latestReleased: unknown; draft: unknown }) => p.latestReleased && p.draft === null)).toBe(true);
    const drafts = await callRoute(proceduresRoute.GET, { path: '/api/procedures?status=draft', as: as(a, a.members.lead) });
    expect(drafts.body.procedures.map((p: { id: string }) => p.id)).not.toContain(procedure.id);
    expect((await callRoute(proceduresRoute.GET, { path: '/api/procedures?status=bogus', as: as(a, a.members.lead) })).status).toBe(400);
  });
});

describe('drafts and released revisions', () => {
  it('autosave bumps the version; a stale version is 409 with the current revision; schema problems are 400 by path', async () => {
    const { draft } = await importAs(a);
    const steps = clone(draft.content.steps);
    steps[0]!.title = 'Lift and support with rated equipment only';
    const saved = await putContent(a, draft.id, { steps, version: 1 });
    expect(saved.status).toBe(200);
    expect(saved.body.version).toBe(2);
    expect(saved.body.content.steps[0].title).toBe('Lift and support with rated equipment only');

    const stale = await putContent(a, draft.id, { steps: draft.content.steps, version: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('conflict');
    expect(stale.body.error.current).toMatchObject({ id: draft.id, version: 2 });
    expect(stale.body.error.current.content.steps[0].title).toBe('Lift and support with rated equipment only');

    const broken = clone(steps) as unknown as Array<Record<string, unknown>>;
    (broken[7]!.passes as unknown[])[0] = { kind: 'percent', percent: 150 };
    const bad = await putContent(a, draft.id, { steps: broken, version: 2 });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toContain('steps.7.passes.0.percent');
    expect((await getRevision(a, draft.id)).body.version).toBe(2);
  });

  it('a released revision refuses every write with 409 and its content stays unchanged', async () => {
    const { draft, procedure } = await importAs(a);
    const rel = await release(a, draft.id, 'First release');
    expect(rel.status).toBe(200);
    expect(rel.body).toMatchObject({ status: 'released', number: 1, note: 'First release', releasedBy: { id: a.members.lead.userId } });
    const before = (await getRevision(a, draft.id)).body;

    const changed = clone(before.content.steps) as Step[];
    changed.reverse();
    const put = await putContent(a, draft.id, { steps: changed, version: before.version });
    expect(put.status).toBe(409);
    expect(put.body.error.message).toBe('Revision 1 is released and can no longer change; start a new draft.');
    const note = await callRoute(revisionRoute.PATCH, { method: 'PATCH', params: { id: draft.id }, body: { note: 'rewritten' }, as: as(a, a.members.lead) });
    expect(note.status).toBe(409);
    expect((await release(a, draft.id)).status).toBe(409);

    const after = (await getRevision(a, draft.id)).body;
    expect(after.content).toEqual(before.content);
    expect(after.contentHash).toBe(before.contentHash);
    expect(after.note).toBe('First release');

    // Retired stays frozen too, and a retired revision cannot be retired twice.
    const ret = await callRoute(retireRoute.POST, { method: 'POST', params: { id: draft.id }, as: as(a, a.members.owner) });
    expect(ret.body).toMatchObject({ status: 'retired', retiredBy: { id: a.members.owner.userId } });
    expect((await callRoute(retireRoute.POST, { method: 'POST', params: { id: draft.id }, as: as(a, a.members.owner) })).status).toBe(409);
    expect((await putContent(a, draft.id, { steps: changed, version: after.version })).body.error.message).toMatch(/^Revision 1 is retired/);
    const p = await callRoute(procedureRoute.GET, { params: { id: procedure.id }, as: as(a, a.members.lead) });
    expect(p.body.latestReleased).toBeNull();
    expect(p.body.revisions.map((r: { status: string }) => r.status)).toEqual(['retired']);
  });

  it('an empty draft cannot be released', async () => {
    const res = await callRoute(proceduresRoute.POST, { method: 'POST', body: { name: 'Empty one', kind: 'teardown', engineFamily: '', description: '' }, as: as(a, a.members.lead) });
    const rel = await release(a, res.body.draft.id);
    expect(rel.status).toBe(409);
    expect(rel.body.error.message).toMatch(/no steps/);
  });

  it('a new draft copies a released revision; a second draft is 409 with the open one', async () => {
    const { draft, procedure } = await importAs(a);
    await release(a, draft.id);
    const next = await startDraft(a, procedure.id, draft.id);
    expect(next.status).toBe(201);
    expect(next.body).toMatchObject({ status: 'draft', number: null, basedOnId: draft.id, version: 1 });
    expect(next.body.content).toEqual((await getRevision(a, draft.id)).body.content);
    const again = await startDraft(a, procedure.id, draft.id);
    expect(again.status).toBe(409);
    expect(again.body.error.draftId).toBe(next.body.id);
  });
});

describe('revision numbers under concurrent releases', () => {
  it('8 procedures released at once each get revision 1', async () => {
    const drafts = await Promise.all(Array.from({ length: 8 }, () => importAs(a)));
    const results = await Promise.all(drafts.map((d) => release(a, d.draft.id)));
    expect(results.map((r) => r.status)).toEqual(Array(8).fill(200));
    expect(results.map((r) => r.body.number)).toEqual(Array(8).fill(1));
  });

  it('parallel releases and parallel new drafts on one procedure give numbers 1..N with no gaps or duplicates', async () => {
    const { procedure, draft } = await importAs(a);
    let draftId = draft.id;
    const cycles = 6;
    for (let cycle = 0; cycle < cycles; cycle++) {
      const releases = await Promise.all(Array.from({ length: 5 }, () => release(a, draftId)));
      const won = releases.filter((r) => r.status === 200);
      expect(won).toHaveLength(1);
      expect(releases.filter((r) => r.status === 409)).toHaveLength(4);
      expect(won[0]!.body.number).toBe(cycle + 1);
      const starts = await Promise.all(Array.from({ length: 4 }, () => startDraft(a, procedure.id, draftId)));
      const created = starts.filter((s) => s.status === 201);
      expect(created).toHaveLength(1);
      for (const s of starts.filter((s) => s.status !== 201)) {
        expect(s.status).toBe(409);
        expect(s.body.error.draftId).toBe(created[0]!.body.id);
      }
      draftId = created[0]!.body.id;
    }
    const p = await callRoute(procedureRoute.GET, { params: { id: procedure.id }, as: as(a, a.members.lead) });
    const numbers = p.body.revisions.map((r: { number: number | null }) => r.number).filter((n: number | null) => n !== null).sort((x: number, y: number) => x - y);
    expect(numbers).toEqual(Array.from({ length: cycles }, (_, i) => i + 1));
    expect(p.body.draft.id).toBe(draftId);
    expect(p.body.latestReleased.number).toBe(cycles);
  });
});

describe('other shops', () => {
  it('answer 404 for every read and write of another shop’s procedure or revision', async () => {
    const { procedure, draft } = await importAs(a);
    await release(a, draft.id);
    const other = as(b, b.members.lead);
    expect((await callRoute(procedureRoute.GET, { params: { id: procedure.id }, as: other })).status).toBe(404);
    expect((await callRoute(procedureRoute.PATCH, { method: 'PATCH', params: { id: procedure.id }, body: { name: 'Mine now' }, as: other })).status).toBe(404);
    expect((await getRevision(b, draft.id)).status).toBe(404);
    expect((await putContent(b, draft.id, { steps: [], version: 1 })).status).toBe(404);
    expect((await release(b, draft.id)).status).toBe(404);
    expect((await callRoute(retireRoute.POST, { method: 'POST', params: { id: draft.id }, as: other })).status).toBe(404);
    expect((await startDraft(b, procedure.id, draft.id)).status).toBe(404);
    expect((await callRoute(exportRoute.GET, { params: { id: procedure.id }, as: other })).status).toBe(404);
    expect((await callRoute(deriveRoute.POST, { method: 'POST', params: { id: draft.id }, as: other })).status).toBe(404);
    expect((await callRoute(compareRoute.GET, { path: `/api/revisions/compare?a=${draft.id}&b=${draft.id}`, as: other })).status).toBe(404);
    const list = await callRoute(proceduresRoute.GET, { as: other });
    expect(list.body.procedures.map((p: { id: string }) => p.id)).not.toContain(procedure.id);
    await expect(getReleasedRevisionContent(orm.em.fork(), b.id, draft.id)).rejects.toBeInstanceOf(AppError);
    expect((await getReleasedRevisionContent(orm.em.fork(), a.id, draft.id)).steps).toHaveLength(30);
    expect((await callRoute(procedureRoute.GET, { params: { id: 'not-a-uuid' }, as: other })).status).toBe(404);
  });
});

describe('compare and derive', () => {
  it('compare lists moved, changed and removed steps between two revisions', async () => {
    const { procedure, draft } = await importAs(a);
    await release(a, draft.id);
    const next = (await startDraft(a, procedure.id, draft.id)).body;
    const steps = clone(next.content.steps) as Step[];
    const [moved] = steps.splice(3, 1);
    steps.splice(10, 0, moved!);
    steps[0]!.title = 'Lift only with rated equipment';
    const removed = steps.pop()!;
    expect((await putContent(a, next.id, { steps, version: 1 })).status).toBe(200);
    const res = await callRoute(compareRoute.GET, { path: `/api/revisions/compare?a=${draft.id}&b=${next.id}`, as: as(a, a.members.lead) });
    expect(res.status).toBe(200);
    expect(res.body.a).toEqual({ id: draft.id, number: 1, status: 'released' });
    expect(res.body.b).toEqual({ id: next.id, number: null, status: 'draft' });
    const by = (kind: string) => res.body.changes.filter((c: { kind: string }) => c.kind === kind).map((c: { stepId: string }) => c.stepId);
    expect(by('moved')).toEqual([moved!.id]);
    expect(by('changed')).toEqual([steps[0]!.id]);
    expect(by('removed')).toEqual([removed.id]);
    expect(res.body.changes.find((c: { kind: string }) => c.kind === 'changed').fields).toEqual([{ path: 'title', before: teardownFile.revision.steps[0].title, after: 'Lift only with rated equipment' }]);
    // A technician may compare released revisions but not a draft.
    expect((await callRoute(compareRoute.GET, { path: `/api/revisions/compare?a=${draft.id}&b=${next.id}`, as: as(a, a.members.technician) })).status).toBe(404);
    expect((await callRoute(compareRoute.GET, { path: `/api/revisions/compare?a=${draft.id}`, as: as(a, a.members.lead) })).status).toBe(400);
  });

  it('derive assembly makes a new assembly procedure with a reversed draft linked to its source', async () => {
    const { procedure, draft } = await importAs(a);
    await release(a, draft.id);
    const res = await callRoute(deriveRoute.POST, { method: 'POST', params: { id: draft.id }, as: as(a, a.members.lead) });
    expect(res.status).toBe(201);
    expect(res.body.procedure).toMatchObject({ kind: 'assembly', name: `${teardownFile.procedure.name} — assembly`, derivedFromRevisionId: draft.id, derivedFrom: { procedureId: procedure.id, revisionId: draft.id, number: 1 } });
    expect(res.body.draft).toMatchObject({ status: 'draft', procedureId: res.body.procedure.id });
    expect(res.body.draft.content.steps).toHaveLength(30);
    expect(res.body.draft.content.steps[0].id).toBe('as-01');
    expect(res.body.draft.content.steps.at(-1).kind).toBe('caution');
    const fromAssembly = await callRoute(deriveRoute.POST, { method: 'POST', params: { id: res.body.draft.id }, as: as(a, a.members.lead) });
    expect(fromAssembly.status).toBe(409);
  });
});

describe('procedure files', () => {
  it('a malformed file lists every problem by path and stores nothing', async () => {
    const file = clone(teardownFile);
    file.procedure.key = 'Bad Key';
    file.revision.steps[7].passes[0] = { kind: 'percent', percent: 150 };
    file.revision.steps[3].id = file.revision.steps[2].id;
    delete file.revision.steps[9].spec;
    const before = await counts();
    const res = await callRoute(importRoute.POST, { method: 'POST', body: file, as: as(a, a.members.lead) });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('bad-request');
    expect(res.body.error.message).toMatch(/problems; nothing was imported/);
    const paths = res.body.error.problems.map((p: { path: string }) => p.path);
    expect(paths).toEqual(expect.arrayContaining(['procedure.key', 'revision.steps[7].passes[0].percent', 'revision.steps[3].id', 'revision.steps[9].spec']));
    for (const p of res.body.error.problems) expect(p.message).toEqual(expect.any(String));
    expect(await counts()).toEqual(before);

    const notJson = await callRoute(importRoute.POST, { method: 'POST', rawBody: '{"schemaVersion": 1,', as: as(a, a.members.lead) });
    expect(notJson.status).toBe(400);
    expect(await counts()).toEqual(before);
  });

  it('export then import gives back the same file, in another shop and in the same one', async () => {
    const { procedure, draft } = await importAs(a);
    await release(a, draft.id, 'For the round trip');
    const out = await callRoute(exportRoute.GET, { params: { id: procedure.id }, path: `/api/procedures/${procedure.id}/export?revision=${draft.id}`, as: as(a, a.members.technician) });
    expect(out.status).toBe(200);
    expect(out.headers.get('content-disposition')).toBe(`attachment; filename="${procedure.key}-rev1.json"`);
    expect(out.body.revision.note).toBe('For the round trip');
    expect(out.body.revision.steps).toEqual(teardownFile.revision.steps);

    const inB = await importAs(b, out.body);
    expect(inB.procedure.key).toBe(procedure.key);
    const back = await callRoute(exportRoute.GET, { params: { id: inB.procedure.id }, path: `/api/procedures/${inB.procedure.id}/export?revision=${inB.draft.id}`, as: as(b, b.members.lead) });
    expect(back.headers.get('content-disposition')).toBe(`attachment; filename="${procedure.key}-draft.json"`);
    expect(back.body).toEqual(out.body);

    const againInA = await importAs(a, out.body);
    expect(againInA.procedure.key).toMatch(new RegExp(`^${procedure.key}-\\d+$`));
  });
});

describe('demo seed step', () => {
  it('imports every procedures/*.json file and releases revision 1 of each; the assembly points at the teardown', async () => {
    const { seedDemoProcedures } = await import('../../src/server/seeders/demo-procedures');
    const shop = await createShop('Demo seed');
    const users = Object.fromEntries(Object.entries(shop.members).map(([role, m]) => [role, m.userId]));
    await seedDemoProcedures(orm.em.fork(), { shopId: shop.id, users });
    const list = await callRoute(proceduresRoute.GET, { as: as(shop, shop.members.technician) });
    const byKey = Object.fromEntries(list.body.procedures.map((p: { key: string }) => [p.key, p]));
    expect(Object.keys(byKey).sort()).toEqual(['assembly-demo-diesel', 'teardown-demo-diesel']);
    for (const p of Object.values(byKey) as Array<{ latestReleased: { number: number } | null; draft: unknown }>) {
      expect(p.latestReleased?.number).toBe(1);
      expect(p.draft).toBeNull();
    }
    const assembly = await callRoute(procedureRoute.GET, { params: { id: byKey['assembly-demo-diesel'].id }, as: as(shop, shop.members.lead) });
    expect(assembly.body.derivedFrom).toMatchObject({ procedureId: byKey['teardown-demo-diesel'].id, number: 1 });
    expect(assembly.body.revisions[0].releasedBy.id).toBe(shop.members.lead.userId);
  });
});
