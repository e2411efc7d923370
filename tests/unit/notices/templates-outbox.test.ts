/** Notice bodies and the outbox retry schedule (pure functions, no database). */
import { describe, expect, it } from 'vitest';
import { renderNotice, noticeCautions, type NoticeInput } from '../../../src/lib/server/mail/templates';
import { noticeMessageId, outboxOptionsFromEnv } from '../../../src/lib/server/mail/outbox';

const base: NoticeInput = {
	kind: 'hold',
	status: 'on_hold',
	companyName: 'Kestrel Mobility Ltd',
	supplierName: 'Voltaria Cells Co.',
	lotCode: 'L-2026-00042',
	poNumber: 'PO-77',
	partNumber: 'VC-21700-50G',
	partDescription: 'NMC cell',
	quantity: 100,
	transport: 'air',
	lithium: true,
	safety: false,
	reasons: ['Missing: UN 38.3 test summary.'],
	decisionReason: null,
	disposition: null,
	dueDate: null,
	nonconforming: [],
	rule: null,
	portalUrl: 'http://127.0.0.1:3000/portal/lots/x'
};

describe('notice templates', () => {
	it('names lot, PO, part and disposition in subject, text and HTML', () => {
		const n = renderNotice(base);
		expect(n.subject).toBe('Inspection result: lot L-2026-00042 ON HOLD (PO PO-77, VC-21700-50G)');
		for (const body of [n.text, n.html]) {
			expect(body).toContain('L-2026-00042');
			expect(body).toContain('PO-77');
			expect(body).toContain('ON HOLD');
			expect(body).toContain('Missing: UN 38.3 test summary.');
			expect(body).toContain(base.portalUrl);
		}
	});

	it('escapes HTML in supplier-visible text', () => {
		const n = renderNotice({ ...base, kind: 'override', status: 'rejected', decisionReason: '<script>x</script> & more' });
		expect(n.html).not.toContain('<script>x</script>');
		expect(n.html).toContain('&lt;script&gt;x&lt;/script&gt; &amp; more');
		expect(n.subject).toMatch(/^Quality decision: lot L-2026-00042 REJECTED/);
	});

	it('adds lithium handling and DG cautions to holds and rejects only', () => {
		// 30 % SOC for Li-ion shipped alone by air: IATA DGR PI 965 (from memory).
		expect(noticeCautions(base).join(' ')).toMatch(/no more than 30 % SOC/);
		expect(noticeCautions(base).join(' ')).toMatch(/must not be recharged/);
		expect(noticeCautions({ ...base, status: 'accepted' })).toEqual([]);
		expect(noticeCautions({ ...base, lithium: false })).toEqual([]);
		expect(renderNotice({ ...base, status: 'accepted', kind: 'accept' }).text).not.toContain('Handling cautions');
	});
});

describe('notices after a material disposition', () => {
	const rejected: NoticeInput = {
		...base,
		kind: 'override',
		status: 'rejected',
		decisionReason: 'Two cells deep-discharged; the lot goes back.',
		disposition: 'return_to_supplier',
		dueDate: '2026-12-18',
		nonconforming: [
			{ serial: 'VC1865-013-000123', ocvV: 2.412, reason: 'rested below its minimum safe voltage (deep discharge)' },
			{ serial: 'VC1865-013-000124', ocvV: null, reason: 'outside the part’s voltage window' }
		],
		rule: 'Sampling by attributes, normal inspection, level II, AQL 1: code letter F, sample of 20, accept with 0 or fewer nonconforming units, reject with 1 or more (ISO 2859-1:1999, Table I and Table II-A).'
	};

	it('lists each nonconforming unit with serial, value and reason, and the rule with its source', () => {
		const n = renderNotice(rejected);
		for (const body of [n.text, n.html]) {
			expect(body).toContain('VC1865-013-000123: 2.412 V, rested below its minimum safe voltage (deep discharge)');
			expect(body).toContain('VC1865-013-000124: no reading, outside the part’s voltage window');
			expect(body).toContain('ISO 2859-1:1999, Table I and Table II-A');
		}
	});

	it('names the disposition and asks for action with the due date, never "No action"', () => {
		const n = renderNotice(rejected);
		expect(n.subject).toBe('Quality decision: lot L-2026-00042 REJECTED (return to supplier) (PO PO-77, VC-21700-50G)');
		const asks = n.text.slice(n.text.indexOf('What we ask of you:'), n.text.indexOf('Handling cautions:'));
		expect(asks).toContain('Arrange the return shipment with our buyer');
		expect(asks).toContain('by 2026-12-18.');
		expect(asks).not.toMatch(/No action/);
		expect(n.text).toContain('Reply due by: 2026-12-18');
		for (const disposition of ['use_as_is', 'sort_rework', 'scrap'] as const) {
			const text = renderNotice({ ...rejected, disposition }).text;
			expect(text).not.toMatch(/No action/);
			expect(text).toContain('Send a corrective-action report');
		}
	});

	it('a release asks nothing and says so', () => {
		const n = renderNotice({ ...rejected, status: 'accepted', disposition: 'release', dueDate: null, nonconforming: [] });
		expect(n.text).toContain('No action is needed');
		expect(n.text).not.toContain('Reply due by');
	});
});

describe('outbox settings', () => {
	it('reads its poll interval and attempt budget from the environment with safe defaults', () => {
		expect(outboxOptionsFromEnv({})).toMatchObject({ pollMs: 2000, maxAttempts: 12 });
		expect(outboxOptionsFromEnv({ OUTBOX_POLL_MS: '150', OUTBOX_MAX_ATTEMPTS: '1' })).toMatchObject({ pollMs: 150, maxAttempts: 1 });
		expect(outboxOptionsFromEnv({ OUTBOX_POLL_MS: 'nonsense', OUTBOX_MAX_ATTEMPTS: '0.5' })).toMatchObject({
			pollMs: 2000,
			maxAttempts: 12
		});
	});

	it('gives every notice one deterministic Message-ID', () => {
		expect(noticeMessageId('abc')).toBe('<notice-abc@restvolt.local>');
	});
});
