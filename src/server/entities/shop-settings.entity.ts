/** Per-shop settings the owner manages: preferred units and sign-off rules. */
import { defineEntity, p } from '@mikro-orm/core';

export const ShopSettings = defineEntity({
  name: 'ShopSettings',
  tableName: 'shop_settings',
  properties: {
    shopId: p.string().primary().length(64),
    preferredTorqueUnit: p.string().length(16).default('N·m'),
    preferredLengthUnit: p.string().length(16).default('mm'),
    /** When false (the default), nobody may sign off a run or hold point they worked on. */
    allowSelfSignoff: p.boolean().default(false),
    updatedAt: p.datetime().onCreate(() => new Date()).onUpdate(() => new Date()),
  },
});
