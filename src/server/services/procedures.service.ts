/**
 * Procedures: list, read, create, rename, import and export procedure files, derive an
 * assembly from a teardown, and the in-memory cache of released revision content the runner
 * reads. Revision use cases live in revisions.service.ts and are re-exported here.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import { UniqueConstraintViolationException } from '@mikro-orm/core';
import * as z from 'zod';
import { matchesState, PROCEDURE_STATES, type ProcedureState } from '../../domain/procedure/availability';
import { deriveAssembly } from '../../domain/procedure/derive-assembly';
import { exportProcedureFile, parseProcedureFile, procedureKeyFrom, procedureMeta, type ProcedureFile } from '../../domain/procedure/file-format';
import { procedureKind, revisionContent, type RevisionContent } from '../../domain/procedure/schema';
import { Procedure, ProcedureRevision } from '../entities';
import type { ProcedureEntity } from '../entities/procedure.entity';
import type { ProcedureRevisionEntity } from '../entities/revision.entity';
import { AppError, notFound } from '../http';
import { type Actor, type ProcedureDto, type ProcedureSummaryDto, type RevisionDto, byNewest, canAuthor, contentHashOf, peopleById, peopleOf, procedureSummaryDto, revisionDto, revisionSummaryDto } from './procedure-dto';
import { isUuid, loadRevision } from './revisions.service';

export * from './revisions.service';
export type * from './procedure-dto';

export const procedureCreate = z.strictObject({
  name: procedureMeta.shape.name,
  kind: procedureKind,
  engineFamily: procedureMeta.shape.engineFamily,
  description: procedureMeta.shape.description,
});
export const procedurePatch = procedureCreate.omit({ kind: true }).partial().strict();
export const procedureListQuery = z.object({
  search: z.string().trim().max(120).optional().transform((s) => s || undefined),
  status: z.enum(PROCEDURE_STATES).optional().or(z.literal('').transform(() => undefined)),
  engineFamily: z.string().trim().max(120).optional().transform((s) => s || undefined),
});

/** The revisions of some procedures that the member may see, without their steps. */
async function visibleRevisions(em: EntityManager, actor: Actor, procedureIds: string[]): Promise<ProcedureRevisionEntity[]> {
  if (procedureIds.length === 0) return [];
  const where = { shopId: actor.shopId, procedure: { $in: procedureIds }, ...(canAuthor(actor.role) ? {} : { status: { $ne: 'draft' as const } }) };
  return em.find(ProcedureRevision, where, { orderBy: { number: 'desc' } });
}

const group = (revs: ProcedureRevisionEntity[]) => {
  const m = new Map<string, ProcedureRevisionEntity[]>();
  for (const r of revs) m.set(r.procedure.id, [...(m.get(r.procedure.id) ?? []), r]);
  return m;
};

/** Procedures of the shop this member may see, filtered; technicians and reviewers see released work only. */
export async function listProcedures(em: EntityManager, actor: Actor, q: { search?: string; status?: ProcedureState; engineFamily?: string } = {}): Promise<ProcedureSummaryDto[]> {
  const like = q.search ? `%${q.search.replace(/[\\%_]/g, (c) => `\\${c}`)}%` : undefined;
  const procedures = await em.find(
    Procedure,
    { shopId: actor.shopId, ...(q.engineFamily ? { engineFamily: q.engineFamily } : {}), ...(like ? { $or: [{ name: { $ilike: like } }, { key: { $ilike: like } }, { engineFamily: { $ilike: like } }] } : {}) },
    { orderBy: { name: 'asc' } },
  );
  const revs = group(await visibleRevisions(em, actor, procedures.map((p) => p.id)));
  return procedures
    .map((p) => procedureSummaryDto(p, revs.get(p.id) ?? []))
    .filter((s) => (canAuthor(actor.role) || s.revisionCount > 0) && matchesState(s, q.status));
}

async function loadProcedure(em: EntityManager, actor: Actor, id: string): Promise<ProcedureEntity> {
  if (!isUuid(id)) throw notFound('That procedure');
  const p = await em.findOne(Procedure, { id, shopId: actor.shopId });
  if (!p) throw notFound('That procedure');
  return p;
}

