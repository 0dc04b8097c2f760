/** Members of a shop with their names and roles, read from better-auth's tables. */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { ShopRole } from '../../lib/access';

const placeholders = (n: number) => Array.from({ length: n }, () => '?').join(', ');

export type ShopMemberRow = { id: string; name: string; role: ShopRole };

/** The given users that are members of the shop (others are simply absent from the result). */
export async function shopMembers(em: EntityManager, shopId: string, userIds?: readonly string[]): Promise<Map<string, ShopMemberRow>> {
  if (userIds && userIds.length === 0) return new Map();
  const rows = await em.getConnection().execute<ShopMemberRow[]>(
    `select u.id, u.name, m.role from member m join "user" u on u.id = m."userId"
      where m."organizationId" = ?${userIds ? ` and u.id in (${placeholders(userIds.length)})` : ''}`,
    userIds ? [shopId, ...userIds] : [shopId],
  );
  return new Map(rows.map((r) => [r.id, r]));
}

/** Names of users (members or former members), for showing who did what in a log. */
export async function userNames(em: EntityManager, userIds: readonly string[]): Promise<Map<string, string>> {
  const ids = [...new Set(userIds)];
  if (ids.length === 0) return new Map();
  const rows = await em.getConnection().execute<Array<{ id: string; name: string }>>(`select id, name from "user" where id in (${placeholders(ids.length)})`, ids);
  return new Map(rows.map((r) => [r.id, r.name]));
}
