/**
 * A small invented procedure for the job and run integration tests, made through the
 * procedures service as the editor would: an action, a 3-fastener 2-pass loosening sequence
 * and a reviewer's hold point. Example data — not a maker's specification.
 */
import { randomUUID } from 'node:crypto';
import type { MikroORM } from '@mikro-orm/postgresql';
import { importProcedure, releaseRevision, retireRevision, startDraft } from '../../src/server/services/procedures.service';
import type { TestShop } from './support/shops';

export const ORDER = ['b2', 'b1', 'b3'];

export const smallProcedureFile = (key: string) => ({
  schemaVersion: 1,
  procedure: { key, name: `Demo cover teardown ${key}`, kind: 'teardown', engineFamily: 'Invented test engine', description: "Example data — not a maker's specification" },
  revision: {
    note: 'Test revision',
    steps: [
      { id: 's-clean', kind: 'action', title: 'Clean around the cover' },
      {
        id: 's-bolts', kind: 'fastener-sequence', title: 'Loosen the cover bolts', direction: 'loosen',
        map: { fasteners: [{ id: 'b1', label: '1', x: 100, y: 100 }, { id: 'b2', label: '2', x: 300, y: 100 }, { id: 'b3', label: '3', x: 500, y: 100 }], order: ORDER, orderMethod: 'manual' },
        passes: [{ kind: 'loosen', degrees: 90 }, { kind: 'remove' }],
      },
      { id: 's-review', kind: 'hold-point', title: 'Cover removal review' },
    ],
  },
});

const actorOf = (shop: TestShop) => ({ shopId: shop.id, userId: shop.members.lead.userId, role: 'lead' as const });

/** A released revision of the small procedure in the shop; with `retire`, a retired one (and `draftId`, a newer draft). */
export async function releasedRevision(orm: MikroORM, shop: TestShop): Promise<{ revisionId: string; draftId: string; procedureId: string }> {
  const em = orm.em.fork();
  const { procedure, draft } = await importProcedure(em, actorOf(shop), smallProcedureFile(`cover-${randomUUID().slice(0, 8)}`));
  await releaseRevision(em, actorOf(shop), draft.id);
  const next = await startDraft(orm.em.fork(), actorOf(shop), procedure.id, draft.id);
  return { revisionId: draft.id, draftId: next.id, procedureId: procedure.id };
}

export async function retire(orm: MikroORM, shop: TestShop, revisionId: string): Promise<void> {
  await retireRevision(orm.em.fork(), actorOf(shop), revisionId);
}
