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

const DEFAULTS = { preferredTorqueUnit: 'N·m', preferredLengthUnit: 'mm', allowSelfSignoff: false } as const;

/** The settings of one shop; the defaults until the owner first changes one (a read writes nothing). */
export async function getShopSettings(em: EntityManager, shopId: string): Promise<ShopSettingsDto> {
  const s = await em.findOne(ShopSettings, { shopId });
  return toDto(s ?? { shopId, ...DEFAULTS });
}

/** Applies a validated patch to the shop's settings, creating their row on the first change. */
export async function updateShopSettings(em: EntityManager, shopId: string, patch: z.infer<typeof shopSettingsPatch>): Promise<ShopSettingsDto> {
  // Two owners saving at once for the first time must not collide on the row's key.
  await em.getConnection().execute('insert into shop_settings (shop_id, preferred_torque_unit, preferred_length_unit, allow_self_signoff, updated_at) values (?, ?, ?, ?, now()) on conflict (shop_id) do nothing', [shopId, DEFAULTS.preferredTorqueUnit, DEFAULTS.preferredLengthUnit, DEFAULTS.allowSelfSignoff], 'run', em.getTransactionContext());
  const s = await em.findOneOrFail(ShopSettings, { shopId });
  em.assign(s, patch);
  await em.flush();
  return toDto(s);
}
