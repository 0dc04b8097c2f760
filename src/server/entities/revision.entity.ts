/**
 * A numbered version of a procedure. A draft changes (autosave, with `version` for optimistic
 * concurrency); release gives it the next number and freezes it; retire takes it out of use.
 */
import { randomUUID } from 'node:crypto';
import { defineEntity, p, type InferEntity } from '@mikro-orm/core';
import type { RevisionContent } from '../../domain/procedure/schema';
import { Procedure } from './procedure.entity';

export const REVISION_STATUSES = ['draft', 'released', 'retired'] as const;
export type RevisionStatus = (typeof REVISION_STATUSES)[number];

export const ProcedureRevision = defineEntity({
  name: 'ProcedureRevision',
  tableName: 'procedure_revision',
  uniques: [{ name: 'procedure_revision_procedure_id_number_unique', properties: ['procedure', 'number'] }],
  indexes: [
    // At most one draft per procedure: the database refuses a second one even under races.
    { name: 'procedure_revision_one_draft', expression: `create unique index "procedure_revision_one_draft" on "procedure_revision" ("procedure_id") where "status" = 'draft'` },
  ],
  properties: {
    id: p.uuid().primary().onCreate(() => randomUUID()),
    procedure: p.manyToOne(Procedure).deleteRule('cascade'),
    /** Denormalised from the procedure so run-time reads are scoped without a join. */
    shopId: p.string().length(64).index(),
    /** Assigned at release: the procedure's highest number + 1, under a lock on the procedure row. */
    number: p.integer().nullable(),
    status: p.string().$type<RevisionStatus>().length(16).default('draft'),
    content: p.json<RevisionContent>(),
    note: p.text().default(''),
    /** Bumped by every content save; a save naming an older version is refused. */
    version: p.integer().default(1),
    basedOnId: p.uuid().nullable(),
    /** sha256 of the canonical JSON of `content`. */
    contentHash: p.string().length(64),
    createdById: p.string().length(64).nullable(),
    createdAt: p.datetime().onCreate(() => new Date()),
    updatedAt: p.datetime().onCreate(() => new Date()).onUpdate(() => new Date()),
    releasedById: p.string().length(64).nullable(),
    releasedAt: p.datetime().nullable(),
    retiredById: p.string().length(64).nullable(),
    retiredAt: p.datetime().nullable(),
  },
});
export type ProcedureRevisionEntity = InferEntity<typeof ProcedureRevision>;
