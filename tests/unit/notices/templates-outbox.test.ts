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
