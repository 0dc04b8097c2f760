/**
 * Tags of removed parts. They are projected from the run log: every `step.complete` of a
 * tag-part step yields one tag per position (`syncTags`, idempotent, run under the run row's
 * lock so two callers never insert the same tag). After that, bin, disposition and condition
 * change by hand with history; a later completion of the same step (after a reopen) updates
 * the tag and says so in its history.
 */
import { LockMode } from '@mikro-orm/core';
import type { EntityManager } from '@mikro-orm/postgresql';
import * as z from 'zod';
import { disposition, type Disposition, type StepOf } from '../../domain/procedure/schema';
import type { RunEventOf } from '../../domain/run';
import { tagCode } from '../../domain/tag-code';
import { Attachment, Job, Run, RunEvent, Tag, TagHistory } from '../entities';
import type { TagEntity } from '../entities/tag.entity';
import type { TagChange } from '../entities/tag-history.entity';
import type { Member } from '../guards';
import { AppError, notFound } from '../http';
import { pinnedRevision } from './run-revision';
import { userNames } from './shop-members';
import { attachmentDto, type AttachmentDto } from './uploads.service';

export const updateTagInput = z
  .object({
    bin: z.string().trim().max(60, 'At most 60 characters').optional(),
    disposition: disposition.optional(),
    conditionNote: z.string().trim().max(2000, 'At most 2000 characters').optional(),
  })
  .strict()
  .refine((v) => v.bin !== undefined || v.disposition !== undefined || v.conditionNote !== undefined, 'Change the bin, the disposition or the condition note');

export type TagDto = {
  id: string; code: string; jobId: string; jobCode: string; runId: string; stepId: string; stepTitle: string; procedureName: string;
  partName: string; position: string; bin: string; disposition: Disposition; conditionNote: string; createdAt: string; updatedAt: string;
  photos: AttachmentDto[];
};
export type TagHistoryDto = { id: string; source: 'created' | 'edit' | 'run'; changes: TagChange[]; by: { id: string; name: string }; at: string };

/** Creates or updates the tags a run's tag-part completions describe. Safe to call any number of times. */
export async function syncTags(em: EntityManager, shopId: string, runId: string): Promise<void> {
  await em.fork().transactional(async (tem) => {
    const run = await tem.findOne(Run, { id: runId, shopId }, { lockMode: LockMode.PESSIMISTIC_WRITE, populate: ['job'] });
    if (!run) throw notFound('That run');
    const { steps } = await pinnedRevision(tem, shopId, run.revisionId);
    const tagSteps = new Map(steps.filter((s): s is StepOf<'tag-part'> => s.kind === 'tag-part').map((s) => [s.id, s]));
    if (tagSteps.size === 0) return;
    const events = await tem.find(RunEvent, { run: run.id, type: 'step.complete', seq: { $gt: 0 } }, { orderBy: { seq: 'asc' } });
    const existing = await tem.find(Tag, { run: run.id });
    const byPlace = new Map(existing.map((t) => [`${t.stepId}\u0000${t.position}`, t]));
    const taken = new Set((await tem.find(Tag, { shopId, job: run.job.id }, { fields: ['code'] })).map((t) => t.code));
    for (const row of events) {
      const ev = row.payload as RunEventOf<'step.complete'>;
      const step = tagSteps.get(ev.stepId);
      if (!step || !ev.tags) continue;
      for (const entry of ev.tags) {
        const bin = entry.bin ?? '';
        const tag = byPlace.get(`${step.id}\u0000${entry.position}`);
        if (!tag) {
          const code = tagCode(run.job.code, step.partName, entry.position, taken);
          taken.add(code);
          const t = tem.create(Tag, { shopId, job: run.job, run, stepId: step.id, partName: step.partName, position: entry.position, code, bin, disposition: entry.disposition, conditionNote: '', sourceSeq: row.seq, createdById: row.actorId });
          byPlace.set(`${step.id}\u0000${entry.position}`, t);
          tem.create(TagHistory, { tag: t, source: 'created', changes: [{ field: 'disposition', from: '', to: entry.disposition }, ...(bin ? [{ field: 'bin' as const, from: '', to: bin }] : [])], changedById: row.actorId, changedAt: row.recordedAt });
        } else if (row.seq > tag.sourceSeq) {
          const changes = diff(tag, { bin, disposition: entry.disposition });
          tag.sourceSeq = row.seq;
          if (changes.length) tem.create(TagHistory, { tag, source: 'run', changes, changedById: row.actorId, changedAt: row.recordedAt });
        }
      }
    }
    await tem.flush();
  });
}

/** Applies the given values to the tag and lists what changed. */
function diff(tag: TagEntity, next: { bin?: string; disposition?: Disposition; conditionNote?: string }): TagChange[] {
  const changes: TagChange[] = [];
  for (const field of ['bin', 'disposition', 'conditionNote'] as const) {
    const to = next[field];
    if (to !== undefined && to !== tag[field]) {
      changes.push({ field, from: tag[field], to });
      (tag as Record<typeof field, string>)[field] = to;
    }
  }
  return changes;
}

