/**
 * The large shop the bench measures: a 500-step, a 300-step and a 5-step procedure (fastener
 * sequences on 64-fastener maps, the rest simple actions), 200 jobs, and runs to read and post to.
 * Everything goes through the app's own API as the demo lead, as a shop would create it.
 * Invented example data, not a maker's specification.
 */
import { rowsLayout } from '../../src/domain/fastener-layouts';
import { expandPasses } from '../../src/domain/passes';
import type { Step } from '../../src/domain/procedure/schema';
import { step as stepSchema } from '../../src/domain/procedure/schema';
import type { RunEventInput } from '../../src/domain/run';
import { ok } from './http';

const NOTE = "Example data — not a maker's specification";

function procedureSteps(total: number, sequences: number): Step[] {
  const steps: Step[] = [];
  for (let i = 0; i < total; i++) {
    const id = `s${String(i + 1).padStart(3, '0')}`;
    if (i < sequences) {
      steps.push(stepSchema.parse({
        id, kind: 'fastener-sequence', title: `Loosen girdle bolts, group ${i + 1}`, body: NOTE, direction: 'loosen',
        map: { fasteners: rowsLayout(32, 2), order: [], orderMethod: 'reverse-centre-out' },
        passes: [{ kind: 'loosen', degrees: 90 }, { kind: 'remove' }],
      }));
    } else {
      steps.push(stepSchema.parse({ id, kind: 'action', title: `Bench task ${i + 1}`, body: NOTE }));
    }
  }
  return steps;
}

/** The events a technician sends to work the steps in order (no actor: the server adds it). */
export function happyPath(steps: Step[]): Array<Omit<RunEventInput, 'actor'>> {
  const out: Array<Omit<RunEventInput, 'actor'>> = [];
  for (const s of steps) {
    out.push({ type: 'step.start', stepId: s.id } as never);
    if (s.kind === 'fastener-sequence') {
      for (const a of expandPasses(s)) out.push({ type: 'fastener.confirm', stepId: s.id, pass: a.pass, fastenerId: a.fastenerId } as never);
    } else out.push({ type: 'step.complete', stepId: s.id } as never);
  }
  return out;
}

async function releasedProcedure(lead: string, name: string, steps: Step[]) {
  const created = await ok(lead, 'POST', '/api/procedures', { name, kind: 'teardown', engineFamily: 'Bench family', description: NOTE });
  const draft = await ok(lead, 'PUT', `/api/revisions/${created.draft.id}/content`, { steps, version: created.draft.version });
  const released = await ok(lead, 'POST', `/api/revisions/${draft.id}/release`, { note: 'bench' });
  return { procedureId: created.procedure.id as string, revisionId: released.id as string, draftId: undefined as string | undefined, steps };
}

export type LargeShop = Awaited<ReturnType<typeof seedLargeShop>>;

export async function seedLargeShop(lead: string, technicianId: string, opts: { jobs: number; postRuns: number }) {
  const p500 = await releasedProcedure(lead, 'Bench 500-step teardown', procedureSteps(500, 12));
  const p5 = await releasedProcedure(lead, 'Bench 5-step teardown', procedureSteps(5, 1));
  const p300 = await releasedProcedure(lead, 'Bench 300-step teardown', procedureSteps(300, 8));
  const p300draft = await ok(lead, 'POST', `/api/procedures/${p300.procedureId}/drafts`, { fromRevisionId: p300.revisionId });
  const jobIds: string[] = [];
  for (let i = 0; i < opts.jobs; i++) {
    const job = await ok(lead, 'POST', '/api/jobs', { unitDescription: `Bench unit ${i + 1}`, serial: `BN-${1000 + i}`, hoursOrOdometer: `${1000 + i} h`, customer: 'Bench customer', notes: NOTE, technicianIds: [technicianId] });
    jobIds.push(job.id);
  }
  const run = async (jobId: string, revisionId: string) => (await ok(lead, 'POST', `/api/jobs/${jobId}/runs`, { revisionId })).run.id as string;
  const read500 = await run(jobIds[0]!, p500.revisionId);
  const read5 = await run(jobIds[1]!, p5.revisionId);
  const postRuns: string[] = [];
  for (let i = 0; i < opts.postRuns; i++) postRuns.push(await run(jobIds[2 + i]!, p500.revisionId));
  const basePostRuns: string[] = [];
  for (let i = 0; i < opts.postRuns; i++) basePostRuns.push(await run(jobIds[2 + opts.postRuns + i]!, p500.revisionId));
  return { p500, p5, p300, p300DraftId: p300draft.id as string, jobIds, read500, read5, postRuns, basePostRuns };
}
