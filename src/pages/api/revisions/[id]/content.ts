import * as z from 'zod';
import { em } from '../../../../server/em';
import { requirePermission } from '../../../../server/guards';
import { handle, json, readJson } from '../../../../server/http';
import { saveRevisionContent } from '../../../../server/services/procedures.service';

// The steps are checked by the step schema in the service, so their problems come back keyed by path.
const body = z.object({ steps: z.unknown(), version: z.number({ error: 'Send the version you loaded' }).int().min(1) });

/** Owner or lead: autosave a draft's steps; 409 when released/retired or when `version` is stale. */
export const PUT = handle(async (ctx) => {
  const m = requirePermission(ctx, { procedure: ['update'] });
  const b = await readJson(ctx.request, body);
  return json(await saveRevisionContent(await em(), m, ctx.params.id ?? '', { steps: b.steps, version: b.version }));
});
