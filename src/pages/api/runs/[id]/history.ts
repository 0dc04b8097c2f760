import { em } from '../../../../server/em';
import { requireMember } from '../../../../server/guards';
import { handle, json } from '../../../../server/http';
import { runHistory } from '../../../../server/services/runs.service';

/** Who recorded what, from which device and when, and the revision the run ran under. */
export const GET = handle(async (ctx) => {
  const m = requireMember(ctx);
  return json(await runHistory(await em(), m.shopId, ctx.params.id ?? ''));
});
