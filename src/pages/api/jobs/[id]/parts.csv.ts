import { em } from '../../../../server/em';
import { requireMember } from '../../../../server/guards';
import { handle } from '../../../../server/http';
import { partsCsv } from '../../../../server/services/parts-list.service';

/** The parts list as CSV (RFC 4180, UTF-8 with a byte-order mark so spreadsheets read accents). */
export const GET = handle(async (ctx) => {
  const m = requireMember(ctx);
  const { filename, body } = await partsCsv(await em(), m.shopId, ctx.params.id ?? '');
  return new Response(`\uFEFF${body}`, { headers: { 'content-type': 'text/csv; charset=utf-8', 'content-disposition': `attachment; filename="${filename}"`, 'cache-control': 'private, no-store' } });
});
