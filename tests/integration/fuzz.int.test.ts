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
import { freshDatabase } from './support/db';
import { createShop, type TestShop } from './support/shops';
import { callRoute } from './support/routes';
import { discoverRoutes, fillPattern, loadRoute, STATE_CHANGING } from './support/routes-index';
import { makeRecords, matrixProcedureFile, type ShopRecords } from './access-matrix.fixtures';
import type { ShopRole } from '../../src/lib/access';

const RUNS = Number(process.env.FUZZ_RUNS ?? 30);
const MB = 1024 * 1024;

/** Strings that have broken web apps before. */
const NASTY: string[] = [
  '', ' ', '\u0000', 'a\u0000b', '\uD800', '\uDFFF', 'x\uD83Dy', '\u202Egnp.exe', 'שלום מנוע', '\u200B\u200C\u200D\uFEFF', '🔧🧰🛠️👩🏽‍🔧', 'e\u0301\u0301\u0301',
  "'; drop table job; --", "' or '1'='1", '1; select pg_sleep(5)', '$1', '%s%s%n', '../../etc/passwd', '\\', '"', '{{7*7}}', '${7*7}',
  '<script>alert(1)</script>', '<img src=x onerror=alert(1)>', 'javascript:alert(1)', '\r\nSet-Cookie: x=1',
  'a'.repeat(10_000), 'é'.repeat(MB / 2), 'x'.repeat(MB),
];
const nasty = fc.constantFrom(...NASTY);
const anyValue = fc.oneof(nasty, fc.jsonValue({ maxDepth: 2 }), fc.integer(), fc.double({ noNaN: true }), fc.boolean(), fc.constant(null), fc.constant([]), fc.constant({}), fc.constant(-1), fc.constant(Number.MAX_SAFE_INTEGER), fc.constant(1e308));
const MALFORMED = ['{', '{"a":', 'nul', "{'a':1}", '[1,2', '{"a":1}}', '\u0000', '', ' ', '{"__proto__":{"polluted":1}}', '{"constructor":{"prototype":{"x":1}}}', '1e999999', '"\\ud800"', '{"a":"\\u0000"}', '\uFEFF{}', '[]', '"just a string"', '123'];
const CONTENT_TYPES = ['application/json', 'application/json', 'application/json', 'application/json; charset=utf-8', 'text/plain', 'application/x-www-form-urlencoded', 'multipart/form-data; boundary=xyz', '', 'application/xml', 'APPLICATION/JSON'];

type Rec = ShopRecords & { technicianId: string };
type Rec2 = Rec;
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
let checksumSql = '';
const stats = { requests: 0, refused: 0, accepted: 0 };

const targets = discoverRoutes().flatMap((r) => r.methods.filter((m) => STATE_CHANGING.has(m)).map((m) => ({ route: r, method: m, key: `${m} ${r.pattern}` })));
// better-auth's endpoints answer in its own shape and are covered by rate-limit and e2e tests.
const fuzzed = targets.filter((t) => !t.route.pattern.startsWith('/api/auth/'));
const handlers = new Map<string, Parameters<typeof callRoute>[0]>();

/** One digest over every table: content for most, row counts where a background worker updates rows. */
const COUNT_ONLY = new Set(['outgoing_message']);
async function checksum(): Promise<string> {
  const rows = (await orm.em.getConnection().execute(checksumSql)) as Array<{ t: string; h: string }>;
  return rows.map((r) => `${r.t}:${r.h}`).join(',');
}

beforeAll(async () => {
  orm = await freshDatabase();
  a = await createShop('Fuzz shop A');
  b = await createShop('Fuzz shop B');
  recA = { ...(await makeRecords(orm, a)), technicianId: a.members.technician.userId } as Rec;
  recB = { ...(await makeRecords(orm, b)), technicianId: b.members.technician.userId } as Rec;
  const tables: Array<{ table_name: string }> = await orm.em.getConnection().execute(`select table_name from information_schema.tables where table_schema = 'public' and table_type = 'BASE TABLE' and table_name <> 'mikro_orm_migrations' order by 1`);
  checksumSql = tables
    .map(({ table_name: t }) => COUNT_ONLY.has(t)
      ? `select '${t}' as t, count(*)::text as h from "${t}"`
      : `select '${t}' as t, count(*)::text || '-' || coalesce(md5(string_agg(x::text, '|' order by x::text)), '') as h from "${t}" x`)
    .join(' union all ');
  for (const t of fuzzed) handlers.set(t.key, (await loadRoute(t.route))[t.method] as Parameters<typeof callRoute>[0]);
}, 120_000);

