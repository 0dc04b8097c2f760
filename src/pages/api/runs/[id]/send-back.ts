import { em } from '../../../../server/em';
import { requireMember } from '../../../../server/guards';
import { handle, json, readJson } from '../../../../server/http';
import { sendBack, sendBackInput } from '../../../../server/services/signoff.service';

/** Send finished work back to a step with a reason; the run machine decides who may (reviewer, lead, owner). */
export const POST = handle(async (ctx) => {
  const m = requireMember(ctx);
  const input = await readJson(ctx.request, sendBackInput);
  return json(await sendBack(await em(), m, ctx.params.id ?? '', input), 201);
});
