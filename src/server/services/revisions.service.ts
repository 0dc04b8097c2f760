/**
 * Revisions: read, autosave a draft (optimistic concurrency by `version`), note, release
 * (numbered under a lock on the procedure row), retire, start a new draft, compare.
 * Drafts are visible to authors only (owner, lead); to everyone else a draft answers 404.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import { LockMode, UniqueConstraintViolationException } from '@mikro-orm/core';
import { compareRevisions } from '../../domain/procedure/compare';
import { revisionContent } from '../../domain/procedure/schema';
import { Procedure, ProcedureRevision } from '../entities';
import type { ProcedureRevisionEntity } from '../entities/revision.entity';
import { AppError, notFound } from '../http';
import { type Actor, type CompareDto, type RevisionDto, canAuthor, contentHashOf, peopleById, peopleOf, revisionDto } from './procedure-dto';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
/** A malformed id can never name a record: 404 rather than a database type error. */
export const isUuid = (id: string | undefined | null): id is string => !!id && UUID.test(id);

export const revisionLabel = (r: { number?: number | null; status: string }) => (r.number != null ? `Revision ${r.number}` : 'This draft');

/** A revision of the member's shop that the member may see, with its procedure; 404 otherwise. */
export async function loadRevision(em: EntityManager, actor: Actor, id: string, opts: { refresh?: boolean } = {}): Promise<ProcedureRevisionEntity> {
  if (!isUuid(id)) throw notFound('That revision');
  const r = await em.findOne(ProcedureRevision, { id, shopId: actor.shopId }, { populate: ['procedure'], refresh: opts.refresh });
  if (!r || (r.status === 'draft' && !canAuthor(actor.role))) throw notFound('That revision');
  return r;
}

export async function toRevisionDto(em: EntityManager, r: ProcedureRevisionEntity): Promise<RevisionDto> {
  return revisionDto(r, r.procedure, await peopleById(em, peopleOf([r])));
}

/** One revision with its steps. */
export async function getRevision(em: EntityManager, actor: Actor, id: string): Promise<RevisionDto> {
  return toRevisionDto(em, await loadRevision(em, actor, id));
}

function frozen(r: ProcedureRevisionEntity): AppError {
  return r.status === 'released'
    ? new AppError('conflict', `${revisionLabel(r)} is released and can no longer change; start a new draft.`, { status: r.status })
    : new AppError('conflict', `${revisionLabel(r)} is retired and can no longer change; start a new draft from a released revision.`, { status: r.status });
}

/** Saves a draft's steps when `version` is the one stored; returns the revision with version + 1. */
export async function saveRevisionContent(em: EntityManager, actor: Actor, id: string, body: { steps: unknown; version: number }): Promise<RevisionDto> {
  const r = await loadRevision(em, actor, id);
  if (r.status !== 'draft') throw frozen(r);
  const content = revisionContent.parse({ steps: body.steps });
  // One conditional UPDATE: two tablets saving the same version cannot both win.
  const changed = await em.nativeUpdate(ProcedureRevision, { id, shopId: actor.shopId, status: 'draft', version: body.version }, { content, contentHash: contentHashOf(content), version: body.version + 1, updatedAt: new Date() });
  const now = await loadRevision(em, actor, id, { refresh: true });
  if (changed === 0) {
    if (now.status !== 'draft') throw frozen(now);
    throw new AppError('conflict', `This draft was changed elsewhere (you had version ${body.version}, the saved one is ${now.version}). Reload it before saving again.`, { current: await toRevisionDto(em, now) });
  }
  return toRevisionDto(em, now);
}

/** Changes a draft's note (the release note it will carry). */
export async function updateRevisionNote(em: EntityManager, actor: Actor, id: string, note: string): Promise<RevisionDto> {
  const r = await loadRevision(em, actor, id);
  if (r.status !== 'draft') throw frozen(r);
  r.note = note;
  await em.flush();
  return toRevisionDto(em, r);
}

/**
 * Releases a draft: the next number (highest + 1) is taken while the procedure row is locked,
 * so concurrent releases queue up; the unique (procedure, number) index backs this up.
 */
