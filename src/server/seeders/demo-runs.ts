/**
 * Demo jobs and runs on the invented TT-4D engine: one job part-way through its teardown and
 * one whose build waits only for the reviewer's final sign-off. Every event is produced for
 * the step in front of it and checked by the run machine (`applyEvent`), so the stored logs
 * replay like real ones. Readings are example data, not a maker's specification.
 */
import type { EntityManager as CoreEntityManager } from '@mikro-orm/core';
import type { EntityManager } from '@mikro-orm/postgresql';
import { randomUUID } from 'node:crypto';
import type { StepOf } from '../../domain/procedure/schema';
import { applyEvent, fastenerProgress, measureDetail, runPhase, startRun, storeRun, type RunActor, type RunEventInput, type RunSnapshot } from '../../domain/run';
import { Job, Procedure, ProcedureRevision, Run, RunEvent } from '../entities';
import type { Member } from '../guards';
import type { ShopRole } from '../../lib/access';
import { changeJobStatus, createJob } from '../services/jobs.service';
import { refreshRunSummary, startJobRun } from '../services/runs.service';
import { DEMO_MEMBERS } from './demo-people';
import type { DemoContext } from './demo-steps';

type Actors = Record<'technician' | 'lead' | 'reviewer', RunActor>;

/** An invented in-spec reading for one slot (slot index varies it a little). */
function demoReading(step: StepOf<'measure'>, part: string, i: number): number {
  const { nominal, min, max } = step.spec;
  const jitter = (((i * 7) % 5) - 2) / 4; // -0.5 … +0.5
  const near = (centre: number, span: number) => Number((centre + jitter * span).toFixed(4));
  switch (part) {
    case 'journal': return 70;
    case 'bore': return near(70 + nominal, (max - min) / 4);
    case 'A0': case 'A90': case 'B0': case 'B90': {
      const limit = Math.min(step.method.kind === 'journal' ? step.method.maxTaper ?? 0.01 : 0.01, step.method.kind === 'journal' ? step.method.maxOutOfRound ?? 0.01 : 0.01);
      return Number((nominal + ['A0', 'A90', 'B0', 'B90'].indexOf(part) * limit / 8).toFixed(4));
    }
    case 'shim': return 2.5;
    default: return near(nominal, (max - min) / 4);
  }
}

const DISPOSITIONS = ['reuse', 'reuse', 'machine-shop', 'reuse', 'replace'] as const;

/** The event that moves this run on by one, as the person at the bench (or desk) would send it; null when complete. */
export function nextDemoEvent(snapshot: RunSnapshot, actors: Actors): RunEventInput | null {
  const { context } = snapshot;
  const step = context.steps[context.cursor];
  const phase = runPhase(snapshot);
  if (!step || phase === 'complete') return null;
  const head = { stepId: step.id, actor: actors.technician };
  if (phase === 'deviationPending') return { type: 'deviation.approve', stepId: step.id, actor: actors.lead, note: 'Accepted; the part goes to the machine shop' };
  if (phase === 'outOfSpec') return { type: 'deviation.request', ...head, kind: 'out-of-spec', reason: 'Out of the example limits; sending to the machine shop' };
  if (phase === 'ready') {
    if (step.kind === 'hold-point') {
      const signer = step.signers.includes('reviewer') ? actors.reviewer : actors.lead;
      return { type: 'hold.sign', stepId: step.id, actor: signer, meaning: `Checked "${step.title}" against the procedure` };
    }
    if (step.kind === 'caution') return step.mustAcknowledge ? { type: 'caution.acknowledge', ...head } : { type: 'step.complete', ...head };
    return { type: 'step.start', ...head, hazards: step.hazards };
  }
  switch (step.kind) {
    case 'fastener-sequence': {
      const next = fastenerProgress(snapshot, step.id)?.next;
      return next ? { type: 'fastener.confirm', ...head, pass: next.pass, fastenerId: next.fastenerId } : { type: 'step.complete', ...head };
    }
    case 'measure': {
      const detail = measureDetail(snapshot, step.id);
      const slots = detail?.slots ?? [];
      const i = slots.findIndex((s) => detail?.readings[s.key] === undefined);
      const slot = slots[i];
      return slot ? { type: 'reading.enter', ...head, key: slot.key, value: demoReading(step, slot.part, i) } : { type: 'measure.submit', ...head };
    }
    case 'torque': {
      const applied = context.records[context.cursor]?.applied;
      return applied ? { type: 'step.complete', ...head } : { type: 'torque.confirm', ...head, applied: step.target };
    }
    case 'tag-part':
      return { type: 'step.complete', ...head, tags: step.positions.map((position, i) => ({ position, disposition: DISPOSITIONS[i % DISPOSITIONS.length]!, bin: `Bin ${String.fromCharCode(65 + (i % 6))}` })) };
    case 'inspect':
      return { type: 'step.complete', ...head, note: 'Nothing found beyond normal wear (demo note)' };
    default:
      return { type: 'step.complete', ...head };
  }
}

type Target = { untilStepId?: string; stopAfterConfirms?: number; startAt: Date };

