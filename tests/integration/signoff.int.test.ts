/** Sign-offs, send-back, read-only links and the mail queue against the real PostgreSQL and the mail catcher. */
import { createHash, randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { RequestContext } from '@mikro-orm/core';
import type { MikroORM } from '@mikro-orm/postgresql';
import nodemailer from 'nodemailer';
import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs';
import { freshDatabase } from './support/db';
import { createShop, type TestShop } from './support/shops';
import { callRoute } from './support/routes';
import { AFTER_HOLD, BEFORE_HOLD, releasedSignoffRevision } from './signoff.fixtures';
import { canonicalJson } from '../../src/domain/canonical-json';
import { stopQueue } from '../../src/server/queue';
import { useMailTransport } from '../../src/server/services/mail-queue.service';
import { updateShopSettings } from '../../src/server/services/shop-settings.service';
import * as jobsRoute from '../../src/pages/api/jobs/index';
import * as jobRoute from '../../src/pages/api/jobs/[id]/index';
import * as jobRunsRoute from '../../src/pages/api/jobs/[id]/runs';
import * as eventsRoute from '../../src/pages/api/runs/[id]/events';
import * as signoffsRoute from '../../src/pages/api/runs/[id]/signoffs';
import * as sendBackRoute from '../../src/pages/api/runs/[id]/send-back';
import * as reportRoute from '../../src/pages/api/runs/[id]/report.pdf';
import * as shareLinksRoute from '../../src/pages/api/jobs/[id]/share-links/index';
import * as shareLinkRoute from '../../src/pages/api/jobs/[id]/share-links/[linkId]';
import * as sendReportRoute from '../../src/pages/api/jobs/[id]/send-report';
import * as sharePdfRoute from '../../src/pages/api/share/[token]/report.pdf';

const PASSWORD = 'integration-pass-1';
const INBOX = process.env.MAIL_INBOX_URL ?? 'http://127.0.0.1:1080';
type Role = keyof TestShop['members'];
const as = (shop: TestShop, role: Role) => ({ shop, member: shop.members[role] });
const sha = (t: string) => createHash('sha256').update(t).digest('hex');

let orm: MikroORM;
let a: TestShop;
let b: TestShop;
let revisionId: string;

beforeAll(async () => {
  process.env.MAIL_RETRY_LIMIT = '2';
  process.env.MAIL_RETRY_DELAY_SECONDS = '1';
  orm = await freshDatabase();
  a = await createShop('Sign shop A');
  b = await createShop('Sign shop B');
  revisionId = await releasedSignoffRevision(orm, a);
}, 60_000);
afterAll(async () => {
  useMailTransport(null);
  await stopQueue();
});

async function newRun(shop = a): Promise<{ jobId: string; runId: string }> {
  const j = await callRoute(jobsRoute.POST, { method: 'POST', body: { unitDescription: 'Invented four-cylinder test unit', serial: 'TT-SN-1', technicianIds: [shop.members.technician.userId], reviewerId: shop.members.reviewer.userId }, as: as(shop, 'lead') });
  expect(j.status).toBe(201);
  const r = await callRoute(jobRunsRoute.POST, { method: 'POST', params: { id: j.body.id }, body: { revisionId }, as: as(shop, 'technician') });
  expect(r.status).toBe(201);
  return { jobId: j.body.id, runId: r.body.run.id };
}

let seq = 0;
async function post(runId: string, events: Array<Record<string, unknown>>, role: Role = 'technician', shop = a) {
  for (const event of events) {
    const r = await callRoute(eventsRoute.POST, { method: 'POST', params: { id: runId }, body: { event, idempotencyKey: randomUUID(), expectedSeq: seq }, as: as(shop, role) });
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    seq = r.body.lastSeq;
  }
}
const sign = (runId: string, body: Record<string, unknown>, role: Role = 'reviewer', shop = a) => callRoute(signoffsRoute.POST, { method: 'POST', params: { id: runId }, body, as: as(shop, role) });
const signatures = async (runId: string) => (await callRoute(signoffsRoute.GET, { params: { id: runId }, as: as(a, 'lead') })).body.signatures as Array<{ stepId: string | null; matches: boolean; recordHash: string; id: string }>;

async function mailTo(address: string, subject: RegExp, timeoutMs = 20_000) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const res = await fetch(`${INBOX}/api/email`);
    const all = (await res.json()) as Array<{ id: string; subject: string; text: string; to: Array<{ address: string }>; attachments?: Array<{ generatedFileName: string; contentType: string }> }>;
    const hit = all.filter((m) => m.to.some((t) => t.address.toLowerCase() === address.toLowerCase()) && subject.test(m.subject));
    if (hit.length) return hit.at(-1)!;
    if (Date.now() > deadline) throw new Error(`no mail to ${address} matching ${subject}`);
    await new Promise((r) => setTimeout(r, 200));
  }
}
async function reportPdf(runId: string, shop = a): Promise<Uint8Array> {
  const ctx = { params: { id: runId }, locals: { user: { id: shop.members.reviewer.userId, name: '', email: '' }, session: null, shop: { id: shop.id, name: shop.name, slug: '' }, role: 'reviewer' }, request: new Request('http://127.0.0.1/'), url: new URL('http://127.0.0.1/') };
  const res = (await RequestContext.create(orm.em, async () => reportRoute.GET(ctx as never))) as Response;
  expect(res.status).toBe(200);
  return new Uint8Array(await res.arrayBuffer());
}
async function pdfText(bytes: Uint8Array): Promise<string> {
  const doc = await getDocument({ data: bytes }).promise;
  let text = '';
  for (let i = 1; i <= doc.numPages; i++) text += `${(await (await doc.getPage(i)).getTextContent()).items.map((it) => ('str' in it ? it.str : '')).join(' ')}\n`;
  return text.replace(/\s+/g, ' ');
}
async function waitForMessage(jobId: string, id: string, status: 'sent' | 'failed', timeoutMs = 30_000) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const r = await callRoute(sendReportRoute.GET, { params: { id: jobId }, as: as(a, 'lead') });
    const m = r.body.messages.find((x: { id: string }) => x.id === id);
    if (m?.status === status) return m;
    if (Date.now() > deadline) throw new Error(`message ${id} is ${m?.status} (${m?.lastError}), not ${status}`);
    await new Promise((res) => setTimeout(res, 250));
  }
}

