/** A shop's procedure: its name and kind; the steps live in its revisions. */
import { randomUUID } from 'node:crypto';
import { defineEntity, p, type InferEntity } from '@mikro-orm/core';

export const PROCEDURE_KINDS = ['teardown', 'assembly', 'inspection'] as const;
export type ProcedureKind = (typeof PROCEDURE_KINDS)[number];

export const Procedure = defineEntity({
  name: 'Procedure',
  tableName: 'procedure',
  uniques: [{ name: 'procedure_shop_id_key_unique', properties: ['shopId', 'key'] }],
  properties: {
    id: p.uuid().primary().onCreate(() => randomUUID()),
    /** The shop (better-auth organization); foreign key written by hand in the migration. */
    shopId: p.string().length(64).index(),
    /** Stable slug, unique in the shop; names exported files. */
    key: p.string().length(80),
    name: p.string().length(120),
    kind: p.string().$type<ProcedureKind>().length(16),
    engineFamily: p.string().length(120).default(''),
    description: p.text().default(''),
    /** The teardown revision an assembly procedure was derived from, if any. */
    derivedFromRevisionId: p.uuid().nullable(),
    createdAt: p.datetime().onCreate(() => new Date()),
    updatedAt: p.datetime().onCreate(() => new Date()).onUpdate(() => new Date()),
  },
});
export type ProcedureEntity = InferEntity<typeof Procedure>;
