import { em } from '../../../server/em';
import { requireMember } from '../../../server/guards';
import { handle, json } from '../../../server/http';
import { attachmentsQuery, listAttachments } from '../../../server/services/uploads.service';

/** Photos of `?runId=&stepId=`, `?tagId=`, `?findingId=` or `?jobId=`. */
export const GET = handle(async (ctx) => {
  const m = requireMember(ctx);
  const q = attachmentsQuery.parse(Object.fromEntries(ctx.url.searchParams));
  return json({ attachments: await listAttachments(await em(), m.shopId, q) });
});
