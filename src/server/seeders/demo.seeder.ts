/** Seeds the demo scenario once: the invented shop and its members (later parts add their data). */
import type { EntityManager } from '@mikro-orm/core';
import { Seeder } from '@mikro-orm/seeder';
import { auth } from '../auth';
import { ShopSettings } from '../entities';
import { DEMO_MEMBERS, DEMO_PASSWORD, DEMO_SHOP } from './demo-people';
import { demoSeedSteps } from './demo-steps';

export class DemoSeeder extends Seeder {
  async run(em: EntityManager): Promise<void> {
    const a = auth();
    const users: Record<string, string> = {};
    for (const m of DEMO_MEMBERS) {
      const res = await a.api.signUpEmail({ body: { email: m.email, password: DEMO_PASSWORD, name: m.name } });
      users[m.role] = res.user.id;
    }
    const ownerId = users.owner!;
    const shop = await a.api.createOrganization({ body: { name: DEMO_SHOP.name, slug: DEMO_SHOP.slug, userId: ownerId } });
    if (!shop) throw new Error('Could not create the demo shop');
    for (const m of DEMO_MEMBERS) {
      if (m.role === 'owner') continue;
      await a.api.addMember({ body: { userId: users[m.role]!, role: m.role, organizationId: shop.id } });
    }
    em.create(ShopSettings, { shopId: shop.id, preferredTorqueUnit: 'N·m', preferredLengthUnit: 'mm', allowSelfSignoff: false });
    await em.flush();
    for (const step of demoSeedSteps) await step(em, { shopId: shop.id, users });
  }
}
