/**
 * Photo uploads straight from the browser to the object store: presign a short-lived PUT for
 * a key under the job's folder, then on completion check what actually arrived (size, type,
 * real image bytes), make a webp thumbnail and record the Attachment. Anything refused on
 * completion is deleted from the store, so a refusal leaves nothing behind.
 */
import { randomUUID } from 'node:crypto';
import { DeleteObjectCommand, GetObjectCommand, HeadObjectCommand, PutObjectCommand } from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';
import type { EntityManager } from '@mikro-orm/postgresql';
import sharp from 'sharp';
import * as z from 'zod';
import { PHOTO_TYPES, checkUpload, formatMatches, isPhotoType, looksLikeHeif } from '../../domain/upload-rules';
import { Attachment, Finding, Job, Run, Tag } from '../entities';
import type { AttachmentEntity, AttachmentScope } from '../entities/attachment.entity';
import type { Member } from '../guards';
import { AppError, notFound } from '../http';
import { bucket, s3 } from '../storage';
import { pinnedRevision } from './run-revision';

export const PUT_EXPIRY_S = 300;
export const GET_EXPIRY_S = 300;

const uuid = (what: string) => z.uuid(`Give the ${what}'s id`);
export const uploadScope = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('run-step'), runId: uuid('run'), stepId: z.string().min(1).max(40) }).strict(),
  z.object({ kind: z.literal('tag'), tagId: uuid('tag') }).strict(),
  z.object({ kind: z.literal('finding'), findingId: uuid('finding') }).strict(),
], 'Say what the photo shows: a run step, a tag or a finding');
export type UploadScope = z.infer<typeof uploadScope>;

const fileFields = {
  filename: z.string().trim().min(1, 'The file has no name').max(200, 'The file name is too long (200 characters at most)'),
  contentType: z.string().trim().max(100),
  size: z.number('Give the file size in bytes').int('Give the file size in whole bytes'),
  scope: uploadScope,
};
export const presignInput = z.object(fileFields).strict();
export const completeInput = z.object({ ...fileFields, key: z.string().min(1).max(300) }).strict();

export type AttachmentDto = {
  id: string; jobId: string; scope: AttachmentScope; runId: string | null; stepId: string | null; tagId: string | null; findingId: string | null;
  filename: string; contentType: string; size: number; width: number | null; height: number | null;
  thumbUrl: string | null; originalUrl: string; createdAt: string;
};

export const attachmentDto = (a: AttachmentEntity): AttachmentDto => ({
  id: a.id, jobId: a.job.id, scope: a.scopeKind, runId: a.runId ?? null, stepId: a.stepId ?? null, tagId: a.tagId ?? null, findingId: a.findingId ?? null,
  filename: a.filename, contentType: a.contentType, size: a.size, width: a.width ?? null, height: a.height ?? null,
  thumbUrl: a.thumbKey ? `/api/attachments/${a.id}/thumb` : null, originalUrl: `/api/attachments/${a.id}/original`, createdAt: a.createdAt.toISOString(),
});

type Resolved = { jobId: string; runId: string | null; stepId: string | null; tagId: string | null; findingId: string | null };

/** The job a scope belongs to, in the member's shop (404 otherwise). */
async function resolveScope(em: EntityManager, shopId: string, scope: UploadScope): Promise<Resolved> {
  if (scope.kind === 'run-step') {
    const run = await em.findOne(Run, { id: scope.runId, shopId });
    if (!run) throw notFound('That run');
    const { steps } = await pinnedRevision(em, shopId, run.revisionId);
    if (!steps.some((s) => s.id === scope.stepId)) throw new AppError('bad-request', 'That step is not part of this run.', { fields: { 'scope.stepId': 'Not a step of this run' } });
    return { jobId: run.job.id, runId: run.id, stepId: scope.stepId, tagId: null, findingId: null };
  }
  if (scope.kind === 'tag') {
    const tag = await em.findOne(Tag, { id: scope.tagId, shopId });
    if (!tag) throw notFound('That tag');
    return { jobId: tag.job.id, runId: tag.run.id, stepId: tag.stepId, tagId: tag.id, findingId: null };
  }
  const f = await em.findOne(Finding, { id: scope.findingId, shopId });
  if (!f) throw notFound('That finding');
  return { jobId: f.job.id, runId: f.runId ?? null, stepId: f.stepId ?? null, tagId: null, findingId: f.id };
}

