/**
 * Bad input on the read side: every GET route found on disk (better-auth's aside) gets right
 * and wrong ids (not a uuid, a random uuid, another shop's record, nasty strings), query strings
 * with the keys the routes read and with junk, as every role and signed out. For every request:
 * no 5xx; every refusal is a 4xx in our error shape; a read changes nothing (one checksum over
 * every table before and after) except the view log of a valid read-only link, which is the
 * point of that route. Bounded by FUZZ_RUNS per route under the global fixed seed.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { MikroORM } from '@mikro-orm/postgresql';
import type { TestShop } from './support/shops';
import { callRoute } from './support/routes';
import { discoverRoutes, fillPattern, isPublicPattern, loadRoute } from './support/routes-index';
import { badId, fuzzWorld, goodParams, nasty, type FuzzRecords } from './fuzz.fixtures';
import type { ShopRole } from '../../src/lib/access';

const RUNS = Number(process.env.FUZZ_RUNS ?? 30);

let orm: MikroORM;
let a: TestShop;
let b: TestShop;
let recA: FuzzRecords;
let recB: FuzzRecords;
let checksum: () => Promise<string>;
const stats = { requests: 0, refused: 0, answered: 0 };

const targets = discoverRoutes()
  // /api/health reads no input; its 503 is its answer when a service is down (foundation tests).
  .filter((r) => r.methods.includes('GET') && !r.pattern.startsWith('/api/auth/') && r.pattern !== '/api/health')
  .map((route) => ({ route, key: `GET ${route.pattern}` }));
const handlers = new Map<string, Parameters<typeof callRoute>[0]>();
/** The one read that records something: a view of a valid read-only link is logged. */
const LOGS_VIEWS = (pattern: string) => pattern.startsWith('/api/share/');

/** Query keys the routes read (grep `searchParams` in src/pages/api), with right values for shop A. */
const QUERY_KEYS = ['after', 'status', 'technician', 'olderThanDays', 'search', 'engineFamily', 'stepId', 'runId', 'tagId', 'jobId', 'a', 'b', 'revision'];
const goodQuery = (r: FuzzRecords): Record<string, string> => ({
  after: '1', status: 'in-teardown', technician: r.technicianId, olderThanDays: '3', search: 'bolt', engineFamily: 'Invented', stepId: 's-bolts',
  runId: r.runId, tagId: r.tagId, jobId: r.jobId, a: r.revisionId, b: r.revisionId, revision: r.revisionId,
});

beforeAll(async () => {
  ({ orm, a, b, recA, recB, checksum } = await fuzzWorld('Read fuzz shop'));
  for (const t of targets) handlers.set(t.key, (await loadRoute(t.route)).GET as Parameters<typeof callRoute>[0]);
}, 120_000);

afterAll(async () => {
  console.log(`[fuzz reads] ${stats.requests} requests over ${targets.length} GET routes: ${stats.refused} refused (4xx), ${stats.answered} answered`);
  await orm?.close(true);
});

type Read = { params: Record<string, string>; query: Array<[string, string]>; role: ShopRole | null; what: string };

function read(pattern: string): fc.Arbitrary<Read> {
  const params = fc.oneof({ weight: 3, arbitrary: fc.constant<'good'>('good') }, { weight: 2, arbitrary: badId() }).map((id) => {
    if (id === 'good') return goodParams(pattern, recA);
    return id === 'B' ? goodParams(pattern, recB) : { id, linkId: id, token: id };
  });
  const value = fc.oneof(nasty, fc.uuid(), fc.integer({ min: -5, max: 1e9 }).map(String), fc.constantFrom('', '-1', '1e999', 'NaN', 'true', '[]', '{}'));
  const pair: fc.Arbitrary<[string, string]> = fc.oneof(
    { weight: 3, arbitrary: fc.constantFrom(...QUERY_KEYS).map((k): [string, string] => [k, goodQuery(recA)[k]!]) },
    { weight: 3, arbitrary: fc.tuple(fc.constantFrom(...QUERY_KEYS), value) },
    { weight: 1, arbitrary: fc.constantFrom(...QUERY_KEYS).map((k): [string, string] => [k, goodQuery(recB)[k]!]) },
    { weight: 1, arbitrary: fc.tuple(fc.string({ maxLength: 12 }), value) },
  );
  return fc.record({
    params,
    query: fc.array(pair, { maxLength: 4 }),
    role: fc.constantFrom<ShopRole | null>('owner', 'lead', 'technician', 'reviewer', null),
  }).map((x) => ({ ...x, what: x.query.map(([k]) => k).join('&') || 'no query' }));
}

async function send(key: string, pattern: string, r: Read) {
  const qs = new URLSearchParams(r.query).toString();
  const path = fillPattern(pattern, r.params) + (qs ? `?${qs}` : '');
  const before = await checksum();
  const res = await callRoute(handlers.get(key)!, { method: 'GET', path, params: r.params, as: r.role ? { shop: a, member: a.members[r.role] } : null });
  stats.requests++;
  const shown = `${key} as ${r.role ?? 'signed out'} [${r.what}] ids ${JSON.stringify(r.params).slice(0, 120)} query ${JSON.stringify(qs.slice(0, 160))} → ${res.status} ${JSON.stringify(res.body).slice(0, 300)}`;
  expect(res.status, shown).toBeLessThan(500);
  if (res.status >= 400) {
    stats.refused++;
    expect(typeof res.body?.error?.code, shown).toBe('string');
    expect(res.body?.error?.message?.length, shown).toBeGreaterThan(0);
  } else stats.answered++;
  if (!(LOGS_VIEWS(pattern) && res.status < 400)) expect(await checksum(), `a read changed data: ${shown}`).toBe(before);
  return res;
}

describe('discovery', () => {
  it('fuzzes every GET route on disk but better-auth’s, public ones included', () => {
    expect(targets.length).toBeGreaterThan(20);
    expect(targets.some((t) => isPublicPattern(t.route.pattern))).toBe(true);
  });
});

describe.each(targets.map((t) => [t.key, t] as const))('%s', (key, t) => {
  it('no 5xx, every refusal a 4xx in our shape, nothing changed', async () => {
    await fc.assert(fc.asyncProperty(read(t.route.pattern), async (r) => { await send(key, t.route.pattern, r); }), { numRuns: RUNS });
  }, 120_000);

  it('another shop’s record is not found, and signed out is 401 unless the route is public', async () => {
    const other = await send(key, t.route.pattern, { params: goodParams(t.route.pattern, recB), query: [], role: 'owner', what: 'other shop' });
    if (t.route.params.length > 0 && !isPublicPattern(t.route.pattern)) expect([403, 404]).toContain(other.status);
    const out = await send(key, t.route.pattern, { params: goodParams(t.route.pattern, recA), query: [], role: null, what: 'signed out' });
    if (!isPublicPattern(t.route.pattern)) expect(out.status).toBe(401);
  });
});
