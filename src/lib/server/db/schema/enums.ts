import { pgEnum } from 'drizzle-orm/pg-core';
// One list of lot states and transport modes, shared with the forms and the API (relative import:
// drizzle-kit reads this file without SvelteKit's aliases).
import { LAST_DIRECTIONS, LOT_STATUSES, TRANSPORTS } from '../../../schemas/lot';

export const roleEnum = pgEnum('role', ['buyer', 'inspector', 'quality', 'supplier', 'admin']);
export const organisationKindEnum = pgEnum('organisation_kind', ['own', 'supplier']);
export const lotStatusEnum = pgEnum('lot_status', LOT_STATUSES);
export const transportEnum = pgEnum('transport_mode', TRANSPORTS);
export const lastDirectionEnum = pgEnum('last_direction', LAST_DIRECTIONS);
export const documentKindEnum = pgEnum('document_kind', ['coc', 'un38_3_summary', 'sds', 'other', 'corrective_action']);
export const severityEnum = pgEnum('inspection_severity', ['normal', 'tightened', 'reduced', 'discontinued']);
export const dispositionEnum = pgEnum('disposition', ['pending', 'accept', 'hold', 'reject']);
export const noticeStatusEnum = pgEnum('notice_status', ['pending', 'sent', 'failed']);
export const readingSourceEnum = pgEnum('reading_source', ['keyboard', 'import', 'api']);
