// The lot page's sampling card writes large numbers one way (format.ts count: thousands separators).
// ISO 2859-1:1999 Table I: a lot above 500,000 units at level II is code letter Q, n = 1,250 (Table 2-A).
import { render } from 'svelte/server';
import { describe, expect, it } from 'vitest';
import LotSampling from '../../src/routes/(app)/lots/[id=uuid]/lot-sampling.svelte';
import { samplingView } from '../../src/routes/(app)/lots/[id=uuid]/sampling';

describe('lot sampling card', () => {
	it('shows a sample of 1,250 and a lot of 600,000 units with thousands separators', () => {
		const sampling = samplingView(600_000, 1, 'II', 'normal');
		expect(sampling.plan).toMatchObject({ code_letter: 'Q', sample_size: 1250 });
		const body = render(LotSampling, { props: { sampling, quantity: 600_000 } }).body;
		expect(body).toContain('1,250');
		expect(body).toContain('600,000\u00a0units'); // a no-break space between number and unit
		expect(body).not.toMatch(/>1250</);
	});
});
