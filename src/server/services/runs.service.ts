/**
 * Runs and their append-only event log. Every event goes through the run machine
 * (`applyEvent`) inside one transaction that holds the run row's lock, so the log never forks:
 * seqs are 1..N without gaps, a retried request (same idempotency key) stores nothing new,
 * and a client that has not seen the latest event gets the fresh state instead.
 */
import { LockMode } from '@mikro-orm/core';
import type { EntityManager } from '@mikro-orm/postgresql';
import * as z from 'zod';
import { acceptsNewRuns, statusOnRunComplete, statusOnRunReopen, statusOnRunStart } from '../../domain/job-status';
import type { Step } from '../../domain/procedure/schema';
import { applyEvent, nextExpected, pendingDeviation, replay, runProgress, startRun, stepStates, storeRun, type RunEvent, type RunSnapshot } from '../../domain/run';
import { roleCan } from '../../lib/access';
import { Job, Run, RunEvent as RunEventRow } from '../entities';
import type { RunEntity, RunStatus } from '../entities/run.entity';
import type { JobEntity } from '../entities/job.entity';
import type { RunEventEntity } from '../entities/run-event.entity';
import type { Member } from '../guards';
import { AppError, notFound } from '../http';
import { pinnedRevision, revisionForNewRun } from './run-revision';
import { userNames } from './shop-members';
import { currentRunState, rememberRunState } from './run-state';
import { noticesAfterEvent } from './review.service';

export const startRunInput = z.object({ revisionId: z.uuid('Choose a released revision') }).strict();
export const recordEventInput = z.object({
  event: z.record(z.string(), z.unknown(), 'Send the event as an object'),
  idempotencyKey: z.uuid('Send a uuid as the idempotency key'),
  expectedSeq: z.number('Send the last seq you have seen').int().min(0),
  device: z.string().trim().max(120).optional(),
  clientAt: z.iso.datetime({ offset: true }).optional(),
}).strict();
export const eventsQuery = z.object({ after: z.coerce.number('Give a seq number').int().min(0).default(0) });

/** Events decided by the machine's own role rules (approver, signer, reopener), not by `run:record`. */
const ROLE_RULED_EVENTS = new Set(['deviation.approve', 'deviation.reject', 'hold.sign', 'run.reopen']);

export type StoredEventDto = { seq: number; type: string; payload: RunEvent; actor: { id: string; name: string; role: string }; device: string | null; recordedAt: string; clientAt: string | null };
export type RunInfoDto = { id: string; jobId: string; jobCode: string; revisionId: string; procedureName: string; revisionNumber: number; status: RunStatus; lastSeq: number; createdAt: string };
export type NextDto = ReturnType<typeof nextExpected>;
export type ProgressDto = ReturnType<typeof runProgress>;
export type RunDto = {
  run: RunInfoDto; steps: Step[]; events: StoredEventDto[]; next: NextDto; progress: ProgressDto;
  stepStates: ReturnType<typeof stepStates>; pendingDeviation: ReturnType<typeof pendingDeviation>;
};
export type RecordedDto = { event: StoredEventDto; lastSeq: number; next: NextDto; progress: ProgressDto };

const runStatusOf = (snapshot: RunSnapshot): RunStatus =>
  runProgress(snapshot).complete ? 'complete' : snapshot.context.reopens.length > 0 ? 'reopened' : 'active';

/** Keeps the run row's list fields (status, progress, next prompt) in step with the machine. */
function summarise(run: RunEntity, snapshot: RunSnapshot): void {
  const progress = runProgress(snapshot);
  run.status = runStatusOf(snapshot);
  run.doneSteps = progress.done;
  run.totalSteps = progress.total;
  run.nextDescription = nextExpected(snapshot)?.description.slice(0, 300) ?? null;
}

async function loadRun(em: EntityManager, shopId: string, runId: string, lock = false): Promise<RunEntity> {
  if (!z.uuid().safeParse(runId).success) throw notFound('That run');
  const run = await em.findOne(Run, { id: runId, shopId }, lock ? { lockMode: LockMode.PESSIMISTIC_WRITE, refresh: true } : {});
  if (!run) throw notFound('That run');
  return run;
}

/** What a log entry needs to become a DTO: an entity row or a plain row from `logOf`. */
type LogRow = Pick<RunEventEntity, 'seq' | 'type' | 'payload' | 'actorId' | 'actorRole' | 'device' | 'recordedAt' | 'clientAt'>;

/** `known` names (the posting member's own) spare the lookup when they cover every actor. */
async function toEventDtos(em: EntityManager, rows: readonly LogRow[], known?: ReadonlyMap<string, string>): Promise<StoredEventDto[]> {
  const names = known && rows.every((r) => known.has(r.actorId)) ? known : await userNames(em, rows.map((r) => r.actorId));
  return rows.map((r) => ({
    seq: r.seq, type: r.type, payload: r.payload,
    actor: { id: r.actorId, name: names.get(r.actorId) ?? 'Former member', role: r.actorRole },
    device: r.device ?? null, recordedAt: r.recordedAt.toISOString(), clientAt: r.clientAt?.toISOString() ?? null,
  }));
}

