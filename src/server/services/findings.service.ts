/** Findings: problems found on a job, with severity, photos and the parts they call for. */
import type { EntityManager } from '@mikro-orm/postgresql';
import * as z from 'zod';
import { Attachment, Finding, Job, Run } from '../entities';
import { FINDING_SEVERITIES, type FindingEntity, type FindingSeverity } from '../entities/finding.entity';
import type { Member } from '../guards';
import { AppError, notFound } from '../http';
import { pinnedRevision } from './run-revision';
import { userNames } from './shop-members';
import { attachmentDto, type AttachmentDto } from './uploads.service';

export const createFindingInput = z
  .object({
    what: z.string().trim().min(1, 'Say what you found').max(300, 'At most 300 characters'),
    where: z.string().trim().max(200, 'At most 200 characters').default(''),
    severity: z.enum(FINDING_SEVERITIES, 'Choose note, minor, major or critical'),
    sendToMachineShop: z.boolean().default(false),
    partsToReplace: z
      .array(z.object({ part: z.string().trim().min(1, 'Name the part').max(120), quantity: z.number('Give a quantity').int('Give a whole number').min(1, 'At least 1').max(999, 'At most 999') }).strict())
      .max(30, 'At most 30 parts')
      .default([]),
    runId: z.uuid('Give the run id').optional(),
    stepId: z.string().min(1).max(40).optional(),
  })
  .strict()
  .refine((v) => !v.stepId || v.runId, { message: 'A step needs its run', path: ['runId'] });

export type FindingDto = {
  id: string; jobId: string; runId: string | null; stepId: string | null; stepTitle: string | null; what: string; where: string; severity: FindingSeverity;
  sendToMachineShop: boolean; partsToReplace: Array<{ part: string; quantity: number }>; createdBy: { id: string; name: string }; createdAt: string; photos: AttachmentDto[];
};

async function loadJob(em: EntityManager, shopId: string, jobId: string) {
  if (!z.uuid().safeParse(jobId).success) throw notFound('That job');
  const job = await em.findOne(Job, { id: jobId, shopId });
  if (!job) throw notFound('That job');
  return job;
}

async function toDtos(em: EntityManager, shopId: string, rows: FindingEntity[]): Promise<FindingDto[]> {
  const names = await userNames(em, rows.map((r) => r.createdById));
  const photos = rows.length ? await em.find(Attachment, { shopId, findingId: { $in: rows.map((r) => r.id) } }, { orderBy: { createdAt: 'asc', id: 'asc' } }) : [];
  const titles = new Map<string, string>();
  for (const runId of new Set(rows.map((r) => r.runId).filter((x): x is string => !!x))) {
    const run = await em.findOne(Run, { id: runId, shopId });
    if (!run) continue;
    for (const s of (await pinnedRevision(em, shopId, run.revisionId)).steps) titles.set(`${runId}\u0000${s.id}`, s.title);
  }
  return rows.map((f) => ({
    id: f.id, jobId: f.job.id, runId: f.runId ?? null, stepId: f.stepId ?? null, stepTitle: f.runId && f.stepId ? (titles.get(`${f.runId}\u0000${f.stepId}`) ?? f.stepId) : null,
    what: f.what, where: f.where, severity: f.severity, sendToMachineShop: f.sendToMachineShop, partsToReplace: f.partsToReplace,
    createdBy: { id: f.createdById, name: names.get(f.createdById) ?? 'Former member' }, createdAt: f.createdAt.toISOString(),
    photos: photos.filter((p) => p.findingId === f.id).map(attachmentDto),
  }));
}

/** Records a finding on a job, optionally on a step of one of its runs. */
export async function createFinding(em: EntityManager, member: Member, jobId: string, input: z.infer<typeof createFindingInput>): Promise<FindingDto> {
  const job = await loadJob(em, member.shopId, jobId);
  if (job.status === 'closed') throw new AppError('conflict', `Job ${job.code} is closed; no findings can be added.`);
  if (input.runId) {
    const run = await em.findOne(Run, { id: input.runId, shopId: member.shopId, job: job.id });
    if (!run) throw new AppError('bad-request', 'That run is not part of this job.', { fields: { runId: 'Not a run of this job' } });
    if (input.stepId && !(await pinnedRevision(em, member.shopId, run.revisionId)).steps.some((s) => s.id === input.stepId))
      throw new AppError('bad-request', 'That step is not part of the run.', { fields: { stepId: 'Not a step of this run' } });
  }
  const f = em.create(Finding, {
    shopId: member.shopId, job, runId: input.runId ?? null, stepId: input.stepId ?? null, what: input.what, where: input.where, severity: input.severity,
    sendToMachineShop: input.sendToMachineShop, partsToReplace: input.partsToReplace, createdById: member.userId,
  });
  await em.flush();
  const [dto] = await toDtos(em, member.shopId, [f]);
  return dto!;
}

/** The job's findings, newest first, with their photos. */
export async function listFindings(em: EntityManager, shopId: string, jobId: string): Promise<{ job: { id: string; code: string; unitDescription: string }; findings: FindingDto[] }> {
  const job = await loadJob(em, shopId, jobId);
  const rows = await em.find(Finding, { shopId, job: job.id }, { orderBy: { createdAt: 'desc', id: 'asc' } });
  return { job: { id: job.id, code: job.code, unitDescription: job.unitDescription }, findings: await toDtos(em, shopId, rows) };
}