/** One procedure with the revisions the member may see; 404 for a procedure with nothing they may see. */
export async function getProcedure(em: EntityManager, actor: Actor, id: string): Promise<ProcedureDto> {
  const p = await loadProcedure(em, actor, id);
  const revs = (await visibleRevisions(em, actor, [p.id])).sort(byNewest);
  if (!canAuthor(actor.role) && revs.length === 0) throw notFound('That procedure');
  let derivedFrom: ProcedureDto['derivedFrom'] = null;
  if (p.derivedFromRevisionId) {
    const src = await em.findOne(ProcedureRevision, { id: p.derivedFromRevisionId, shopId: actor.shopId }, { populate: ['procedure'] });
    if (src && (src.status !== 'draft' || canAuthor(actor.role))) derivedFrom = { procedureId: src.procedure.id, procedureName: src.procedure.name, revisionId: src.id, number: src.number ?? null };
  }
  const people = await peopleById(em, peopleOf(revs));
  return { ...procedureSummaryDto(p, revs), description: p.description, createdAt: p.createdAt.toISOString(), derivedFromRevisionId: p.derivedFromRevisionId ?? null, derivedFrom, revisions: revs.map((r) => revisionSummaryDto(r, people)) };
}

/** A key not yet used in the shop: the wanted one, else with -2, -3 … appended. */
async function freeKey(em: EntityManager, shopId: string, wanted: string): Promise<string> {
  const base = wanted.slice(0, 74).replace(/-+$/, '') || 'procedure';
  const taken = new Set((await em.find(Procedure, { shopId, key: { $like: `${base}%` } }, { fields: ['key'] })).map((p) => p.key));
  if (!taken.has(wanted)) return wanted;
  for (let i = 2; ; i++) if (!taken.has(`${base}-${i}`)) return `${base}-${i}`;
}

type NewProcedure = { key?: string; name: string; kind: ProcedureEntity['kind']; engineFamily: string; description: string; derivedFromRevisionId?: string | null };

/** Creates a procedure and its first draft in one transaction. */
async function createWithDraft(em: EntityManager, actor: Actor, meta: NewProcedure, content: RevisionContent, note = ''): Promise<{ procedure: ProcedureDto; draft: RevisionDto }> {
  try {
    const ids = await em.transactional(async (tx) => {
      // Key choice is serialised per shop, so parallel imports of one file get -2, -3 … rather than a clash.
      await tx.getConnection().execute('select pg_advisory_xact_lock(hashtext(?))', [`procedure-key:${actor.shopId}`], 'all', tx.getTransactionContext());
      const key = await freeKey(tx, actor.shopId, meta.key ?? procedureKeyFrom(meta.name));
      const procedure = tx.create(Procedure, { shopId: actor.shopId, key, name: meta.name, kind: meta.kind, engineFamily: meta.engineFamily, description: meta.description, derivedFromRevisionId: meta.derivedFromRevisionId ?? null });
      const draft = tx.create(ProcedureRevision, { procedure, shopId: actor.shopId, status: 'draft', content, note, version: 1, contentHash: contentHashOf(content), createdById: actor.userId });
      await tx.flush();
      return { procedureId: procedure.id, draftId: draft.id };
    });
    const draft = await loadRevision(em, actor, ids.draftId);
    return { procedure: await getProcedure(em, actor, ids.procedureId), draft: revisionDto(draft, draft.procedure, await peopleById(em, peopleOf([draft]))) };
  } catch (e) {
    if (e instanceof UniqueConstraintViolationException) {
      console.error('[procedures] unexpected unique violation while creating a procedure', e);
      throw new AppError('conflict', 'Another procedure took that key a moment ago; try again.');
    }
    throw e;
  }
}

/** A new procedure with an empty draft. */
export async function createProcedure(em: EntityManager, actor: Actor, input: z.infer<typeof procedureCreate>) {
  return createWithDraft(em, actor, input, { steps: [] });
}

/** Renames a procedure or changes its engine family or description (kind and key stay). */
export async function updateProcedure(em: EntityManager, actor: Actor, id: string, patch: z.infer<typeof procedurePatch>): Promise<ProcedureDto> {
  const p = await loadProcedure(em, actor, id);
  em.assign(p, patch);
  await em.flush();
  return getProcedure(em, actor, id);
}

