/** The plain shapes procedures and revisions leave the server in (island props and JSON bodies). */
import type { EntityManager } from '@mikro-orm/postgresql';
import { createHash } from 'node:crypto';
import { canonicalJson } from '../../domain/canonical-json';
import type { RevisionContent } from '../../domain/procedure/schema';
import type { StepChange } from '../../domain/procedure/compare';
import { roleCan } from '../../lib/access';
import type { Member } from '../guards';
import type { ProcedureEntity, ProcedureKind } from '../entities/procedure.entity';
import type { ProcedureRevisionEntity, RevisionStatus } from '../entities/revision.entity';

export type Actor = Pick<Member, 'shopId' | 'userId' | 'role'>;
export type Person = { id: string; name: string };

export type ProcedureSummaryDto = {
  id: string;
  key: string;
  name: string;
  kind: ProcedureKind;
  engineFamily: string;
  latestReleased: { id: string; number: number; releasedAt: string } | null;
  /** Only for members who may author procedures; null for everyone else. */
  draft: { id: string; updatedAt: string } | null;
  /** Revisions this member can see (technicians and reviewers never see drafts). */
  revisionCount: number;
  updatedAt: string;
};

export type RevisionSummaryDto = {
  id: string;
  procedureId: string;
  number: number | null;
  status: RevisionStatus;
  note: string;
  version: number;
  stepCount: number;
  contentHash: string;
  basedOnId: string | null;
  createdBy: Person | null;
  createdAt: string;
  updatedAt: string;
  releasedBy: Person | null;
  releasedAt: string | null;
  retiredBy: Person | null;
  retiredAt: string | null;
};

export type RevisionDto = RevisionSummaryDto & {
  procedureKey: string;
  procedureName: string;
  procedureKind: ProcedureKind;
  content: RevisionContent;
};

export type ProcedureDto = ProcedureSummaryDto & {
  description: string;
  createdAt: string;
  derivedFromRevisionId: string | null;
  /** The teardown revision this procedure was derived from, when the member may see it. */
  derivedFrom: { procedureId: string; procedureName: string; revisionId: string; number: number | null } | null;
  /** Newest first: the draft (for authors), then released and retired revisions by number. */
  revisions: RevisionSummaryDto[];
};

export type CompareDto = {
  a: { id: string; number: number | null; status: RevisionStatus };
  b: { id: string; number: number | null; status: RevisionStatus };
  changes: StepChange[];
};

/** Whether the member may see and change drafts (owners and leads). */
export const canAuthor = (role: string | null | undefined) => roleCan(role, { procedure: ['update'] });

/** sha256 of the canonical JSON of a revision's content. */
export const contentHashOf = (content: RevisionContent) => createHash('sha256').update(canonicalJson(content)).digest('hex');

const iso = (d: Date | null | undefined) => (d ? d.toISOString() : null);

/** Names of the given users, from better-auth's table, in one query. */
export async function peopleById(em: EntityManager, ids: Array<string | null | undefined>): Promise<Map<string, Person>> {
  const unique = [...new Set(ids.filter((i): i is string => !!i))];
  if (unique.length === 0) return new Map();
  const rows = await em.getConnection().execute<Array<{ id: string; name: string }>>(`select "id", "name" from "user" where "id" in (${unique.map(() => '?').join(', ')})`, unique);
  return new Map(rows.map((r) => [r.id, { id: r.id, name: r.name }]));
}

const person = (people: Map<string, Person>, id: string | null | undefined): Person | null => (id ? (people.get(id) ?? { id, name: 'Former member' }) : null);

export function revisionSummaryDto(r: ProcedureRevisionEntity, people: Map<string, Person>): RevisionSummaryDto {
  return {
    id: r.id,
    procedureId: r.procedure.id,
    number: r.number ?? null,
    status: r.status,
    note: r.note,
    version: r.version,
    stepCount: r.content?.steps?.length ?? 0,
    contentHash: r.contentHash,
    basedOnId: r.basedOnId ?? null,
    createdBy: person(people, r.createdById),
    createdAt: r.createdAt.toISOString(),
    updatedAt: r.updatedAt.toISOString(),
    releasedBy: person(people, r.releasedById),
    releasedAt: iso(r.releasedAt),
    retiredBy: person(people, r.retiredById),
    retiredAt: iso(r.retiredAt),
  };
}

export function revisionDto(r: ProcedureRevisionEntity, p: ProcedureEntity, people: Map<string, Person>): RevisionDto {
  return { ...revisionSummaryDto(r, people), procedureKey: p.key, procedureName: p.name, procedureKind: p.kind, content: r.content };
}

export const peopleOf = (revs: ProcedureRevisionEntity[]) => revs.flatMap((r) => [r.createdById, r.releasedById, r.retiredById]);

/** Summary of a procedure from the revisions this member may see. */
export function procedureSummaryDto(p: ProcedureEntity, visible: ProcedureRevisionEntity[]): ProcedureSummaryDto {
  const released = visible.filter((r) => r.status === 'released' && r.number != null).sort((x, y) => (y.number ?? 0) - (x.number ?? 0))[0];
  const draft = visible.find((r) => r.status === 'draft');
  const latest = [p.updatedAt, ...visible.map((r) => r.updatedAt)].reduce((a, b) => (b > a ? b : a));
  return {
    id: p.id,
    key: p.key,
    name: p.name,
    kind: p.kind,
    engineFamily: p.engineFamily,
    latestReleased: released ? { id: released.id, number: released.number ?? 0, releasedAt: iso(released.releasedAt) ?? released.updatedAt.toISOString() } : null,
    draft: draft ? { id: draft.id, updatedAt: draft.updatedAt.toISOString() } : null,
    revisionCount: visible.length,
    updatedAt: latest.toISOString(),
  };
}

/** Newest first: the draft on top, then by number descending. */
export const byNewest = (x: ProcedureRevisionEntity, y: ProcedureRevisionEntity) => (x.number == null ? -1 : y.number == null ? 1 : y.number - x.number);
