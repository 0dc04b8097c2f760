/**
 * The revision a run is pinned to: only a released revision of the member's shop may start a
 * run; a run keeps reading its revision after it is retired. Released content never changes,
 * so its parsed steps are cached by revision id (one array per revision, which also lets the
 * run machine be built once per revision): procedures.service's cached content supplies them.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Step } from '../../domain/procedure/schema';
import { ProcedureRevision } from '../entities';
import { AppError, notFound } from '../http';
import { getReleasedRevisionContent } from './procedures.service';

export type PinnedRevision = { id: string; procedureId: string; procedureName: string; procedureKey: string; number: number; status: 'released' | 'retired'; steps: Step[] };

async function load(em: EntityManager, shopId: string, revisionId: string) {
  // The content column (large for long procedures) comes from the released-content cache instead.
  const rev = await em.findOne(ProcedureRevision, { id: revisionId, shopId }, { populate: ['procedure'], exclude: ['content'] });
  if (!rev) throw notFound('That procedure revision');
  return rev;
}

/** The revision a new run may start on: released (404 for another shop's, 409 for a draft or retired one). */
export async function revisionForNewRun(em: EntityManager, shopId: string, revisionId: string): Promise<PinnedRevision> {
  const rev = await load(em, shopId, revisionId);
  if (rev.status === 'draft') throw new AppError('conflict', 'This revision is still a draft; release it before starting a run on it.');
  if (rev.status === 'retired') throw new AppError('conflict', `Revision ${rev.number} of "${rev.procedure.name}" is retired; start the run on the current released revision.`);
  return toPinned(em, rev);
}

/** The revision an existing run is pinned to (released or since retired). */
export async function pinnedRevision(em: EntityManager, shopId: string, revisionId: string): Promise<PinnedRevision> {
  const rev = await load(em, shopId, revisionId);
  if (rev.status === 'draft') throw new AppError('internal', 'A run points at a draft revision.');
  return toPinned(em, rev);
}

async function toPinned(em: EntityManager, rev: Awaited<ReturnType<typeof load>>): Promise<PinnedRevision> {
  const { steps } = await getReleasedRevisionContent(em, rev.shopId, rev.id);
  return {
    id: rev.id,
    procedureId: rev.procedure.id,
    procedureName: rev.procedure.name,
    procedureKey: rev.procedure.key,
    number: rev.number ?? 0,
    status: rev.status as 'released' | 'retired',
    steps,
  };
}
