import * as z from 'zod';
import { em } from '../../../server/em';
import { requireMember } from '../../../server/guards';
import { handle, json } from '../../../server/http';
import { compareRevisionsById } from '../../../server/services/procedures.service';

const query = z.object({ a: z.string().min(1, 'Choose the first revision'), b: z.string().min(1, 'Choose the second revision') });

/** What changed from revision a to revision b, step by step. */
export const GET = handle(async (ctx) => {
  const m = requireMember(ctx);
  const { a, b } = query.parse(Object.fromEntries(ctx.url.searchParams));
  return json(await compareRevisionsById(await em(), m, a, b));
});
