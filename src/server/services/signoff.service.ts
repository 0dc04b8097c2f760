/**
 * Sign-offs: everything recorded about a run (loaded once for sign-offs and reports), the
 * canonical record a signature covers and its SHA-256, signing with password re-entry, the
 * match check against today's data, and sending work back.
 */
import { createHash, randomUUID } from 'node:crypto';
import { LockMode } from '@mikro-orm/core';
import type { EntityManager } from '@mikro-orm/postgresql';
import * as z from 'zod';
import { nextExpected, replay, runProgress, type RunSnapshot } from '../../domain/run';
import { MEANING_LABELS, SIGNOFF_MEANINGS, checkSigner, recordHash, signoffRecord, workersOf, type SignoffMeaning, type SignoffRecordInput, type SignoffScope } from '../../domain/signoff';
import { roleCan } from '../../lib/access';
import { auth } from '../auth';
import { config } from '../config';
import { Job, JobAssignment, Run, RunEvent as RunEventRow, Signature } from '../entities';
import type { SignatureEntity } from '../entities/signature.entity';
import type { Member } from '../guards';
import { AppError } from '../http';
import { recordRunEvent } from './runs.service';
import { getShopSettings } from './shop-settings.service';
import { queueNotices } from './mail-queue.service';
import type { JobEntity } from '../entities/job.entity';
import type { RunEntity } from '../entities/run.entity';
import type { RunEventEntity } from '../entities/run-event.entity';
import { notFound } from '../http';
import { pinnedRevision, type PinnedRevision } from './run-revision';
import { userNames } from './shop-members';

export type TagRow = { stepId: string; part: string; position: string; code: string; bin: string; disposition: string; condition: string };
export type FindingRow = { id: string; stepId: string | null; what: string; where: string; severity: string; parts: Array<{ part: string; quantity: number }> };
export type PhotoRow = { id: string; stepId: string | null; tagCode: string | null; findingId: string | null; filename: string };

export type RunMaterial = {
  run: RunEntity; job: JobEntity; revision: PinnedRevision; procedureKind: string; procedureDescription: string;
  rows: RunEventEntity[]; names: Map<string, string>; snapshot: RunSnapshot; shopName: string;
  tags: TagRow[]; findings: FindingRow[]; photos: PhotoRow[];
};

async function tableExists(em: EntityManager, table: string): Promise<boolean> {
  const [row] = await em.getConnection().execute<Array<{ t: string | null }>>(`select to_regclass(?) as t`, [`public.${table}`]);
  return Boolean(row?.t);
}

/** Tags, findings and photos of a run, read without depending on their services (empty when the tables are absent). */
async function besideTheLog(em: EntityManager, shopId: string, run: RunEntity): Promise<Pick<RunMaterial, 'tags' | 'findings' | 'photos'>> {
  const c = em.getConnection();
  const [hasTag, hasFinding, hasAttachment] = await Promise.all([tableExists(em, 'tag'), tableExists(em, 'finding'), tableExists(em, 'attachment')]);
  const tags = hasTag
    ? (await c.execute<Array<Record<string, string>>>(`select step_id, part_name, position, code, bin, disposition, condition_note from tag where shop_id = ? and run_id = ? order by step_id, position`, [shopId, run.id]))
        .map((r) => ({ stepId: r.step_id!, part: r.part_name!, position: r.position!, code: r.code!, bin: r.bin ?? '', disposition: r.disposition!, condition: r.condition_note ?? '' }))
    : [];
  const findings = hasFinding
    ? (await c.execute<Array<Record<string, unknown>>>(`select id, step_id, what, "where", severity, parts_to_replace from finding where shop_id = ? and (run_id = ? or (run_id is null and job_id = ?)) order by created_at, id`, [shopId, run.id, run.job.id]))
        .map((r) => ({ id: String(r.id), stepId: (r.step_id as string | null) ?? null, what: String(r.what), where: String(r.where ?? ''), severity: String(r.severity), parts: Array.isArray(r.parts_to_replace) ? (r.parts_to_replace as FindingRow['parts']) : [] }))
    : [];
  const photos = hasAttachment
    ? (await c.execute<Array<Record<string, string | null>>>(`select a.id, a.step_id, a.finding_id, a.filename, t.code as tag_code from attachment a left join ${hasTag ? 'tag' : '(select null::uuid as id, null::text as code)'} t on t.id = a.tag_id where a.shop_id = ? and (a.run_id = ? or a.finding_id in (${findings.length ? findings.map(() => '?').join(', ') : 'null'})) order by a.created_at, a.id`, [shopId, run.id, ...findings.map((f) => f.id)]))
        .map((r) => ({ id: String(r.id), stepId: r.step_id ?? null, tagCode: r.tag_code ?? null, findingId: r.finding_id ?? null, filename: String(r.filename) }))
    : [];
  return { tags, findings, photos };
}

