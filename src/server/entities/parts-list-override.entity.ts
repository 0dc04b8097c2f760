/** A quantity on a job's parts list set by hand, replacing the computed one for that part. */
import { randomUUID } from 'node:crypto';
import { defineEntity, p, type InferEntity } from '@mikro-orm/core';
import { Job } from './job.entity';

export const PartsListOverride = defineEntity({
  name: 'PartsListOverride',
  tableName: 'parts_list_override',
  uniques: [{ name: 'parts_list_override_job_id_part_key_unique', properties: ['job', 'partKey'] }],
  properties: {
    id: p.uuid().primary().onCreate(() => randomUUID()),
    shopId: p.string().length(64).index(),
    job: p.manyToOne(Job).deleteRule('cascade'),
    /** src/domain/parts-list.ts partKey(). */
    partKey: p.string().length(120),
    quantity: p.integer(),
    updatedById: p.string().length(64),
    updatedAt: p.datetime().onCreate(() => new Date()).onUpdate(() => new Date()),
  },
});
export type PartsListOverrideEntity = InferEntity<typeof PartsListOverride>;
