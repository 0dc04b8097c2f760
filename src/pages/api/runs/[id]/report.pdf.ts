import { em } from '../../../../server/em';
import { requireMember } from '../../../../server/guards';
import { handle } from '../../../../server/http';
import { runReportPdf } from '../../../../server/services/reports.service';

/** The run's teardown report or build sheet (chosen by the procedure's kind) as a PDF. */
export const GET = handle(async (ctx) => {
  const m = requireMember(ctx);
  const { bytes, filename } = await runReportPdf(await em(), m.shopId, ctx.params.id ?? '');
  return new Response(bytes as unknown as BodyInit, {
    headers: { 'content-type': 'application/pdf', 'content-disposition': `inline; filename="${filename}"`, 'cache-control': 'no-store' },
  });
});
