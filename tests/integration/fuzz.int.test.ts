/**
 * Bad input, property-based: every state-changing API route found on disk gets malformed JSON,
 * wrong types, huge strings, unicode edge cases (lone surrogates, NUL, RTL override, zero-width,
 * emoji), SQL and script injection strings, wrong ids (not a uuid, a random uuid, another shop's
 * record) and wrong content types. For every request: no 5xx; every refusal is a 4xx in our
 * error shape; a refused request changes nothing (a checksum over every table, before and after).
 * Bounded: a fixed number of runs per route (FUZZ_RUNS, default 30) under the global fixed seed.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { MikroORM } from '@mikro-orm/postgresql';
import type { TestShop } from './support/shops';
import { callRoute } from './support/routes';
import { discoverRoutes, fillPattern, loadRoute, STATE_CHANGING } from './support/routes-index';
import { matrixProcedureFile } from './access-matrix.fixtures';
import { badId, fuzzWorld, goodParams, nasty, type FuzzRecords } from './fuzz.fixtures';
import type { ShopRole } from '../../src/lib/access';

const RUNS = Number(process.env.FUZZ_RUNS ?? 30);
const MB = 1024 * 1024;

const anyValue = fc.oneof(nasty, fc.jsonValue({ maxDepth: 2 }), fc.integer(), fc.double({ noNaN: true }), fc.boolean(), fc.constant(null), fc.constant([]), fc.constant({}), fc.constant(-1), fc.constant(Number.MAX_SAFE_INTEGER), fc.constant(1e308));
const MALFORMED = ['{', '{"a":', 'nul', "{'a':1}", '[1,2', '{"a":1}}', '\u0000', '', ' ', '{"__proto__":{"polluted":1}}', '{"constructor":{"prototype":{"x":1}}}', '1e999999', '"\\ud800"', '{"a":"\\u0000"}', '\uFEFF{}', '[]', '"just a string"', '123'];
const CONTENT_TYPES = ['application/json', 'application/json', 'application/json', 'application/json; charset=utf-8', 'text/plain', 'application/x-www-form-urlencoded', 'multipart/form-data; boundary=xyz', '', 'application/xml', 'APPLICATION/JSON'];

type Rec = FuzzRecords;
/** A body each route accepts from an owner, which the fuzz then damages field by field. */
const VALID: Record<string, (r: Rec) => Record<string, unknown>> = {
  'POST /api/jobs': (r) => ({ unitDescription: 'Invented unit', serial: 'FZ-1', technicianIds: [r.technicianId] }),
  'PATCH /api/jobs/[id]': () => ({ notes: 'Customer called', serial: 'FZ-2' }),
  'POST /api/jobs/[id]/findings': () => ({ what: 'Oil weep', severity: 'note', where: 'Sump', partsToReplace: [{ part: 'Gasket', quantity: 1 }] }),
  'PUT /api/jobs/[id]/parts': () => ({ part: 'Cover gasket', quantity: 2 }),
  'POST /api/jobs/[id]/runs': (r) => ({ revisionId: r.revisionId }),
  'POST /api/jobs/[id]/send-report': (r) => ({ runId: r.runId, to: 'machinist@example.test', message: 'Attached' }),
  'POST /api/jobs/[id]/share-links': (r) => ({ runId: r.runId, days: 3 }),
  'POST /api/jobs/[id]/status': () => ({ to: 'at-machine-shop', reason: 'Heads out' }),
  'POST /api/procedures': () => ({ name: 'Fuzz procedure', kind: 'teardown', engineFamily: 'Invented', description: '' }),
  'POST /api/procedures/import': () => matrixProcedureFile('fuzz-import') as unknown as Record<string, unknown>,
  'PATCH /api/procedures/[id]': () => ({ name: 'Renamed', description: 'Example data' }),
  'POST /api/procedures/[id]/drafts': (r) => ({ fromRevisionId: r.revisionId }),
  'PATCH /api/revisions/[id]': () => ({ note: 'Reworded' }),
  'PUT /api/revisions/[id]/content': () => ({ version: 1, steps: [{ id: 's-one', kind: 'action', title: 'Wipe the flange' }] }),
  'POST /api/revisions/[id]/release': () => ({ note: 'Fuzz release' }),
  'POST /api/runs/[id]/events': () => ({ event: { type: 'step.start', stepId: 's-bolts' }, idempotencyKey: crypto.randomUUID(), expectedSeq: 4 }),
  'POST /api/runs/[id]/send-back': () => ({ stepId: 's-tag', reason: 'Redo the tag' }),
  'POST /api/runs/[id]/signoffs': () => ({ meaning: 'reviewed', password: 'integration-pass-1', stepId: 's-review' }),
  'PATCH /api/shop/settings': () => ({ allowSelfSignoff: false, preferredTorqueUnit: 'N·m' }),
  'PATCH /api/tags/[id]': () => ({ bin: 'B-2', disposition: 'replace', conditionNote: 'Scored' }),
  'POST /api/uploads/presign': (r) => ({ filename: 'cover.jpg', contentType: 'image/jpeg', size: 120_000, scope: { kind: 'tag', tagId: r.tagId } }),
  'POST /api/uploads/complete': (r) => ({ filename: 'cover.jpg', contentType: 'image/jpeg', size: 120_000, key: 'shops/x/y.jpg', scope: { kind: 'tag', tagId: r.tagId } }),
};