const scopeFilter = (shopId: string, scope: UploadScope) =>
  scope.kind === 'run-step' ? { shopId, scopeKind: scope.kind, runId: scope.runId, stepId: scope.stepId }
  : scope.kind === 'tag' ? { shopId, scopeKind: scope.kind, tagId: scope.tagId }
  : { shopId, scopeKind: scope.kind, findingId: scope.findingId };

function refuse(check: Exclude<ReturnType<typeof checkUpload>, { ok: true }>): never {
  const code = check.code === 'invalid-input' ? 'bad-request' : check.code;
  throw new AppError(code, check.message, { fields: { [check.field]: check.message } });
}

/** A presigned PUT for one photo, after the type, size and count checks. */
export async function presignUpload(em: EntityManager, member: Member, input: z.infer<typeof presignInput>) {
  const where = await resolveScope(em, member.shopId, input.scope);
  const check = checkUpload(input, await em.count(Attachment, scopeFilter(member.shopId, input.scope)));
  if (!check.ok) refuse(check);
  const contentType = input.contentType.toLowerCase();
  const key = `shops/${member.shopId}/jobs/${where.jobId}/${randomUUID()}.${check.ext}`;
  const url = await getSignedUrl(s3(), new PutObjectCommand({ Bucket: bucket(), Key: key, ContentType: contentType }), { expiresIn: PUT_EXPIRY_S });
  return { key, url, method: 'PUT' as const, headers: { 'content-type': contentType }, expiresIn: PUT_EXPIRY_S };
}

const drop = (key: string) => s3().send(new DeleteObjectCommand({ Bucket: bucket(), Key: key })).catch((e) => console.error('[uploads] could not delete a refused object', key, e));

async function head(key: string) {
  try {
    return await s3().send(new HeadObjectCommand({ Bucket: bucket(), Key: key }));
  } catch (e) {
    const status = (e as { $metadata?: { httpStatusCode?: number } }).$metadata?.httpStatusCode;
    if (status === 404 || (e as Error).name === 'NotFound') return null;
    throw e;
  }
}

async function readObject(key: string): Promise<Buffer> {
  const res = await s3().send(new GetObjectCommand({ Bucket: bucket(), Key: key }));
  return Buffer.from(await res.Body!.transformToByteArray());
}

/** Thumbnail and pixel size; null thumbnail for HEIC/HEIF, which this build of sharp cannot decode. */
async function thumbnail(bytes: Buffer, contentType: string): Promise<{ thumb: Buffer | null; width: number | null; height: number | null } | 'not-image'> {
  if (contentType === 'image/heic' || contentType === 'image/heif') return looksLikeHeif(bytes.subarray(0, 16)) ? { thumb: null, width: null, height: null } : 'not-image';
  try {
    const meta = await sharp(bytes).metadata();
    if (!formatMatches(contentType, meta.format)) return 'not-image';
    const thumb = await sharp(bytes).rotate().resize(480, 480, { fit: 'inside', withoutEnlargement: true }).webp({ quality: 78 }).toBuffer();
    const upright = (meta.orientation ?? 1) >= 5;
    return { thumb, width: (upright ? meta.height : meta.width) ?? null, height: (upright ? meta.width : meta.height) ?? null };
  } catch {
    return 'not-image';
  }
}

/**
 * Checks the uploaded object against what was declared and records it. Wrong size, wrong
 * type or bytes that are not that kind of image: the object is deleted and 400/413/415 answered.
 */
