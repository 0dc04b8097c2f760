/**
 * Upload throughput to the S3 fake (20 photos of 5 MB in parallel through presigned PUTs),
 * beside a bare loopback HTTP sink receiving the same bytes in the same way: the ratio is what
 * the store costs over just moving the bytes.
 */
import http from 'node:http';
import { randomBytes } from 'node:crypto';
import { uploadThroughput } from './upload-throughput';
import { freePortTs } from './ports';

async function sinkThroughput(count: number, megabytes: number): Promise<number> {
  const port = await freePortTs();
  const server = http.createServer((req, res) => { req.resume(); req.on('end', () => res.writeHead(200).end()); });
  await new Promise<void>((r) => server.listen(port, '127.0.0.1', r));
  const body = new Uint8Array(randomBytes(Math.round(megabytes * 1024 * 1024)));
  const t0 = performance.now();
  await Promise.all(Array.from({ length: count }, () => fetch(`http://127.0.0.1:${port}/x`, { method: 'PUT', body, headers: { 'content-type': 'image/jpeg' } })));
  const seconds = (performance.now() - t0) / 1000;
  await new Promise((r) => server.close(r));
  return (count * megabytes) / seconds;
}

export async function figure(): Promise<Array<[string, string, string, string, string]>> {
  const ours = await uploadThroughput(20, 5);
  const base = await sinkThroughput(20, 5);
  return [['Upload 20 × 5 MB in parallel (S3 fake)', `${ours.mbPerSecond.toFixed(1)} MB/s`, `${base.toFixed(1)} MB/s (bare HTTP sink)`, `${((ours.mbPerSecond / base) * 100).toFixed(0)} %`, '']];
}
