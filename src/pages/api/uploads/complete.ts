import { em } from '../../../server/em';
import { requirePermission } from '../../../server/guards';
import { handle, json, readJson } from '../../../server/http';
import { completeInput, completeUpload } from '../../../server/services/uploads.service';

/** Checks an uploaded photo, makes its thumbnail and records it; refused files are deleted. */
export const POST = handle(async (ctx) => {
  const m = requirePermission(ctx, { run: ['record'] });
  const input = await readJson(ctx.request, completeInput);
  return json(await completeUpload(await em(), m, input), 201);
});
