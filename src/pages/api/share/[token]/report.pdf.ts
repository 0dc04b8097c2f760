import { em } from '../../../../server/em';
import { handle } from '../../../../server/http';
import { runReportPdf } from '../../../../server/services/reports.service';
import { clientIp, openShareLink } from '../../../../server/services/share.service';

/** The shared run's report as a PDF, for anyone holding a live link (no sign-in); every opening is logged. */
export const GET = handle(async (ctx) => {
  const e = await em();
  const link = await openShareLink(e, ctx.params.token ?? '', { what: 'pdf', ip: clientIp(ctx.request, ctx.clientAddress ?? ''), userAgent: ctx.request.headers.get('user-agent') ?? '' });
  const { bytes, filename } = await runReportPdf(e, link.shopId, link.runId);
  return new Response(bytes as unknown as BodyInit, {
    headers: { 'content-type': 'application/pdf', 'content-disposition': `inline; filename="${filename}"`, 'cache-control': 'no-store', 'x-robots-tag': 'noindex' },
  });
});