export async function releaseRevision(em: EntityManager, actor: Actor, id: string, note?: string): Promise<RevisionDto> {
  const first = await loadRevision(em, actor, id);
  if (first.status !== 'draft') throw new AppError('conflict', `${revisionLabel(first)} is already ${first.status}.`, { status: first.status });
  const released = await em.transactional(async (tx) => {
    await tx.findOneOrFail(Procedure, { id: first.procedure.id, shopId: actor.shopId }, { lockMode: LockMode.PESSIMISTIC_WRITE, refresh: true });
    const r = await tx.findOneOrFail(ProcedureRevision, { id }, { lockMode: LockMode.PESSIMISTIC_WRITE, refresh: true, populate: ['procedure'] });
    if (r.status !== 'draft') throw new AppError('conflict', `${revisionLabel(r)} is already ${r.status}.`, { status: r.status });
    const content = revisionContent.parse(r.content);
    if (content.steps.length === 0) throw new AppError('conflict', 'This draft has no steps yet; add at least one step before releasing it.');
    const [top] = await tx.find(ProcedureRevision, { procedure: r.procedure.id, number: { $ne: null } }, { orderBy: { number: 'desc' }, limit: 1 });
    r.number = (top?.number ?? 0) + 1;
    r.status = 'released';
    if (note !== undefined) r.note = note;
    r.contentHash = contentHashOf(content);
    r.releasedById = actor.userId;
    r.releasedAt = new Date();
    return r;
  });
  return toRevisionDto(em, await loadRevision(em, actor, released.id, { refresh: true }));
}

/** Takes a released revision out of use; runs already pinned to it keep it. */
export async function retireRevision(em: EntityManager, actor: Actor, id: string): Promise<RevisionDto> {
  const r = await loadRevision(em, actor, id);
  if (r.status !== 'released') throw new AppError('conflict', r.status === 'draft' ? 'A draft is not released, so it cannot be retired; delete it instead.' : `${revisionLabel(r)} is already retired.`, { status: r.status });
  const n = await em.nativeUpdate(ProcedureRevision, { id, status: 'released' }, { status: 'retired', retiredById: actor.userId, retiredAt: new Date(), updatedAt: new Date() });
  if (n === 0) throw new AppError('conflict', `${revisionLabel(r)} was retired a moment ago.`);
  return toRevisionDto(em, await loadRevision(em, actor, id, { refresh: true }));
}

/** Deletes a draft (never a released or retired revision). */
export async function deleteDraft(em: EntityManager, actor: Actor, id: string): Promise<void> {
  const r = await loadRevision(em, actor, id);
  if (r.status !== 'draft') throw frozen(r);
  await em.nativeDelete(ProcedureRevision, { id, status: 'draft' });
}

/** The existing draft of a procedure as a 409, so the editor can open it instead. */
async function draftExists(em: EntityManager, procedureId: string): Promise<AppError> {
  const d = await em.findOne(ProcedureRevision, { procedure: procedureId, status: 'draft' }, { refresh: true });
  return new AppError('conflict', 'This procedure already has a draft; open it or delete it first.', { draftId: d?.id ?? null });
}

/** Starts a new draft holding a copy of a released (or retired) revision's steps. */
export async function startDraft(em: EntityManager, actor: Actor, procedureId: string, fromRevisionId: string): Promise<RevisionDto> {
  if (!isUuid(procedureId)) throw notFound('That procedure');
  const procedure = await em.findOne(Procedure, { id: procedureId, shopId: actor.shopId });
  if (!procedure) throw notFound('That procedure');
  const from = await loadRevision(em, actor, fromRevisionId);
  if (from.procedure.id !== procedure.id) throw new AppError('bad-request', 'That revision belongs to another procedure.', { fields: { fromRevisionId: 'Choose a revision of this procedure' } });
  if (from.status === 'draft') throw new AppError('conflict', 'Start a new draft from a released or retired revision, not from a draft.', { draftId: from.id });
  if (await em.count(ProcedureRevision, { procedure: procedure.id, status: 'draft' })) throw await draftExists(em, procedure.id);
  const content = revisionContent.parse(from.content);
  const draft = em.create(ProcedureRevision, { procedure, shopId: actor.shopId, status: 'draft', content, note: '', version: 1, basedOnId: from.id, contentHash: contentHashOf(content), createdById: actor.userId });
  try {
    await em.flush();
  } catch (e) {
    if (e instanceof UniqueConstraintViolationException) {
      em.clear();
      throw await draftExists(em, procedure.id);
    }
    throw e;
  }
  return toRevisionDto(em, draft);
}

/** Step-by-step changes from revision a to revision b (any two revisions the member may see). */
export async function compareRevisionsById(em: EntityManager, actor: Actor, aId: string, bId: string): Promise<CompareDto> {
  const a = await loadRevision(em, actor, aId);
  const b = await loadRevision(em, actor, bId);
  const head = (r: ProcedureRevisionEntity) => ({ id: r.id, number: r.number ?? null, status: r.status });
  return { a: head(a), b: head(b), changes: compareRevisions(a.content.steps, b.content.steps) };
}
