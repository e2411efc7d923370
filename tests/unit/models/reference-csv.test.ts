// Reading pasted reference curves (the model page's parser, shared by the browser preview and the save action).
import { describe, expect, it } from 'vitest';
import { parseReferenceCsv } from '../../../src/routes/(app)/models/[code]/reference-csv';

describe('parseReferenceCsv', () => {
	it('reads SOC in % with a header, and sorts by SOC', () => {
		const parsed = parseReferenceCsv('SOC (%),OCV (V)\n50,3.70\n0,3.00\n100,4.18\n');
		expect(parsed.socUnit).toBe('percent');
		expect(parsed.errors).toEqual([]);
		expect(parsed.points).toEqual([
			{ soc: 0, ocv_v: 3.0 },
			{ soc: 0.5, ocv_v: 3.7 },
			{ soc: 1, ocv_v: 4.18 }
		]);
	});

	it('reads SOC as a fraction when no value is above 1', () => {
		const parsed = parseReferenceCsv('0.0, 3.00\n0.5, 3.70\n1.0, 4.18');
		expect(parsed.socUnit).toBe('fraction');
		expect(parsed.points.map((p) => p.soc)).toEqual([0, 0.5, 1]);
	});

	it('accepts semicolons or tabs with decimal commas, spaces, and # comments', () => {
		expect(parseReferenceCsv('10;3,45\n20;3,52 # from the datasheet').points).toEqual([
			{ soc: 0.1, ocv_v: 3.45 },
			{ soc: 0.2, ocv_v: 3.52 }
		]);
		expect(parseReferenceCsv('10\t3,45').points).toEqual([{ soc: 0.1, ocv_v: 3.45 }]);
		expect(parseReferenceCsv('10 3.45\n20   3.52').points).toHaveLength(2);
	});

	it('reports unreadable lines and out-of-range values with their line or point', () => {
		const parsed = parseReferenceCsv('soc,ocv\n10,3.4\n20,three\n130,3.9\n40,-1');
		expect(parsed.errors).toContain('line 3: expected two numbers "soc,ocv_v"');
		expect(parsed.errors).toContain('point 2: SOC must be within 0–100 % (or 0–1)');
		expect(parsed.errors).toContain('point 3: OCV must be a positive voltage');
	});

	it('gives nothing for text without numbers', () => {
		expect(parseReferenceCsv('no curve here\n\n')).toEqual({ points: [], socUnit: null, errors: [] });
	});
});
