/**
 * A reviewer's signature on a run or on one hold point: who, in which role, when, what it
 * means, and the SHA-256 of the canonical record it covers (kept whole in `record`).
 * Signatures are never changed; a later change to the work shows as a mismatch, not an edit.
 */
import { randomUUID } from 'node:crypto';
import { defineEntity, p, type InferEntity } from '@mikro-orm/core';
import type { SignoffMeaning, SignoffRecord } from '../../domain/signoff';

export const Signature = defineEntity({
  name: 'Signature',
  tableName: 'signature',
  properties: {
    id: p.uuid().primary().onCreate(() => randomUUID()),
    shopId: p.string().length(64).index(),
    /** The run signed (foreign key written by hand). */
    runId: p.uuid().index(),
    /** The hold point signed; null for a signature on the whole run. */
    stepId: p.string().length(40).nullable(),
    signerId: p.string().length(64),
    signerName: p.string().length(200),
    signerRole: p.string().length(16),
    meaning: p.string().$type<SignoffMeaning>().length(40),
    signedAt: p.datetime().onCreate(() => new Date()),
    /** The run's last seq when signed, for showing what came after. */
    runSeq: p.integer(),
    recordHash: p.string().length(64),
    record: p.json<SignoffRecord>(),
  },
});
export type SignatureEntity = InferEntity<typeof Signature>;
