/** What both fuzz runs (writes and reads) draw from: nasty strings, right and wrong ids. */
import fc from 'fast-check';
import { makeRecords, type ShopRecords } from './access-matrix.fixtures';
import { tableChecksum } from './support/checksum';
import { freshDatabase } from './support/db';
import { createShop, type TestShop } from './support/shops';

const MB = 1024 * 1024;
export type FuzzRecords = ShopRecords & { technicianId: string };

/** Strings that have broken web apps before. */
export const NASTY: string[] = [
  '', ' ', '\u0000', 'a\u0000b', '\uD800', '\uDFFF', 'x\uD83Dy', '\u202Egnp.exe', 'שלום מנוע', '\u200B\u200C\u200D\uFEFF', '🔧🧰🛠️👩🏽‍🔧', 'e\u0301\u0301\u0301',
  "'; drop table job; --", "' or '1'='1", '1; select pg_sleep(5)', '$1', '%s%s%n', '../../etc/passwd', '\\', '"', '{{7*7}}', '${7*7}',
  '<script>alert(1)</script>', '<img src=x onerror=alert(1)>', 'javascript:alert(1)', '\r\nSet-Cookie: x=1',
  'a'.repeat(10_000), 'é'.repeat(MB / 2), 'x'.repeat(MB),
];
export const nasty = fc.constantFrom(...NASTY);

/** Right ids of shop A by the route's first segment, wrong ids of every other kind. */
export function goodParams(pattern: string, r: FuzzRecords): Record<string, string> {
  const seg = pattern.split('/')[2]!;
  const byKind: Record<string, string> = { jobs: r.jobId, runs: r.runId, procedures: r.procedureId, revisions: pattern.endsWith('/release') || pattern === '/api/revisions/[id]' || pattern.endsWith('/content') ? r.draftId : r.revisionId, tags: r.tagId, attachments: r.attachmentId };
  return { id: byKind[seg] ?? crypto.randomUUID(), linkId: r.shareLinkId, token: r.shareToken };
}
export const badId = () => fc.oneof(
  fc.constantFrom('not-a-uuid', '0', '-1', "1' or '1'='1", '../../etc', '%00', '\u0000', 'x'.repeat(5000), '🔧', '00000000-0000-0000-0000-000000000000', 'ZZZZZZZZ-ZZZZ-ZZZZ-ZZZZ-ZZZZZZZZZZZZ'),
  fc.uuid(),
  fc.constant('B'), // marker: another shop's record of the right kind
);


/** A fresh database with two shops and a full set of records in each, and the table checksum. */
export async function fuzzWorld(label: string) {
  const orm = await freshDatabase();
  const a = await createShop(`${label} A`);
  const b = await createShop(`${label} B`);
  const records = async (shop: TestShop): Promise<FuzzRecords> => ({ ...(await makeRecords(orm, shop)), technicianId: shop.members.technician.userId });
  return { orm, a, b, recA: await records(a), recB: await records(b), checksum: await tableChecksum(orm) };
}
