import * as z from 'zod';
import { em } from '../../../../server/em';
import { requirePermission } from '../../../../server/guards';
import { handle, json } from '../../../../server/http';
import { readOptionalJson } from '../../../../server/optional-json';
import { releaseRevision } from '../../../../server/services/procedures.service';

const body = z.strictObject({ note: z.string().trim().max(2000, 'Keep the note under 2000 characters').optional() });

/** Owner or lead: release a draft; it gets the next revision number and never changes again. */
export const POST = handle(async (ctx) => {
  const m = requirePermission(ctx, { procedure: ['release'] });
  const { note } = await readOptionalJson(ctx.request, body);
  return json(await releaseRevision(await em(), m, ctx.params.id ?? '', note));
});
