import { em } from '../../../../server/em';
import { requireMember } from '../../../../server/guards';
import { handle, json, readJson } from '../../../../server/http';
import { listSignatures, signInput, signRun } from '../../../../server/services/signoff.service';

/** Every signature on the run, each with `matches`: whether today's data still gives the signed record. */
export const GET = handle(async (ctx) => {
  const m = requireMember(ctx);
  return json({ signatures: await listSignatures(await em(), m.shopId, ctx.params.id ?? '') });
});

/**
 * Sign the run (no stepId) or a hold point (stepId), with the meaning and the signer's own
 * password. Who may sign is decided in the service: signoff:sign for a run, the hold point's
 * listed signers for a hold point, never one's own work unless the shop allows it.
 */
export const POST = handle(async (ctx) => {
  const m = requireMember(ctx);
  const input = await readJson(ctx.request, signInput);
  return json(await signRun(await em(), m, ctx.params.id ?? '', input), 201);
});
