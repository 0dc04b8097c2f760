import { em } from '../../../../server/em';
import { requireMember, requirePermission } from '../../../../server/guards';
import { handle, json, readJson } from '../../../../server/http';
import { getProcedure, procedurePatch, updateProcedure } from '../../../../server/services/procedures.service';

/** One procedure with its revisions (drafts only for authors). */
export const GET = handle(async (ctx) => {
  const m = requireMember(ctx);
  return json(await getProcedure(await em(), m, ctx.params.id ?? ''));
});

/** Owner or lead: change name, engine family or description. */
export const PATCH = handle(async (ctx) => {
  const m = requirePermission(ctx, { procedure: ['update'] });
  const patch = await readJson(ctx.request, procedurePatch);
  return json(await updateProcedure(await em(), m, ctx.params.id ?? '', patch));
});
