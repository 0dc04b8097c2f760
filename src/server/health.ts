/** Reachability of the three services the app depends on, each checked with a short timeout. */
import { HeadBucketCommand } from '@aws-sdk/client-s3';
import { bucket, s3 } from './storage';
import { mailer } from './mailer';
import { pgPool } from './pg-pool';

export type HealthReport = { ok: boolean; checks: Record<'database' | 'store' | 'mail', { ok: boolean; ms: number; error?: string }> };

async function timed(fn: () => Promise<unknown>, timeoutMs = 3000) {
  const t0 = performance.now();
  try {
    await Promise.race([fn(), new Promise((_, rej) => setTimeout(() => rej(new Error(`no answer within ${timeoutMs} ms`)), timeoutMs))]);
    return { ok: true, ms: Math.round(performance.now() - t0) };
  } catch (e) {
    return { ok: false, ms: Math.round(performance.now() - t0), error: e instanceof Error ? e.message : String(e) };
  }
}

export async function checkHealth(): Promise<HealthReport> {
  const [database, store, mail] = await Promise.all([
    timed(() => pgPool().query('select 1')),
    timed(() => s3().send(new HeadBucketCommand({ Bucket: bucket() }))),
    timed(() => mailer().verify()),
  ]);
  return { ok: database.ok && store.ok && mail.ok, checks: { database, store, mail } };
}
