/** A JSON body that may be left out entirely (POSTs like release or retire work without one). */
import type * as z from 'zod';
import { readJson } from './http';

export async function readOptionalJson<S extends z.ZodType>(request: Request, schema: S): Promise<z.infer<S>> {
  const text = await request.clone().text();
  if (text.trim() === '') return schema.parse({});
  return readJson(request, schema);
}
