import { em } from '../../../server/em';
import { requireMember, requirePermission } from '../../../server/guards';
import { handle, json, readJson } from '../../../server/http';
import { getShopSettings, shopSettingsPatch, updateShopSettings } from '../../../server/services/shop-settings.service';

/** The active shop's settings. */
export const GET = handle(async (ctx) => {
  const m = requireMember(ctx);
  return json(await getShopSettings(await em(), m.shopId));
});

/** Owner only: change preferred units and the self-sign-off rule. */
export const PATCH = handle(async (ctx) => {
  const m = requirePermission(ctx, { settings: ['update'] });
  const patch = await readJson(ctx.request, shopSettingsPatch);
  return json(await updateShopSettings(await em(), m.shopId, patch));
});
