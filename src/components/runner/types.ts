/** The run as the API and the page hand it to the runner (plain JSON, as runs.service returns it). */
import type { Role, Step } from '../../domain/procedure/schema';
import type { RunEvent } from '../../domain/run';

export type EventActorDto = { id: string; name: string; role: Role };

/** One entry of the run's append-only log. */
export type StoredEventDto = {
  seq: number;
  type: string;
  payload: RunEvent;
  actor: EventActorDto;
  device?: string | null;
  recordedAt: string;
};

export type RunInfoDto = {
  id: string;
  jobId: string;
  jobCode: string;
  revisionId: string;
  procedureName: string;
  revisionNumber: number;
  status: string;
  lastSeq: number;
  createdAt: string;
};

export type RunDto = { run: RunInfoDto; steps: Step[]; events: StoredEventDto[]; next?: unknown; progress?: unknown };

/** The signed-in member viewing the run. */
export type Viewer = { userId: string; name: string; role: Role };

/** Units the shop prefers to read targets in; the other unit is shown beside. */
export type PreferredUnits = { torque: string; length: string };

/** The answer to POST /api/runs/:id/events. */
export type RecordedDto = { event: StoredEventDto; lastSeq: number };
