/** What each role's home page offers; later parts of the app add their sections here. */
import type { ShopRole } from './access';

export type HomeSection = { href: string; title: string; text: string; roles: readonly ShopRole[] };

export const HOME_SECTIONS: HomeSection[] = [
  { href: '/jobs?technician=me', title: 'My jobs', text: 'The jobs assigned to you, each with its next step; continue a run where it stopped.', roles: ['technician'] },
  { href: '/jobs?status=open', title: 'Open jobs', text: 'Jobs waiting to start: assign technicians and a reviewer, start a run.', roles: ['lead', 'owner'] },
  { href: '/jobs', title: 'All jobs', text: 'Every job in the shop by status, technician and age; open a new one.', roles: ['lead', 'owner', 'reviewer'] },
  { href: '/procedures?status=draft', title: 'Procedure drafts', text: 'Drafts waiting to be finished and released; open one in the editor.', roles: ['lead', 'owner'] },
  { href: '/procedures', title: 'Procedures', text: 'Every teardown, assembly and inspection procedure with its revisions; write, import, release, compare.', roles: ['lead', 'owner'] },
  { href: '/shop/members', title: 'Members and roles', text: 'Invite people to the shop, change roles, remove members.', roles: ['owner'] },
];

export const homeSections = (role: ShopRole | null) => (role ? HOME_SECTIONS.filter((s) => s.roles.includes(role)) : []);
