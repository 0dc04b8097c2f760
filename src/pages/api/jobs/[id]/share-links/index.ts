import { em } from '../../../../../server/em';
import { requirePermission } from '../../../../../server/guards';
import { handle, json, readJson } from '../../../../../server/http';
import { createShareInput, createShareLink, listShareLinks } from '../../../../../server/services/share.service';

/** The job's read-only links with every view. */
export const GET = handle(async (ctx) => {
  const m = requirePermission(ctx, { report: ['share'] });
  return json({ links: await listShareLinks(await em(), m.shopId, ctx.params.id ?? '') });
});

/** A new read-only link to one run's report; the answer carries the URL once (only its hash is kept). */
export const POST = handle(async (ctx) => {
  const m = requirePermission(ctx, { report: ['share'] });
  const input = await readJson(ctx.request, createShareInput);
  return json(await createShareLink(await em(), m, ctx.params.id ?? '', input), 201);
});