type RawLogRow = { seq: number; type: string; payload: RunEvent; actor_id: string; actor_role: string; device: string | null; recorded_ms: number | string; client_ms: number | string | null };
// Times as whole epoch milliseconds (what a Date holds), so no timestamp text is parsed here.
const epochMs = (column: string) => `floor(extract(epoch from ${column}) * 1000)::float8`;
/**
 * A run's log after a seq, read as plain rows: every run view and every runner's poll reads it,
 * and the entries are never changed, so they skip entity hydration and the identity map.
 */
async function logOf(em: EntityManager, run: RunEntity, afterSeq = 0): Promise<LogRow[]> {
  const rows = await em.getConnection().execute<RawLogRow[]>(
    `select seq, type, payload, actor_id, actor_role, device, ${epochMs('recorded_at')} as recorded_ms, ${epochMs('client_at')} as client_ms from run_event where run_id = ? and seq > ? order by seq`,
    [run.id, afterSeq],
    'all',
    em.getTransactionContext(), // inside a transaction, read on its connection
  );
  return rows.map((r) => ({ seq: r.seq, type: r.type, payload: r.payload, actorId: r.actor_id, actorRole: r.actor_role, device: r.device, recordedAt: new Date(Number(r.recorded_ms)), clientAt: r.client_ms === null ? null : new Date(Number(r.client_ms)) }));
}

async function runInfo(em: EntityManager, run: RunEntity): Promise<RunInfoDto> {
  const job = await em.findOneOrFail(Job, { id: run.job.id, shopId: run.shopId });
  return { id: run.id, jobId: job.id, jobCode: job.code, revisionId: run.revisionId, procedureName: run.procedureName, revisionNumber: run.revisionNumber, status: run.status, lastSeq: run.lastSeq, createdAt: run.createdAt.toISOString() };
}

/** Starts a run of a released revision on a job; the run stays pinned to that revision. */
export async function startJobRun(em: EntityManager, member: Member, jobId: string, revisionId: string): Promise<RunDto> {
  if (!z.uuid().safeParse(jobId).success) throw notFound('That job');
  const runId = await em.transactional(async (tem) => {
    const job = await tem.findOne(Job, { id: jobId, shopId: member.shopId }, { lockMode: LockMode.PESSIMISTIC_WRITE });
    if (!job) throw notFound('That job');
    const revision = await revisionForNewRun(tem, member.shopId, revisionId);
    if (!acceptsNewRuns(job.status)) throw new AppError('conflict', `Job ${job.code} is ${job.status === 'closed' ? 'closed' : 'waiting for sign-off'}; no new runs can start on it.`);
    const run = tem.create(Run, { shopId: member.shopId, job, revisionId: revision.id, procedureName: revision.procedureName, revisionNumber: revision.number, status: 'active', lastSeq: 0, createdById: member.userId });
    summarise(run, startRun(revision.steps));
    job.status = statusOnRunStart(job.status);
    await tem.flush();
    return run.id;
  });
  return getRun(em, member.shopId, runId);
}

/** The run as the runner needs it: pinned steps, the whole log, and the state rebuilt from it. */
export async function getRun(em: EntityManager, shopId: string, runId: string): Promise<RunDto> {
  const run = await loadRun(em, shopId, runId);
  const [revision, rows] = await Promise.all([pinnedRevision(em, shopId, run.revisionId), logOf(em, run)]);
  // The log was read after the run row, so it can only be as new or newer than lastSeq.
  const snapshot = rows.length === run.lastSeq ? await currentRunState(em, run, revision.steps) : replay(revision.steps, rows.map((r) => r.payload));
  return {
    run: await runInfo(em, run), steps: revision.steps, events: await toEventDtos(em, rows),
    next: nextExpected(snapshot), progress: runProgress(snapshot), stepStates: stepStates(snapshot), pendingDeviation: pendingDeviation(snapshot),
  };
}

/** Recomputes a run's list fields (status, progress, next prompt) from its log; for seeding and repair. */
export async function refreshRunSummary(em: EntityManager, shopId: string, runId: string): Promise<void> {
  const run = await loadRun(em, shopId, runId);
  const [revision, rows] = await Promise.all([pinnedRevision(em, shopId, run.revisionId), logOf(em, run)]);
  summarise(run, replay(revision.steps, rows.map((r) => r.payload)));
  run.lastSeq = rows.at(-1)?.seq ?? 0;
  await em.flush();
}

/** Events after a seq, for a client catching up. */
export async function runEventsAfter(em: EntityManager, shopId: string, runId: string, after: number): Promise<{ events: StoredEventDto[]; lastSeq: number }> {
  const run = await loadRun(em, shopId, runId);
  return { events: await toEventDtos(em, await logOf(em, run, after)), lastSeq: run.lastSeq };
}

/** The log with who, where and when, and the revision the run ran under. */
export async function runHistory(em: EntityManager, shopId: string, runId: string) {
  const run = await loadRun(em, shopId, runId);
  const [revision, rows] = await Promise.all([pinnedRevision(em, shopId, run.revisionId), logOf(em, run)]);
  return {
    run: await runInfo(em, run),
    revision: { id: revision.id, number: revision.number, status: revision.status, procedureId: revision.procedureId, procedureName: revision.procedureName },
    events: await toEventDtos(em, rows),
  };
}

