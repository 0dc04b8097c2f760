import { em } from '../../../../server/em';
import { requirePermission } from '../../../../server/guards';
import { handle, json, readJson } from '../../../../server/http';
import { startJobRun, startRunInput } from '../../../../server/services/runs.service';

/** Start a run of a released revision on this job. */
export const POST = handle(async (ctx) => {
  const m = requirePermission(ctx, { run: ['start'] });
  const { revisionId } = await readJson(ctx.request, startRunInput);
  return json(await startJobRun(await em(), m, ctx.params.id ?? '', revisionId), 201);
});