export async function completeUpload(em: EntityManager, member: Member, input: z.infer<typeof completeInput>): Promise<AttachmentDto> {
  const where = await resolveScope(em, member.shopId, input.scope);
  const contentType = input.contentType.toLowerCase();
  const ext = isPhotoType(contentType) ? PHOTO_TYPES[contentType] : null;
  const prefix = `shops/${member.shopId}/jobs/${where.jobId}/`;
  const keyOk = input.key.startsWith(prefix) && new RegExp(`^[0-9a-f-]{36}\\.${ext ?? '-'}$`).test(input.key.slice(prefix.length));
  if (!keyOk) throw new AppError('bad-request', 'That upload key was not issued for this job and file type; ask for a new upload.', { fields: { key: 'Not a key from /api/uploads/presign for this scope' } });
  if (await em.findOne(Attachment, { key: input.key })) throw new AppError('conflict', 'This photo is already recorded.');

  const check = checkUpload(input, await em.count(Attachment, scopeFilter(member.shopId, input.scope)));
  const stored = await head(input.key);
  if (!stored) throw new AppError('not-found', 'No photo arrived for this upload; upload it again.');
  if (!check.ok) {
    await drop(input.key);
    refuse(check);
  }
  if (stored.ContentLength !== input.size) {
    await drop(input.key);
    throw new AppError('bad-request', `The uploaded file is ${stored.ContentLength ?? 0} bytes, not the ${input.size} declared; it was discarded. Upload it again.`, { fields: { size: 'Does not match the uploaded file' } });
  }
  if ((stored.ContentType ?? '').toLowerCase() !== contentType) {
    await drop(input.key);
    throw new AppError('unsupported-media-type', `The file arrived as ${stored.ContentType ?? 'an unknown type'}, not ${contentType}; it was discarded.`, { fields: { contentType: 'Does not match the uploaded file' } });
  }
  const bytes = await readObject(input.key);
  const made = await thumbnail(bytes, contentType);
  if (made === 'not-image') {
    await drop(input.key);
    throw new AppError('unsupported-media-type', `“${input.filename}” is not a readable ${contentType.replace('image/', '').toUpperCase()} image; it was discarded.`, { fields: { contentType: 'The bytes are not this kind of image' } });
  }
  const thumbKey = made.thumb ? `${prefix}thumbs/${input.key.slice(prefix.length).replace(/\.[a-z]+$/, '')}.webp` : null;
  if (thumbKey && made.thumb) await s3().send(new PutObjectCommand({ Bucket: bucket(), Key: thumbKey, Body: made.thumb, ContentType: 'image/webp' }));
  const job = em.getReference(Job, where.jobId);
  const row = em.create(Attachment, {
    shopId: member.shopId, job, scopeKind: input.scope.kind, runId: where.runId, stepId: where.stepId, tagId: where.tagId, findingId: where.findingId,
    key: input.key, thumbKey, filename: input.filename, contentType, size: input.size, width: made.width, height: made.height, createdById: member.userId,
  });
  await em.flush();
  return attachmentDto(row);
}

/** A presigned GET (≤ 5 min) for a photo or its thumbnail of the member's shop. */
export async function attachmentUrl(em: EntityManager, shopId: string, id: string, which: 'thumb' | 'original'): Promise<string> {
  if (!z.uuid().safeParse(id).success) throw notFound('That photo');
  const a = await em.findOne(Attachment, { id, shopId });
  if (!a) throw notFound('That photo');
  const key = which === 'thumb' ? a.thumbKey : a.key;
  if (!key) throw new AppError('not-found', 'This photo has no preview (HEIC); open the original.');
  return getSignedUrl(s3(), new GetObjectCommand({ Bucket: bucket(), Key: key, ResponseCacheControl: `private, max-age=${GET_EXPIRY_S}` }), { expiresIn: GET_EXPIRY_S });
}

export const attachmentsQuery = z.union([
  z.object({ runId: z.uuid(), stepId: z.string().min(1).max(40) }).strict(),
  z.object({ tagId: z.uuid() }).strict(),
  z.object({ findingId: z.uuid() }).strict(),
  z.object({ jobId: z.uuid() }).strict(),
], 'Ask for the photos of a run step (runId and stepId), a tag, a finding or a job');

/** Photos of a run step, tag, finding or whole job, oldest first. */
export async function listAttachments(em: EntityManager, shopId: string, q: z.infer<typeof attachmentsQuery>): Promise<AttachmentDto[]> {
  // The record asked about must be this shop's: another shop's id answers 404, like every read.
  const owner = 'jobId' in q ? em.count(Job, { id: q.jobId, shopId }) : 'tagId' in q ? em.count(Tag, { id: q.tagId, shopId }) : 'findingId' in q ? em.count(Finding, { id: q.findingId, shopId }) : em.count(Run, { id: q.runId, shopId });
  if ((await owner) === 0) throw notFound('jobId' in q ? 'That job' : 'tagId' in q ? 'That tag' : 'findingId' in q ? 'That finding' : 'That run');
  const where = 'jobId' in q ? { shopId, job: q.jobId } : 'tagId' in q ? { shopId, tagId: q.tagId } : 'findingId' in q ? { shopId, findingId: q.findingId } : { shopId, scopeKind: 'run-step' as const, runId: q.runId, stepId: q.stepId };
  const rows = await em.find(Attachment, where, { orderBy: { createdAt: 'asc', id: 'asc' } });
  return rows.map(attachmentDto);
}
