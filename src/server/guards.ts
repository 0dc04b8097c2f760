/** Guard clauses for routes, in STYLE.md's order: session, then role. */
import type { APIContext } from 'astro';
import { roleCan, type Permissions, type ShopRole } from '../lib/access';
import { AppError } from './http';

export type Member = { userId: string; name: string; email: string; shopId: string; shopName: string; role: ShopRole };

/** The signed-in member of the active shop, or 401 (signed out) / 403 (no shop). */
export function requireMember(ctx: Pick<APIContext, 'locals'>): Member {
  const { user, shop, role } = ctx.locals;
  if (!user) throw new AppError('unauthenticated', 'Sign in first.');
  if (!shop || !role) throw new AppError('forbidden', 'You are not a member of any shop yet.');
  return { userId: user.id, name: user.name, email: user.email, shopId: shop.id, shopName: shop.name, role };
}

/** The member, if their role holds every listed permission; otherwise 403. */
export function requirePermission(ctx: Pick<APIContext, 'locals'>, permissions: Permissions): Member {
  const m = requireMember(ctx);
  if (!roleCan(m.role, permissions)) throw new AppError('forbidden', `Your role (${m.role}) may not do this.`);
  return m;
}
