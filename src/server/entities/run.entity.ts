/**
 * One released revision being worked on one job (the traveler). The log in RunEvent is the
 * truth; status, progress and the next prompt are kept here so lists need no replay.
 */
import { randomUUID } from 'node:crypto';
import { defineEntity, p, type InferEntity } from '@mikro-orm/core';
import { Job } from './job.entity';

export const RUN_STATUSES = ['active', 'complete', 'reopened'] as const;
export type RunStatus = (typeof RUN_STATUSES)[number];

export const Run = defineEntity({
  name: 'Run',
  tableName: 'run',
  properties: {
    id: p.uuid().primary().onCreate(() => randomUUID()),
    shopId: p.string().length(64).index(),
    job: p.manyToOne(Job).deleteRule('cascade').index(),
    /** Pinned forever: the revision the run was started on (foreign key written by hand). */
    revisionId: p.uuid().index(),
    procedureName: p.string().length(120),
    revisionNumber: p.integer(),
    status: p.string().$type<RunStatus>().length(16).default('active'),
    /** Seq of the last stored event; 0 before any. Bumped under a row lock. */
    lastSeq: p.integer().default(0),
    doneSteps: p.integer().default(0),
    totalSteps: p.integer().default(0),
    nextDescription: p.string().length(300).nullable(),
    createdById: p.string().length(64),
    createdAt: p.datetime().onCreate(() => new Date()),
    updatedAt: p.datetime().onCreate(() => new Date()).onUpdate(() => new Date()),
  },
});
export type RunEntity = InferEntity<typeof Run>;
