/** A technician assigned to a job. */
import { randomUUID } from 'node:crypto';
import { defineEntity, p, type InferEntity } from '@mikro-orm/core';
import { Job } from './job.entity';

export const JobAssignment = defineEntity({
  name: 'JobAssignment',
  tableName: 'job_assignment',
  uniques: [{ name: 'job_assignment_job_id_user_id_unique', properties: ['job', 'userId'] }],
  properties: {
    id: p.uuid().primary().onCreate(() => randomUUID()),
    job: p.manyToOne(Job).deleteRule('cascade'),
    userId: p.string().length(64).index(),
    createdAt: p.datetime().onCreate(() => new Date()),
  },
});
export type JobAssignmentEntity = InferEntity<typeof JobAssignment>;
