import { em } from '../../../../server/em';
import { requireMember } from '../../../../server/guards';
import { handle, json, readJson } from '../../../../server/http';
import { changeJobStatus, jobStatusInput } from '../../../../server/services/jobs.service';

/** Move the job along its status flow; who may make each move is the flow's own rule (403 / 409). */
export const POST = handle(async (ctx) => {
  const m = requireMember(ctx);
  const { to } = await readJson(ctx.request, jobStatusInput);
  return json(await changeJobStatus(await em(), m, ctx.params.id ?? '', to));
});
