/**
 * Read-only links: a random 32-byte token (only its SHA-256 is stored) opening one run's
 * report summary and PDF until it expires or is revoked. Every opening is logged for the shop.
 */
import { createHash, randomBytes } from 'node:crypto';
import type { EntityManager } from '@mikro-orm/postgresql';
import * as z from 'zod';
import { DEFAULT_SHARE_DAYS, MAX_SHARE_DAYS, shareExpiry, shareLinkState, type ShareLinkState } from '../../domain/share-link';
import { Job, Run, ShareLink, ShareView } from '../entities';
import type { ShareLinkEntity } from '../entities/share-link.entity';
import { config } from '../config';
import type { Member } from '../guards';
import { AppError, notFound } from '../http';
import { userNames } from './shop-members';

export const createShareInput = z.object({
  runId: z.uuid('Choose a run of this job'),
  days: z.number('Give the number of days').int('Give whole days').min(1, 'At least 1 day').max(MAX_SHARE_DAYS, `At most ${MAX_SHARE_DAYS} days`).default(DEFAULT_SHARE_DAYS),
}).strict();

export type ShareLinkDto = {
  id: string; runId: string; procedureName: string; state: ShareLinkState; expiresAt: string; revokedAt: string | null;
  createdBy: string; createdAt: string; views: Array<{ at: string; what: string; ip: string; userAgent: string }>;
};

const hashToken = (token: string) => createHash('sha256').update(token).digest('hex');
export const shareUrl = (token: string) => `${config().PUBLIC_URL}/share/${token}`;

async function jobOf(em: EntityManager, shopId: string, jobId: string) {
  if (!z.uuid().safeParse(jobId).success) throw notFound('That job');
  const job = await em.findOne(Job, { id: jobId, shopId });
  if (!job) throw notFound('That job');
  return job;
}

/** Makes a link to one run of a job; the token is returned once and never stored. */
export async function createShareLink(em: EntityManager, member: Member, jobId: string, input: z.infer<typeof createShareInput>): Promise<{ link: ShareLinkDto; token: string; url: string }> {
  const job = await jobOf(em, member.shopId, jobId);
  const run = await em.findOne(Run, { id: input.runId, shopId: member.shopId, job: job.id });
  if (!run) throw new AppError('bad-request', 'That run is not part of this job.', { fields: { runId: 'Not a run of this job' } });
  const token = randomBytes(32).toString('base64url');
  const link = em.create(ShareLink, { shopId: member.shopId, jobId: job.id, runId: run.id, tokenHash: hashToken(token), expiresAt: shareExpiry(new Date(), input.days), revokedAt: null, createdBy: member.userId });
  await em.flush();
  return { link: (await toDtos(em, [link]))[0]!, token, url: shareUrl(token) };
}

/** Revokes a link at once (404 for another shop's or an unknown link). */
export async function revokeShareLink(em: EntityManager, member: Member, jobId: string, linkId: string): Promise<ShareLinkDto> {
  await jobOf(em, member.shopId, jobId);
  if (!z.uuid().safeParse(linkId).success) throw notFound('That link');
  const link = await em.findOne(ShareLink, { id: linkId, shopId: member.shopId, jobId });
  if (!link) throw notFound('That link');
  if (!link.revokedAt) {
    link.revokedAt = new Date();
    await em.flush();
  }
  return (await toDtos(em, [link]))[0]!;
}

async function toDtos(em: EntityManager, links: ShareLinkEntity[]): Promise<ShareLinkDto[]> {
  const ids = links.map((l) => l.id);
  const views = ids.length ? await em.find(ShareView, { linkId: { $in: ids } }, { orderBy: { at: 'desc' } }) : [];
  const runs = ids.length ? await em.find(Run, { id: { $in: links.map((l) => l.runId) } }) : [];
  const names = await userNames(em, links.map((l) => l.createdBy));
  const now = new Date();
  return links.map((l) => ({
    id: l.id, runId: l.runId, procedureName: runs.find((r) => r.id === l.runId)?.procedureName ?? '', state: shareLinkState({ expiresAt: l.expiresAt, revokedAt: l.revokedAt ?? null }, now),
    expiresAt: l.expiresAt.toISOString(), revokedAt: l.revokedAt?.toISOString() ?? null, createdBy: names.get(l.createdBy) ?? 'Former member', createdAt: l.createdAt.toISOString(),
    views: views.filter((v) => v.linkId === l.id).map((v) => ({ at: v.at.toISOString(), what: v.what, ip: v.ip, userAgent: v.userAgent })),
  }));
}

/** A job's links with their views, newest first. */
export async function listShareLinks(em: EntityManager, shopId: string, jobId: string): Promise<ShareLinkDto[]> {
  await jobOf(em, shopId, jobId);
  return toDtos(em, await em.find(ShareLink, { shopId, jobId }, { orderBy: { createdAt: 'desc' } }));
}

/**
 * Opens a link: the shop and run it grants, with the view logged; an unknown, expired or
 * revoked token is simply "not found" (nothing tells a stranger which of these it was).
 */
export async function openShareLink(em: EntityManager, token: string, view: { what: 'page' | 'pdf'; ip: string; userAgent: string }): Promise<{ shopId: string; runId: string; jobId: string; expiresAt: string }> {
  if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) throw notFound('That link');
  const link = await em.findOne(ShareLink, { tokenHash: hashToken(token) }, { refresh: true });
  if (!link || shareLinkState({ expiresAt: link.expiresAt, revokedAt: link.revokedAt ?? null }, new Date()) !== 'active') throw notFound('That link');
  em.create(ShareView, { linkId: link.id, what: view.what, ip: view.ip.slice(0, 80), userAgent: view.userAgent.slice(0, 300) });
  await em.flush();
  return { shopId: link.shopId, runId: link.runId, jobId: link.jobId, expiresAt: link.expiresAt.toISOString() };
}

/** The client address as the load balancer reports it (README: X-Forwarded-For), else the socket's. */
export function clientIp(request: Request, fallback = ''): string {
  return request.headers.get('x-forwarded-for')?.split(',')[0]?.trim() || request.headers.get('x-real-ip') || fallback;
}
