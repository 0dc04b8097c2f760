/** One engine (the unit) and the work on it; runs and assignments hang off it. */
import { randomUUID } from 'node:crypto';
import { defineEntity, p, type InferEntity } from '@mikro-orm/core';
import type { JobStatus } from '../../domain/job-status';

export const Job = defineEntity({
  name: 'Job',
  tableName: 'job',
  uniques: [{ name: 'job_shop_id_code_unique', properties: ['shopId', 'code'] }],
  properties: {
    id: p.uuid().primary().onCreate(() => randomUUID()),
    /** The shop (better-auth organization); foreign key written by hand in the migration. */
    shopId: p.string().length(64).index(),
    /** Short readable code, unique in the shop: "J-0007". */
    code: p.string().length(16),
    unitDescription: p.string().length(200),
    serial: p.string().length(80).default(''),
    /** As the shop writes it: "8 412 h", "212 000 km". */
    hoursOrOdometer: p.string().length(40).default(''),
    customer: p.string().length(160).default(''),
    notes: p.text().default(''),
    status: p.string().$type<JobStatus>().length(20).default('open'),
    reviewerId: p.string().length(64).nullable(),
    createdById: p.string().length(64),
    createdAt: p.datetime().onCreate(() => new Date()),
    updatedAt: p.datetime().onCreate(() => new Date()).onUpdate(() => new Date()),
  },
});
export type JobEntity = InferEntity<typeof Job>;
