/** GET /api/v1/readings (serial trace) and the /trace page: one exact serial, or a prefix. */
import { z } from 'zod';
import { fromText, text, wholeNumber } from './fields';
import { blankAsMissing } from './lot';

export const TRACE_LIMIT_MAX = 500;
/** A prefix shorter than this would match much of a large database and tell nobody anything. */
export const TRACE_PREFIX_MIN = 3;

const limitMessage = `limit must be a whole number from 1 to ${TRACE_LIMIT_MAX}`;

export const traceQuerySchema = z
	.object({
		serial: blankAsMissing(text().trim().min(1).max(64, 'serial is at most 64 characters')).describe('Exact serial number of a unit'),
		serial_prefix: blankAsMissing(
			text()
				.trim()
				.min(TRACE_PREFIX_MIN, `serial_prefix needs at least ${TRACE_PREFIX_MIN} characters`)
				.max(64, 'serial_prefix is at most 64 characters')
		).describe('The start of serial numbers (at least 3 characters)'),
		limit: z.preprocess(
			(v) => (v === '' || v === undefined ? 100 : v),
			fromText(wholeNumber(limitMessage).min(1, limitMessage).max(TRACE_LIMIT_MAX, limitMessage), { whole: true })
		)
	})
	.refine((q) => (q.serial === undefined) !== (q.serial_prefix === undefined), {
		message: 'Give either serial (exact) or serial_prefix, not both and not neither',
		path: ['serial']
	});

export type TraceQuery = z.infer<typeof traceQuerySchema>;
