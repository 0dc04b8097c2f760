/** Who changed a tag's bin, disposition or condition note, when, from what to what. */
import { randomUUID } from 'node:crypto';
import { defineEntity, p, type InferEntity } from '@mikro-orm/core';
import { Tag } from './tag.entity';

export type TagChange = { field: 'bin' | 'disposition' | 'conditionNote'; from: string; to: string };

export const TagHistory = defineEntity({
  name: 'TagHistory',
  tableName: 'tag_history',
  properties: {
    id: p.uuid().primary().onCreate(() => randomUUID()),
    tag: p.manyToOne(Tag).deleteRule('cascade').index(),
    /** `created` at the bench, `edit` by hand, `run` when a re-run of the step retagged it. */
    source: p.string().$type<'created' | 'edit' | 'run'>().length(16),
    changes: p.json<TagChange[]>(),
    changedById: p.string().length(64),
    changedAt: p.datetime().onCreate(() => new Date()),
  },
});
export type TagHistoryEntity = InferEntity<typeof TagHistory>;
