import { em } from '../../../server/em';
import { requireMember, requirePermission } from '../../../server/guards';
import { handle, json, readJson } from '../../../server/http';
import { getTag, updateTag, updateTagInput } from '../../../server/services/tags.service';

/** One tag with photos and history. */
export const GET = handle(async (ctx) => {
  const m = requireMember(ctx);
  return json(await getTag(await em(), m.shopId, ctx.params.id ?? ''));
});

/** Change bin, disposition or condition note; each change is kept in the tag's history. */
export const PATCH = handle(async (ctx) => {
  const m = requirePermission(ctx, { run: ['record'] });
  const input = await readJson(ctx.request, updateTagInput);
  return json(await updateTag(await em(), m, ctx.params.id ?? '', input));
});
