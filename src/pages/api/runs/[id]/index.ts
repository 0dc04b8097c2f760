import { em } from '../../../../server/em';
import { requireMember } from '../../../../server/guards';
import { handle, json } from '../../../../server/http';
import { getRun } from '../../../../server/services/runs.service';

/** The run: pinned steps, its log, and what it expects next. */
export const GET = handle(async (ctx) => {
  const m = requireMember(ctx);
  return json(await getRun(await em(), m.shopId, ctx.params.id ?? ''));
});
