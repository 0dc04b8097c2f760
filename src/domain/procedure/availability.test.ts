import { describe, expect, it } from 'vitest';
import { matchesState, procedureStates } from './availability';

const rel = { id: 'r', number: 1 };
const dr = { id: 'd' };

describe.each([
  { name: 'released only', p: { latestReleased: rel, draft: null, revisionCount: 1 }, states: ['released'] },
  { name: 'released with an open draft', p: { latestReleased: rel, draft: dr, revisionCount: 2 }, states: ['released', 'draft'] },
  { name: 'a first draft', p: { latestReleased: null, draft: dr, revisionCount: 1 }, states: ['draft'] },
  { name: 'every revision retired', p: { latestReleased: null, draft: null, revisionCount: 3 }, states: ['retired'] },
  { name: 'no revisions at all', p: { latestReleased: null, draft: null, revisionCount: 0 }, states: [] },
])('procedureStates: $name', ({ p, states }) => {
  it('lists the states', () => expect(procedureStates(p)).toEqual(states));
  it('matches exactly those filters, and no filter', () => {
    for (const s of ['released', 'draft', 'retired'] as const) expect(matchesState(p, s)).toBe(states.includes(s));
    expect(matchesState(p, null)).toBe(true);
  });
});
