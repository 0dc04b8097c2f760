import { em } from '../../../server/em';
import { requirePermission } from '../../../server/guards';
import { handle, json, readJson } from '../../../server/http';
import { presignInput, presignUpload } from '../../../server/services/uploads.service';

/** A short-lived presigned PUT for one photo of a run step, tag or finding. */
export const POST = handle(async (ctx) => {
  const m = requirePermission(ctx, { run: ['record'] });
  const input = await readJson(ctx.request, presignInput);
  return json(await presignUpload(await em(), m, input), 201);
});
