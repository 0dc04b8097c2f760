import { em } from '../../../../server/em';
import { requireMember } from '../../../../server/guards';
import { handle } from '../../../../server/http';
import { GET_EXPIRY_S, attachmentUrl } from '../../../../server/services/uploads.service';

/** Redirects to a presigned GET of the photo's thumbnail, valid for at most 5 minutes. */
export const GET = handle(async (ctx) => {
  const m = requireMember(ctx);
  const url = await attachmentUrl(await em(), m.shopId, ctx.params.id ?? '', 'thumb');
  return new Response(null, { status: 302, headers: { location: url, 'cache-control': `private, max-age=${GET_EXPIRY_S - 60}` } });
});
