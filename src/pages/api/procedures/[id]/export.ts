import { em } from '../../../../server/em';
import { requireMember } from '../../../../server/guards';
import { handle } from '../../../../server/http';
import { exportProcedure } from '../../../../server/services/procedures.service';
import { procedureFileJson } from '../../../../domain/procedure/file-format';

/** A revision (?revision=<id>, else the latest released) as a procedure file download. */
export const GET = handle(async (ctx) => {
  const m = requireMember(ctx);
  const { filename, file } = await exportProcedure(await em(), m, ctx.params.id ?? '', ctx.url.searchParams.get('revision'));
  return new Response(procedureFileJson(file), {
    headers: { 'content-type': 'application/json; charset=utf-8', 'content-disposition': `attachment; filename="${filename}"`, 'cache-control': 'no-store' },
  });
});
