/** Shops with one member per role, created through better-auth's own API as the app does. */
import { randomUUID } from 'node:crypto';
import { auth } from '../../../src/server/auth';
import type { ShopRole } from '../../../src/lib/access';

export type TestMember = { userId: string; name: string; email: string; role: ShopRole; headers: Headers };
export type TestShop = { id: string; name: string; members: Record<ShopRole, TestMember> };

const PASSWORD = 'integration-pass-1';

/** Signs a user in and returns request headers carrying their session cookie. */
export async function sessionHeaders(email: string, password = PASSWORD): Promise<Headers> {
  const res = await auth().api.signInEmail({ body: { email, password }, asResponse: true });
  if (!res.ok) throw new Error(`sign-in failed for ${email}: ${res.status}`);
  const cookie = res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
  return new Headers({ cookie });
}

/** A new shop whose owner, lead, technician and reviewer can all sign in. */
export async function createShop(label = 'Test shop'): Promise<TestShop> {
  const tag = randomUUID().slice(0, 8);
  const a = auth();
  const roles: ShopRole[] = ['owner', 'lead', 'technician', 'reviewer'];
  const ids: Partial<Record<ShopRole, { id: string; name: string; email: string }>> = {};
  for (const role of roles) {
    const email = `${role}.${tag}@it.torquetrail.test`;
    const name = `${role[0]!.toUpperCase()}${role.slice(1)} ${tag}`;
    const r = await a.api.signUpEmail({ body: { email, password: PASSWORD, name } });
    ids[role] = { id: r.user.id, name, email };
  }
  const shop = await a.api.createOrganization({ body: { name: `${label} ${tag}`, slug: `shop-${tag}`, userId: ids.owner!.id } });
  if (!shop) throw new Error('createOrganization returned nothing');
  for (const role of roles.filter((r) => r !== 'owner')) {
    await a.api.addMember({ body: { userId: ids[role]!.id, role, organizationId: shop.id } });
  }
  const members = {} as Record<ShopRole, TestMember>;
  for (const role of roles) {
    const u = ids[role]!;
    members[role] = { userId: u.id, name: u.name, email: u.email, role, headers: await sessionHeaders(u.email) };
  }
  return { id: shop.id, name: shop.name, members };
}
