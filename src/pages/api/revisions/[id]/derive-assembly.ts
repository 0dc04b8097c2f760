import { em } from '../../../../server/em';
import { requirePermission } from '../../../../server/guards';
import { handle, json } from '../../../../server/http';
import { deriveAssemblyFrom } from '../../../../server/services/procedures.service';

/** Owner or lead: a new assembly procedure whose draft is this teardown revision turned round. */
export const POST = handle(async (ctx) => {
  const m = requirePermission(ctx, { procedure: ['create'] });
  return json(await deriveAssemblyFrom(await em(), m, ctx.params.id ?? ''), 201);
});
