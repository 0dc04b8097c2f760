/** Page frontmatter helper: the signed-in member of the active shop, or where to send them. */
import type { AstroGlobal } from 'astro';
import type { Member } from '../../server/guards';
import { AppError } from '../../server/http';

export async function pageMember(Astro: AstroGlobal): Promise<Member | Response> {
  const { user, shop, role } = Astro.locals;
  if (!user) return Astro.redirect(`/sign-in?next=${encodeURIComponent(Astro.url.pathname)}`, 303);
  if (!shop || !role) return Astro.rewrite('/404');
  return { userId: user.id, name: user.name, email: user.email, shopId: shop.id, shopName: shop.name, role };
}

/** Runs a loader; a not-found becomes the 404 page. */
export async function loadOr404<T>(Astro: AstroGlobal, load: () => Promise<T>): Promise<T | Response> {
  try {
    return await load();
  } catch (e) {
    if (e instanceof AppError && e.code === 'not-found') return Astro.rewrite('/404');
    throw e;
  }
}
