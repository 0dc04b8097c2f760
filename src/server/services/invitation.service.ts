/** What an invitation link shows before anyone signs in: the shop, the role and who sent it. */
import { SHOP_ROLES, type ShopRole } from '../../lib/access';
import { pgPool } from '../pg-pool';

const isShopRole = (r: string): r is ShopRole => (SHOP_ROLES as readonly string[]).includes(r);

export type InvitationState = 'pending' | 'expired' | 'canceled' | 'accepted' | 'rejected';

export type InvitationView = {
  id: string;
  state: InvitationState;
  email: string;
  role: ShopRole | null;
  shopId: string;
  shopName: string;
  inviterName: string;
  expiresAt: string;
  /** Whether an account with the invited e-mail exists (then the person signs in instead of signing up). */
  hasAccount: boolean;
};

/** The invitation with its shop and inviter, or null when no invitation has that id. `now` is injectable for tests. */
export async function findInvitation(id: string, now = new Date()): Promise<InvitationView | null> {
  if (!id || id.length > 200) return null;
  const { rows } = await pgPool().query<{ id: string; email: string; role: string | null; status: string; expiresAt: Date; shopId: string; shopName: string; inviterName: string; hasAccount: boolean }>(
    `select i.id, i.email, i.role, i.status, i."expiresAt", o.id as "shopId", o.name as "shopName", u.name as "inviterName",
            exists(select 1 from "user" x where lower(x.email) = lower(i.email)) as "hasAccount"
       from invitation i
       join organization o on o.id = i."organizationId"
       join "user" u on u.id = i."inviterId"
      where i.id = $1`,
    [id],
  );
  const r = rows[0];
  if (!r) return null;
  const state: InvitationState = r.status === 'pending' ? (r.expiresAt.getTime() <= now.getTime() ? 'expired' : 'pending') : r.status === 'accepted' ? 'accepted' : r.status === 'rejected' ? 'rejected' : 'canceled';
  return {
    id: r.id,
    state,
    email: r.email,
    role: r.role && isShopRole(r.role) ? r.role : null,
    shopId: r.shopId,
    shopName: r.shopName,
    inviterName: r.inviterName,
    expiresAt: r.expiresAt.toISOString(),
    hasAccount: r.hasAccount,
  };
}
