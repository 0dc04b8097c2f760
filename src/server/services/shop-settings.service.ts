/** Shop settings: read by every member of the shop, changed by its owner. */
import type { EntityManager } from '@mikro-orm/postgresql';
import * as z from 'zod';
import { ShopSettings } from '../entities';
import { lengthUnit, torqueUnit } from '../../domain/procedure/schema';

export const shopSettingsPatch = z
  .object({ preferredTorqueUnit: torqueUnit, preferredLengthUnit: lengthUnit, allowSelfSignoff: z.boolean() })
  .partial()
  .strict();

export type ShopSettingsDto = { shopId: string; preferredTorqueUnit: string; preferredLengthUnit: string; allowSelfSignoff: boolean };

const toDto = (s: { shopId: string; preferredTorqueUnit: string; preferredLengthUnit: string; allowSelfSignoff: boolean }): ShopSettingsDto => ({
  shopId: s.shopId,
  preferredTorqueUnit: s.preferredTorqueUnit,
  preferredLengthUnit: s.preferredLengthUnit,
  allowSelfSignoff: s.allowSelfSignoff,
});

/** The settings of one shop, created with defaults on first read. */
export async function getShopSettings(em: EntityManager, shopId: string): Promise<ShopSettingsDto> {
  let s = await em.findOne(ShopSettings, { shopId });
  if (!s) {
    s = em.create(ShopSettings, { shopId, preferredTorqueUnit: 'N·m', preferredLengthUnit: 'mm', allowSelfSignoff: false });
    await em.flush();
  }
  return toDto(s);
}

/** Applies a validated patch to the shop's settings. */
export async function updateShopSettings(em: EntityManager, shopId: string, patch: z.infer<typeof shopSettingsPatch>): Promise<ShopSettingsDto> {
  await getShopSettings(em, shopId);
  const s = await em.findOneOrFail(ShopSettings, { shopId });
  em.assign(s, patch);
  await em.flush();
  return toDto(s);
}
