/** One opening of a read-only link (page or PDF), shown to the shop. */
import { randomUUID } from 'node:crypto';
import { defineEntity, p, type InferEntity } from '@mikro-orm/core';

export const ShareView = defineEntity({
  name: 'ShareView',
  tableName: 'share_view',
  properties: {
    id: p.uuid().primary().onCreate(() => randomUUID()),
    linkId: p.uuid().index(),
    /** What was opened: the summary page or the PDF. */
    what: p.string().length(16),
    at: p.datetime().onCreate(() => new Date()),
    ip: p.string().length(80).default(''),
    userAgent: p.string().length(300).default(''),
  },
});
export type ShareViewEntity = InferEntity<typeof ShareView>;
