/**
 * An invented teardown procedure for the run machine's tests: one step of every kind, a
 * 10-fastener 2-pass loosening sequence. Example data, not a maker's specification.
 */
import { step, type Role, type Step } from '../procedure/schema';
import type { RunActor, RunEvent, RunEventInput } from './run-events';
import { runEvent } from './run-events';

export const tech: RunActor = { userId: 'u-tech', role: 'technician' };
export const tech2: RunActor = { userId: 'u-tech-2', role: 'technician' };
export const lead: RunActor = { userId: 'u-lead', role: 'lead' };
export const lead2: RunActor = { userId: 'u-lead-2', role: 'lead' };
export const owner: RunActor = { userId: 'u-owner', role: 'owner' };
export const reviewer: RunActor = { userId: 'u-rev', role: 'reviewer' };
export const actorOf = (role: Role): RunActor => ({ userId: `u-${role}`, role });

const ids = ['h1', 'h2', 'h3', 'h4', 'h5', 'h6', 'h7', 'h8', 'h9', 'h10'];
/** Fixed work order so expectations don't depend on the order generator. */
export const HEAD_ORDER = ['h7', 'h2', 'h9', 'h4', 'h1', 'h10', 'h5', 'h8', 'h3', 'h6'];

const S = (input: unknown): Step => step.parse(input);

export const cautionStep = S({ id: 'c-cool', kind: 'caution', title: 'Let the engine cool before opening the cooling system', severity: 'warning', hazards: ['hot-fluid'] });
export const coverStep = S({ id: 'a-cover', kind: 'action', title: 'Remove the rocker cover' });
export const headBoltStep = S({
  id: 'f-head',
  kind: 'fastener-sequence',
  title: 'Loosen and remove the head bolts',
  direction: 'loosen',
  map: { fasteners: ids.map((id, i) => ({ id, label: String(i + 1), x: 100 + (i % 5) * 150, y: i < 5 ? 100 : 300 })), order: HEAD_ORDER, orderMethod: 'manual' },
  passes: [{ kind: 'loosen', degrees: 90 }, { kind: 'remove' }],
});
export const liftStep = S({ id: 'a-lift', kind: 'action', title: 'Lift the cylinder head off with the hoist', hazards: ['lifting'] });
export const tagStep = S({ id: 't-caps', kind: 'tag-part', title: 'Tag the main bearing caps', partName: 'Main bearing cap', positions: ['Main 1', 'Main 2'], bin: 'B-4' });
export const measureStep = S({
  id: 'm-main',
  kind: 'measure',
  title: 'Measure main journal diameter',
  body: "Example data — not a maker's specification",
  unit: 'mm',
  spec: { nominal: 60, min: 59.98, max: 60.02, unit: 'mm' },
  instrument: { name: 'Outside micrometer 50–75 mm', resolution: 0.001 },
  positions: ['Main 1', 'Main 2'],
  method: { kind: 'direct' },
});
export const inspectStep = S({ id: 'i-deck', kind: 'inspect', title: 'Inspect the deck for cracks', lookFor: ['cracks', 'erosion near coolant ports'] });
export const holdStep = S({ id: 'h-review', kind: 'hold-point', title: 'Teardown review' });
export const torqueStep = S({ id: 'q-pump', kind: 'torque', title: 'Torque the oil pump bolts', target: { value: 25, unit: 'N·m' } });
export const replaceStep = S({ id: 'r-bolts', kind: 'replace', title: 'Order new head bolts', parts: [{ part: 'Head bolt', quantity: 10 }] });

/** The whole invented procedure, in order. */
export const PROCEDURE: Step[] = [cautionStep, coverStep, headBoltStep, liftStep, tagStep, measureStep, inspectStep, holdStep, torqueStep, replaceStep];

/** Parse an event as the API would (defaults applied). */
export const ev = (input: RunEventInput): RunEvent => runEvent.parse(input);

/** Confirm events for a sequence, in the given order, pass by pass. */
export const confirmAll = (stepId: string, order: string[], passes: number, actor: RunActor = tech): RunEvent[] =>
  Array.from({ length: passes }, (_, p) => order.map((fastenerId) => ev({ type: 'fastener.confirm', stepId, actor, pass: p + 1, fastenerId }))).flat();

/** Events up to (not including) the first event on `stepId`, along the happy path of FULL_LOG. */
export const logUntil = (stepId: string): RunEvent[] => {
  const i = FULL_LOG.findIndex((e) => e.stepId === stepId);
  return FULL_LOG.slice(0, i < 0 ? FULL_LOG.length : i);
};

/**
 * A whole run of PROCEDURE: main 2 is read under its minimum, the technician asks for a
 * deviation and a lead approves it; the reviewer signs the hold point.
 */
export const FULL_LOG: RunEvent[] = [
  ev({ type: 'caution.acknowledge', stepId: 'c-cool', actor: tech }),
  ev({ type: 'step.start', stepId: 'a-cover', actor: tech }),
  ev({ type: 'step.complete', stepId: 'a-cover', actor: tech }),
  ev({ type: 'step.start', stepId: 'f-head', actor: tech }),
  ...confirmAll('f-head', HEAD_ORDER, 2),
  ev({ type: 'step.start', stepId: 'a-lift', actor: tech, hazards: ['lifting'] }),
  ev({ type: 'step.complete', stepId: 'a-lift', actor: tech2, note: 'Two-person lift with the shop hoist' }),
  ev({ type: 'step.start', stepId: 't-caps', actor: tech }),
  ev({
    type: 'step.complete',
    stepId: 't-caps',
    actor: tech,
    tags: [
      { position: 'Main 1', disposition: 'reuse', bin: 'B-4' },
      { position: 'Main 2', disposition: 'machine-shop' },
    ],
  }),
  ev({ type: 'step.start', stepId: 'm-main', actor: tech }),
  ev({ type: 'reading.enter', stepId: 'm-main', actor: tech, key: 'Main 1', value: 60.004 }),
  ev({ type: 'reading.enter', stepId: 'm-main', actor: tech, key: 'Main 2', value: 59.95 }),
  ev({ type: 'measure.submit', stepId: 'm-main', actor: tech }),
  ev({ type: 'deviation.request', stepId: 'm-main', actor: tech, kind: 'out-of-spec', reason: 'Crank goes to the machine shop for regrind' }),
  ev({ type: 'deviation.approve', stepId: 'm-main', actor: lead }),
  ev({ type: 'step.start', stepId: 'i-deck', actor: tech }),
  ev({ type: 'step.complete', stepId: 'i-deck', actor: tech, note: 'No cracks found' }),
  ev({ type: 'hold.sign', stepId: 'h-review', actor: reviewer, meaning: 'Teardown checked against the procedure' }),
  ev({ type: 'step.start', stepId: 'q-pump', actor: tech }),
  ev({ type: 'torque.confirm', stepId: 'q-pump', actor: tech, applied: { value: 25, unit: 'N·m' } }),
  ev({ type: 'step.complete', stepId: 'q-pump', actor: tech }),
  ev({ type: 'step.start', stepId: 'r-bolts', actor: tech }),
  ev({ type: 'step.complete', stepId: 'r-bolts', actor: lead }),
];
