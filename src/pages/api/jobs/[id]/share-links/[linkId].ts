import { em } from '../../../../../server/em';
import { requirePermission } from '../../../../../server/guards';
import { handle, json } from '../../../../../server/http';
import { revokeShareLink } from '../../../../../server/services/share.service';

/** Revoke a link: it answers "not found" from now on. */
export const DELETE = handle(async (ctx) => {
  const m = requirePermission(ctx, { report: ['share'] });
  return json(await revokeShareLink(await em(), m, ctx.params.id ?? '', ctx.params.linkId ?? ''));
});
