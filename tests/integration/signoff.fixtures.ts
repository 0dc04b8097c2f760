/**
 * An invented teardown for the sign-off and report tests, made through the procedures service:
 * clean, measure two clearances, tag two caps, a reviewer's hold point, then a last action.
 * Example data — not a maker's specification.
 */
import { randomUUID } from 'node:crypto';
import type { MikroORM } from '@mikro-orm/postgresql';
import { importProcedure, releaseRevision } from '../../src/server/services/procedures.service';
import type { TestShop } from './support/shops';

export const signoffProcedureFile = (key: string, kind: 'teardown' | 'assembly' = 'teardown') => ({
  schemaVersion: 1,
  procedure: { key, name: `Demo bottom end ${key}`, kind, engineFamily: 'Invented test engine', description: "Example data — not a maker's specification" },
  revision: {
    note: 'Test revision',
    steps: [
      { id: 's-clean', kind: 'action', title: 'Clean the block' },
      {
        id: 's-bearing', kind: 'measure', title: 'Main bearing clearance', unit: 'mm',
        spec: { nominal: 0.05, min: 0.03, max: 0.07, unit: 'mm' }, instrument: { name: 'Bore gauge', resolution: 0.001 },
        positions: ['M1', 'M2'], method: { kind: 'clearance' },
      },
      { id: 's-tag', kind: 'tag-part', title: 'Tag the main caps', partName: 'Main bearing cap', positions: ['M1', 'M2'], bin: 'B-7' },
      { id: 's-hold', kind: 'hold-point', title: 'Bottom end review' },
      { id: 's-last', kind: 'action', title: 'Cover the block' },
    ],
  },
});

/** Events before the hold point, with the role that sends each. */
export const BEFORE_HOLD: Array<Record<string, unknown>> = [
  { type: 'step.start', stepId: 's-clean' },
  { type: 'step.complete', stepId: 's-clean', note: 'Degreased' },
  { type: 'step.start', stepId: 's-bearing' },
  { type: 'reading.enter', stepId: 's-bearing', key: 'M1/bore', value: 60.046 },
  { type: 'reading.enter', stepId: 's-bearing', key: 'M1/journal', value: 60.0 },
  { type: 'reading.enter', stepId: 's-bearing', key: 'M2/bore', value: 60.052 },
  { type: 'reading.enter', stepId: 's-bearing', key: 'M2/journal', value: 60.001 },
  { type: 'measure.submit', stepId: 's-bearing' },
  { type: 'step.start', stepId: 's-tag' },
  { type: 'step.complete', stepId: 's-tag', tags: [{ position: 'M1', disposition: 'reuse', bin: 'B-7' }, { position: 'M2', disposition: 'replace', bin: 'B-7' }] },
];
export const AFTER_HOLD: Array<Record<string, unknown>> = [
  { type: 'step.start', stepId: 's-last' },
  { type: 'step.complete', stepId: 's-last' },
];

export async function releasedSignoffRevision(orm: MikroORM, shop: TestShop, kind: 'teardown' | 'assembly' = 'teardown'): Promise<string> {
  const actor = { shopId: shop.id, userId: shop.members.lead.userId, role: 'lead' as const };
  const { draft } = await importProcedure(orm.em.fork(), actor, signoffProcedureFile(`bottom-${randomUUID().slice(0, 8)}`, kind));
  await releaseRevision(orm.em.fork(), actor, draft.id);
  return draft.id;
}
