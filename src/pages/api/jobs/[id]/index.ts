import { em } from '../../../../server/em';
import { requireMember, requirePermission } from '../../../../server/guards';
import { handle, json, readJson } from '../../../../server/http';
import { getJob, updateJob, updateJobInput } from '../../../../server/services/jobs.service';

/** One job with its technicians, reviewer and runs. */
export const GET = handle(async (ctx) => {
  const m = requireMember(ctx);
  return json(await getJob(await em(), m, ctx.params.id ?? ''));
});

/** Change the unit's details, notes and assignments. */
export const PATCH = handle(async (ctx) => {
  const m = requirePermission(ctx, { job: ['update'] });
  const input = await readJson(ctx.request, updateJobInput);
  return json(await updateJob(await em(), m, ctx.params.id ?? '', input));
});
