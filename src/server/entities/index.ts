/** Every MikroORM entity of the app, listed explicitly (see mikro-orm.config.ts). */
import { ShopSettings } from './shop-settings.entity';
import { Procedure } from './procedure.entity';
import { ProcedureRevision } from './revision.entity';
import { Job } from './job.entity';
import { JobAssignment } from './job-assignment.entity';
import { Run } from './run.entity';
import { RunEvent } from './run-event.entity';
import { Signature } from './signature.entity';
import { ShareLink } from './share-link.entity';
import { ShareView } from './share-view.entity';
import { OutgoingMessage } from './outgoing-message.entity';
import { Attachment } from './attachment.entity';
import { Tag } from './tag.entity';
import { TagHistory } from './tag-history.entity';
import { Finding } from './finding.entity';
import { PartsListOverride } from './parts-list-override.entity';

export const entities = [ShopSettings, Procedure, ProcedureRevision, Job, JobAssignment, Run, RunEvent, Signature, ShareLink, ShareView, OutgoingMessage, Attachment, Tag, TagHistory, Finding, PartsListOverride];
export { ShopSettings };
export { Procedure, ProcedureRevision };
export { Job, JobAssignment, Run, RunEvent };
export { Signature, ShareLink, ShareView, OutgoingMessage };
export { Attachment, Tag, TagHistory, Finding, PartsListOverride };
