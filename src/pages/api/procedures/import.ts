import * as z from 'zod';
import { em } from '../../../server/em';
import { requirePermission } from '../../../server/guards';
import { handle, json, readJson } from '../../../server/http';
import { importProcedure } from '../../../server/services/procedures.service';

/** Owner or lead: a procedure file becomes a new procedure with a draft; problems are listed by path. */
export const POST = handle(async (ctx) => {
  const m = requirePermission(ctx, { procedure: ['create'] });
  const file = await readJson(ctx.request, z.unknown());
  return json(await importProcedure(await em(), m, file), 201);
});
