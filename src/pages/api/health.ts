import { checkHealth } from '../../server/health';
import { handle, json } from '../../server/http';

/** 200 when the database, the object store and the mail server all answer; 503 naming the ones that don't. */
export const GET = handle(async () => {
  const report = await checkHealth();
  const failed = Object.entries(report.checks).filter(([, c]) => !c.ok).map(([k]) => k);
  return json(failed.length ? { ...report, failed } : report, report.ok ? 200 : 503);
});
