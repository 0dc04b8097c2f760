import * as z from 'zod';
import { em } from '../../../../server/em';
import { requireMember, requirePermission } from '../../../../server/guards';
import { handle, json, readJson } from '../../../../server/http';
import { deleteDraft, getRevision, updateRevisionNote } from '../../../../server/services/procedures.service';

const notePatch = z.strictObject({ note: z.string().trim().max(2000, 'Keep the note under 2000 characters') });

/** One revision with its steps; a draft answers 404 to members who cannot author. */
export const GET = handle(async (ctx) => {
  const m = requireMember(ctx);
  return json(await getRevision(await em(), m, ctx.params.id ?? ''));
});

/** Owner or lead: change a draft's note. */
export const PATCH = handle(async (ctx) => {
  const m = requirePermission(ctx, { procedure: ['update'] });
  const { note } = await readJson(ctx.request, notePatch);
  return json(await updateRevisionNote(await em(), m, ctx.params.id ?? '', note));
});

/** Owner or lead: delete a draft (released and retired revisions stay forever). */
export const DELETE = handle(async (ctx) => {
  const m = requirePermission(ctx, { procedure: ['update'] });
  await deleteDraft(await em(), m, ctx.params.id ?? '');
  return new Response(null, { status: 204 });
});
