/**
 * Who may do what in a shop: better-auth's access control, shared by the server (which
 * enforces it) and the islands (which hide what a role cannot do).
 */
import { createAccessControl } from 'better-auth/plugins/access';
import { defaultStatements, ownerAc } from 'better-auth/plugins/organization/access';

/** Torquetrail's own resources and actions, beside better-auth's organization ones. */
const shopStatements = {
  procedure: ['create', 'update', 'release', 'retire'],
  job: ['create', 'update', 'assign'],
  run: ['start', 'record'],
  deviation: ['approve'],
  signoff: ['sign', 'send-back'],
  report: ['send', 'share'],
  settings: ['update'],
} as const;

export const statements = { ...defaultStatements, ...shopStatements } as const;

export const ac = createAccessControl(statements);

export const roles = {
  // The owner may do everything in the shop.
  owner: ac.newRole({ ...ownerAc.statements, ...shopStatements }),
  lead: ac.newRole({
    invitation: ['create'],
    procedure: ['create', 'update', 'release', 'retire'],
    job: ['create', 'update', 'assign'],
    run: ['start', 'record'],
    deviation: ['approve'],
    report: ['send', 'share'],
  }),
  technician: ac.newRole({
    run: ['start', 'record'],
  }),
  reviewer: ac.newRole({
    signoff: ['sign', 'send-back'],
    report: ['send', 'share'],
  }),
};

export type ShopRole = keyof typeof roles;
export const SHOP_ROLES = ['owner', 'lead', 'technician', 'reviewer'] as const satisfies readonly ShopRole[];
export type Permissions = { [K in keyof typeof statements]?: Array<(typeof statements)[K][number]> };

/** Whether a role holds every listed permission (the same check better-auth's hasPermission runs). */
export function roleCan(role: string | null | undefined, permissions: Permissions): boolean {
  if (!role || !(role in roles)) return false;
  const r = roles[role as ShopRole];
  return r.authorize(permissions as never).success;
}

export const ROLE_LABELS: Record<ShopRole, string> = {
  owner: 'Owner',
  lead: 'Shop lead',
  technician: 'Technician',
  reviewer: 'Reviewer',
};
