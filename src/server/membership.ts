/** The shop a signed-in user is working in, and their role there, from better-auth's tables. */
import type { ShopRole } from '../lib/access';
import { pgPool } from './pg-pool';

export type ActiveMembership = { shop: { id: string; name: string; slug: string }; role: ShopRole };

/**
 * The session's active shop when the user is a member of it, otherwise their oldest
 * membership; null when they belong to no shop. One query.
 */
export async function activeMembership(userId: string, activeShopId: string | null | undefined): Promise<ActiveMembership | null> {
  const { rows } = await pgPool().query<{ id: string; name: string; slug: string; role: ShopRole }>(
    `select o.id, o.name, o.slug, m.role
       from member m join organization o on o.id = m."organizationId"
      where m."userId" = $1
      order by (o.id = $2) desc, m."createdAt" asc
      limit 1`,
    [userId, activeShopId ?? ''],
  );
  const r = rows[0];
  return r ? { shop: { id: r.id, name: r.name, slug: r.slug }, role: r.role } : null;
}
