/** The shapes the editor receives from the page and the revisions API: the services' DTOs. */
export type { RevisionDto, RevisionSummaryDto, ProcedureDto, CompareDto } from '../../server/services/procedure-dto';
import type { RevisionSummaryDto } from '../../server/services/procedure-dto';

/** "Revision 3", or "Draft" before a draft has a number. */
export const revisionName = (r: Pick<RevisionSummaryDto, 'number' | 'status'>) => (r.number != null ? `Revision ${r.number}` : 'Draft');
