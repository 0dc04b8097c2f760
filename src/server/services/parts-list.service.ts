/** The job's parts to replace: built from its runs, tags and findings, with hand-set quantities. */
import type { EntityManager } from '@mikro-orm/postgresql';
import * as z from 'zod';
import { toCsv } from '../../domain/csv';
import { PARTS_CSV_HEADER, buildPartsList, partKey, partsCsvRows, type PartsRow } from '../../domain/parts-list';
import { Finding, Job, PartsListOverride, Run, Tag } from '../entities';
import type { Member } from '../guards';
import { AppError, notFound } from '../http';
import { pinnedRevision } from './run-revision';
import { syncTags } from './tags.service';

export const overrideInput = z
  .object({
    part: z.string().trim().min(1, 'Name the part').max(120),
    quantity: z.number('Give a quantity').int('Give a whole number').min(0, 'At least 0').max(9999, 'At most 9999').nullable(),
  })
  .strict();

export type PartsListDto = { job: { id: string; code: string; unitDescription: string; customer: string }; rows: PartsRow[] };

async function loadJob(em: EntityManager, shopId: string, jobId: string) {
  if (!z.uuid().safeParse(jobId).success) throw notFound('That job');
  const job = await em.findOne(Job, { id: jobId, shopId });
  if (!job) throw notFound('That job');
  return job;
}

/** The merged list (src/domain/parts-list.ts) for a job of the shop. */
export async function getPartsList(em: EntityManager, shopId: string, jobId: string): Promise<PartsListDto> {
  const job = await loadJob(em, shopId, jobId);
  const runRows = await em.find(Run, { shopId, job: job.id }, { orderBy: { createdAt: 'asc' } });
  for (const r of runRows) await syncTags(em, shopId, r.id);
  const runs = await Promise.all(runRows.map(async (r) => ({ id: r.id, procedureName: r.procedureName, steps: (await pinnedRevision(em, shopId, r.revisionId)).steps })));
  const [tags, findings, overrides] = await Promise.all([
    em.find(Tag, { shopId, job: job.id }, { refresh: true }),
    em.find(Finding, { shopId, job: job.id }),
    em.find(PartsListOverride, { shopId, job: job.id }, { refresh: true }),
  ]);
  const rows = buildPartsList({
    runs,
    tags: tags.map((t) => ({ id: t.id, code: t.code, partName: t.partName, position: t.position, disposition: t.disposition, runId: t.run.id, stepId: t.stepId })),
    findings: findings.map((f) => ({ id: f.id, what: f.what, runId: f.runId ?? null, stepId: f.stepId ?? null, partsToReplace: f.partsToReplace })),
    overrides: overrides.map((o) => ({ partKey: o.partKey, quantity: o.quantity })),
  });
  return { job: { id: job.id, code: job.code, unitDescription: job.unitDescription, customer: job.customer }, rows };
}

/** Sets (or with `null` clears) the hand-set quantity of one part on the list. */
export async function setPartQuantity(em: EntityManager, member: Member, jobId: string, input: z.infer<typeof overrideInput>): Promise<PartsListDto> {
  const before = await getPartsList(em, member.shopId, jobId);
  const key = partKey(input.part);
  if (!before.rows.some((r) => r.key === key)) throw new AppError('not-found', `“${input.part}” is not on this job's parts list.`);
  const job = em.getReference(Job, before.job.id);
  const existing = await em.findOne(PartsListOverride, { shopId: member.shopId, job: job.id, partKey: key });
  if (input.quantity === null) {
    if (existing) em.remove(existing);
  } else if (existing) {
    existing.quantity = input.quantity;
    existing.updatedById = member.userId;
  } else em.create(PartsListOverride, { shopId: member.shopId, job, partKey: key, quantity: input.quantity, updatedById: member.userId });
  await em.flush();
  return getPartsList(em, member.shopId, jobId);
}

/** The list as CSV, named after the job. */
export async function partsCsv(em: EntityManager, shopId: string, jobId: string): Promise<{ filename: string; body: string }> {
  const list = await getPartsList(em, shopId, jobId);
  return { filename: `${list.job.code}-parts-to-replace.csv`, body: toCsv(PARTS_CSV_HEADER, partsCsvRows(list.rows)) };
}
