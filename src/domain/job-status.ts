/**
 * A job's status flow: which moves are allowed, who may make each, and what starting or
 * finishing a run does to the job. Pure; the API enforces it and the desk views ask it.
 */
import type { Role } from './procedure/schema';

export const JOB_STATUSES = ['open', 'teardown', 'at-machine-shop', 'assembly', 'awaiting-signoff', 'closed'] as const;
export type JobStatus = (typeof JOB_STATUSES)[number];

export const JOB_STATUS_LABELS: Record<JobStatus, string> = {
  open: 'Open',
  teardown: 'Teardown',
  'at-machine-shop': 'At machine shop',
  assembly: 'Assembly',
  'awaiting-signoff': 'Awaiting sign-off',
  closed: 'Closed',
};

type Move = { from: JobStatus; to: JobStatus; by: readonly Role[]; why: string };

const DESK: readonly Role[] = ['lead', 'owner'];
const BENCH: readonly Role[] = ['technician', 'lead', 'owner'];
const SIGNERS: readonly Role[] = ['reviewer', 'owner'];

/** Every allowed move. Forward moves follow the work; back-steps undo a move or send work back. */
export const JOB_MOVES: readonly Move[] = [
  { from: 'open', to: 'teardown', by: BENCH, why: 'teardown starts' },
  { from: 'teardown', to: 'at-machine-shop', by: DESK, why: 'parts go to the machine shop' },
  { from: 'teardown', to: 'assembly', by: DESK, why: 'no machine work needed' },
  { from: 'at-machine-shop', to: 'assembly', by: DESK, why: 'machined parts are back' },
  { from: 'assembly', to: 'awaiting-signoff', by: BENCH, why: 'the build is finished' },
  { from: 'awaiting-signoff', to: 'closed', by: SIGNERS, why: 'the work is signed off' },
  // Back-steps.
  { from: 'teardown', to: 'open', by: DESK, why: 'teardown was started by mistake' },
  { from: 'at-machine-shop', to: 'teardown', by: DESK, why: 'more teardown is needed' },
  { from: 'assembly', to: 'at-machine-shop', by: DESK, why: 'a part goes back to the machine shop' },
  { from: 'awaiting-signoff', to: 'assembly', by: ['reviewer', 'lead', 'owner'], why: 'the work is sent back' },
  { from: 'closed', to: 'awaiting-signoff', by: ['owner'], why: 'a closed job is reopened' },
];

const ROLE_WORDS: Record<Role, string> = { owner: 'an owner', lead: 'a lead', technician: 'a technician', reviewer: 'a reviewer' };
const whoOf = (roles: readonly Role[]) => roles.map((r) => ROLE_WORDS[r]).join(' or ');

/** What the job-level checks need besides the two statuses. */
export type JobFacts = { activeRuns: number };

export type JobMoveResult = { ok: true } | { ok: false; code: 'out-of-order' | 'not-allowed'; message: string };

/** Whether a member in `role` may move a job from `from` to `to`, with a message for a person when not. */
export function checkJobMove(from: JobStatus, to: JobStatus, role: Role, facts: JobFacts = { activeRuns: 0 }): JobMoveResult {
  const label = (s: JobStatus) => JOB_STATUS_LABELS[s].toLowerCase();
  if (from === to) return { ok: false, code: 'out-of-order', message: `The job is already ${label(to)}.` };
  const move = JOB_MOVES.find((m) => m.from === from && m.to === to);
  if (!move) {
    const options = JOB_MOVES.filter((m) => m.from === from).map((m) => label(m.to));
    return { ok: false, code: 'out-of-order', message: `A job cannot go from ${label(from)} to ${label(to)}; from ${label(from)} it can go to ${options.join(' or ')}.` };
  }
  if (!move.by.includes(role)) return { ok: false, code: 'not-allowed', message: `Only ${whoOf(move.by)} may move a job from ${label(from)} to ${label(to)}.` };
  if (to === 'closed' && facts.activeRuns > 0) {
    return { ok: false, code: 'out-of-order', message: `The job still has ${facts.activeRuns} unfinished run${facts.activeRuns === 1 ? '' : 's'}; finish ${facts.activeRuns === 1 ? 'it' : 'them'} before closing the job.` };
  }
  return { ok: true };
}

/** The statuses a member in `role` may move the job to now (for the desk's buttons). */
export function nextJobStatuses(from: JobStatus, role: Role, facts: JobFacts = { activeRuns: 0 }): JobStatus[] {
  return JOB_MOVES.filter((m) => m.from === from && checkJobMove(from, m.to, role, facts).ok).map((m) => m.to);
}

/** Whether runs may be started on a job in this status (not once it waits for sign-off or is closed). */
export const acceptsNewRuns = (status: JobStatus): boolean => status !== 'closed' && status !== 'awaiting-signoff';

/** The job's status once a run starts on it: an open job goes into teardown, others stay. */
export const statusOnRunStart = (status: JobStatus): JobStatus => (status === 'open' ? 'teardown' : status);

/** The job's status once one of its runs completes: a finished build waits for sign-off. */
export const statusOnRunComplete = (status: JobStatus, facts: JobFacts): JobStatus =>
  status === 'assembly' && facts.activeRuns === 0 ? 'awaiting-signoff' : status;

/** The job's status when a reviewer or lead sends a run's work back: a job waiting for sign-off returns to assembly. */
export const statusOnRunReopen = (status: JobStatus): JobStatus => (status === 'awaiting-signoff' ? 'assembly' : status);
