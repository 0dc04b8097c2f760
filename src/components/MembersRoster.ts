/**
 * The members page's data: who is in the shop and who is invited, as plain values. Built from
 * better-auth's full-organization answer both in the page's frontmatter and after each change
 * in the browser, so the two never disagree.
 */
import { SHOP_ROLES, type ShopRole } from '../lib/access';

export type RosterMember = { id: string; userId: string; name: string; email: string; role: ShopRole; joinedAt: string };
export type RosterInvitation = { id: string; email: string; role: ShopRole | null; inviterName: string; expiresAt: string };
export type Roster = { members: RosterMember[]; invitations: RosterInvitation[] };

type When = Date | string;
export type FullShop = {
  members: Array<{ id: string; userId: string; role: string; createdAt: When; user: { name: string; email: string } }>;
  invitations: Array<{ id: string; email: string; role: string | null; status: string; expiresAt: When; inviterId: string }>;
};

const iso = (w: When) => (w instanceof Date ? w : new Date(w)).toISOString();
const asRole = (r: string | null | undefined): ShopRole | null => (r && (SHOP_ROLES as readonly string[]).includes(r) ? (r as ShopRole) : null);

/** Members by name, and the invitations still waiting (pending and not yet expired), newest first. */
export function toRoster(full: FullShop, now = new Date()): Roster {
  const names = new Map(full.members.map((m) => [m.userId, m.user.name]));
  const members = full.members
    .map((m) => ({ id: m.id, userId: m.userId, name: m.user.name, email: m.user.email, role: asRole(m.role) ?? 'technician', joinedAt: iso(m.createdAt) }))
    .sort((a, b) => a.name.localeCompare(b.name));
  const invitations = full.invitations
    .filter((i) => i.status === 'pending' && new Date(iso(i.expiresAt)).getTime() > now.getTime())
    .map((i) => ({ id: i.id, email: i.email, role: asRole(i.role), inviterName: names.get(i.inviterId) ?? 'a former member', expiresAt: iso(i.expiresAt) }))
    .sort((a, b) => b.expiresAt.localeCompare(a.expiresAt));
  return { members, invitations };
}

/** A date as the shop reads it, the same on server and browser (no locale or time-zone drift). */
export const shortDate = (isoString: string) => isoString.slice(0, 10);
