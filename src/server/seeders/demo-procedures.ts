/**
 * Demo procedures: every file in procedures/*.json imported into the demo shop and its
 * revision 1 released by the lead, teardowns first so the assembly can point at its source.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { join } from 'node:path';
import type { EntityManager as CoreEntityManager } from '@mikro-orm/core';
import type { EntityManager } from '@mikro-orm/postgresql';
import { Procedure } from '../entities';
import { importProcedure, releaseRevision } from '../services/procedures.service';
import type { DemoContext } from './demo-steps';

const DIR = fileURLToPath(new URL('../../../procedures/', import.meta.url));
const ORDER = { teardown: 0, inspection: 1, assembly: 2 } as const;

export async function seedDemoProcedures(coreEm: CoreEntityManager, ctx: DemoContext): Promise<void> {
  const em = coreEm as EntityManager;
  const lead = ctx.users.lead;
  if (!lead) throw new Error('The demo has no lead to release its procedures');
  const actor = { shopId: ctx.shopId, userId: lead, role: 'lead' as const };
  const files = readdirSync(DIR)
    .filter((n) => n.endsWith('.json'))
    .map((n) => ({ name: n, json: JSON.parse(readFileSync(join(DIR, n), 'utf8')) as { procedure?: { kind?: keyof typeof ORDER } } }))
    .sort((x, y) => (ORDER[x.json.procedure?.kind ?? 'inspection'] ?? 1) - (ORDER[y.json.procedure?.kind ?? 'inspection'] ?? 1) || x.name.localeCompare(y.name));
  const teardownRevisions = new Map<string, string>(); // engine family → released teardown revision id
  for (const f of files) {
    const { procedure, draft } = await importProcedure(em, actor, f.json);
    const released = await releaseRevision(em, actor, draft.id);
    if (procedure.kind === 'teardown') teardownRevisions.set(procedure.engineFamily, released.id);
    const source = procedure.kind === 'assembly' ? teardownRevisions.get(procedure.engineFamily) : undefined;
    if (source) await em.nativeUpdate(Procedure, { id: procedure.id }, { derivedFromRevisionId: source });
  }
}
