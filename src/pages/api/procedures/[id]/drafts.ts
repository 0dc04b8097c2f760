import * as z from 'zod';
import { em } from '../../../../server/em';
import { requirePermission } from '../../../../server/guards';
import { handle, json, readJson } from '../../../../server/http';
import { startDraft } from '../../../../server/services/procedures.service';

const body = z.strictObject({ fromRevisionId: z.string().min(1, 'Choose the revision to start from') });

/** Owner or lead: a new draft copied from a released or retired revision (409 with draftId when one is open). */
export const POST = handle(async (ctx) => {
  const m = requirePermission(ctx, { procedure: ['update'] });
  const { fromRevisionId } = await readJson(ctx.request, body);
  return json(await startDraft(await em(), m, ctx.params.id ?? '', fromRevisionId), 201);
});