afterAll(async () => {
  console.log(`[fuzz] ${stats.requests} requests over ${fuzzed.length} routes: ${stats.refused} refused (4xx, no data change), ${stats.accepted} accepted`);
  await orm?.close(true);
});


/** Right ids of shop A by the route's first segment, wrong ids of every other kind. */
function goodParams(pattern: string, r: Rec2): Record<string, string> {
  const seg = pattern.split('/')[2]!;
  const byKind: Record<string, string> = { jobs: r.jobId, runs: r.runId, procedures: r.procedureId, revisions: pattern.endsWith('/release') || pattern === '/api/revisions/[id]' || pattern.endsWith('/content') ? r.draftId : r.revisionId, tags: r.tagId, attachments: r.attachmentId };
  return { id: byKind[seg] ?? crypto.randomUUID(), linkId: r.shareLinkId, token: r.shareToken };
}
const badId = () => fc.oneof(
  fc.constantFrom('not-a-uuid', '0', '-1', "1' or '1'='1", '../../etc', '%00', '\u0000', 'x'.repeat(5000), '🔧', '00000000-0000-0000-0000-000000000000', 'ZZZZZZZZ-ZZZZ-ZZZZ-ZZZZ-ZZZZZZZZZZZZ'),
  fc.uuid(),
  fc.constant('B'), // marker: another shop's record of the right kind
);

type Attempt = { params: Record<string, string>; rawBody: string; contentType: string; role: ShopRole; what: string };

function attempt(key: string, pattern: string): fc.Arbitrary<Attempt> {
  const valid = VALID[key];
  const body: fc.Arbitrary<[string, string]> = fc.oneof(
    { weight: 4, arbitrary: valid ? fc.tuple(fc.constantFrom(...Object.keys(valid(recA as Rec2))), anyValue).map(([k, v]): [string, string] => ['field ' + k, JSON.stringify({ ...valid(recA as Rec2), [k]: v })]) : anyValue.map((v): [string, string] => ['value', JSON.stringify(v)]) },
    { weight: 1, arbitrary: valid ? fc.tuple(fc.string({ maxLength: 12 }), anyValue).map(([k, v]): [string, string] => ['extra ' + k, JSON.stringify({ ...valid(recA as Rec2), [k]: v })]) : fc.constant<[string, string]>(['empty', '{}']) },
    { weight: 2, arbitrary: fc.jsonValue({ maxDepth: 3 }).map((v): [string, string] => ['json', JSON.stringify(v)]) },
    { weight: 2, arbitrary: fc.oneof(fc.constantFrom(...MALFORMED), fc.string({ maxLength: 40 })).map((s): [string, string] => ['malformed', s]) },
    { weight: 1, arbitrary: nasty.map((s): [string, string] => ['nasty', JSON.stringify(s)]) },
  );
  const params = fc.oneof({ weight: 3, arbitrary: fc.constant<'good'>('good') }, { weight: 1, arbitrary: badId() }).map((id) => {
    const good = goodParams(pattern, recA as Rec2);
    if (id === 'good') return good;
    const other = goodParams(pattern, recB as Rec2);
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
    const p = goodParams(t.route.pattern, recA as Rec2);
    const huge = await send(key, { params: p, role: 'owner', contentType: 'application/json', what: 'huge', rawBody: JSON.stringify({ x: 'y'.repeat(3 * MB) }) });
    const form = await send(key, { params: p, role: 'owner', contentType: 'application/x-www-form-urlencoded', what: 'form', rawBody: 'a=1&b=2' });
    const valid = VALID[key]?.(recA as Rec2) ?? {};
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
