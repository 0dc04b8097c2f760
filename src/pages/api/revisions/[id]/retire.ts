import { em } from '../../../../server/em';
import { requirePermission } from '../../../../server/guards';
import { handle, json } from '../../../../server/http';
import { retireRevision } from '../../../../server/services/procedures.service';

/** Owner or lead: take a released revision out of use (runs already on it keep it). */
export const POST = handle(async (ctx) => {
  const m = requirePermission(ctx, { procedure: ['retire'] });
  return json(await retireRevision(await em(), m, ctx.params.id ?? ''));
});
