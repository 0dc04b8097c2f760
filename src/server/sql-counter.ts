/**
 * Counts SQL statements per request when TT_COUNT_SQL=1 (the benchmark turns it on), so
 * `npm run bench` can show that statements per request do not grow with a procedure's size.
 * The count rides on AsyncLocalStorage; with the flag off nothing is wrapped.
 */
import { AsyncLocalStorage } from 'node:async_hooks';

const store = new AsyncLocalStorage<{ statements: number }>();
export const countingSql = process.env.TT_COUNT_SQL === '1';

/** Runs fn with a fresh statement counter; returns its result and the count. */
export async function withSqlCount<T>(fn: () => Promise<T>): Promise<{ result: T; statements: number }> {
  const box = { statements: 0 };
  const result = await store.run(box, fn);
  return { result, statements: box.statements };
}

/** Called once per statement sent to PostgreSQL. */
export function countStatement(): void {
  const box = store.getStore();
  if (box) box.statements += 1;
}
