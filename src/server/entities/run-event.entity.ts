/** One accepted event of a run's log. Append-only: rows are inserted, never updated or deleted. */
import { defineEntity, p, type InferEntity } from '@mikro-orm/core';
import type { RunEvent as DomainRunEvent } from '../../domain/run';
import { Run } from './run.entity';

export const RunEvent = defineEntity({
  name: 'RunEvent',
  tableName: 'run_event',
  uniques: [
    { name: 'run_event_run_id_seq_unique', properties: ['run', 'seq'] },
    { name: 'run_event_run_id_idempotency_key_unique', properties: ['run', 'idempotencyKey'] },
  ],
  properties: {
    id: p.bigint('number').primary().autoincrement(),
    run: p.manyToOne(Run).deleteRule('cascade'),
    /** 1..N within the run, no gaps. */
    seq: p.integer(),
    type: p.string().length(40),
    /** The whole event as the run machine accepted it, actor included. */
    payload: p.json<DomainRunEvent>(),
    actorId: p.string().length(64),
    actorRole: p.string().length(16),
    device: p.string().length(120).nullable(),
    idempotencyKey: p.uuid(),
    recordedAt: p.datetime().onCreate(() => new Date()),
    clientAt: p.datetime().nullable(),
  },
});
export type RunEventEntity = InferEntity<typeof RunEvent>;
