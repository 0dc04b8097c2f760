/**
 * A photo in the object store: the original (never changed) and its webp thumbnail, with the
 * thing it shows — a run step, a tag or a finding. Only uploads that passed every check on
 * completion get a row.
 */
import { randomUUID } from 'node:crypto';
import { defineEntity, p, type InferEntity } from '@mikro-orm/core';
import { Job } from './job.entity';

export const ATTACHMENT_SCOPES = ['run-step', 'tag', 'finding'] as const;
export type AttachmentScope = (typeof ATTACHMENT_SCOPES)[number];

export const Attachment = defineEntity({
  name: 'Attachment',
  tableName: 'attachment',
  indexes: [{ name: 'attachment_run_id_step_id_index', properties: ['runId', 'stepId'] }],
  properties: {
    id: p.uuid().primary().onCreate(() => randomUUID()),
    shopId: p.string().length(64).index(),
    job: p.manyToOne(Job).deleteRule('cascade').index(),
    scopeKind: p.string().$type<AttachmentScope>().length(16),
    runId: p.uuid().nullable(),
    stepId: p.string().length(40).nullable(),
    tagId: p.uuid().nullable().index(),
    findingId: p.uuid().nullable().index(),
    /** `shops/<shopId>/jobs/<jobId>/<uuid>.<ext>`. */
    key: p.string().length(300).unique(),
    /** `shops/<shopId>/jobs/<jobId>/thumbs/<uuid>.webp`; null when the format has no decoder here (HEIC). */
    thumbKey: p.string().length(300).nullable(),
    filename: p.string().length(200),
    contentType: p.string().length(40),
    size: p.integer(),
    width: p.integer().nullable(),
    height: p.integer().nullable(),
    createdById: p.string().length(64),
    createdAt: p.datetime().onCreate(() => new Date()),
  },
});
export type AttachmentEntity = InferEntity<typeof Attachment>;