/** Appends valid events to a run's log until it reaches the target; returns the events stored. */
async function advance(em: EntityManager, runId: string, steps: Parameters<typeof startRun>[0], actors: Actors, target: Target): Promise<number> {
  const run = await em.findOneOrFail(Run, { id: runId });
  let snapshot = startRun(steps);
  let seq = 0;
  let confirmsInTarget = 0;
  for (;;) {
    const step = snapshot.context.steps[snapshot.context.cursor];
    if (target.untilStepId && step?.id === target.untilStepId && (target.stopAfterConfirms ?? 0) <= confirmsInTarget) break;
    const input = nextDemoEvent(snapshot, actors);
    if (!input) break;
    const result = applyEvent(steps, storeRun(snapshot), input);
    if (!result.ok) throw new Error(`Demo run refused at ${step?.id}: ${result.message}`);
    if (step?.id === target.untilStepId && input.type === 'fastener.confirm') confirmsInTarget++;
    seq++;
    em.create(RunEvent, {
      run, seq, type: result.event.type, payload: result.event, actorId: result.event.actor.userId, actorRole: result.event.actor.role,
      device: result.event.actor.role === 'technician' ? 'Bench tablet 1' : 'Office desk', idempotencyKey: randomUUID(),
      recordedAt: new Date(target.startAt.getTime() + seq * 90_000), clientAt: null,
    });
    snapshot = result.snapshot;
  }
  run.lastSeq = seq;
  await em.flush();
  return seq;
}

async function releasedOf(em: EntityManager, shopId: string, key: string) {
  const procedure = await em.findOneOrFail(Procedure, { shopId, key });
  const revision = await em.findOneOrFail(ProcedureRevision, { procedure, status: 'released' }, { orderBy: { number: 'desc' } });
  return revision.id;
}

const DAY = 86_400_000;

/** Seeds the two demo jobs (after the demo procedures are released). */
export async function seedDemoRuns(coreEm: CoreEntityManager, ctx: DemoContext): Promise<void> {
  const em = coreEm as EntityManager;
  const member = (role: ShopRole): Member => {
    const p = DEMO_MEMBERS.find((m) => m.role === role)!;
    return { userId: ctx.users[role]!, name: p.name, email: p.email, shopId: ctx.shopId, shopName: '', role };
  };
  const lead = member('lead');
  const tech = member('technician');
  const actors: Actors = { technician: { userId: tech.userId, role: 'technician' }, lead: { userId: lead.userId, role: 'lead' }, reviewer: { userId: ctx.users.reviewer!, role: 'reviewer' } };
  const teardownId = await releasedOf(em, ctx.shopId, 'teardown-demo-diesel');
  const assemblyId = await releasedOf(em, ctx.shopId, 'assembly-demo-diesel');
  const now = Date.now();
  const assign = { technicianIds: [tech.userId], reviewerId: actors.reviewer.userId };

  // 1. Part-way: the teardown run stops in the rocker pedestal sequence, pass 1.
  const partWay = await createJob(em, lead, {
    ...assign, unitDescription: 'TT-4D demo diesel, 4-cylinder (invented engine)', serial: 'TT4D-DEMO-0412', hoursOrOdometer: '8 412 h',
    customer: 'Stillwater Orchard Co-op (invented)', notes: 'Demo job. Low compression on cylinder 3 reported by the customer. Example data — not a maker\'s specification.',
  });
  const partWayRun = await startJobRun(em, tech, partWay.id, teardownId);
  const teardownSteps = partWayRun.steps;
  await advance(em, partWayRun.run.id, teardownSteps, actors, { untilStepId: 'td-11-rocker-pedestal-bolts', stopAfterConfirms: 3, startAt: new Date(now - 2 * DAY) });
  await em.nativeUpdate(Job, { id: partWay.id }, { createdAt: new Date(now - 3 * DAY) });

  // 2. Awaiting sign-off: teardown complete, machine shop done, build complete but for the final sign-off.
  const waiting = await createJob(em, lead, {
    ...assign, unitDescription: 'TT-4D demo diesel, 4-cylinder, generator set (invented engine)', serial: 'TT4D-DEMO-0977', hoursOrOdometer: '12 960 h',
    customer: 'Harrow Point Marina (invented)', notes: 'Demo job. Full rebuild after a coolant leak. Example data — not a maker\'s specification.',
  });
  const teardownRun = await startJobRun(em, tech, waiting.id, teardownId);
  await advance(em, teardownRun.run.id, teardownSteps, actors, { startAt: new Date(now - 12 * DAY) });
  await changeJobStatus(em, lead, waiting.id, 'at-machine-shop');
  await changeJobStatus(em, lead, waiting.id, 'assembly');
  const buildRun = await startJobRun(em, tech, waiting.id, assemblyId);
  await advance(em, buildRun.run.id, buildRun.steps, actors, { untilStepId: 'as-33-build-sign-off', startAt: new Date(now - 4 * DAY) });
  await changeJobStatus(em, tech, waiting.id, 'awaiting-signoff');
  await em.nativeUpdate(Job, { id: waiting.id }, { createdAt: new Date(now - 13 * DAY) });

  // Keep the runs' list fields (status, progress, next) in step with their logs.
  for (const runId of [partWayRun.run.id, teardownRun.run.id, buildRun.run.id]) await refreshRunSummary(em, ctx.shopId, runId);
}
