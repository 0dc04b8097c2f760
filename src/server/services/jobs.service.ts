/** Jobs: open, list, edit, assign and move through the status flow (src/domain/job-status.ts). */
import { LockMode } from '@mikro-orm/core';
import type { EntityManager } from '@mikro-orm/postgresql';
import * as z from 'zod';
import { JOB_STATUSES, checkJobMove, nextJobStatuses, type JobStatus } from '../../domain/job-status';
import { roleCan } from '../../lib/access';
import { Job, JobAssignment, Run } from '../entities';
import type { JobEntity } from '../entities/job.entity';
import type { Member } from '../guards';
import { AppError, notFound } from '../http';
import { shopMembers } from './shop-members';

const text = (max: number) => z.string().trim().max(max, `At most ${max} characters`);
const userId = z.string().trim().min(1).max(64);
const jobFields = {
  unitDescription: text(200).min(1, 'Describe the unit (engine, model, what it came out of)'),
  serial: text(80),
  hoursOrOdometer: text(40),
  customer: text(160),
  notes: text(5000),
  technicianIds: z.array(userId).max(20, 'At most 20 technicians').refine((ids) => new Set(ids).size === ids.length, 'A technician is listed twice'),
  reviewerId: userId.nullable(),
};

export const createJobInput = z.object({
  ...jobFields,
  serial: jobFields.serial.default(''),
  hoursOrOdometer: jobFields.hoursOrOdometer.default(''),
  customer: jobFields.customer.default(''),
  notes: jobFields.notes.default(''),
  technicianIds: jobFields.technicianIds.default([]),
  reviewerId: jobFields.reviewerId.optional(),
}).strict();
export const updateJobInput = z.object(jobFields).partial().strict();
export const jobStatusInput = z.object({ to: z.enum(JOB_STATUSES, 'Choose one of the job statuses'), reason: text(1000).optional() }).strict();
export const jobListQuery = z.object({
  status: z.enum(JOB_STATUSES, 'Unknown job status').optional(),
  technician: userId.optional(),
  olderThanDays: z.coerce.number('Give a number of days').int('Give a whole number of days').min(0).max(36500).optional(),
});

export type PersonDto = { id: string; name: string };
export type JobSummaryDto = {
  id: string; code: string; unitDescription: string; serial: string; customer: string; status: JobStatus;
  technicians: PersonDto[]; reviewer: PersonDto | null; runs: number; createdAt: string; updatedAt: string; ageDays: number;
};
export type JobRunDto = { id: string; procedureName: string; revisionNumber: number; status: string; progress: { done: number; total: number }; next: string | null; createdAt: string };
export type JobDto = Omit<JobSummaryDto, 'runs'> & { hoursOrOdometer: string; notes: string; createdById: string; runs: JobRunDto[]; nextStatuses: JobStatus[] };

const DAY_MS = 86_400_000;
const ageDays = (createdAt: Date, now = Date.now()) => Math.max(0, Math.floor((now - createdAt.getTime()) / DAY_MS));

/** Checks that technicians can record runs and the reviewer can sign off, all in this shop; 400 with fields otherwise. */
async function checkAssignees(em: EntityManager, shopId: string, technicianIds: readonly string[] | undefined, reviewerId: string | null | undefined): Promise<void> {
  const ids = [...(technicianIds ?? []), ...(reviewerId ? [reviewerId] : [])];
  const members = await shopMembers(em, shopId, ids);
  const fields: Record<string, string> = {};
  (technicianIds ?? []).forEach((id, i) => {
    const m = members.get(id);
    if (!m) fields[`technicianIds.${i}`] = 'This person is not a member of the shop.';
    else if (!roleCan(m.role, { run: ['record'] })) fields[`technicianIds.${i}`] = `${m.name} is a ${m.role} and cannot work steps.`;
  });
  if (reviewerId) {
    const m = members.get(reviewerId);
    if (!m) fields.reviewerId = 'This person is not a member of the shop.';
    else if (!roleCan(m.role, { signoff: ['sign'] })) fields.reviewerId = `${m.name} is a ${m.role} and cannot sign off work.`;
  }
  if (Object.keys(fields).length > 0) throw new AppError('bad-request', 'Some people cannot be assigned to this job.', { fields });
}

