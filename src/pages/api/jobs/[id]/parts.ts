import { em } from '../../../../server/em';
import { requireMember, requirePermission } from '../../../../server/guards';
import { handle, json, readJson } from '../../../../server/http';
import { getPartsList, overrideInput, setPartQuantity } from '../../../../server/services/parts-list.service';

/** The job's parts to replace, merged from its runs, tags and findings. */
export const GET = handle(async (ctx) => {
  const m = requireMember(ctx);
  return json(await getPartsList(await em(), m.shopId, ctx.params.id ?? ''));
});

/** Set a part's quantity by hand (`quantity: null` goes back to the computed one). */
export const PUT = handle(async (ctx) => {
  const m = requirePermission(ctx, { job: ['update'] });
  const input = await readJson(ctx.request, overrideInput);
  return json(await setPartQuantity(await em(), m, ctx.params.id ?? '', input));
});