describe('signing a hold point and a run', () => {
  let jobId: string;
  let runId: string;
  beforeAll(async () => {
    ({ jobId, runId } = await newRun());
    seq = 0;
    await post(runId, BEFORE_HOLD);
  });

  it('notifies the job reviewer when the hold point enters the queue', async () => {
    const mail = await mailTo(a.members.reviewer.email, /Hold point waiting/);
    expect(mail.text).toContain('Bottom end review');
  });

  it('refuses without the password, with a wrong one, for the wrong role and for another shop', async () => {
    const none = await sign(runId, { meaning: 'reviewed', stepId: 's-hold' });
    expect(none.status).toBe(400);
    expect(none.body.error.fields.password).toBeTruthy();
    const wrong = await sign(runId, { meaning: 'reviewed', stepId: 's-hold', password: 'not-my-password' });
    expect(wrong.status).toBe(403);
    expect(wrong.body.error.message).toMatch(/password is not right/);
    const tech = await sign(runId, { meaning: 'reviewed', stepId: 's-hold', password: PASSWORD }, 'technician');
    expect(tech.status).toBe(403);
    const techRun = await sign(runId, { meaning: 'reviewed', password: PASSWORD }, 'lead');
    expect(techRun.status).toBe(403);
    expect(techRun.body.error.message).toMatch(/may not sign off a run/);
    const other = await sign(runId, { meaning: 'reviewed', stepId: 's-hold', password: PASSWORD }, 'reviewer', b);
    expect(other.status).toBe(404);
    expect(await signatures(runId)).toEqual([]);
  });

  it('signs the hold point: the machine gets hold.sign and the hash matches the stored record', async () => {
    const r = await sign(runId, { meaning: 'approved-for-assembly', stepId: 's-hold', password: PASSWORD });
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    expect(r.body).toMatchObject({ stepId: 's-hold', signerName: a.members.reviewer.name, signerRole: 'reviewer', meaning: 'approved-for-assembly', meaningLabel: 'Approved for assembly', matches: true });
    const rows = await orm.em.fork().getConnection().execute<Array<{ record: unknown; record_hash: string }>>(`select record, record_hash from signature where id = ?`, [r.body.id]);
    expect(sha(canonicalJson(rows[0]!.record))).toBe(rows[0]!.record_hash);
    expect(rows[0]!.record_hash).toMatch(/^[0-9a-f]{64}$/);
    const log = await callRoute(eventsRoute.GET, { params: { id: runId }, as: as(a, 'lead') });
    expect(log.body.events.at(-1)).toMatchObject({ type: 'hold.sign', payload: { meaning: 'Approved for assembly' } });
    seq = log.body.lastSeq;
    // A signature is never edited in place.
    await expect(orm.em.fork().getConnection().execute(`update signature set meaning = 'reviewed' where id = ?`, [r.body.id])).rejects.toThrow(/cannot be changed/);
  });

  it('a run is signed only once finished, never by someone who worked it unless the shop allows it', async () => {
    const early = await sign(runId, { meaning: 'reviewed', password: PASSWORD }, 'owner');
    expect(early.status).toBe(409);
    await post(runId, AFTER_HOLD.slice(0, 1), 'technician');
    await post(runId, AFTER_HOLD.slice(1), 'owner');
    const own = await sign(runId, { meaning: 'reviewed', password: PASSWORD }, 'owner');
    expect(own.status).toBe(403);
    expect(own.body.error.message).toMatch(/You worked on this run/);
    await updateShopSettings(orm.em.fork(), a.id, { allowSelfSignoff: true });
    const allowed = await sign(runId, { meaning: 'reviewed', password: PASSWORD }, 'owner');
    expect(allowed.status).toBe(201);
    await updateShopSettings(orm.em.fork(), a.id, { allowSelfSignoff: false });
    const r = await sign(runId, { meaning: 'approved-for-release', password: PASSWORD });
    expect(r.status).toBe(201);
    expect(r.body.matches).toBe(true);
    const again = await sign(runId, { meaning: 'approved-for-release', password: PASSWORD });
    expect(again.status).toBe(409);
    expect((await signatures(runId)).map((s) => [s.stepId, s.matches])).toEqual([['s-hold', true], [null, true], [null, true]]);
  });

  it('the report PDF holds every reading, tag and signature', async () => {
    const r = await callRoute(reportRoute.GET, { params: { id: runId }, as: as(a, 'reviewer') });
    expect(r.status).toBe(200);
    expect(r.headers.get('content-type')).toBe('application/pdf');
    const text = await pdfText(await reportPdf(runId));
    for (const s of ['Teardown report', 'Main bearing clearance', 'M1', 'M2', '0.046', '0.051', 'Main bearing cap', 'reuse', 'replace', 'Approved for assembly', 'Approved for release to customer', "Example data", 'Page 1 of']) expect(text).toContain(s);
    for (const s of await signatures(runId)) expect(text.replace(/ /g, '')).toContain(s.recordHash.slice(0, 24));
  });

  it('sending back flips the signatures to "not matching", reopens the job and tells the technician', async () => {
    const tech = await callRoute(sendBackRoute.POST, { method: 'POST', params: { id: runId }, body: { stepId: 's-tag', reason: 'Cap M2 photo missing' }, as: as(a, 'technician') });
    expect(tech.status).toBe(403);
    const noReason = await callRoute(sendBackRoute.POST, { method: 'POST', params: { id: runId }, body: { stepId: 's-tag', reason: ' ' }, as: as(a, 'reviewer') });
    expect(noReason.status).toBe(400);
    const r = await callRoute(sendBackRoute.POST, { method: 'POST', params: { id: runId }, body: { stepId: 's-tag', reason: 'Cap M2 photo missing' }, as: as(a, 'reviewer') });
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    expect(r.body.next).toMatchObject({ stepId: 's-tag' });
    seq = r.body.lastSeq;
    expect((await signatures(runId)).map((s) => s.matches)).toEqual([false, false, false]);
    const job = await callRoute(jobRoute.GET, { params: { id: jobId }, as: as(a, 'lead') });
    expect(job.body.runs[0].status).toBe('reopened');
    const mail = await mailTo(a.members.technician.email, /Work sent back/);
    expect(mail.text).toContain('Cap M2 photo missing');
  });
});

