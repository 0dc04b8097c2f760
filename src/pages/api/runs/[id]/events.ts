import { em } from '../../../../server/em';
import { requireMember } from '../../../../server/guards';
import { handle, json, readJson } from '../../../../server/http';
import { eventsQuery, recordEventInput, recordRunEvent, runEventsAfter } from '../../../../server/services/runs.service';
import { syncTags } from '../../../../server/services/tags.service';

/** Events after `?after=<seq>` (default: all). */
export const GET = handle(async (ctx) => {
  const m = requireMember(ctx);
  const { after } = eventsQuery.parse(Object.fromEntries([...ctx.url.searchParams].filter(([, v]) => v !== '')));
  return json(await runEventsAfter(await em(), m.shopId, ctx.params.id ?? '', after));
});

/**
 * Record one event. The role check depends on the event (work needs `run:record`; approvals,
 * signatures and send-backs follow the run machine's own role rules), so it runs in the service.
 * A hold point's `hold.sign` is refused here (403): it is posted only by POST .../signoffs, which
 * re-checks the password and stores the signed record.
 */
export const POST = handle(async (ctx) => {
  const m = requireMember(ctx);
  const input = await readJson(ctx.request, recordEventInput);
  const device = input.device ?? ctx.request.headers.get('x-device')?.trim().slice(0, 120) ?? undefined;
  const { status, body } = await recordRunEvent(await em(), m, ctx.params.id ?? '', { ...input, device: device || undefined });
  // Tags project from tag-part completions; the tag board re-syncs on load if this ever fails.
  if (status === 201 && body.event.type === 'step.complete') await syncTags(await em(), m.shopId, ctx.params.id ?? '').catch((e) => console.error('[tags] sync after event failed', e));
  return json(body, status);
});
