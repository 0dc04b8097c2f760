import * as z from 'zod';
import { em } from '../../../../server/em';
import { requireMember } from '../../../../server/guards';
import { handle } from '../../../../server/http';
import { jobLabelsPdf } from '../../../../server/services/labels.service';

const query = z.object({ stepId: z.string().min(1).max(40).optional() }).strict();

/** QR label sheet (A4, 3 × 8 labels of 70 × 37 mm) for the job's tags, or one step's with `?stepId=`. */
export const GET = handle(async (ctx) => {
  const m = requireMember(ctx);
  const { stepId } = query.parse(Object.fromEntries([...ctx.url.searchParams].filter(([, v]) => v !== '')));
  const pdf = await jobLabelsPdf(await em(), m.shopId, ctx.params.id ?? '', stepId);
  return new Response(new Blob([pdf.bytes as Uint8Array<ArrayBuffer>], { type: 'application/pdf' }), {
    headers: { 'content-type': 'application/pdf', 'content-disposition': `inline; filename="${pdf.filename}"`, 'cache-control': 'private, no-store', 'x-label-count': String(pdf.count) },
  });
});