describe('a new event after signing', () => {
  it('makes the run signature not match', async () => {
    const { runId } = await newRun();
    seq = 0;
    await post(runId, BEFORE_HOLD);
    expect((await sign(runId, { meaning: 'reviewed', stepId: 's-hold', password: PASSWORD })).status).toBe(201);
    const s0 = await signatures(runId);
    expect(s0[0]!.matches).toBe(true);
    seq += 1;
    await post(runId, AFTER_HOLD.slice(0, 1));
    // Work after the hold point is outside what the hold point covers.
    expect((await signatures(runId))[0]!.matches).toBe(true);
    await post(runId, AFTER_HOLD.slice(1));
    expect((await sign(runId, { meaning: 'reviewed', password: PASSWORD })).status).toBe(201);
    expect((await signatures(runId)).map((s) => s.matches)).toEqual([true, true]);
    const r = await callRoute(sendBackRoute.POST, { method: 'POST', params: { id: runId }, body: { stepId: 's-last', reason: 'Redo the cover' }, as: as(a, 'lead') });
    expect(r.status).toBe(201);
    expect((await signatures(runId)).map((s) => s.matches)).toEqual([true, false]);
  });
});

describe('read-only links', () => {
  it('open the PDF without sign-in, log each view, and answer 404 once revoked or expired', async () => {
    const { jobId, runId } = await newRun();
    const tech = await callRoute(shareLinksRoute.POST, { method: 'POST', params: { id: jobId }, body: { runId }, as: as(a, 'technician') });
    expect(tech.status).toBe(403);
    const bad = await callRoute(shareLinksRoute.POST, { method: 'POST', params: { id: jobId }, body: { runId, days: 0 }, as: as(a, 'lead') });
    expect(bad.status).toBe(400);
    const made = await callRoute(shareLinksRoute.POST, { method: 'POST', params: { id: jobId }, body: { runId }, as: as(a, 'reviewer') });
    expect(made.status).toBe(201);
    const token = made.body.url.split('/share/')[1];
    expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/);
    const stored = await orm.em.fork().getConnection().execute<Array<{ token_hash: string }>>(`select token_hash from share_link where id = ?`, [made.body.link.id]);
    expect(stored[0]!.token_hash).toBe(sha(token));
    const ok = await callRoute(sharePdfRoute.GET, { params: { token }, as: null });
    expect(ok.status).toBe(200);
    expect(ok.headers.get('content-type')).toBe('application/pdf');
    expect((await callRoute(sharePdfRoute.GET, { params: { token: 'x'.repeat(43) }, as: null })).status).toBe(404);
    const list = await callRoute(shareLinksRoute.GET, { params: { id: jobId }, as: as(a, 'owner') });
    expect(list.body.links[0].views).toHaveLength(1);
    expect(list.body.links[0].views[0].what).toBe('pdf');
    // Another shop cannot see or revoke it.
    expect((await callRoute(shareLinkRoute.DELETE, { method: 'DELETE', params: { id: jobId, linkId: made.body.link.id }, as: as(b, 'owner') })).status).toBe(404);
    const revoked = await callRoute(shareLinkRoute.DELETE, { method: 'DELETE', params: { id: jobId, linkId: made.body.link.id }, as: as(a, 'lead') });
    expect(revoked.body.state).toBe('revoked');
    expect((await callRoute(sharePdfRoute.GET, { params: { token }, as: null })).status).toBe(404);

    const second = await callRoute(shareLinksRoute.POST, { method: 'POST', params: { id: jobId }, body: { runId, days: 1 }, as: as(a, 'lead') });
    const token2 = second.body.url.split('/share/')[1];
    expect((await callRoute(sharePdfRoute.GET, { params: { token: token2 }, as: null })).status).toBe(200);
    await orm.em.fork().getConnection().execute(`update share_link set expires_at = now() - interval '1 minute' where id = ?`, [second.body.link.id]);
    const expired = await callRoute(sharePdfRoute.GET, { params: { token: token2 }, as: null });
    expect(expired.status).toBe(404);
    expect(expired.body.error.code).toBe('not-found');
  });
});

