/** Navigation entries and which roles see them; later parts of the app add theirs here. */
import type { ShopRole } from './access';

/** `badge: 'review'` shows the number of items waiting in the review queue beside the entry. */
export type NavItem = { href: string; label: string; roles: readonly ShopRole[]; badge?: 'review' };

export const NAV: NavItem[] = [
  { href: '/', label: 'Home', roles: ['owner', 'lead', 'technician', 'reviewer'] },
  { href: '/jobs', label: 'Jobs', roles: ['owner', 'lead', 'technician', 'reviewer'] },
  { href: '/procedures', label: 'Procedures', roles: ['owner', 'lead', 'technician', 'reviewer'] },
  { href: '/review', label: 'Review', roles: ['owner', 'lead', 'reviewer'], badge: 'review' },
  { href: '/shop/members', label: 'Members', roles: ['owner'] },
];

export const navFor = (role: ShopRole | null) => (role ? NAV.filter((n) => n.roles.includes(role)) : []);
