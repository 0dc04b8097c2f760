/**
 * The events a run accepts, as one zod schema: the API parses request bodies with it and the
 * run machine is typed by it, so the browser, the server and the stored log agree on one shape.
 */
import * as z from 'zod';
import { disposition, hazard, role, torqueQuantity } from '../procedure/schema';

/** Who sent the event: the member and the role they act in. */
export const runActor = z.object({ userId: z.string().trim().min(1).max(80), role });
/** A parsed actor. */
export type RunActor = z.infer<typeof runActor>;

const stepId = z.string().min(1).max(40);
const reason = z.string().trim().min(1, 'Give a reason').max(1000);
const note = z.string().trim().max(1000).optional();
const head = { stepId, actor: runActor };

/** One removed part's tag as recorded when a tag-part step completes (the tag record lives elsewhere). */
export const tagEntry = z.object({
  position: z.string().trim().min(1).max(40),
  disposition,
  bin: z.string().trim().max(60).optional(),
});
/** A parsed tag entry. */
export type TagEntry = z.infer<typeof tagEntry>;

/** Deviation kinds: skip a step, or accept readings that are out of spec. */
export const deviationKind = z.enum(['skip', 'out-of-spec']);
/** skip or out-of-spec. */
export type DeviationKind = z.infer<typeof deviationKind>;

/** Every event a run accepts, discriminated on `type`; every event names its step and its actor. */
export const runEvent = z.discriminatedUnion('type', [
  /** `hazards` acknowledges the step's hazard cautions; a step with hazards needs all of them. */
  z.object({ type: z.literal('step.start'), ...head, hazards: z.array(hazard).max(20).default([]) }),
  z.object({ type: z.literal('fastener.confirm'), ...head, pass: z.number().int().min(1).max(10), fastenerId: z.string().min(1).max(40) }),
  z.object({ type: z.literal('reading.enter'), ...head, key: z.string().min(1).max(120), value: z.number().refine(Number.isFinite, 'Must be a finite number') }),
  z.object({ type: z.literal('measure.submit'), ...head }),
  z.object({ type: z.literal('caution.acknowledge'), ...head }),
  z.object({ type: z.literal('torque.confirm'), ...head, applied: torqueQuantity }),
  z.object({ type: z.literal('step.complete'), ...head, note, applied: torqueQuantity.optional(), tags: z.array(tagEntry).max(64).optional() }),
  z.object({ type: z.literal('deviation.request'), ...head, kind: deviationKind, reason }),
  z.object({ type: z.literal('deviation.approve'), ...head, note }),
  z.object({ type: z.literal('deviation.reject'), ...head, reason }),
  z.object({ type: z.literal('hold.sign'), ...head, meaning: z.string().trim().min(1, 'Say what the signature means').max(300) }),
  z.object({ type: z.literal('run.reopen'), ...head, reason }),
]);
/** A parsed run event (defaults applied). */
export type RunEvent = z.infer<typeof runEvent>;
/** A run event as a client may send it (defaults not yet applied). */
export type RunEventInput = z.input<typeof runEvent>;
/** The dotted event names. */
export type RunEventType = RunEvent['type'];
/** The event of one type. */
export type RunEventOf<T extends RunEventType> = Extract<RunEvent, { type: T }>;

/** The dotted event names, in schema order. */
export const RUN_EVENT_TYPES = runEvent.options.map((o) => o.shape.type.value) as readonly RunEventType[];
