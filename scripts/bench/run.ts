/**
 * The benchmark proper (started by scripts/bench.mjs with the app running in bench mode):
 * seeds a large shop, then prints each figure beside its baseline from this same run.
 * Targets are reported, not asserted.
 */
import { DEMO_PASSWORD } from '../../src/server/seeders/demo-people';
import { startBaseline } from './baseline-server';
import { APP_URL, api, ok, signIn } from './http';
import { happyPath, seedLargeShop } from './large-shop';
import { loadGet, loadPost, type LoadResult } from './load';
import { measurePage } from './pages';
import { freePortTs } from './ports';

const seconds = Number(process.env.BENCH_SECONDS ?? 8);
// `npm run bench -- reads pages` measures only those parts (sql, reads, posts, pages, extras).
const SECTIONS = ['sql', 'reads', 'posts', 'pages', 'extras'] as const;
const asked = process.argv.slice(2).filter((a) => (SECTIONS as readonly string[]).includes(a));
const wants = (section: (typeof SECTIONS)[number]) => asked.length === 0 || asked.includes(section);
const rows: Array<[string, string, string, string, string]> = [];
const fmt = (n: number, d = 0) => n.toLocaleString('en-US', { maximumFractionDigits: d, minimumFractionDigits: d });
const ratio = (a: number, b: number) => (b ? `${fmt((a / b) * 100)} %` : '—');
const row = (what: string, ours: string, base: string, r: string, target = '') => rows.push([what, ours, base, r, target]);

const t0 = Date.now();
console.log('\nSeeding the large shop through the API …');
const lead = await signIn('lars.lead@demo.torquetrail.test', DEMO_PASSWORD);
const tech = await signIn('tess.tech@demo.torquetrail.test', DEMO_PASSWORD);
const members = (await ok(tech, 'GET', '/api/jobs')).jobs; // warms the route
void members;
const techId = (await (await fetch(`${APP_URL}/api/auth/get-session`, { headers: { cookie: tech } })).json()).user.id as string;
const shop = await seedLargeShop(lead, techId, { jobs: 200, postRuns: 32 });
const events500 = happyPath(shop.p500.steps);
// Give the read runs a realistic log: 260 events on the 500-step run, the whole 5-step run.
const post = async (runId: string, events: unknown[]) => {
  let seq = 0;
  for (const event of events) {
    const r = await ok(tech, 'POST', `/api/runs/${runId}/events`, { event, idempotencyKey: crypto.randomUUID(), expectedSeq: seq });
    seq = r.lastSeq;
  }
};
await post(shop.read500, events500.slice(0, 260));
await post(shop.read5, happyPath(shop.p5.steps).slice(0, 60));
console.log(`  seeded in ${fmt((Date.now() - t0) / 1000, 1)} s: 200 jobs, procedures of 500/300/5 steps with 64-fastener maps, ${shop.postRuns.length * 2 + 2} runs`);

// SQL statements per request, small against large.
if (wants('sql')) {
  const sql = async (path: string) => Number((await api(tech, 'GET', path)).headers.get('x-sql-statements') ?? NaN);
  const leadSql = async (path: string) => Number((await api(lead, 'GET', path)).headers.get('x-sql-statements') ?? NaN);
  const s5 = await sql(`/api/runs/${shop.read5}`), s500 = await sql(`/api/runs/${shop.read500}`);
  row('SQL per run-state read (5 → 500 steps)', `${s5} → ${s500}`, '6 (baseline)', s5 === s500 ? 'constant' : 'GROWS', 'constant');
  const j = await sql('/api/jobs');
  row('SQL per job list (200 jobs)', String(j), '—', '', 'constant');
  const pl5 = await leadSql(`/api/procedures/${shop.p5.procedureId}`), pl500 = await leadSql(`/api/procedures/${shop.p500.procedureId}`);
  row('SQL per procedure load (5 → 500 steps)', `${pl5} → ${pl500}`, '—', pl5 === pl500 ? 'constant' : 'GROWS', 'constant');
  const r5 = await leadSql(`/api/revisions/${shop.p5.revisionId}`), r500 = await leadSql(`/api/revisions/${shop.p500.revisionId}`);
  row('SQL per revision load (5 → 500 steps)', `${r5} → ${r500}`, '—', r5 === r500 ? 'constant' : 'GROWS', 'constant');
  // A post on a run of its own (the load's runs must start at seq 0): the second event's count.
  const sqlRun = (await ok(lead, 'POST', `/api/jobs/${shop.jobIds.at(-1)}/runs`, { revisionId: shop.p500.revisionId })).run.id as string;
  const postSql = async (seq: number) => {
    const r = await api(tech, 'POST', `/api/runs/${sqlRun}/events`, { event: events500[seq], idempotencyKey: crypto.randomUUID(), expectedSeq: seq });
    if (r.status !== 201) throw new Error(`post for the SQL count answered ${r.status}`);
    return Number(r.headers.get('x-sql-statements') ?? NaN);
  };
  await postSql(0);
  const p2 = await postSql(1);
  // The baseline's post: session and membership, then begin, the run locked, its revision, its log, insert, update, commit.
  row('SQL per step-event post', String(p2), '9 (baseline)', '', '');
}

