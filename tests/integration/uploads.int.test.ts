/** Photo uploads against the real S3 fake: presign → PUT → complete, every refusal, shop scoping. */
import { beforeAll, describe, expect, it } from 'vitest';
import type { MikroORM } from '@mikro-orm/postgresql';
import { HeadObjectCommand } from '@aws-sdk/client-s3';
import sharp from 'sharp';
import { freshDatabase } from './support/db';
import { createShop, type TestShop } from './support/shops';
import { callRoute } from './support/routes';
import { as, jobWithRun, partsRevision } from './parts.fixtures';
import { Attachment, Job } from '../../src/server/entities';
import { bucket, s3 } from '../../src/server/storage';
import { MAX_PHOTOS_PER_SCOPE } from '../../src/domain/upload-rules';
import * as presignRoute from '../../src/pages/api/uploads/presign';
import * as completeRoute from '../../src/pages/api/uploads/complete';
import * as thumbRoute from '../../src/pages/api/attachments/[id]/thumb';
import * as originalRoute from '../../src/pages/api/attachments/[id]/original';
import * as listRoute from '../../src/pages/api/attachments/index';

let orm: MikroORM;
let a: TestShop;
let b: TestShop;
let runId: string;
let jobId: string;
let jpeg: Buffer;
let png: Buffer;
const scope = () => ({ kind: 'run-step', runId, stepId: 's-caps' });

beforeAll(async () => {
  orm = await freshDatabase();
  a = await createShop('Uploads A');
  b = await createShop('Uploads B');
  ({ runId, jobId } = await jobWithRun(a, await partsRevision(orm, a)));
  jpeg = await sharp({ create: { width: 640, height: 400, channels: 3, background: { r: 200, g: 90, b: 30 } } }).jpeg().toBuffer();
  png = await sharp({ create: { width: 64, height: 64, channels: 3, background: { r: 10, g: 90, b: 130 } } }).png().toBuffer();
}, 90_000);

const exists = async (key: string) => s3().send(new HeadObjectCommand({ Bucket: bucket(), Key: key })).then(() => true, () => false);
const rows = () => orm.em.fork().count(Attachment, { runId });

async function presign(body: Record<string, unknown>, shop = a) {
  return callRoute(presignRoute.POST, { method: 'POST', body: { filename: 'cap.jpg', contentType: 'image/jpeg', size: jpeg.length, scope: scope(), ...body }, as: as(shop) });
}
async function put(url: string, bytes: Buffer, contentType: string) {
  const r = await fetch(url, { method: 'PUT', body: new Uint8Array(bytes), headers: { 'content-type': contentType } });
  expect(r.status).toBe(200);
}
const complete = (body: Record<string, unknown>, shop = a) => callRoute(completeRoute.POST, { method: 'POST', body: { filename: 'cap.jpg', contentType: 'image/jpeg', size: jpeg.length, scope: scope(), ...body }, as: as(shop) });