type Outcome =
  | { kind: 'stored'; row: RunEventEntity; snapshot: RunSnapshot; lastSeq: number; created: boolean; run?: RunEntity; job?: JobEntity }
  | { kind: 'stale'; lastSeq: number; rows: LogRow[] };

/** Events only the sign-off service may post: it re-checks the password and stores the Signature first. */
const SIGNATURE_EVENTS = new Set(['hold.sign']);

export type RecordOptions = {
  /** Set only by the sign-off service, after the password re-entry and the own-work rule. */
  signature?: boolean;
};

/**
 * Records one event from a member: the server fills the actor from the session. Answers
 * `{ status: 201 }` for a new event, `{ status: 200 }` for a retry of a stored one. A hold
 * point's `hold.sign` is refused unless it comes from the sign-off service (`signature`).
 */
export async function recordRunEvent(em: EntityManager, member: Member, runId: string, input: z.infer<typeof recordEventInput>, options: RecordOptions = {}): Promise<{ status: 200 | 201; body: RecordedDto }> {
  const type = typeof input.event.type === 'string' ? input.event.type : '';
  if (SIGNATURE_EVENTS.has(type) && !options.signature) throw new AppError('forbidden', 'Sign hold points on the sign-off page, with your password.');
  if (!ROLE_RULED_EVENTS.has(type) && !roleCan(member.role, { run: ['record'] })) throw new AppError('forbidden', `Your role (${member.role}) may not record work on a run.`);
  const event = { ...input.event, actor: { userId: member.userId, role: member.role } };

  const outcome = await em.transactional(async (tem): Promise<Outcome> => {
    const run = await loadRun(tem, member.shopId, runId, true);
    const [revision, earlier] = await Promise.all([
      pinnedRevision(tem, member.shopId, run.revisionId),
      tem.findOne(RunEventRow, { run: run.id, idempotencyKey: input.idempotencyKey }),
    ]);
    if (earlier) {
      if (earlier.type !== type || earlier.payload.stepId !== input.event.stepId) throw new AppError('conflict', 'This idempotency key was already used for a different event; send a new key for a new event.');
      return { kind: 'stored', row: earlier, snapshot: await currentRunState(tem, run, revision.steps), lastSeq: run.lastSeq, created: false };
    }
    if (input.expectedSeq !== run.lastSeq) return { kind: 'stale', lastSeq: run.lastSeq, rows: await logOf(tem, run, input.expectedSeq) };
    const job = await tem.findOneOrFail(Job, { id: run.job.id, shopId: member.shopId });
    if (job.status === 'closed') throw new AppError('conflict', `Job ${job.code} is closed; nothing more can be recorded on its runs.`);

    // Under the row lock lastSeq is current, so the cached state (if any) is exactly the log's.
    const before = await currentRunState(tem, run, revision.steps);
    const result = applyEvent(revision.steps, storeRun(before), event);
    if (!result.ok) {
      if (result.code === 'invalid-input') throw new AppError('bad-request', result.message, { next: nextExpected(before) });
      throw new AppError(result.code, result.message, { next: nextExpected(before) });
    }
    const wasComplete = run.status === 'complete';
    const row = tem.create(RunEventRow, {
      run, seq: run.lastSeq + 1, type: result.event.type, payload: result.event, actorId: member.userId, actorRole: member.role,
      device: input.device ?? null, idempotencyKey: input.idempotencyKey, clientAt: input.clientAt ? new Date(input.clientAt) : null,
    });
    run.lastSeq = row.seq;
    summarise(run, result.snapshot);
    if (run.status === 'complete' && !wasComplete) {
      const activeRuns = await tem.count(Run, { job: job.id, id: { $ne: run.id }, status: { $ne: 'complete' } });
      job.status = statusOnRunComplete(job.status, { activeRuns });
    }
    if (result.event.type === 'run.reopen') job.status = statusOnRunReopen(job.status);
    await tem.flush();
    rememberRunState(run, run.lastSeq, result.snapshot);
    return { kind: 'stored', row, snapshot: result.snapshot, lastSeq: run.lastSeq, created: true, run, job };
  });

  if (outcome.kind === 'stale') {
    throw new AppError('conflict', 'Someone else recorded on this run first; here is the fresh state.', { lastSeq: outcome.lastSeq, events: await toEventDtos(em, outcome.rows) });
  }
  // Review-queue notices (hold point reached, run finished, deviation asked); never throws.
  if (outcome.created) await noticesAfterEvent(em, member.shopId, runId, outcome.row.payload, outcome.snapshot, outcome.run && outcome.job ? { run: outcome.run, job: outcome.job } : undefined);
  const [dto] = await toEventDtos(em, [outcome.row], new Map([[member.userId, member.name]]));
  return { status: outcome.created ? 201 : 200, body: { event: dto!, lastSeq: outcome.lastSeq, next: nextExpected(outcome.snapshot), progress: runProgress(outcome.snapshot) } };
}
