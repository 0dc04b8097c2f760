/**
 * The review queue: hold points waiting for a signature, finished runs without a current run
 * signature, and deviations waiting for a lead. Also the notices sent when something enters
 * the queue. Runs are replayed through the run machine; results are cached by run and seq.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import { JOB_STATUS_LABELS, type JobStatus } from '../../domain/job-status';
import { nextExpected, pendingDeviation, replay, runProgress, type RunEvent, type RunSnapshot } from '../../domain/run';
import type { Role } from '../../domain/procedure/schema';
import { roleCan, type ShopRole } from '../../lib/access';
import { config } from '../config';
import { Job, Run, RunEvent as RunEventRow, Signature } from '../entities';
import type { JobEntity } from '../entities/job.entity';
import type { RunEntity } from '../entities/run.entity';
import type { Member } from '../guards';
import { queueNotices } from './mail-queue.service';
import { pinnedRevision } from './run-revision';
import { shopMembers, userNames } from './shop-members';

export type ReviewItem = {
  kind: 'hold-point' | 'run' | 'deviation';
  runId: string; jobId: string; jobCode: string; unitDescription: string; jobStatus: string; procedureName: string; revisionNumber: number;
  stepId: string | null; stepNumber: number | null; stepTitle: string; detail: string; since: string; href: string;
};
export type ReviewQueue = { items: ReviewItem[]; counts: { holds: number; runs: number; deviations: number; total: number } };

type RunState = { seq: number; hold: { stepId: string; index: number; title: string; signers: Role[] } | null; deviation: { stepId: string; index: number; title: string; kind: string; reason: string; by: string } | null; complete: boolean; since: string };
const cache = new Map<string, RunState>();

function stateOf(snapshot: RunSnapshot): Omit<RunState, 'seq' | 'since'> {
  const next = nextExpected(snapshot);
  const step = next ? snapshot.context.steps[next.stepIndex] : undefined;
  const dev = pendingDeviation(snapshot);
  const devIndex = dev ? snapshot.context.steps.findIndex((s) => s.id === dev.stepId) : -1;
  return {
    hold: step?.kind === 'hold-point' ? { stepId: step.id, index: next!.stepIndex, title: step.title, signers: step.signers } : null,
    deviation: dev ? { stepId: dev.stepId, index: devIndex, title: snapshot.context.steps[devIndex]?.title ?? dev.stepId, kind: dev.kind, reason: dev.reason, by: dev.requestedBy } : null,
    complete: runProgress(snapshot).complete,
  };
}

async function runState(em: EntityManager, run: { id: string; shopId: string; revisionId: string; lastSeq: number; updatedAt: Date }): Promise<RunState> {
  const hit = cache.get(run.id);
  if (hit && hit.seq === run.lastSeq) return hit;
  const [revision, rows] = await Promise.all([pinnedRevision(em, run.shopId, run.revisionId), em.find(RunEventRow, { run: run.id }, { orderBy: { seq: 'asc' } })]);
  const s: RunState = { seq: run.lastSeq, since: (rows.at(-1)?.recordedAt ?? run.updatedAt).toISOString(), ...stateOf(replay(revision.steps, rows.map((r) => r.payload))) };
  cache.set(run.id, s);
  return s;
}

/** What waits for this member: hold points their role may sign, runs to sign off, deviations to decide. */
export async function reviewQueue(em: EntityManager, member: Pick<Member, 'shopId' | 'role'>): Promise<ReviewQueue> {
  const canSign = roleCan(member.role, { signoff: ['sign'] });
  const canApprove = roleCan(member.role, { deviation: ['approve'] });
  const runs = await em.find(Run, { shopId: member.shopId }, { orderBy: { updatedAt: 'desc' }, limit: 1000 });
  const jobs = runs.length ? await em.find(Job, { id: { $in: [...new Set(runs.map((r) => r.job.id))] }, shopId: member.shopId }) : [];
  const jobById = new Map(jobs.map((j) => [j.id, j]));
  const complete = runs.filter((r) => r.status === 'complete');
  const sigs = complete.length ? await em.find(Signature, { shopId: member.shopId, runId: { $in: complete.map((r) => r.id) }, stepId: null }) : [];
  const names = new Map<string, string>();
  const items: ReviewItem[] = [];
  for (const run of runs) {
    const job = jobById.get(run.job.id);
    if (!job || job.status === 'closed') continue;
    const base = { runId: run.id, jobId: job.id, jobCode: job.code, unitDescription: job.unitDescription, jobStatus: JOB_STATUS_LABELS[job.status as JobStatus], procedureName: run.procedureName, revisionNumber: run.revisionNumber };
    if (run.status === 'complete') {
      // A run signature made at the current seq still covers everything; a later event means sign again.
      if (canSign && !sigs.some((s) => s.runId === run.id && s.runSeq === run.lastSeq)) {
        items.push({ ...base, kind: 'run', stepId: null, stepNumber: null, stepTitle: 'Whole run', detail: `${run.totalSteps} steps finished`, since: run.updatedAt.toISOString(), href: `/runs/${run.id}/signoff` });
      }
      continue;
    }
    const s = await runState(em, run);
    if (s.hold && s.hold.signers.includes(member.role as Role)) {
      items.push({ ...base, kind: 'hold-point', stepId: s.hold.stepId, stepNumber: s.hold.index + 1, stepTitle: s.hold.title, detail: `Signers: ${s.hold.signers.join(', ')}`, since: s.since, href: `/runs/${run.id}/signoff?step=${encodeURIComponent(s.hold.stepId)}` });
    }
    if (s.deviation && canApprove) {
      if (!names.has(s.deviation.by)) for (const [id, n] of await userNames(em, [s.deviation.by])) names.set(id, n);
      items.push({ ...base, kind: 'deviation', stepId: s.deviation.stepId, stepNumber: s.deviation.index + 1, stepTitle: s.deviation.title, detail: `${s.deviation.kind === 'skip' ? 'Skip' : 'Out of spec'} asked by ${names.get(s.deviation.by) ?? 'a technician'}: ${s.deviation.reason}`, since: s.since, href: `/runs/${run.id}` });
    }
  }
  const count = (k: ReviewItem['kind']) => items.filter((i) => i.kind === k).length;
  return { items, counts: { holds: count('hold-point'), runs: count('run'), deviations: count('deviation'), total: items.length } };
}