/** Imports a procedure file as a new procedure with a draft; every problem is listed by path and nothing is stored. */
export async function importProcedure(em: EntityManager, actor: Actor, json: unknown): Promise<{ procedure: ProcedureDto; draft: RevisionDto }> {
  const parsed = parseProcedureFile(json);
  if (!parsed.ok) throw new AppError('bad-request', `The file has ${parsed.problems.length} problem${parsed.problems.length === 1 ? '' : 's'}; nothing was imported.`, { problems: parsed.problems });
  const { procedure: meta, revision } = parsed.file;
  return createWithDraft(em, actor, meta, revisionContent.parse({ steps: revision.steps }), revision.note);
}

/** A revision as a procedure file, with its download name (`<key>-rev<N>.json`, drafts `<key>-draft.json`). */
export async function exportProcedure(em: EntityManager, actor: Actor, procedureId: string, revisionId?: string | null): Promise<{ filename: string; file: ProcedureFile }> {
  const p = await loadProcedure(em, actor, procedureId);
  let r: ProcedureRevisionEntity | undefined;
  if (revisionId) {
    r = await loadRevision(em, actor, revisionId);
    if (r.procedure.id !== p.id) throw notFound('That revision');
  } else {
    const revs = (await visibleRevisions(em, actor, [p.id])).sort(byNewest);
    r = revs.find((x) => x.status === 'released') ?? revs[0];
  }
  if (!r) throw notFound('A revision to export');
  const file = exportProcedureFile({ key: p.key, name: p.name, kind: p.kind, engineFamily: p.engineFamily, description: p.description }, { note: r.note, steps: r.content.steps });
  return { filename: `${p.key}-${r.number != null ? `rev${r.number}` : 'draft'}.json`, file };
}

/** A new assembly procedure whose draft is derived from a teardown revision. */
export async function deriveAssemblyFrom(em: EntityManager, actor: Actor, revisionId: string) {
  const r = await loadRevision(em, actor, revisionId);
  if (r.procedure.kind !== 'teardown') throw new AppError('conflict', 'Only a teardown procedure can be turned into an assembly.');
  if (r.content.steps.length === 0) throw new AppError('conflict', 'This revision has no steps to derive an assembly from.');
  const steps = deriveAssembly(r.content.steps, (i) => `as-${String(i + 1).padStart(2, '0')}`);
  const src = r.procedure;
  const name = `${src.name} — assembly`.slice(0, 120);
  const note = `Derived from ${src.name}, ${r.number != null ? `revision ${r.number}` : 'its draft'}.`;
  return createWithDraft(em, actor, { key: procedureKeyFrom(`${src.key}-assembly`), name, kind: 'assembly', engineFamily: src.engineFamily, description: src.description, derivedFromRevisionId: r.id }, { steps }, note);
}

/** Released content never changes, so it is kept in memory by revision id (bounded, oldest dropped first). */
const releasedCache = new Map<string, { shopId: string; content: RevisionContent }>();
const CACHE_LIMIT = 500;

/** Shared between requests, so no caller may change it in place. */
function deepFreeze<T>(v: T): T {
  if (v && typeof v === 'object' && !Object.isFrozen(v)) {
    Object.freeze(v);
    for (const x of Object.values(v)) deepFreeze(x);
  }
  return v;
}

/**
 * The steps of a released (or retired: runs stay pinned to it) revision of the shop, for the
 * runner; 404 for drafts, unknown ids and other shops.
 */
export async function getReleasedRevisionContent(em: EntityManager, shopId: string, revisionId: string): Promise<RevisionContent> {
  const hit = releasedCache.get(revisionId);
  if (hit) {
    if (hit.shopId !== shopId) throw notFound('That revision');
    return hit.content;
  }
  if (!isUuid(revisionId)) throw notFound('That revision');
  const r = await em.findOne(ProcedureRevision, { id: revisionId, shopId, status: { $ne: 'draft' } });
  if (!r) throw notFound('That revision');
  const content = deepFreeze(revisionContent.parse(r.content));
  if (releasedCache.size >= CACHE_LIMIT) releasedCache.delete(releasedCache.keys().next().value as string);
  releasedCache.set(revisionId, { shopId, content });
  return content;
}