/** The run of this shop and everything recorded about it (404 for another shop's run). */
export async function loadRunMaterial(em: EntityManager, shopId: string, runId: string): Promise<RunMaterial> {
  if (!z.uuid().safeParse(runId).success) throw notFound('That run');
  const run = await em.findOne(Run, { id: runId, shopId }, { refresh: true });
  if (!run) throw notFound('That run');
  const [job, revision, rows] = await Promise.all([
    em.findOneOrFail(Job, { id: run.job.id, shopId }),
    pinnedRevision(em, shopId, run.revisionId),
    em.find(RunEventRow, { run: run.id }, { orderBy: { seq: 'asc' }, refresh: true }),
  ]);
  const [proc] = await em.getConnection().execute<Array<{ kind: string; description: string }>>(`select kind, description from procedure where id = ?`, [revision.procedureId]);
  const [shop] = await em.getConnection().execute<Array<{ name: string }>>(`select name from organization where id = ?`, [shopId]);
  const names = await userNames(em, rows.map((r) => r.actorId));
  return {
    run, job, revision, procedureKind: proc?.kind ?? 'teardown', procedureDescription: proc?.description ?? '',
    rows, names, snapshot: replay(revision.steps, rows.map((r) => r.payload)), shopName: shop?.name ?? '',
    ...(await besideTheLog(em, shopId, run)),
  };
}

// ——— Sign-off ———

export const signInput = z.object({
  meaning: z.enum(SIGNOFF_MEANINGS, 'Choose what your signature means'),
  password: z.string('Enter your password to sign').min(1, 'Enter your password to sign').max(200),
  stepId: z.string().min(1).max(40).optional(),
}).strict();
export const sendBackInput = z.object({
  stepId: z.string('Choose the step to send back to').min(1, 'Choose the step to send back to').max(40),
  reason: z.string('Say why the work is sent back').trim().min(1, 'Say why the work is sent back').max(1000),
}).strict();

export type SignatureDto = {
  id: string; runId: string; stepId: string | null; scope: string; signerId: string; signerName: string; signerRole: string;
  meaning: SignoffMeaning; meaningLabel: string; signedAt: string; runSeq: number; recordHash: string;
  /** The current data gives the same record (and hash) as when signed. */
  matches: boolean;
};

const sha256Hex = (text: string) => createHash('sha256').update(text).digest('hex');

/** The inputs of a signature's record, from the run's material (the log plus tags, findings and photos). */
export function recordInputOf(m: RunMaterial): SignoffRecordInput {
  return {
    run: { id: m.run.id, jobId: m.job.id, jobCode: m.job.code, procedureName: m.run.procedureName, revisionId: m.run.revisionId, revisionNumber: m.run.revisionNumber },
    steps: m.revision.steps,
    events: m.rows.map((r) => ({ seq: r.seq, type: r.type, actorId: r.actorId, payload: r.payload as unknown as SignoffRecordInput['events'][number]['payload'] })),
    extras: {
      tags: m.tags.map((t) => ({ ...t })),
      findings: m.findings.map((f) => ({ ...f })),
      photos: m.photos.map((p) => ({ ...p })),
    },
  };
}

const scopeOf = (stepId: string | null | undefined): SignoffScope => (stepId ? { kind: 'hold-point', stepId } : { kind: 'run' });

