/** What each role's home page offers; later parts of the app add their sections here. */
import type { ShopRole } from './access';

export type HomeSection = { href: string; title: string; text: string; roles: readonly ShopRole[] };

export const HOME_SECTIONS: HomeSection[] = [
  { href: '/shop/members', title: 'Members and roles', text: 'Invite people to the shop, change roles, remove members.', roles: ['owner'] },
];

export const homeSections = (role: ShopRole | null) => (role ? HOME_SECTIONS.filter((s) => s.roles.includes(role)) : []);