describe('a photo upload', () => {
  it('presigns, lands in the store, and is recorded with a thumbnail', async () => {
    const p = await presign({});
    expect(p.status).toBe(201);
    const job = await orm.em.fork().findOneOrFail(Job, { id: jobId });
    expect(p.body.key).toMatch(new RegExp(`^shops/${a.id}/jobs/${job.id}/[0-9a-f-]{36}\\.jpg$`));
    expect(p.body.url).toMatch(/X-Amz-Expires=300/);
    await put(p.body.url, jpeg, 'image/jpeg');
    const c = await complete({ key: p.body.key });
    expect(c.status, JSON.stringify(c.body)).toBe(201);
    expect(c.body).toMatchObject({ scope: 'run-step', runId, stepId: 's-caps', contentType: 'image/jpeg', size: jpeg.length, width: 640, height: 400, thumbUrl: `/api/attachments/${c.body.id}/thumb` });

    const row = await orm.em.fork().findOneOrFail(Attachment, { id: c.body.id });
    expect(row).toMatchObject({ shopId: a.id, key: p.body.key, size: jpeg.length, contentType: 'image/jpeg', createdById: a.members.technician.userId });
    expect(row.thumbKey).toBe(p.body.key.replace(/\/([0-9a-f-]{36})\.jpg$/, '/thumbs/$1.webp'));
    expect(await exists(row.key)).toBe(true);
    expect(await exists(row.thumbKey!)).toBe(true);

    const t = await callRoute(thumbRoute.GET, { params: { id: row.id }, as: as(a, 'reviewer') });
    expect(t.status).toBe(302);
    expect(t.headers.get('cache-control')).toMatch(/^private, max-age=\d+$/);
    expect(t.headers.get('location')).toMatch(/X-Amz-Expires=300/);
    const thumb = Buffer.from(await (await fetch(t.headers.get('location')!)).arrayBuffer());
    const meta = await sharp(thumb).metadata();
    expect(meta).toMatchObject({ format: 'webp', width: 480, height: 300 });
    const o = await callRoute(originalRoute.GET, { params: { id: row.id }, as: as(a) });
    const original = Buffer.from(await (await fetch(o.headers.get('location')!)).arrayBuffer());
    expect(original.equals(jpeg)).toBe(true);

    const list = await callRoute(listRoute.GET, { path: `/api/attachments?runId=${runId}&stepId=s-caps`, as: as(a) });
    expect(list.body.attachments.map((x: { id: string }) => x.id)).toEqual([row.id]);
  });

  it.each([
    ['a PDF', { filename: 'notes.pdf', contentType: 'application/pdf' }, 415, /not a photo/],
    ['a 21 MB photo', { size: 21 * 1024 * 1024 }, 413, /at most 20\.0 MB/],
    ['a step that is not in the run', { scope: { kind: 'run-step', runId: '00000000-0000-4000-8000-000000000000', stepId: 's-caps' } }, 404, /run was not found/],
  ])('refuses %s before anything is uploaded', async (_n, body, status, message) => {
    const before = await rows();
    const p = await presign(body);
    expect(p.status).toBe(status);
    expect(p.body.error.message).toMatch(message);
    expect(await rows()).toBe(before);
  });

  it('refuses completion when nothing was uploaded', async () => {
    const p = await presign({});
    const before = await rows();
    const c = await complete({ key: p.body.key });
    expect(c.status).toBe(404);
    expect(c.body.error.message).toMatch(/No photo arrived/);
    expect(await rows()).toBe(before);
  });

  it('deletes a PNG sent as JPEG and records nothing', async () => {
    const p = await presign({ size: png.length });
    await put(p.body.url, png, 'image/jpeg');
    const c = await complete({ key: p.body.key, size: png.length });
    expect(c.status).toBe(415);
    expect(c.body.error.message).toMatch(/not a readable JPEG/);
    expect(await exists(p.body.key)).toBe(false);
    expect(await orm.em.fork().count(Attachment, { key: p.body.key })).toBe(0);
  });

  it('deletes a file whose size is not the declared one', async () => {
    const p = await presign({ size: 100 });
    await put(p.body.url, jpeg, 'image/jpeg');
    const c = await complete({ key: p.body.key, size: 100 });
    expect(c.status).toBe(400);
    expect(c.body.error.fields).toHaveProperty('size');
    expect(await exists(p.body.key)).toBe(false);
  });

  it('refuses a key that was not issued for this job', async () => {
    const c = await complete({ key: `shops/${b.id}/jobs/${jobId}/00000000-0000-4000-8000-000000000000.jpg` });
    expect(c.status).toBe(400);
    expect(c.body.error.fields).toHaveProperty('key');
  });

  it(`refuses the ${MAX_PHOTOS_PER_SCOPE + 1}th photo of a step`, async () => {
    const em = orm.em.fork();
    const job = em.getReference(Job, jobId);
    const have = await em.count(Attachment, { runId, stepId: 's-caps' });
    for (let i = have; i < MAX_PHOTOS_PER_SCOPE; i++)
      em.create(Attachment, { shopId: a.id, job, scopeKind: 'run-step', runId, stepId: 's-caps', key: `shops/${a.id}/jobs/${jobId}/filler-${i}.jpg`, thumbKey: null, filename: 'x.jpg', contentType: 'image/jpeg', size: 1, createdById: a.members.technician.userId });
    await em.flush();
    const p = await presign({});
    expect(p.status).toBe(409);
    expect(p.body.error.message).toMatch(/at most 12/);
    await em.nativeDelete(Attachment, { key: { $like: '%/filler-%' } });
  });
});

describe('another shop', () => {
  it('gets 404 for the photo and cannot presign for the job', async () => {
    const [row] = await orm.em.fork().find(Attachment, { runId }, { limit: 1 });
    for (const route of [thumbRoute, originalRoute]) {
      const r = await callRoute(route.GET, { params: { id: row!.id }, as: as(b) });
      expect(r.status).toBe(404);
    }
    const p = await presign({}, b);
    expect(p.status).toBe(404);
    const list = await callRoute(listRoute.GET, { path: `/api/attachments?jobId=${jobId}`, as: as(b) });
    expect(list.status).toBe(404);
    expect(list.body.error.message).toBe('That job was not found.');
  });

  it('a reviewer cannot upload (403), a signed-out caller gets 401', async () => {
    expect((await callRoute(presignRoute.POST, { method: 'POST', body: {}, as: as(a, 'reviewer') })).status).toBe(403);
    expect((await callRoute(presignRoute.POST, { method: 'POST', body: {}, as: null })).status).toBe(401);
  });
});
