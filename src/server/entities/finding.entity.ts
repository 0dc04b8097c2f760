/** A problem found on a job (crack, leak, broken connector …), with what it takes to fix. */
import { randomUUID } from 'node:crypto';
import { defineEntity, p, type InferEntity } from '@mikro-orm/core';
import { Job } from './job.entity';

export const FINDING_SEVERITIES = ['note', 'minor', 'major', 'critical'] as const;
export type FindingSeverity = (typeof FINDING_SEVERITIES)[number];

export const Finding = defineEntity({
  name: 'Finding',
  tableName: 'finding',
  properties: {
    id: p.uuid().primary().onCreate(() => randomUUID()),
    shopId: p.string().length(64).index(),
    job: p.manyToOne(Job).deleteRule('cascade').index(),
    runId: p.uuid().nullable(),
    stepId: p.string().length(40).nullable(),
    what: p.string().length(300),
    where: p.string().length(200).default(''),
    severity: p.string().$type<FindingSeverity>().length(16),
    sendToMachineShop: p.boolean().default(false),
    partsToReplace: p.json<Array<{ part: string; quantity: number }>>(),
    createdById: p.string().length(64),
    createdAt: p.datetime().onCreate(() => new Date()),
  },
});
export type FindingEntity = InferEntity<typeof Finding>;
