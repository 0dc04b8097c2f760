/**
 * The shape of a procedure revision and its steps: the one schema that the editor's forms,
 * the API, the import/export files in `procedures/` and the run machine all share.
 */
import * as z from 'zod';
import { ANGLE_UNITS, DISPOSITIONS, HAZARDS, LENGTH_UNITS, MESSAGES, ROLES, TORQUE_UNITS } from './vocabulary';

export { ANGLE_UNITS, LENGTH_UNITS, TORQUE_UNITS } from './vocabulary';

export const torqueUnit = z.enum(TORQUE_UNITS);
export const lengthUnit = z.enum(LENGTH_UNITS);
export const angleUnit = z.enum(ANGLE_UNITS);
export const anyUnit = z.enum([...TORQUE_UNITS, ...LENGTH_UNITS, ...ANGLE_UNITS]);
export type TorqueUnit = z.infer<typeof torqueUnit>;
export type LengthUnit = z.infer<typeof lengthUnit>;
export type AngleUnit = z.infer<typeof angleUnit>;
export type AnyUnit = z.infer<typeof anyUnit>;

const finite = z.number().refine(Number.isFinite, MESSAGES.finite);
const positive = finite.refine((n) => n > 0, MESSAGES.positive);

export const torqueQuantity = z.object({ value: positive, unit: torqueUnit });
export type TorqueQuantity = z.infer<typeof torqueQuantity>;

/** Short free text shown to people; trimmed, never empty. */
const label = (max = 120) => z.string().trim().min(1, 'Required').max(max);
/** Step text: plain text with a small, safely rendered markup (see `rich-text.ts`). */
const body = z.string().max(10_000).default('');

/** One fastener on the 2-D layout. x and y are layout units (0–1000), y grows downward. */
export const fastener = z.object({
  id: z.string().min(1).max(40),
  label: label(20),
  x: finite.min(0).max(1000),
  y: finite.min(0).max(1000),
});
export type Fastener = z.infer<typeof fastener>;

export const orderMethod = z.enum(['centre-out', 'reverse-centre-out', 'cross', 'manual']);
export type OrderMethod = z.infer<typeof orderMethod>;

/** A fastener map: where the fasteners sit and the order (fastener ids) they are worked in. */
export const fastenerMap = z.object({
  fasteners: z.array(fastener).min(1, 'Place at least one fastener').max(200),
  order: z.array(z.string()).default([]),
  orderMethod: orderMethod.default('centre-out'),
});
export type FastenerMap = z.infer<typeof fastenerMap>;

/**
 * One pass over every fastener in order. `percent` is a stage of the step's final torque,
 * `torque` an absolute stage, `snug` hand-tight seating, `angle` a turn past the last stage,
 * `loosen` a loosening turn (e.g. 90° = a quarter turn), `remove` runs each one out.
 */
export const pass = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('snug') }),
  z.object({ kind: z.literal('percent'), percent: positive.max(100) }),
  z.object({ kind: z.literal('torque'), target: torqueQuantity }),
  z.object({ kind: z.literal('angle'), degrees: positive.max(720) }),
  z.object({ kind: z.literal('loosen'), degrees: positive.max(3600) }),
  z.object({ kind: z.literal('remove') }),
]);
export type Pass = z.infer<typeof pass>;

export const threadCondition = z.enum(['dry', 'engine-oil', 'assembly-lube', 'thread-sealant', 'threadlocker']);

/** A spec: nominal with inclusive limits, in one unit. */
export const spec = z
  .object({ nominal: finite, min: finite, max: finite, unit: anyUnit })
  .refine((s) => s.min <= s.nominal && s.nominal <= s.max, {
    message: 'Nominal must lie between min and max',
    path: ['nominal'],
  });
export type Spec = z.infer<typeof spec>;

export const instrument = z.object({
  name: label(80),
  /** Smallest step the instrument reads, in the step's unit. */
  resolution: positive,
});

/**
 * How a measure step collects and reduces its readings:
 * - `direct`: each reading is checked against the spec;
 * - `clearance`: per position a bore and a journal reading; clearance = bore − journal (diametral);
 * - `journal`: per position diameters at planes A/B and angles 0°/90°; each diameter against the
 *   spec, taper (along) and out-of-round (around) against their own maxima;
 * - `valve-shim`: per valve the measured clearance and the installed shim; the spec is the
 *   clearance, and a stocked shim is chosen.
 */
export const measureMethod = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('direct') }),
  z.object({ kind: z.literal('clearance') }),
  z.object({ kind: z.literal('journal'), maxTaper: finite.min(0), maxOutOfRound: finite.min(0) }),
  z.object({
    kind: z.literal('valve-shim'),
    /** Shim sizes the shop stocks, in the step's unit: a list or a range with a step. */
    stock: z.union([
      z.object({ kind: z.literal('list'), sizes: z.array(positive).min(1) }),
      z.object({ kind: z.literal('range'), from: positive, to: positive, step: positive }),
    ]),
  }),
]);
export type MeasureMethod = z.infer<typeof measureMethod>;

