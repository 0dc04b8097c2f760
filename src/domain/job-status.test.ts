import { describe, expect, it } from 'vitest';
import type { Role } from './procedure/schema';
import { JOB_STATUSES, acceptsNewRuns, checkJobMove, nextJobStatuses, statusOnRunComplete, statusOnRunReopen, statusOnRunStart, type JobStatus } from './job-status';

const ROLES: Role[] = ['owner', 'lead', 'technician', 'reviewer'];

// from, to, roles that may make the move (every other role is refused with not-allowed).
const ALLOWED: Array<[JobStatus, JobStatus, Role[]]> = [
  ['open', 'teardown', ['technician', 'lead', 'owner']],
  ['teardown', 'at-machine-shop', ['lead', 'owner']],
  ['teardown', 'assembly', ['lead', 'owner']],
  ['at-machine-shop', 'assembly', ['lead', 'owner']],
  ['assembly', 'awaiting-signoff', ['technician', 'lead', 'owner']],
  ['awaiting-signoff', 'closed', ['reviewer', 'owner']],
  ['teardown', 'open', ['lead', 'owner']],
  ['at-machine-shop', 'teardown', ['lead', 'owner']],
  ['assembly', 'at-machine-shop', ['lead', 'owner']],
  ['awaiting-signoff', 'assembly', ['reviewer', 'lead', 'owner']],
  ['closed', 'awaiting-signoff', ['owner']],
];

describe.each(ALLOWED)('%s → %s', (from, to, by) => {
  it.each(ROLES)('as %s', (role) => {
    const r = checkJobMove(from, to, role);
    if (by.includes(role)) expect(r).toEqual({ ok: true });
    else expect(r).toMatchObject({ ok: false, code: 'not-allowed', message: expect.stringMatching(/^Only /) });
  });
});

const allowedPairs = new Set(ALLOWED.map(([f, t]) => `${f}>${t}`));
const REFUSED = JOB_STATUSES.flatMap((from) => JOB_STATUSES.filter((to) => to !== from && !allowedPairs.has(`${from}>${to}`)).map((to) => [from, to] as const));

describe('moves outside the flow', () => {
  it('leaves some pairs to refuse', () => expect(REFUSED.length).toBeGreaterThan(10));
  it.each(REFUSED)('%s → %s is out of order for every role, naming where the job can go', (from, to) => {
    for (const role of ROLES) {
      const r = checkJobMove(from, to, role);
      expect(r.ok).toBe(false);
      if (!r.ok) {
        expect(r.code).toBe('out-of-order');
        expect(r.message).toContain('can go to');
      }
    }
  });
  it.each(JOB_STATUSES)('staying at %s is refused', (s) => {
    expect(checkJobMove(s, s, 'owner')).toMatchObject({ ok: false, code: 'out-of-order', message: expect.stringContaining('already') });
  });
});

describe('closing', () => {
  it('is refused while runs are unfinished', () => {
    expect(checkJobMove('awaiting-signoff', 'closed', 'reviewer', { activeRuns: 2 })).toMatchObject({ ok: false, code: 'out-of-order', message: expect.stringContaining('2 unfinished runs') });
    expect(checkJobMove('awaiting-signoff', 'closed', 'reviewer', { activeRuns: 0 })).toEqual({ ok: true });
  });
});

describe('nextJobStatuses', () => {
  it.each([
    ['teardown', 'lead', ['at-machine-shop', 'assembly', 'open']],
    ['teardown', 'technician', []],
    ['awaiting-signoff', 'reviewer', ['closed', 'assembly']],
    ['open', 'reviewer', []],
  ] as Array<[JobStatus, Role, JobStatus[]]>)('from %s as %s', (from, role, expected) => {
    expect(nextJobStatuses(from, role)).toEqual(expected);
  });
});

describe('run effects', () => {
  it.each([
    ['open', 'teardown'],
    ['teardown', 'teardown'],
    ['assembly', 'assembly'],
  ] as Array<[JobStatus, JobStatus]>)('a run starting on a %s job leaves it %s', (s, expected) => expect(statusOnRunStart(s)).toBe(expected));
  it.each([
    ['assembly', 0, 'awaiting-signoff'],
    ['assembly', 1, 'assembly'],
    ['teardown', 0, 'teardown'],
    ['awaiting-signoff', 0, 'awaiting-signoff'],
  ] as Array<[JobStatus, number, JobStatus]>)('a run completing on a %s job with %i others active leaves it %s', (s, activeRuns, expected) => {
    expect(statusOnRunComplete(s, { activeRuns })).toBe(expected);
  });
  it.each([
    ['open', true],
    ['assembly', true],
    ['awaiting-signoff', false],
    ['closed', false],
  ] as Array<[JobStatus, boolean]>)('new runs on a %s job: %s', (s, ok) => expect(acceptsNewRuns(s)).toBe(ok));
  it.each([
    ['awaiting-signoff', 'assembly'],
    ['teardown', 'teardown'],
  ] as Array<[JobStatus, JobStatus]>)('work sent back on a %s job leaves it %s', (s, expected) => expect(statusOnRunReopen(s)).toBe(expected));
});