/** The hash the current data gives for a scope. */
export function currentHash(m: RunMaterial, scope: SignoffScope): string {
  return recordHash(signoffRecord(recordInputOf(m), scope), sha256Hex);
}

function scopeLabel(m: RunMaterial, stepId: string | null): string {
  if (!stepId) return 'Whole run';
  const i = m.revision.steps.findIndex((s) => s.id === stepId);
  return i < 0 ? `Hold point ${stepId}` : `Hold point ${i + 1}: ${m.revision.steps[i]!.title}`;
}

function toSignatureDto(m: RunMaterial, s: SignatureEntity): SignatureDto {
  const scope = scopeOf(s.stepId);
  // A stored record that no longer hashes to its stored hash was tampered with: never "matches".
  const intact = recordHash(s.record, sha256Hex) === s.recordHash;
  let matches = false;
  try {
    matches = intact && currentHash(m, scope) === s.recordHash;
  } catch {
    matches = false;
  }
  return {
    id: s.id, runId: s.runId, stepId: s.stepId ?? null, scope: scopeLabel(m, s.stepId ?? null), signerId: s.signerId, signerName: s.signerName, signerRole: s.signerRole,
    meaning: s.meaning, meaningLabel: MEANING_LABELS[s.meaning] ?? s.meaning, signedAt: s.signedAt.toISOString(), runSeq: s.runSeq, recordHash: s.recordHash, matches,
  };
}

/** Every signature on a run, each checked against a record recomputed from the current data. */
export async function listSignatures(em: EntityManager, shopId: string, runId: string, material?: RunMaterial): Promise<SignatureDto[]> {
  const m = material ?? (await loadRunMaterial(em, shopId, runId));
  const rows = await em.find(Signature, { shopId, runId: m.run.id }, { orderBy: { signedAt: 'asc' }, refresh: true });
  return rows.map((s) => toSignatureDto(m, s));
}

async function passwordMatches(em: EntityManager, userId: string, password: string): Promise<boolean> {
  const [row] = await em.getConnection().execute<Array<{ password: string | null }>>(`select password from account where "userId" = ? and "providerId" = 'credential'`, [userId]);
  if (!row?.password) return false;
  const ctx = await auth().$context;
  return ctx.password.verify({ hash: row.password, password });
}

/**
 * Signs a run or one of its hold points: re-checks the password, refuses one's own work
 * (unless the shop allows it), hashes the canonical record and, for a hold point, posts the
 * machine's `hold.sign` through the runs service in the same transaction.
 */
