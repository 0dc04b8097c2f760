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

export const entities = [ShopSettings, Procedure, ProcedureRevision, Job, JobAssignment, Run, RunEvent, Signature, ShareLink, ShareView, OutgoingMessage];
export { ShopSettings };
export { Procedure, ProcedureRevision };
export { Job, JobAssignment, Run, RunEvent };
export { Signature, ShareLink, ShareView, OutgoingMessage };
