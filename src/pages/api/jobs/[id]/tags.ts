import { em } from '../../../../server/em';
import { requireMember } from '../../../../server/guards';
import { handle, json } from '../../../../server/http';
import { listJobTags } from '../../../../server/services/tags.service';

/** Every tag of the job (brought up to date from its runs), with photos. */
export const GET = handle(async (ctx) => {
  const m = requireMember(ctx);
  return json(await listJobTags(await em(), m.shopId, ctx.params.id ?? ''));
});