// HTTP load: ours against the bare node:http + pg server doing the same SQL.
const basePort = await freePortTs();
const baseline = await startBaseline(process.env.DATABASE_URL!, basePort);
const baseUrl = `http://127.0.0.1:${basePort}`;
console.log(`Load: ${seconds} s each at 32 connections …`);
const line = (what: string, a: LoadResult, b: LoadResult, target: string) => {
  row(`${what} req/s`, fmt(a.rps), fmt(b.rps), ratio(a.rps, b.rps), target);
  row(`${what} p50 / p99 ms`, `${a.p50} / ${a.p99}`, `${b.p50} / ${b.p99}`, '', '');
  if (a.non2xx || b.non2xx) row(`${what} non-2xx responses`, `${a.non2xx} ${a.statuses ? JSON.stringify(a.statuses) : ''}`, String(b.non2xx), '', '0');
};
if (wants('reads')) {
  const oursGet = await loadGet(`${APP_URL}/api/runs/${shop.read500}`, tech, seconds);
  const baseGet = await loadGet(`${baseUrl}/runs/${shop.read500}`, tech, seconds);
  line('Run-state read (500 steps, 260 events)', oursGet, baseGet, '≥ 70 %');
}
if (wants('posts')) {
  const oursPost = await loadPost(APP_URL, '/api', shop.postRuns, events500, tech, APP_URL, seconds);
  const basePost = await loadPost(baseUrl, '', shop.basePostRuns, events500, tech, baseUrl, seconds);
  line('Step event post', oursPost, basePost, '≥ 50 %');
}
await baseline.close();

// Pages in headless Chromium; a failure becomes a row, so the table always prints.
const pageRow = async (label: string, cookie: string, path: string, target: string) => {
  try {
    const f = await measurePage(APP_URL, cookie, path);
    row(`${label} page JS (gzip)`, `${fmt(f.jsGzipKB, 1)} KB in ${f.jsFiles} files`, '—', '', target);
    row(`${label} of which the React runtime`, `${fmt(f.reactGzipKB, 1)} KB`, '—', '', '');
    row(`${label} first byte / interactive`, `${fmt(f.firstByteMs)} / ${fmt(f.interactiveMs)} ms`, '—', '', '');
  } catch (e) {
    row(`${label} page`, `failed: ${String(e).split('\n')[0]!.slice(0, 70)}`, '—', '', target);
  }
};
if (wants('pages')) {
  await pageRow('Runner, 500-step run,', tech, `/runs/${shop.read500}`, '≤ 90 KB');
  await pageRow('Editor, 300 steps,', lead, `/revisions/${shop.p300DraftId}/edit`, '');
}

// Figures other parts provide, when present.
for (const extra of wants('extras') ? ['./upload-figure', './report-figure'] : []) {
  try {
    const mod = (await import(extra)) as { figure: (ctx: { lead: string; tech: string; shop: typeof shop }) => Promise<Array<[string, string, string, string, string]>> };
    rows.push(...(await mod.figure({ lead, tech, shop })));
  } catch (e) {
    row(`${extra.slice(2)} failed`, String(e).slice(0, 80), '', '', '');
  }
}

const widths = [0, 1, 2, 3, 4].map((i) => Math.max(...[['figure', 'Torquetrail', 'baseline (same run)', 'ratio', 'target'], ...rows].map((r) => r[i]!.length)));
const print = (r: string[]) => console.log(`  ${r.map((c, i) => c.padEnd(widths[i]!)).join('  ')}`);
console.log('');
print(['figure', 'Torquetrail', 'baseline (same run)', 'ratio', 'target']);
print(widths.map((w) => '-'.repeat(w)));
rows.forEach(print);
console.log(`\n  bench wall time ${fmt((Date.now() - t0) / 1000, 1)} s\n`);
