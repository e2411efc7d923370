import { z } from 'zod';
import { text } from './fields';

/** Quality resumes discontinued inspection: why (the accepted corrective action). */
export const resumeSchema = z.object({
	reason: text({ error: 'Say why inspection may resume', multiline: true })
		.trim()
		.min(10, 'Describe the accepted corrective action (at least 10 characters)')
		.max(2000, 'At most 2,000 characters')
});