async function setTechnicians(em: EntityManager, job: JobEntity, technicianIds: readonly string[]): Promise<void> {
  await em.nativeDelete(JobAssignment, { job: job.id, userId: { $nin: [...technicianIds] } });
  const existing = new Set((await em.find(JobAssignment, { job: job.id })).map((a) => a.userId));
  for (const userId of technicianIds) if (!existing.has(userId)) em.create(JobAssignment, { job, userId });
}

/** The shop's next job code, "J-0001" upward; callers hold the shop's code lock. */
async function nextCode(em: EntityManager, shopId: string): Promise<string> {
  const [row] = await em.getConnection().execute<Array<{ n: number | null }>>(`select max(substring(code from 3)::int) as n from job where shop_id = ? and code ~ '^J-[0-9]+$'`, [shopId], 'all', em.getTransactionContext());
  return `J-${String((row?.n ?? 0) + 1).padStart(4, '0')}`;
}

async function loadJob(em: EntityManager, shopId: string, jobId: string): Promise<JobEntity> {
  if (!z.uuid().safeParse(jobId).success) throw notFound('That job');
  const job = await em.findOne(Job, { id: jobId, shopId });
  if (!job) throw notFound('That job');
  return job;
}

/** Opens a job (code assigned under a per-shop lock so two leads never get the same code). */
export async function createJob(em: EntityManager, member: Member, input: z.infer<typeof createJobInput>): Promise<JobDto> {
  await checkAssignees(em, member.shopId, input.technicianIds, input.reviewerId);
  const id = await em.transactional(async (tem) => {
    await tem.getConnection().execute(`select pg_advisory_xact_lock(hashtext(?))`, [`job-code:${member.shopId}`], 'all', tem.getTransactionContext());
    const code = await nextCode(tem, member.shopId);
    const { technicianIds, ...fields } = input;
    const job = tem.create(Job, { ...fields, reviewerId: input.reviewerId ?? null, shopId: member.shopId, code, status: 'open', createdById: member.userId });
    for (const userId of technicianIds) tem.create(JobAssignment, { job, userId });
    await tem.flush();
    return job.id;
  });
  return getJob(em, member, id);
}

/** Changes a job's unit details and assignments. */
export async function updateJob(em: EntityManager, member: Member, jobId: string, input: z.infer<typeof updateJobInput>): Promise<JobDto> {
  const job = await loadJob(em, member.shopId, jobId);
  await checkAssignees(em, member.shopId, input.technicianIds, input.reviewerId);
  const { technicianIds, ...fields } = input;
  em.assign(job, fields);
  if (technicianIds) {
    await setTechnicians(em, job, technicianIds);
    job.updatedAt = new Date();
  }
  await em.flush();
  return getJob(em, member, job.id);
}

/** Moves a job to another status when the flow and the member's role allow it (409 / 403 otherwise). */
export async function changeJobStatus(em: EntityManager, member: Member, jobId: string, to: JobStatus): Promise<JobDto> {
  await em.transactional(async (tem) => {
    const job = await loadJob(tem, member.shopId, jobId);
    await tem.lock(job, LockMode.PESSIMISTIC_WRITE);
    const activeRuns = await tem.count(Run, { job: job.id, status: { $ne: 'complete' } });
    const move = checkJobMove(job.status, to, member.role, { activeRuns });
    if (!move.ok) throw new AppError(move.code, move.message, { status: job.status });
    job.status = to;
  });
  return getJob(em, member, jobId);
}

type Names = Map<string, { id: string; name: string }>;
async function namesFor(em: EntityManager, shopId: string, ids: string[]): Promise<Names> {
  const members = await shopMembers(em, shopId, [...new Set(ids)]);
  return new Map([...members].map(([id, m]) => [id, { id, name: m.name }]));
}
const person = (names: Names, id: string): PersonDto => names.get(id) ?? { id, name: 'Former member' };

