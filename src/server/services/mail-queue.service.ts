/**
 * Outgoing e-mail through the queue: a row in outgoing_message (what the desk sees: queued,
 * sent or failed, attempts, last error) and a pg-boss job that renders any report PDF, sends
 * through nodemailer and retries with backoff. The share link travels in the job's data only,
 * so the stored message never holds a usable token.
 */
import * as z from 'zod';
import type { EntityManager } from '@mikro-orm/postgresql';
import type PgBoss from 'pg-boss';
import type { Transporter } from 'nodemailer';
import { Job, OutgoingMessage } from '../entities';
import { notFound } from '../http';
import type { OutgoingMessageEntity, OutgoingStatus } from '../entities/outgoing-message.entity';
import { initORM } from '../db';
import { config } from '../config';
import { mailer } from '../mailer';
import { enqueue, queue, registerWorker } from '../queue';

export const MAIL_QUEUE = 'outgoing-mail';

type MailJob = { messageId: string; shareUrl?: string };

export type OutgoingMessageDto = {
  id: string; kind: string; reportKind: string | null; to: string; subject: string; status: OutgoingStatus;
  attempts: number; lastError: string | null; sentAt: string | null; createdAt: string; runId: string | null;
};

const toDto = (m: OutgoingMessageEntity): OutgoingMessageDto => ({
  id: m.id, kind: m.kind, reportKind: m.reportKind ?? null, to: m.to, subject: m.subject, status: m.status,
  attempts: m.attempts, lastError: m.lastError ?? null, sentAt: m.sentAt?.toISOString() ?? null, createdAt: m.createdAt.toISOString(), runId: m.runId ?? null,
});

const num = (v: string | undefined, fallback: number) => (v && Number.isFinite(Number(v)) ? Number(v) : fallback);
/** Retry policy: MAIL_RETRY_LIMIT retries (default 4), first delay MAIL_RETRY_DELAY_SECONDS (default 30), doubling. */
const retryPolicy = () => ({ retryLimit: num(process.env.MAIL_RETRY_LIMIT, 4), retryDelay: num(process.env.MAIL_RETRY_DELAY_SECONDS, 30), retryBackoff: true });

let transportOverride: Transporter | null = null;
/** Tests only: send through another transport (e.g. one pointing at a closed port to play "SMTP down"). */
export function useMailTransport(t: Transporter | null): void {
  transportOverride = t;
}

async function deliver(job: PgBoss.JobWithMetadata<MailJob>): Promise<void> {
  const orm = await initORM();
  const em = orm.em.fork();
  const msg = await em.findOne(OutgoingMessage, { id: job.data.messageId });
  // A job whose message is gone (its shop or job was deleted) has nothing left to do.
  if (!msg || msg.status === 'sent') return;
  msg.attempts += 1;
  await em.flush();
  try {
    const attachments = [];
    if (msg.kind === 'report' && msg.runId) {
      const { runReportPdf } = await import('./reports.service');
      const pdf = await runReportPdf(em, msg.shopId, msg.runId);
      attachments.push({ filename: pdf.filename, content: Buffer.from(pdf.bytes), contentType: 'application/pdf' });
    }
    const text = job.data.shareUrl ? `${msg.body}\n\nRead-only link (no sign-in needed):\n${job.data.shareUrl}\n` : msg.body;
    await (transportOverride ?? mailer()).sendMail({ from: config().MAIL_FROM, to: msg.to, subject: msg.subject, text, attachments });
    msg.status = 'sent';
    msg.sentAt = new Date();
    msg.lastError = null;
    await em.flush();
  } catch (e) {
    const error = e instanceof Error ? e.message : String(e);
    msg.lastError = error.slice(0, 2000);
    // pg-boss retries until retryCount reaches retryLimit; the last failure is final.
    if (job.retryCount >= job.retryLimit) msg.status = 'failed';
    await em.flush();
    throw e;
  }
}

registerWorker<MailJob>(MAIL_QUEUE, retryPolicy(), { pollingIntervalSeconds: 0.5 }, deliver);

export type QueueMailInput = {
  shopId: string; jobId: string | null; runId: string | null; kind: 'report' | 'notice'; reportKind?: string | null;
  to: string; subject: string; body: string; createdBy?: string | null; shareUrl?: string;
};

/** Stores a message as queued and hands it to the queue; returns it as the desk shows it. */
export async function queueMail(em: EntityManager, input: QueueMailInput): Promise<OutgoingMessageDto> {
  const { shareUrl, ...fields } = input;
  const msg = em.create(OutgoingMessage, { ...fields, reportKind: fields.reportKind ?? null, createdBy: fields.createdBy ?? null, status: 'queued', attempts: 0 });
  await em.flush();
  try {
    await enqueue<MailJob>(MAIL_QUEUE, { messageId: msg.id, ...(shareUrl ? { shareUrl } : {}) }, retryPolicy());
  } catch (e) {
    msg.status = 'failed';
    msg.lastError = `Could not queue the message: ${e instanceof Error ? e.message : String(e)}`;
    await em.flush();
  }
  return toDto(msg);
}

/** Queues notices to several people, one message each; never throws (a notice must not undo the work it reports). */
export async function queueNotices(em: EntityManager, base: Omit<QueueMailInput, 'to' | 'kind'>, to: readonly string[]): Promise<void> {
  for (const address of new Set(to)) {
    try {
      await queueMail(em, { ...base, kind: 'notice', to: address });
    } catch (e) {
      console.error('[mail] notice not queued', e);
    }
  }
}

/** The messages sent for one job, newest first; starts the queue so waiting messages resume after a restart. */
export async function listJobMessages(em: EntityManager, shopId: string, jobId: string): Promise<OutgoingMessageDto[]> {
  void queue().catch((e) => console.error('[queue] not started', e));
  if (!z.uuid().safeParse(jobId).success || (await em.count(Job, { id: jobId, shopId })) === 0) throw notFound('That job');
  const rows = await em.find(OutgoingMessage, { shopId, jobId }, { orderBy: { createdAt: 'desc' }, limit: 200 });
  return rows.map(toDto);
}