export async function signRun(em: EntityManager, member: Member, runId: string, input: z.infer<typeof signInput>): Promise<SignatureDto> {
  const scope = scopeOf(input.stepId);
  const before = await loadRunMaterial(em, member.shopId, runId);
  if (scope.kind === 'hold-point') {
    const step = before.revision.steps.find((s) => s.id === scope.stepId);
    if (!step) throw new AppError('bad-request', `There is no step "${scope.stepId}" in this procedure.`, { fields: { stepId: 'Unknown step' } });
    if (step.kind !== 'hold-point') throw new AppError('bad-request', `Step "${step.title}" is not a hold point; sign the run or a hold point.`, { fields: { stepId: 'Not a hold point' } });
    if (!step.signers.includes(member.role)) throw new AppError('forbidden', `Your role (${member.role}) may not sign this hold point; it is signed by: ${step.signers.join(', ')}.`);
  } else if (!roleCan(member.role, { signoff: ['sign'] })) {
    throw new AppError('forbidden', `Your role (${member.role}) may not sign off a run; a reviewer or an owner does.`);
  }
  if (!(await passwordMatches(em, member.userId, input.password))) {
    throw new AppError('forbidden', 'That password is not right. Enter your own sign-in password to sign.', { fields: { password: 'Wrong password' } });
  }
  const settings = await getShopSettings(em, member.shopId);

  const id = await em.transactional(async (tem) => {
    await tem.findOneOrFail(Run, { id: before.run.id, shopId: member.shopId }, { lockMode: LockMode.PESSIMISTIC_WRITE, refresh: true });
    const m = await loadRunMaterial(tem, member.shopId, runId);
    const existing = scope.kind === 'run' ? await tem.find(Signature, { runId: m.run.id, stepId: null, signerId: member.userId }) : [];
    const refusal = checkSigner({
      signer: { userId: member.userId, role: member.role },
      roleMaySign: roleCan(member.role, { signoff: ['sign'] }),
      scope,
      events: m.rows.map((r) => ({ type: r.type, actorId: r.actorId })),
      allowSelfSignoff: settings.allowSelfSignoff,
      runComplete: runProgress(m.snapshot).complete,
      currentStepId: nextExpected(m.snapshot)?.stepId ?? null,
      alreadySignedByThem: existing.some((s) => s.runSeq === m.run.lastSeq && s.recordHash === currentHash(m, scope)),
    });
    if (refusal) throw new AppError(refusal.code, refusal.message);
    const record = signoffRecord(recordInputOf(m), scope);
    let runSeq = m.run.lastSeq;
    if (scope.kind === 'hold-point') {
      const posted = await recordRunEvent(tem, member, m.run.id, {
        event: { type: 'hold.sign', stepId: scope.stepId, meaning: MEANING_LABELS[input.meaning] },
        idempotencyKey: randomUUID(),
        expectedSeq: m.run.lastSeq,
        device: 'sign-off',
      }, { signature: true });
      runSeq = posted.body.lastSeq;
    }
    const sig = tem.create(Signature, {
      shopId: member.shopId, runId: m.run.id, stepId: scope.kind === 'hold-point' ? scope.stepId : null,
      signerId: member.userId, signerName: member.name, signerRole: member.role, meaning: input.meaning,
      runSeq, recordHash: recordHash(record, sha256Hex), record,
    });
    await tem.flush();
    return sig.id;
  });
  const after = await loadRunMaterial(em, member.shopId, runId);
  const sig = await em.findOneOrFail(Signature, { id }, { refresh: true });
  return toSignatureDto(after, sig);
}

async function emailsOf(em: EntityManager, ids: readonly string[]): Promise<string[]> {
  const uniq = [...new Set(ids)];
  if (uniq.length === 0) return [];
  const rows = await em.getConnection().execute<Array<{ email: string }>>(`select email from "user" where id in (${uniq.map(() => '?').join(', ')})`, uniq);
  return rows.map((r) => r.email);
}

/** Sends finished work back: the machine's `run.reopen` (it decides who may), then a notice to the job's technicians. */
export async function sendBack(em: EntityManager, member: Member, runId: string, input: z.infer<typeof sendBackInput>) {
  const m = await loadRunMaterial(em, member.shopId, runId);
  const step = m.revision.steps.find((s) => s.id === input.stepId);
  if (!step) throw new AppError('bad-request', `There is no step "${input.stepId}" in this procedure.`, { fields: { stepId: 'Unknown step' } });
  const result = await recordRunEvent(em, member, m.run.id, {
    event: { type: 'run.reopen', stepId: input.stepId, reason: input.reason },
    idempotencyKey: randomUUID(),
    expectedSeq: m.run.lastSeq,
    device: 'review desk',
  });
  const assigned = await em.find(JobAssignment, { job: m.job.id });
  const workers = [...workersOf(m.rows.map((r) => ({ type: r.type, actorId: r.actorId })))];
  const to = await emailsOf(em, [...assigned.map((a) => a.userId), ...workers].filter((id) => id !== member.userId));
  const index = m.revision.steps.indexOf(step) + 1;
  await queueNotices(em, {
    shopId: member.shopId, jobId: m.job.id, runId: m.run.id, createdBy: member.userId,
    subject: `Work sent back on ${m.job.code}: step ${index}, ${step.title}`,
    body: `${member.name} (${member.role}) sent work back on job ${m.job.code} (${m.job.unitDescription}), ${m.run.procedureName} revision ${m.run.revisionNumber}.\n\nThe run reopens at step ${index}: ${step.title}.\nReason: ${input.reason}\n\nOpen the traveler: ${config().PUBLIC_URL}/runs/${m.run.id}\n`,
  }, to);
  return result.body;
}

/** E-mail addresses of users, for notices. */
export { emailsOf };