async function loadJob(em: EntityManager, shopId: string, jobId: string) {
  if (!z.uuid().safeParse(jobId).success) throw notFound('That job');
  const job = await em.findOne(Job, { id: jobId, shopId });
  if (!job) throw notFound('That job');
  return job;
}

/** Brings every run of the job up to date, then lists its tags with photos. */
export async function listJobTags(em: EntityManager, shopId: string, jobId: string, opts: { stepId?: string } = {}): Promise<{ job: { id: string; code: string; unitDescription: string }; tags: TagDto[] }> {
  const job = await loadJob(em, shopId, jobId);
  const runs = await em.find(Run, { shopId, job: job.id });
  for (const r of runs) await syncTags(em, shopId, r.id);
  em.clear();
  const tags = await em.find(Tag, { shopId, job: job.id, ...(opts.stepId ? { stepId: opts.stepId } : {}) }, { orderBy: { partName: 'asc', createdAt: 'asc', position: 'asc' } });
  return { job: { id: job.id, code: job.code, unitDescription: job.unitDescription }, tags: await toDtos(em, shopId, tags, runs) };
}

async function toDtos(em: EntityManager, shopId: string, tags: TagEntity[], runs?: Array<{ id: string; revisionId: string; procedureName: string }>): Promise<TagDto[]> {
  if (tags.length === 0) return [];
  const runRows = runs ?? (await em.find(Run, { shopId, id: { $in: [...new Set(tags.map((t) => t.run.id))] } }));
  const titles = new Map<string, string>();
  const procs = new Map<string, string>();
  for (const r of runRows) {
    procs.set(r.id, r.procedureName);
    const { steps } = await pinnedRevision(em, shopId, r.revisionId);
    for (const s of steps) titles.set(`${r.id}\u0000${s.id}`, s.title);
  }
  const job = await em.findOneOrFail(Job, { id: tags[0]!.job.id, shopId });
  const photos = await em.find(Attachment, { shopId, $or: [{ tagId: { $in: tags.map((t) => t.id) } }, { scopeKind: 'run-step', runId: { $in: [...new Set(tags.map((t) => t.run.id))] }, stepId: { $in: [...new Set(tags.map((t) => t.stepId))] } }] }, { orderBy: { createdAt: 'asc', id: 'asc' } });
  return tags.map((t) => ({
    id: t.id, code: t.code, jobId: job.id, jobCode: job.code, runId: t.run.id, stepId: t.stepId, stepTitle: titles.get(`${t.run.id}\u0000${t.stepId}`) ?? t.stepId, procedureName: procs.get(t.run.id) ?? '',
    partName: t.partName, position: t.position, bin: t.bin, disposition: t.disposition, conditionNote: t.conditionNote, createdAt: t.createdAt.toISOString(), updatedAt: t.updatedAt.toISOString(),
    // A tag's own photos first, then the photos taken on the step that removed it.
    photos: [...photos.filter((p) => p.tagId === t.id), ...photos.filter((p) => p.scopeKind === 'run-step' && p.runId === t.run.id && p.stepId === t.stepId)].map(attachmentDto),
  }));
}

async function loadTag(em: EntityManager, shopId: string, tagId: string, lock = false): Promise<TagEntity> {
  if (!z.uuid().safeParse(tagId).success) throw notFound('That tag');
  const tag = await em.findOne(Tag, { id: tagId, shopId }, lock ? { lockMode: LockMode.PESSIMISTIC_WRITE } : {});
  if (!tag) throw notFound('That tag');
  return tag;
}

/** One tag with its photos and the whole history of its bin, disposition and condition. */
export async function getTag(em: EntityManager, shopId: string, tagId: string): Promise<{ tag: TagDto; history: TagHistoryDto[] }> {
  const tag = await loadTag(em, shopId, tagId);
  const [dto] = await toDtos(em, shopId, [tag]);
  const rows = await em.find(TagHistory, { tag: tag.id }, { orderBy: { changedAt: 'asc', id: 'asc' } });
  const names = await userNames(em, rows.map((r) => r.changedById));
  return { tag: dto!, history: rows.map((r) => ({ id: r.id, source: r.source, changes: r.changes, by: { id: r.changedById, name: names.get(r.changedById) ?? 'Former member' }, at: r.changedAt.toISOString() })) };
}

/** Changes a tag's bin, disposition or condition note and records who changed what. */
export async function updateTag(em: EntityManager, member: Member, tagId: string, input: z.infer<typeof updateTagInput>) {
  await em.transactional(async (tem) => {
    const tag = await loadTag(tem, member.shopId, tagId, true);
    const job = await tem.findOneOrFail(Job, { id: tag.job.id, shopId: member.shopId });
    if (job.status === 'closed') throw new AppError('conflict', `Job ${job.code} is closed; its tags can no longer change.`);
    const changes = diff(tag, input);
    if (changes.length) tem.create(TagHistory, { tag, source: 'edit', changes, changedById: member.userId });
    await tem.flush();
  });
  em.clear();
  return getTag(em, member.shopId, tagId);
}