let orm: MikroORM;
let a: TestShop;
let b: TestShop;
let recA: Rec;
let recB: Rec;
let checksum: () => Promise<string>;
const stats = { requests: 0, refused: 0, accepted: 0 };

const targets = discoverRoutes().flatMap((r) => r.methods.filter((m) => STATE_CHANGING.has(m)).map((m) => ({ route: r, method: m, key: `${m} ${r.pattern}` })));
// better-auth's endpoints answer in its own shape and are covered by rate-limit and e2e tests.
const fuzzed = targets.filter((t) => !t.route.pattern.startsWith('/api/auth/'));
const handlers = new Map<string, Parameters<typeof callRoute>[0]>();

beforeAll(async () => {
  ({ orm, a, b, recA, recB, checksum } = await fuzzWorld('Fuzz shop'));
  for (const t of fuzzed) handlers.set(t.key, (await loadRoute(t.route))[t.method] as Parameters<typeof callRoute>[0]);
}, 120_000);

afterAll(async () => {
  console.log(`[fuzz] ${stats.requests} requests over ${fuzzed.length} routes: ${stats.refused} refused (4xx, no data change), ${stats.accepted} accepted`);
  await orm?.close(true);
});


type Attempt = { params: Record<string, string>; rawBody: string; contentType: string; role: ShopRole; what: string };

function attempt(key: string, pattern: string): fc.Arbitrary<Attempt> {
  const valid = VALID[key];
  const body: fc.Arbitrary<[string, string]> = fc.oneof(
    { weight: 4, arbitrary: valid ? fc.tuple(fc.constantFrom(...Object.keys(valid(recA as FuzzRecords))), anyValue).map(([k, v]): [string, string] => ['field ' + k, JSON.stringify({ ...valid(recA as FuzzRecords), [k]: v })]) : anyValue.map((v): [string, string] => ['value', JSON.stringify(v)]) },
    { weight: 1, arbitrary: valid ? fc.tuple(fc.string({ maxLength: 12 }), anyValue).map(([k, v]): [string, string] => ['extra ' + k, JSON.stringify({ ...valid(recA as FuzzRecords), [k]: v })]) : fc.constant<[string, string]>(['empty', '{}']) },
    { weight: 2, arbitrary: fc.jsonValue({ maxDepth: 3 }).map((v): [string, string] => ['json', JSON.stringify(v)]) },
    { weight: 2, arbitrary: fc.oneof(fc.constantFrom(...MALFORMED), fc.string({ maxLength: 40 })).map((s): [string, string] => ['malformed', s]) },
    { weight: 1, arbitrary: nasty.map((s): [string, string] => ['nasty', JSON.stringify(s)]) },
  );
  const params = fc.oneof({ weight: 3, arbitrary: fc.constant<'good'>('good') }, { weight: 1, arbitrary: badId() }).map((id) => {
    const good = goodParams(pattern, recA as FuzzRecords);
    if (id === 'good') return good;
    const other = goodParams(pattern, recB as FuzzRecords);
    return id === 'B' ? other : { id, linkId: id, token: id };
  });
  return fc.record({
    params,
    body,
    contentType: fc.constantFrom(...CONTENT_TYPES),
    role: fc.constantFrom<ShopRole>('owner', 'owner', 'owner', 'lead', 'technician', 'reviewer'),
  }).map(({ params: p, body: [what, rawBody], contentType, role }) => ({ params: p, rawBody, contentType, role, what }));
}

