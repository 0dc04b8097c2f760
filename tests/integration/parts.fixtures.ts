/**
 * An invented teardown for the parts tests: a torque-to-yield cover bolt sequence, a tag-part
 * step for three caps and a replace step. Example data — not a maker's specification.
 */
import { randomUUID } from 'node:crypto';
import { expect } from 'vitest';
import type { MikroORM } from '@mikro-orm/postgresql';
import { importProcedure, releaseRevision } from '../../src/server/services/procedures.service';
import * as jobsRoute from '../../src/pages/api/jobs/index';
import * as jobRunsRoute from '../../src/pages/api/jobs/[id]/runs';
import * as eventsRoute from '../../src/pages/api/runs/[id]/events';
import { callRoute } from './support/routes';
import type { TestShop } from './support/shops';

export const CAPS = ['Main 1', 'Main 2', 'Main 3'];
const BOLTS = ['c1', 'c2', 'c3'];

const file = (key: string) => ({
  schemaVersion: 1,
  procedure: { key, name: `Demo cap teardown ${key}`, kind: 'teardown', engineFamily: 'Invented test engine', description: "Example data — not a maker's specification" },
  revision: {
    note: 'Test revision',
    steps: [
      {
        id: 's-cover', kind: 'fastener-sequence', title: 'Remove the cover bolts', direction: 'loosen', torqueToYield: true, fastenerPart: 'Cover bolt M8',
        map: { fasteners: BOLTS.map((id, i) => ({ id, label: String(i + 1), x: 100 + i * 200, y: 100 })), order: BOLTS, orderMethod: 'manual' },
        passes: [{ kind: 'loosen', degrees: 90 }, { kind: 'remove' }],
      },
      { id: 's-caps', kind: 'tag-part', title: 'Tag the main caps', partName: 'Main bearing cap', positions: CAPS, bin: 'B-1' },
      { id: 's-new', kind: 'replace', title: 'Parts always renewed', parts: [{ part: 'Cover gasket', quantity: 1, note: '' }] },
    ],
  },
});

export const as = (shop: TestShop, role: keyof TestShop['members'] = 'technician') => ({ shop, member: shop.members[role] });

/** A released revision of the procedure in the shop. */
export async function partsRevision(orm: MikroORM, shop: TestShop): Promise<string> {
  const actor = { shopId: shop.id, userId: shop.members.lead.userId, role: 'lead' as const };
  const em = orm.em.fork();
  const { draft } = await importProcedure(em, actor, file(`caps-${randomUUID().slice(0, 8)}`));
  await releaseRevision(em, actor, draft.id);
  return draft.id;
}

/** A job with one run of the revision, started by the shop's technician. */
export async function jobWithRun(shop: TestShop, revisionId: string): Promise<{ jobId: string; jobCode: string; runId: string }> {
  const job = await callRoute(jobsRoute.POST, { method: 'POST', body: { unitDescription: 'Invented test unit', technicianIds: [shop.members.technician.userId] }, as: as(shop, 'lead') });
  expect(job.status).toBe(201);
  const run = await callRoute(jobRunsRoute.POST, { method: 'POST', params: { id: job.body.id }, body: { revisionId }, as: as(shop) });
  expect(run.status).toBe(201);
  return { jobId: job.body.id, jobCode: job.body.code, runId: run.body.run.id };
}

/** Posts events in order as the technician; each must be accepted. */
export async function record(shop: TestShop, runId: string, events: Array<Record<string, unknown>>): Promise<number> {
  let seq = (await callRoute(eventsRoute.GET, { params: { id: runId }, as: as(shop) })).body.lastSeq as number;
  for (const event of events) {
    const r = await callRoute(eventsRoute.POST, { method: 'POST', params: { id: runId }, body: { event, idempotencyKey: randomUUID(), expectedSeq: seq }, as: as(shop) });
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    seq = r.body.lastSeq;
  }
  return seq;
}

/** Runs the cover sequence and the tag-part step with the given tags. */
export const throughCaps = (tags: Array<{ position: string; disposition: string; bin?: string }>) => [
  { type: 'step.start', stepId: 's-cover' },
  ...[1, 2].flatMap((pass) => BOLTS.map((fastenerId) => ({ type: 'fastener.confirm', stepId: 's-cover', pass, fastenerId }))),
  { type: 'step.start', stepId: 's-caps' },
  { type: 'step.complete', stepId: 's-caps', tags },
];
