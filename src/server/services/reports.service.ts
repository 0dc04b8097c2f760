/** Teardown reports and build sheets: the run's material turned into report data, then a PDF. */
import type { EntityManager } from '@mikro-orm/postgresql';
import * as z from 'zod';
import { DEFAULT_SHARE_DAYS } from '../../domain/share-link';
import { Job } from '../entities';
import type { Member } from '../guards';
import { AppError, notFound } from '../http';
import { REPORT_TITLES, buildReportData, reportKindOf, type ReportData, type ReportInput } from '../reports/report-data';
import { queueMail, type OutgoingMessageDto } from './mail-queue.service';
import { createShareLink } from './share.service';
import { renderRunReport } from '../reports/render';
import { listSignatures, loadRunMaterial, type RunMaterial } from './signoff.service';

/** The pure report input from a run's material and its checked signatures. */
export async function reportInputOf(em: EntityManager, m: RunMaterial): Promise<ReportInput> {
  const signatures = await listSignatures(em, m.run.shopId, m.run.id, m);
  const photosByTag = new Map<string, number>();
  for (const p of m.photos) if (p.tagCode) photosByTag.set(p.tagCode, (photosByTag.get(p.tagCode) ?? 0) + 1);
  return {
    shopName: m.shopName,
    job: { code: m.job.code, unitDescription: m.job.unitDescription, serial: m.job.serial, hoursOrOdometer: m.job.hoursOrOdometer, customer: m.job.customer },
    procedure: { name: m.run.procedureName, kind: m.procedureKind, revisionNumber: m.run.revisionNumber, description: m.procedureDescription },
    run: { id: m.run.id, status: m.run.status, createdAt: m.run.createdAt.toISOString() },
    steps: m.revision.steps,
    events: m.rows.map((r) => ({ seq: r.seq, type: r.type, payload: r.payload, actorName: m.names.get(r.actorId) ?? 'Former member', actorRole: r.actorRole, recordedAt: r.recordedAt.toISOString() })),
    signatures: signatures.map((s) => ({ scope: s.scope, signerName: s.signerName, signerRole: s.signerRole, meaning: s.meaning, signedAt: s.signedAt, recordHash: s.recordHash, matches: s.matches })),
    ...(m.tags.length > 0 ? { tags: m.tags.map((t) => ({ stepId: t.stepId, part: t.part, position: `${t.position} (${t.code})`, disposition: t.disposition, bin: t.bin, photos: photosByTag.get(t.code) ?? 0 })) } : {}),
    findings: m.findings.map((f) => ({
      title: f.where ? `${f.what} — ${f.where}` : f.what, severity: f.severity, description: '',
      parts: f.parts.map((p) => (p.quantity > 1 ? `${p.part} ×${p.quantity}` : p.part)),
      photos: m.photos.filter((p) => p.findingId === f.id).map((p) => ({ caption: p.filename })),
    })),
    photos: m.photos.length,
    generatedAt: new Date().toISOString(),
    snapshot: m.snapshot,
  };
}

/** The report data of a run of this shop (404 for another shop's). */
export async function runReportData(em: EntityManager, shopId: string, runId: string): Promise<ReportData> {
  const m = await loadRunMaterial(em, shopId, runId);
  return buildReportData(await reportInputOf(em, m));
}

const slug = (s: string) => s.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 60);

/** The PDF of a run's report, with a file name people can keep. */
export async function runReportPdf(em: EntityManager, shopId: string, runId: string): Promise<{ bytes: Uint8Array; filename: string; data: ReportData }> {
  const data = await runReportData(em, shopId, runId);
  const bytes = await renderRunReport(data);
  return { bytes, filename: `${data.job.code}-${data.kind === 'build' ? 'build-sheet' : 'teardown-report'}-${slug(data.procedure.name)}.pdf`, data };
}

export const sendReportInput = z.object({
  runId: z.uuid('Choose a run of this job'),
  to: z.email('Give one e-mail address').max(320),
  message: z.string().trim().max(5000, 'At most 5000 characters').default(''),
  kind: z.enum(['teardown', 'build'], 'Choose the teardown report or the build sheet').optional(),
  days: z.number().int().min(1).max(90).default(DEFAULT_SHARE_DAYS),
}).strict();

/** Queues a run's report to an outside address: the PDF is rendered when the mail goes out, with a fresh read-only link. */
export async function sendReport(em: EntityManager, member: Member, jobId: string, input: z.infer<typeof sendReportInput>): Promise<OutgoingMessageDto> {
  if (!(await em.findOne(Job, { id: jobId, shopId: member.shopId }))) throw notFound('That job');
  const m = await loadRunMaterial(em, member.shopId, input.runId).catch((e) => {
    if (e instanceof AppError && e.code === 'not-found') throw new AppError('bad-request', 'That run is not part of this job.', { fields: { runId: 'Not a run of this job' } });
    throw e;
  });
  if (m.job.id !== jobId) {
    if (!(await em.findOne(Job, { id: jobId, shopId: member.shopId }))) throw notFound('That job');
    throw new AppError('bad-request', 'That run is not part of this job.', { fields: { runId: 'Not a run of this job' } });
  }
  const kind = reportKindOf(m.procedureKind);
  if (input.kind && input.kind !== kind) throw new AppError('bad-request', `This run is ${kind === 'build' ? 'an assembly run; its report is the build sheet' : 'a teardown run; its report is the teardown report'}.`, { fields: { kind: 'Does not match the run' } });
  const { url } = await createShareLink(em, member, jobId, { runId: m.run.id, days: input.days });
  const title = REPORT_TITLES[kind];
  const body = [
    input.message,
    `${title} for job ${m.job.code} (${m.job.unitDescription}${m.job.serial ? `, serial ${m.job.serial}` : ''}): ${m.run.procedureName}, revision ${m.run.revisionNumber}.`,
    `Sent by ${member.name}, ${m.shopName}. The PDF is attached.`,
  ].filter(Boolean).join('\n\n');
  return queueMail(em, {
    shopId: member.shopId, jobId, runId: m.run.id, kind: 'report', reportKind: kind, to: input.to,
    subject: `${title} ${m.job.code} — ${m.job.unitDescription}`, body, createdBy: member.userId, shareUrl: url,
  });
}
