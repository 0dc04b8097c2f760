/** A read-only link to one run's report for someone outside the shop. Only the token's SHA-256 is kept. */
import { randomUUID } from 'node:crypto';
import { defineEntity, p, type InferEntity } from '@mikro-orm/core';

export const ShareLink = defineEntity({
  name: 'ShareLink',
  tableName: 'share_link',
  properties: {
    id: p.uuid().primary().onCreate(() => randomUUID()),
    shopId: p.string().length(64).index(),
    jobId: p.uuid().index(),
    runId: p.uuid(),
    tokenHash: p.string().length(64).unique(),
    expiresAt: p.datetime(),
    revokedAt: p.datetime().nullable(),
    createdBy: p.string().length(64),
    createdAt: p.datetime().onCreate(() => new Date()),
  },
});
export type ShareLinkEntity = InferEntity<typeof ShareLink>;
