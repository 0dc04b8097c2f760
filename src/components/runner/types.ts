/** The run as the page and the API hand it to the runner: the server's own DTOs (type-only imports). */
import type { Role } from '../../domain/procedure/schema';
export type { RunDto, StoredEventDto, RecordedDto, RunInfoDto } from '../../server/services/runs.service';

/** The signed-in member viewing the run. */
export type Viewer = { userId: string; name: string; role: Role };

/** Units the shop prefers to read targets in; the other unit is shown beside. */
export type PreferredUnits = { torque: string; length: string };