describe('report mail through the queue', () => {
  it('delivers the report with the PDF and a link, and marks it sent', async () => {
    const { jobId, runId } = await newRun();
    seq = 0;
    await post(runId, BEFORE_HOLD);
    const to = `machining.${randomUUID().slice(0, 6)}@machine-shop.test`;
    const wrongKind = await callRoute(sendReportRoute.POST, { method: 'POST', params: { id: jobId }, body: { runId, to, kind: 'build' }, as: as(a, 'lead') });
    expect(wrongKind.status).toBe(400);
    expect((await callRoute(sendReportRoute.POST, { method: 'POST', params: { id: jobId }, body: { runId, to: 'not an address' }, as: as(a, 'lead') })).status).toBe(400);
    expect((await callRoute(sendReportRoute.POST, { method: 'POST', params: { id: jobId }, body: { runId, to }, as: as(a, 'technician') })).status).toBe(403);
    const r = await callRoute(sendReportRoute.POST, { method: 'POST', params: { id: jobId }, body: { runId, to, message: 'Please quote a line bore.' }, as: as(a, 'lead') });
    expect(r.status).toBe(202);
    expect(r.body.status).toBe('queued');
    const sent = await waitForMessage(jobId, r.body.id, 'sent');
    expect(sent.attempts).toBe(1);
    const mail = await mailTo(to, /Teardown report/);
    expect(mail.text).toContain('Please quote a line bore.');
    expect(mail.text).toMatch(/\/share\/[A-Za-z0-9_-]{43}/);
    const att = mail.attachments?.find((x) => x.contentType === 'application/pdf');
    expect(att).toBeTruthy();
    const pdf = new Uint8Array(await (await fetch(`${INBOX}/api/email/${mail.id}/attachment/${encodeURIComponent(att!.generatedFileName)}`)).arrayBuffer());
    const text = await pdfText(pdf);
    for (const s of ['Main bearing clearance', 'M1', 'M2', 'Main bearing cap', 'B-7']) expect(text).toContain(s);
  });

  it('ends failed after its retries when SMTP is down', async () => {
    const { jobId, runId } = await newRun();
    useMailTransport(nodemailer.createTransport({ host: '127.0.0.1', port: 9, connectionTimeout: 1000, greetingTimeout: 1000 }));
    try {
      const r = await callRoute(sendReportRoute.POST, { method: 'POST', params: { id: jobId }, body: { runId, to: 'nobody@machine-shop.test' }, as: as(a, 'owner') });
      expect(r.status).toBe(202);
      const failed = await waitForMessage(jobId, r.body.id, 'failed', 45_000);
      expect(failed.attempts).toBe(3);
      expect(failed.lastError).toBeTruthy();
    } finally {
      useMailTransport(null);
    }
  }, 60_000);
});