/** The number of items waiting for a role, for the navigation badge (0 for roles without a queue). */
export async function reviewCount(em: EntityManager, shopId: string, role: ShopRole | null): Promise<number> {
  if (!role || !(roleCan(role, { signoff: ['sign'] }) || roleCan(role, { deviation: ['approve'] }))) return 0;
  return (await reviewQueue(em, { shopId, role })).counts.total;
}

async function emails(em: EntityManager, ids: string[]): Promise<string[]> {
  if (ids.length === 0) return [];
  const rows = await em.getConnection().execute<Array<{ email: string }>>(`select email from "user" where id in (${ids.map(() => '?').join(', ')})`, ids);
  return rows.map((r) => r.email);
}

/**
 * Notices after an accepted event: the job's reviewer when a hold point or a finished run
 * enters the queue, the shop's leads when a deviation waits. Called by the runs service after
 * it stores an event; never throws (a notice must not undo the work).
 */
export async function noticesAfterEvent(em: EntityManager, shopId: string, runId: string, event: RunEvent, snapshot: RunSnapshot, loaded?: { run: RunEntity; job: JobEntity }): Promise<void> {
  try {
    // The poster has just had the run and its job under lock; only other callers load them.
    const run = loaded?.run ?? (await em.findOne(Run, { id: runId, shopId }));
    if (!run) return;
    const job = loaded?.job ?? (await em.findOneOrFail(Job, { id: run.job.id, shopId }));
    const s = stateOf(snapshot);
    const link = `${config().PUBLIC_URL}/review`;
    const base = { shopId, jobId: job.id, runId, createdBy: event.actor.userId };
    const where = `job ${job.code} (${job.unitDescription}), ${run.procedureName} revision ${run.revisionNumber}`;
    if (event.type === 'run.reopen' || event.type === 'hold.sign') return;
    if (s.hold && s.hold.stepId !== event.stepId && job.reviewerId) {
      await queueNotices(em, { ...base, subject: `Hold point waiting on ${job.code}: ${s.hold.title}`, body: `A hold point waits for your signature on ${where}.\n\nStep ${s.hold.index + 1}: ${s.hold.title}\n\nOpen the review queue: ${link}\n` }, await emails(em, [job.reviewerId]));
    } else if (s.complete && job.reviewerId) {
      await queueNotices(em, { ...base, subject: `Run ready for sign-off on ${job.code}: ${run.procedureName}`, body: `Every step is finished on ${where}; it waits for your sign-off.\n\nOpen the review queue: ${link}\n` }, await emails(em, [job.reviewerId]));
    } else if (event.type === 'deviation.request') {
      const members = await shopMembers(em, shopId);
      const leads = [...members.values()].filter((m) => roleCan(m.role, { deviation: ['approve'] }) && m.id !== event.actor.userId).map((m) => m.id);
      await queueNotices(em, { ...base, subject: `Deviation waiting on ${job.code}`, body: `A deviation (${event.kind}) waits for a lead's decision on ${where}.\n\nReason: ${event.reason}\n\nOpen the review queue: ${link}\n` }, await emails(em, leads));
    }
  } catch (e) {
    console.error('[review] notice not queued', e);
  }
}
