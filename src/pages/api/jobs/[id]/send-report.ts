import { em } from '../../../../server/em';
import { requireMember, requirePermission } from '../../../../server/guards';
import { handle, json, readJson } from '../../../../server/http';
import { listJobMessages } from '../../../../server/services/mail-queue.service';
import { sendReport, sendReportInput } from '../../../../server/services/reports.service';

/** Messages sent for the job (reports and notices) with their delivery state. */
export const GET = handle(async (ctx) => {
  const m = requireMember(ctx);
  return json({ messages: await listJobMessages(await em(), m.shopId, ctx.params.id ?? '') });
});

/** Queue the run's report to an outside address, with the PDF attached and a read-only link. */
export const POST = handle(async (ctx) => {
  const m = requirePermission(ctx, { report: ['send'] });
  const input = await readJson(ctx.request, sendReportInput);
  return json(await sendReport(await em(), m, ctx.params.id ?? '', input), 202);
});
