/** Read-only links for people outside the shop: how long they last and whether one still opens. Pure. */

export const DEFAULT_SHARE_DAYS = 14;
export const MAX_SHARE_DAYS = 90;
const DAY_MS = 86_400_000;

export type ShareLinkState = 'active' | 'expired' | 'revoked';

/** The expiry of a link made now for the given number of whole days (1–90). */
export function shareExpiry(now: Date, days: number = DEFAULT_SHARE_DAYS): Date {
  if (!Number.isInteger(days) || days < 1 || days > MAX_SHARE_DAYS) throw new RangeError(`A link lasts 1 to ${MAX_SHARE_DAYS} whole days`);
  return new Date(now.getTime() + days * DAY_MS);
}

/** Whether a link opens at `now`: revoked wins over expired; it expires at the instant `expiresAt`. */
export function shareLinkState(link: { expiresAt: Date; revokedAt: Date | null }, now: Date): ShareLinkState {
  if (link.revokedAt && link.revokedAt.getTime() <= now.getTime()) return 'revoked';
  if (now.getTime() >= link.expiresAt.getTime()) return 'expired';
  return 'active';
}

export const SHARE_STATE_LABELS: Record<ShareLinkState, string> = { active: 'Active', expired: 'Expired', revoked: 'Revoked' };
