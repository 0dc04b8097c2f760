/**
 * A removed part's tag: projected from the run's `step.complete` events of tag-part steps
 * (one per position), then kept up to date by hand (bin, disposition, condition) with history.
 */
import { randomUUID } from 'node:crypto';
import { defineEntity, p, type InferEntity } from '@mikro-orm/core';
import type { Disposition } from '../../domain/procedure/schema';
import { Job } from './job.entity';
import { Run } from './run.entity';

export const Tag = defineEntity({
  name: 'Tag',
  tableName: 'tag',
  uniques: [
    { name: 'tag_shop_id_code_unique', properties: ['shopId', 'code'] },
    { name: 'tag_run_id_step_id_position_unique', properties: ['run', 'stepId', 'position'] },
  ],
  properties: {
    id: p.uuid().primary().onCreate(() => randomUUID()),
    shopId: p.string().length(64).index(),
    job: p.manyToOne(Job).deleteRule('cascade').index(),
    run: p.manyToOne(Run).deleteRule('cascade'),
    stepId: p.string().length(40),
    partName: p.string().length(120),
    position: p.string().length(40),
    /** Readable and unique in the shop: "J-0007-VALVE-SHIM-3" (src/domain/tag-code.ts). */
    code: p.string().length(64),
    bin: p.string().length(60).default(''),
    disposition: p.string().$type<Disposition>().length(16),
    conditionNote: p.text().default(''),
    /** Seq of the run event the tag was last taken from; a later completion (after a reopen) updates it. */
    sourceSeq: p.integer(),
    createdById: p.string().length(64),
    createdAt: p.datetime().onCreate(() => new Date()),
    updatedAt: p.datetime().onCreate(() => new Date()).onUpdate(() => new Date()),
  },
});
export type TagEntity = InferEntity<typeof Tag>;
