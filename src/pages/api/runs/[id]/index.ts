import { em } from '../../../../server/em';
import { requireMember } from '../../../../server/guards';
import { handle, jsonText } from '../../../../server/http';
import { runDtoJson } from '../../../../server/run-json';
import { getRun } from '../../../../server/services/runs.service';

/** The run: pinned steps, its log, and what it expects next. */
export const GET = handle(async (ctx) => {
  const m = requireMember(ctx);
  return jsonText(runDtoJson(await getRun(await em(), m.shopId, ctx.params.id ?? '')));
});
