import { em } from '../../../server/em';
import { requireMember, requirePermission } from '../../../server/guards';
import { handle, json, readJson } from '../../../server/http';
import { createJob, createJobInput, jobListQuery, listJobs } from '../../../server/services/jobs.service';

/** The shop's jobs: `?status=&technician=<user id or "me">&olderThanDays=`. */
export const GET = handle(async (ctx) => {
  const m = requireMember(ctx);
  const q = jobListQuery.parse(Object.fromEntries([...ctx.url.searchParams].filter(([, v]) => v !== '')));
  return json({ jobs: await listJobs(await em(), m, q) });
});

/** Leads and owners open a job for a unit and assign its technicians and reviewer. */
export const POST = handle(async (ctx) => {
  const m = requirePermission(ctx, { job: ['create'] });
  const input = await readJson(ctx.request, createJobInput);
  return json(await createJob(await em(), m, input), 201);
});
