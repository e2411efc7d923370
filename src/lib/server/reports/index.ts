export type { ReportData, ReportReason, ReportSignature, ReportUnit, TagData } from './types';
export { renderInspectionReport } from './pdf';
export { renderQuarantineTag } from './quarantine-tag';
export { lotReadingsXlsx, lotListXlsx, type LotListRow } from './xlsx';
