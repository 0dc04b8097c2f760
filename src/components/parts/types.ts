/** DTOs the parts pages and islands receive (type-only imports of the server's shapes). */
export type { AttachmentDto, UploadScope } from '../../server/services/uploads.service';
export type { TagDto, TagHistoryDto } from '../../server/services/tags.service';
export type { FindingDto } from '../../server/services/findings.service';
export type { PartsListDto } from '../../server/services/parts-list.service';
export type { PartsRow } from '../../domain/parts-list';
