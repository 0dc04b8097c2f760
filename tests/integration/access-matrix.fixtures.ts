/**
 * Real records in one shop for the access matrix and the fuzz tests: a released revision with
 * a tag-part step, a draft, a job with its technician and reviewer, a run part-way through (a
 * tag recorded), a finding, a photo row, a share link. Example data — not a maker's specification.
 */
import { randomUUID } from 'node:crypto';
import type { MikroORM } from '@mikro-orm/postgresql';
import { RequestContext } from '@mikro-orm/core';
import { importProcedure, releaseRevision, startDraft } from '../../src/server/services/procedures.service';
import { createJob } from '../../src/server/services/jobs.service';
import { startJobRun, recordRunEvent } from '../../src/server/services/runs.service';
import { createFinding } from '../../src/server/services/findings.service';
import { createShareLink } from '../../src/server/services/share.service';
import { listJobTags } from '../../src/server/services/tags.service';
import { Attachment, Job } from '../../src/server/entities';
import type { Member } from '../../src/server/guards';
import type { TestShop } from './support/shops';
import type { ShopRole } from '../../src/lib/access';

export const memberOf = (shop: TestShop, role: ShopRole): Member => {
  const m = shop.members[role];
  return { userId: m.userId, name: m.name, email: m.email, shopId: shop.id, shopName: shop.name, role };
};

export const matrixProcedureFile = (key: string) => ({
  schemaVersion: 1,
  procedure: { key, name: `Matrix cover teardown ${key}`, kind: 'teardown', engineFamily: 'Invented test engine', description: "Example data — not a maker's specification" },
  revision: {
    note: 'Matrix revision',
    steps: [
      { id: 's-tag', kind: 'tag-part', title: 'Tag the cover', partName: 'Valve cover', positions: ['front'], photoRequired: false },
      { id: 's-clean', kind: 'action', title: 'Clean around the cover' },
      {
        id: 's-bolts', kind: 'fastener-sequence', title: 'Loosen the cover bolts', direction: 'loosen',
        map: { fasteners: [{ id: 'b1', label: '1', x: 100, y: 100 }, { id: 'b2', label: '2', x: 300, y: 100 }], order: ['b1', 'b2'], orderMethod: 'manual' },
        passes: [{ kind: 'remove' }],
      },
      { id: 's-review', kind: 'hold-point', title: 'Cover removal review' },
    ],
  },
});

/** The events that bring a fresh run to `s-bolts` (tag and clean done). */
export const FIRST_EVENTS: Array<Record<string, unknown>> = [
  { type: 'step.start', stepId: 's-tag' },
  { type: 'step.complete', stepId: 's-tag', tags: [{ position: 'front', disposition: 'reuse', bin: 'A-1' }] },
  { type: 'step.start', stepId: 's-clean' },
  { type: 'step.complete', stepId: 's-clean' },
];

export type ShopRecords = Awaited<ReturnType<typeof makeRecords>>;

/** Everything built through the services as the routes would, inside a request context. */
export async function makeRecords(orm: MikroORM, shop: TestShop) {
  const lead = memberOf(shop, 'lead');
  const tech = memberOf(shop, 'technician');
  const ctx = <T>(fn: () => Promise<T>) => RequestContext.create(orm.em.fork(), fn);
  const em = () => orm.em.fork();

  const procedure = async () => {
    const { procedure: p, draft } = await importProcedure(em(), lead, matrixProcedureFile(`mx-${randomUUID().slice(0, 8)}`));
    await releaseRevision(em(), lead, draft.id);
    return { procedureId: p.id as string, revisionId: draft.id as string };
  };
  const draftOf = async (procedureId: string, fromRevisionId: string) => (await startDraft(em(), lead, procedureId, fromRevisionId)).id as string;
  const job = async () => (await createJob(em(), lead, { unitDescription: 'Invented matrix unit', serial: 'MX-1', hoursOrOdometer: '', customer: 'Invented customer', notes: '', technicianIds: [tech.userId], reviewerId: shop.members.reviewer.userId })).id as string;
  const run = async (jobId: string, revisionId: string, events = FIRST_EVENTS) => {
    const r = await startJobRun(em(), tech, jobId, revisionId);
    let seq = 0;
    for (const event of events) {
      const res = await recordRunEvent(em(), tech, r.run.id, { event, idempotencyKey: randomUUID(), expectedSeq: seq });
      seq = res.body.lastSeq;
    }
    return r.run.id as string;
  };

  const base = await procedure();
  const draftId = await draftOf(base.procedureId, base.revisionId);
  const jobId = await job();
  const runId = await run(jobId, base.revisionId);
  const tags = await ctx(() => listJobTags(em(), shop.id, jobId));
  const tagId = tags.tags[0]?.id;
  if (!tagId) throw new Error(`no tag was made from the run: ${JSON.stringify(tags).slice(0, 300)}`);
  const finding = await createFinding(em(), tech, jobId, { what: 'Hairline crack by bolt 2', where: 'Cover flange', severity: 'minor', sendToMachineShop: false, partsToReplace: [{ part: 'Cover gasket', quantity: 1 }] });
  const share = await createShareLink(em(), lead, jobId, { runId, days: 7 });
  const e = em();
  const attachment = e.create(Attachment, {
    shopId: shop.id, job: e.getReference(Job, jobId), scopeKind: 'tag', runId: null, stepId: null, tagId, findingId: null,
    key: `shops/${shop.id}/jobs/${jobId}/${randomUUID()}.jpg`, thumbKey: `shops/${shop.id}/jobs/${jobId}/thumbs/${randomUUID()}.webp`,
    filename: 'cover.jpg', contentType: 'image/jpeg', size: 1234, width: 10, height: 10, createdById: tech.userId,
  });
  await e.flush();
  return {
    ...base, draftId, jobId, runId, tagId, findingId: finding.id as string, shareLinkId: share.link.id, shareToken: share.token, attachmentId: attachment.id as string,
    /** Fresh records for cells that change them. */
    fresh: { procedure, draftOf, job, run, shareLink: async () => (await createShareLink(em(), lead, jobId, { runId, days: 7 })).link.id as string },
  };
}