/** One job with its assignees and runs. */
export async function getJob(em: EntityManager, member: Member, jobId: string): Promise<JobDto> {
  const job = await loadJob(em, member.shopId, jobId);
  const [assignments, runs] = await Promise.all([
    em.find(JobAssignment, { job: job.id }, { orderBy: { createdAt: 'asc' } }),
    em.find(Run, { job: job.id, shopId: member.shopId }, { orderBy: { createdAt: 'asc' } }),
  ]);
  const names = await namesFor(em, member.shopId, [...assignments.map((a) => a.userId), ...(job.reviewerId ? [job.reviewerId] : [])]);
  const activeRuns = runs.filter((r) => r.status !== 'complete').length;
  return {
    id: job.id, code: job.code, unitDescription: job.unitDescription, serial: job.serial, hoursOrOdometer: job.hoursOrOdometer, customer: job.customer, notes: job.notes, status: job.status,
    technicians: assignments.map((a) => person(names, a.userId)),
    reviewer: job.reviewerId ? person(names, job.reviewerId) : null,
    createdById: job.createdById, createdAt: job.createdAt.toISOString(), updatedAt: job.updatedAt.toISOString(), ageDays: ageDays(job.createdAt),
    runs: runs.map((r) => ({ id: r.id, procedureName: r.procedureName, revisionNumber: r.revisionNumber, status: r.status, progress: { done: r.doneSteps, total: r.totalSteps }, next: r.nextDescription ?? null, createdAt: r.createdAt.toISOString() })),
    nextStatuses: nextJobStatuses(job.status, member.role, { activeRuns }),
  };
}

/** The shop's jobs, most recently changed first, filtered by status, assigned technician and age. */
export async function listJobs(em: EntityManager, member: Member, q: z.infer<typeof jobListQuery>): Promise<JobSummaryDto[]> {
  const where: Record<string, unknown> = { shopId: member.shopId };
  if (q.status) where.status = q.status;
  if (q.olderThanDays !== undefined) where.createdAt = { $lte: new Date(Date.now() - q.olderThanDays * DAY_MS) };
  if (q.technician) {
    const technician = q.technician === 'me' ? member.userId : q.technician;
    const assigned = await em.find(JobAssignment, { userId: technician, job: { shopId: member.shopId } });
    where.id = { $in: assigned.map((a) => a.job.id) };
  }
  const jobs = await em.find(Job, where, { orderBy: { updatedAt: 'desc' }, limit: 500 });
  const ids = jobs.map((j) => j.id);
  const [assignments, runCounts] = await Promise.all([
    ids.length ? em.find(JobAssignment, { job: { $in: ids } }, { orderBy: { createdAt: 'asc' } }) : Promise.resolve([]),
    ids.length
      ? em.getConnection().execute<Array<{ job_id: string; n: string }>>(`select job_id, count(*) as n from run where job_id in (${ids.map(() => '?').join(', ')}) group by job_id`, ids)
      : Promise.resolve([]),
  ]);
  const names = await namesFor(em, member.shopId, [...assignments.map((a) => a.userId), ...jobs.flatMap((j) => (j.reviewerId ? [j.reviewerId] : []))]);
  const counts = new Map(runCounts.map((r) => [r.job_id, Number(r.n)]));
  const now = Date.now();
  return jobs.map((job) => ({
    id: job.id, code: job.code, unitDescription: job.unitDescription, serial: job.serial, customer: job.customer, status: job.status,
    technicians: assignments.filter((a) => a.job.id === job.id).map((a) => person(names, a.userId)),
    reviewer: job.reviewerId ? person(names, job.reviewerId) : null,
    runs: counts.get(job.id) ?? 0,
    createdAt: job.createdAt.toISOString(), updatedAt: job.updatedAt.toISOString(), ageDays: ageDays(job.createdAt, now),
  }));
}