export const cautionSeverity = z.enum(['notice', 'caution', 'warning', 'danger']);
export const hazard = z.enum(HAZARDS);
export type Hazard = z.infer<typeof hazard>;
export const disposition = z.enum(DISPOSITIONS);
export type Disposition = z.infer<typeof disposition>;
export const role = z.enum(ROLES);
export type Role = z.infer<typeof role>;

const base = {
  /** Stable within a procedure across revisions; used by compare and by the run log. */
  id: z.string().min(1).max(40),
  title: label(160),
  body,
  /** Section heading the step sits under (e.g. "Cylinder head"); empty for none. */
  section: z.string().trim().max(80).default(''),
  /** Hazards this step involves; each shows its usual caution in the runner. */
  hazards: z.array(hazard).default([]),
};

export const actionStep = z.object({ ...base, kind: z.literal('action'), tools: z.array(label(80)).default([]), photoRequired: z.boolean().default(false) });
export const fastenerSequenceStep = z.object({
  ...base,
  kind: z.literal('fastener-sequence'),
  direction: z.enum(['loosen', 'tighten']),
  map: fastenerMap,
  passes: z.array(pass).min(1, 'Add at least one pass').max(10),
  /** Final torque that `percent` passes are stages of; required when any pass is a percentage. */
  finalTorque: torqueQuantity.optional(),
  threadCondition: threadCondition.default('engine-oil'),
  /** Torque-to-yield fasteners are never reused: the sequence adds them to the parts to replace. */
  torqueToYield: z.boolean().default(false),
  fastenerPart: z.string().trim().max(120).default(''),
});
export const torqueStep = z.object({ ...base, kind: z.literal('torque'), target: torqueQuantity, angleDegrees: finite.min(0).max(720).optional(), fastenerLabel: z.string().trim().max(80).default('') });
export const measureStep = z.object({
  ...base,
  kind: z.literal('measure'),
  unit: z.union([lengthUnit, torqueUnit, angleUnit]),
  spec,
  instrument,
  positions: z.array(label(40)).min(1).max(64),
  method: measureMethod,
});
export const tagPartStep = z.object({
  ...base,
  kind: z.literal('tag-part'),
  partName: label(120),
  positions: z.array(label(40)).min(1).max(64),
  bin: z.string().trim().max(60).default(''),
  photoRequired: z.boolean().default(true),
  defaultDisposition: disposition.default('reuse'),
});
export const inspectStep = z.object({ ...base, kind: z.literal('inspect'), lookFor: z.array(label(120)).default([]) });
export const cautionStep = z.object({ ...base, kind: z.literal('caution'), severity: cautionSeverity, mustAcknowledge: z.boolean().default(true) });
export const holdPointStep = z.object({ ...base, kind: z.literal('hold-point'), signers: z.array(role).min(1).default(['reviewer']) });
export const replaceStep = z.object({
  ...base,
  kind: z.literal('replace'),
  parts: z.array(z.object({ part: label(120), quantity: z.number().int().min(1).max(999), note: z.string().trim().max(200).default('') })).min(1),
});

export const step = z.discriminatedUnion('kind', [
  actionStep, fastenerSequenceStep, torqueStep, measureStep, tagPartStep, inspectStep, cautionStep, holdPointStep, replaceStep,
]);
export type Step = z.infer<typeof step>;
export type StepKind = Step['kind'];
export type StepOf<K extends StepKind> = Extract<Step, { kind: K }>;
export const STEP_KINDS = ['action', 'fastener-sequence', 'torque', 'measure', 'tag-part', 'inspect', 'caution', 'hold-point', 'replace'] as const satisfies readonly StepKind[];

export const procedureKind = z.enum(['teardown', 'assembly', 'inspection']);

/** The editable body of a revision: what a draft holds and a release freezes. */
export const revisionContent = z
  .object({
    steps: z.array(step).max(1000),
  })
  .superRefine((c, ctx) => {
    const seen = new Set<string>();
    c.steps.forEach((s, i) => {
      if (seen.has(s.id)) ctx.addIssue({ code: 'custom', message: `Step id "${s.id}" is used twice`, path: ['steps', i, 'id'] });
      seen.add(s.id);
      if (s.kind === 'fastener-sequence' && s.passes.some((p) => p.kind === 'percent') && !s.finalTorque)
        ctx.addIssue({ code: 'custom', message: 'Percentage passes need a final torque', path: ['steps', i, 'finalTorque'] });
    });
  });
export type RevisionContent = z.infer<typeof revisionContent>;
