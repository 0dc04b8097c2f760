/**
 * Which states a procedure is in, from its revisions, for the list's status filter (server and
 * table use this one rule). A procedure can be in two at once: released, with a draft open.
 */
export const PROCEDURE_STATES = ['released', 'draft', 'retired'] as const;
export type ProcedureState = (typeof PROCEDURE_STATES)[number];

export interface RevisionTally {
  latestReleased: unknown | null;
  draft: unknown | null;
  revisionCount: number;
}

/** `released` when some revision is released, `draft` when a draft is open, `retired` when every revision is retired. */
export function procedureStates(p: RevisionTally): ProcedureState[] {
  const out: ProcedureState[] = [];
  if (p.latestReleased) out.push('released');
  if (p.draft) out.push('draft');
  if (!p.latestReleased && !p.draft && p.revisionCount > 0) out.push('retired');
  return out;
}

/** Whether a procedure matches a status filter; no filter matches every procedure. */
export function matchesState(p: RevisionTally, state: ProcedureState | null | undefined): boolean {
  return !state || procedureStates(p).includes(state);
}
