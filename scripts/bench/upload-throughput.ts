/**
 * Photo upload throughput: N photos of a given size PUT in parallel to the object store through
 * presigned URLs, as browsers do. Objects go under `bench/` and are deleted afterwards.
 * CLI: `node --import tsx scripts/bench/upload-throughput.ts [count=20] [megabytes=5]`
 * (S3_ENDPOINT etc. from the environment; defaults are the local S3 fake).
 */
import { randomBytes, randomUUID } from 'node:crypto';
import { pathToFileURL } from 'node:url';
import { DeleteObjectCommand, PutObjectCommand } from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';
import { bucket, s3 } from '../../src/server/storage';

export type UploadThroughput = { files: number; bytes: number; seconds: number; mbPerSecond: number; slowestMs: number };

/** Uploads `count` files of `megabytes` MB at once and reports MB/s over the whole batch. */
export async function uploadThroughput(count = 20, megabytes = 5): Promise<UploadThroughput> {
  const size = Math.round(megabytes * 1024 * 1024);
  const body = randomBytes(size);
  const keys = Array.from({ length: count }, () => `bench/${randomUUID()}.jpg`);
  const urls = await Promise.all(keys.map((Key) => getSignedUrl(s3(), new PutObjectCommand({ Bucket: bucket(), Key, ContentType: 'image/jpeg' }), { expiresIn: 300 })));
  const t0 = performance.now();
  const times = await Promise.all(
    urls.map(async (url) => {
      const t = performance.now();
      const r = await fetch(url, { method: 'PUT', body: new Uint8Array(body), headers: { 'content-type': 'image/jpeg' } });
      if (!r.ok) throw new Error(`PUT answered ${r.status}: ${await r.text()}`);
      return performance.now() - t;
    }),
  );
  const seconds = (performance.now() - t0) / 1000;
  await Promise.all(keys.map((Key) => s3().send(new DeleteObjectCommand({ Bucket: bucket(), Key }))));
  const bytes = size * count;
  return { files: count, bytes, seconds, mbPerSecond: bytes / (1024 * 1024) / seconds, slowestMs: Math.max(...times) };
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  const [count = '20', mb = '5'] = process.argv.slice(2);
  const r = await uploadThroughput(Number(count), Number(mb));
  console.log(`upload throughput: ${r.files} × ${(r.bytes / r.files / 1024 / 1024).toFixed(1)} MB in ${r.seconds.toFixed(2)} s = ${r.mbPerSecond.toFixed(1)} MB/s (slowest file ${r.slowestMs.toFixed(0)} ms)`);
}
