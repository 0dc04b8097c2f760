/** What the jobs pages hand their islands: the server's DTOs (type-only) and small lists. */
export type { JobDto, JobSummaryDto, JobRunDto, PersonDto } from '../../server/services/jobs.service';
import type { ShopRole } from '../../lib/access';

export type MemberOption = { id: string; name: string; role: ShopRole };
/** A released revision a run can start from. */
export type RevisionOption = { id: string; label: string };
