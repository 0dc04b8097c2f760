import { em } from '../../../server/em';
import { requireMember, requirePermission } from '../../../server/guards';
import { handle, json, readJson } from '../../../server/http';
import { createProcedure, listProcedures, procedureCreate, procedureListQuery } from '../../../server/services/procedures.service';

/** Procedures of the shop, filtered by ?search=&status=&engineFamily= (drafts only for authors). */
export const GET = handle(async (ctx) => {
  const m = requireMember(ctx);
  const q = procedureListQuery.parse(Object.fromEntries(ctx.url.searchParams));
  return json({ procedures: await listProcedures(await em(), m, q) });
});

/** Owner or lead: a new procedure with an empty draft. */
export const POST = handle(async (ctx) => {
  const m = requirePermission(ctx, { procedure: ['create'] });
  const body = await readJson(ctx.request, procedureCreate);
  return json(await createProcedure(await em(), m, body), 201);
});
