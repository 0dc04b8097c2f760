import { em } from '../../../../server/em';
import { requireMember, requirePermission } from '../../../../server/guards';
import { handle, json, readJson } from '../../../../server/http';
import { createFinding, createFindingInput, listFindings } from '../../../../server/services/findings.service';

/** The job's findings, newest first. */
export const GET = handle(async (ctx) => {
  const m = requireMember(ctx);
  return json(await listFindings(await em(), m.shopId, ctx.params.id ?? ''));
});

/** Record a finding (optionally on a run step); photos follow with scope `finding`. */
export const POST = handle(async (ctx) => {
  const m = requirePermission(ctx, { run: ['record'] });
  const input = await readJson(ctx.request, createFindingInput);
  return json(await createFinding(await em(), m, ctx.params.id ?? '', input), 201);
});
