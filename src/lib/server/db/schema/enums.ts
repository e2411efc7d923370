import { pgEnum } from 'drizzle-orm/pg-core';

export const roleEnum = pgEnum('role', ['buyer', 'inspector', 'quality', 'supplier', 'admin']);
export const organisationKindEnum = pgEnum('organisation_kind', ['own', 'supplier']);
export const lotStatusEnum = pgEnum('lot_status', [
	'draft',
	'awaiting_arrival',
	'in_inspection',
	'pending_decision',
	'accepted',
	'on_hold',
	'rejected',
	'cancelled'
]);
export const transportEnum = pgEnum('transport_mode', ['air', 'sea', 'road', 'rail']);
export const documentKindEnum = pgEnum('document_kind', [
	'coc',
	'un38_3_summary',
	'sds',
	'other',
	'corrective_action'
]);
export const severityEnum = pgEnum('inspection_severity', ['normal', 'tightened', 'reduced', 'discontinued']);
export const dispositionEnum = pgEnum('disposition', ['pending', 'accept', 'hold', 'reject']);
export const noticeStatusEnum = pgEnum('notice_status', ['pending', 'sent', 'failed']);
export const readingSourceEnum = pgEnum('reading_source', ['keyboard', 'import', 'api']);