async function send(key: string, t: Attempt) {
  const [method, pattern] = key.split(' ') as [string, string];
  const path = fillPattern(pattern, t.params);
  const before = await checksum();
  const res = await callRoute(handlers.get(key)!, { method, path, params: t.params, rawBody: t.rawBody, contentType: t.contentType, as: { shop: a, member: a.members[t.role] } });
  stats.requests++;
  const shown = `${key} as ${t.role} [${t.what}, ${JSON.stringify(t.contentType)}, ids ${JSON.stringify(t.params).slice(0, 120)}] body ${JSON.stringify(t.rawBody.slice(0, 120))} → ${res.status} ${JSON.stringify(res.body).slice(0, 300)}`;
  expect(res.status, shown).toBeLessThan(500);
  if (res.status >= 400) {
    stats.refused++;
    expect(typeof res.body?.error?.code, shown).toBe('string');
    expect(typeof res.body?.error?.message, shown).toBe('string');
    expect(res.body.error.message.length, shown).toBeGreaterThan(0);
    expect(await checksum(), `a refused request changed data: ${shown}`).toBe(before);
  } else stats.accepted++;
  return res;
}

describe('discovery', () => {
  it('fuzzes every state-changing route on disk but better-auth’s', () => {
    expect(fuzzed.length).toBeGreaterThan(15);
    const noValid = fuzzed.filter((t) => !VALID[t.key] && t.method !== 'DELETE' && !/derive-assembly|retire/.test(t.key)).map((t) => t.key);
    if (noValid.length) console.warn(`[fuzz] routes with no valid body to damage (fuzzed with whole random bodies):\n  ${noValid.join('\n  ')}`);
    expect(Object.keys(VALID).filter((k) => !fuzzed.some((t) => t.key === k))).toEqual([]);
  });
});

describe.each(fuzzed.map((t) => [t.key, t] as const))('%s', (key, t) => {
  it('every bad request is a 4xx in our shape and changes nothing', async () => {
    await fc.assert(fc.asyncProperty(attempt(key, t.route.pattern), async (x) => { await send(key, x); }), { numRuns: RUNS });
  }, 120_000);

  it('a 3 MB body is 413, a form post is 415, a body of nothing but a NUL or a lone surrogate is 400 (or ignored)', async () => {
    const p = goodParams(t.route.pattern, recA as FuzzRecords);
    const huge = await send(key, { params: p, role: 'owner', contentType: 'application/json', what: 'huge', rawBody: JSON.stringify({ x: 'y'.repeat(3 * MB) }) });
    const form = await send(key, { params: p, role: 'owner', contentType: 'application/x-www-form-urlencoded', what: 'form', rawBody: 'a=1&b=2' });
    const valid = VALID[key]?.(recA as FuzzRecords) ?? {};
    const textField = Object.keys(valid).find((k) => typeof valid[k] === 'string') ?? 'note';
    const nul = await send(key, { params: p, role: 'owner', contentType: 'application/json', what: 'nul', rawBody: JSON.stringify({ ...valid, [textField]: 'x\u0000y' }) });
    const surrogate = await send(key, { params: p, role: 'owner', contentType: 'application/json', what: 'surrogate', rawBody: JSON.stringify({ ...valid, [textField]: 'x\uD800y' }) });
    // Routes that read no body (derive, retire, delete) may accept or answer for their own reasons.
    if (VALID[key]) {
      expect(huge.status, key).toBe(413);
      expect(form.status, key).toBe(415);
      expect(nul.status, key).toBe(400);
      expect(surrogate.status, key).toBe(400);
    }
  }, 60_000);
});
