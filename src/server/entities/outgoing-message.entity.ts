/** One e-mail the app sends through the queue, with its delivery state for the desk to see. */
import { randomUUID } from 'node:crypto';
import { defineEntity, p, type InferEntity } from '@mikro-orm/core';

export const OUTGOING_STATUSES = ['queued', 'sent', 'failed'] as const;
export type OutgoingStatus = (typeof OUTGOING_STATUSES)[number];

export const OutgoingMessage = defineEntity({
  name: 'OutgoingMessage',
  tableName: 'outgoing_message',
  properties: {
    id: p.uuid().primary().onCreate(() => randomUUID()),
    shopId: p.string().length(64).index(),
    jobId: p.uuid().nullable().index(),
    runId: p.uuid().nullable(),
    /** report (with a PDF attached) or notice (review queue and send-back notifications). */
    kind: p.string().length(16),
    /** For a report: teardown or build. */
    reportKind: p.string().length(16).nullable(),
    to: p.string().length(320),
    subject: p.string().length(300),
    body: p.text(),
    status: p.string().$type<OutgoingStatus>().length(12).default('queued'),
    attempts: p.integer().default(0),
    lastError: p.text().nullable(),
    sentAt: p.datetime().nullable(),
    createdBy: p.string().length(64).nullable(),
    createdAt: p.datetime().onCreate(() => new Date()),
    updatedAt: p.datetime().onCreate(() => new Date()).onUpdate(() => new Date()),
  },
});
export type OutgoingMessageEntity = InferEntity<typeof OutgoingMessage>;
