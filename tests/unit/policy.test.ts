/**
 * Role × action matrix for `can()`, written out from issue 5's role list (source: the issue text,
 * quoted per role below). Where the issue is silent, the row says "policy's choice" so a reader
 * can tell a requirement from a decision. Every cell is checked, allowed and refused alike.
 */
import { describe, expect, it } from 'vitest';
import { can, type Action, type Role, type SessionUser } from '../../src/lib/server/policy';

const OWN = '00000000-0000-4000-8000-000000000001';
const SUPPLIER_A = '00000000-0000-4000-8000-00000000000a';
const SUPPLIER_B = '00000000-0000-4000-8000-00000000000b';

const ACTIONS: Action[] = [
	'lot:read',
	'lot:create',
	'lot:edit',
	'lot:cancel',
	'document:upload',
	'document:read',
	'reading:write',
	'lot:submit',
	'lot:decide',
	'review:read',
	'part:read',
	'part:edit',
	'part:limits',
	'supplier:read',
	'supplier:edit',
	'model:read',
	'model:fit',
	'model:approve',
	'notice:read',
	'notice:acknowledge',
	'scorecard:read',
	'report:read',
	'electrochem:use',
	'sampling:resume',
	'admin:users',
	'admin:orgs',
	'admin:tokens',
	'admin:outbox',
	'self:read'
];

/** Reads of the receiving company's data that the issue gives buyers ("read everything of the own company"). */
const COMPANY_READS: Action[] = [
	'lot:read',
	'document:read',
	'part:read',
	'supplier:read',
	'model:read',
	'notice:read',
	'scorecard:read',
	'report:read'
];

const ALLOWED: Record<Role, Action[]> = {
	// "buyer: create and edit lots and parts, upload lot documents, read everything of the own company,
	//  cancel a lot before inspection". supplier:edit and electrochem:use: policy's choice.
	buyer: [
		...COMPANY_READS,
		'lot:create',
		'lot:edit',
		'part:edit',
		'document:upload',
		'lot:cancel',
		'supplier:edit',
		'electrochem:use',
		'self:read'
	],
	// "inspector: record readings and import measurement files on lots in inspection, read lots".
	// Submitting the readings is part of recording them; the other reads: policy's choice.
	inspector: [...COMPANY_READS, 'reading:write', 'lot:submit', 'electrochem:use', 'self:read'],
	// "quality: everything an inspector can read, release or reject held lots, edit part acceptance
	//  limits and sampling settings, approve model versions". lot:submit and model:fit: policy's choice.
	quality: [
		...COMPANY_READS,
		'review:read',
		'lot:decide',
		'part:limits',
		'sampling:resume',
		'model:approve',
		'model:fit',
		'lot:submit',
		'electrochem:use',
		'self:read'
	],
	// "supplier: read only its own organisation's lots, dispositions, reports and notices; acknowledge a notice
	//  and attach a response".
	supplier: ['lot:read', 'document:read', 'report:read', 'notice:read', 'notice:acknowledge', 'self:read'],
	// "admin: manage users, organisations and API tokens; no quality decisions". Outbox and the
	// calculator: policy's choice.
	admin: ['admin:users', 'admin:orgs', 'admin:tokens', 'admin:outbox', 'electrochem:use', 'self:read']
};

const person = (role: Role, organisationId: string): SessionUser => ({
	id: `user-${role}`,
	email: `${role}@example.test`,
	name: null,
	role,
	organisationId
});

const staff = (role: Exclude<Role, 'supplier'>) => person(role, OWN);

describe('role × action matrix (staff, on the receiving company’s things)', () => {
	for (const role of ['buyer', 'inspector', 'quality', 'admin'] as const) {
		for (const action of ACTIONS) {
			const allowed = ALLOWED[role].includes(action);
			it(`${role} ${allowed ? 'may' : 'may not'} ${action}`, () => {
				expect(can(staff(role), action, { supplierId: SUPPLIER_A })).toBe(allowed);
				expect(can(staff(role), action)).toBe(allowed);
			});
		}
	}
});

describe('role × action matrix (supplier, on its own organisation’s things)', () => {
	const supplier = person('supplier', SUPPLIER_A);
	for (const action of ACTIONS) {
		const allowed = ALLOWED.supplier.includes(action);
		it(`supplier ${allowed ? 'may' : 'may not'} ${action} on its own`, () => {
			expect(can(supplier, action, { supplierId: SUPPLIER_A })).toBe(allowed);
		});
	}
});

describe('supplier isolation', () => {
	const supplierA = person('supplier', SUPPLIER_A);
	const resourceActions = ALLOWED.supplier.filter((a) => a !== 'self:read');

	it.each(resourceActions)('supplier A may not %s on supplier B’s things', (action) => {
		expect(can(supplierA, action, { supplierId: SUPPLIER_A })).toBe(true);
		expect(can(supplierA, action, { supplierId: SUPPLIER_B })).toBe(false);
	});

	it.each(resourceActions)('a supplier may not %s on something that names no supplier (deny by default)', (action) => {
		expect(can(supplierA, action)).toBe(false);
		expect(can(supplierA, action, { supplierId: null })).toBe(false);
	});

	it('a supplier user without an organisation sees nothing', () => {
		const orphan = { ...person('supplier', SUPPLIER_A), organisationId: null };
		expect(can(orphan, 'lot:read', { supplierId: SUPPLIER_A })).toBe(false);
		expect(can(orphan, 'lot:read', { supplierId: null })).toBe(false);
	});
});

describe('cross-role rules from the issue', () => {
	it('nobody anonymous may do anything', () => {
		for (const action of ACTIONS) expect(can(null, action, { supplierId: SUPPLIER_A })).toBe(false);
	});

	it('quality may read everything an inspector may read', () => {
		const inspectorReads = ACTIONS.filter((a) => a.endsWith(':read') && can(staff('inspector'), a));
		expect(inspectorReads.length).toBeGreaterThan(3);
		for (const action of inspectorReads) expect(can(staff('quality'), action)).toBe(true);
	});

	it('only quality takes quality decisions (release/reject, limits, sampling, model approval)', () => {
		const decisions: Action[] = ['lot:decide', 'part:limits', 'sampling:resume', 'model:approve'];
		for (const role of ['buyer', 'inspector', 'admin'] as const) {
			for (const action of decisions) expect(can(staff(role), action)).toBe(false);
		}
		for (const action of decisions) expect(can(staff('quality'), action)).toBe(true);
	});

	it('only admins manage users, organisations and tokens', () => {
		const adminActions: Action[] = ['admin:users', 'admin:orgs', 'admin:tokens'];
		for (const role of ['buyer', 'inspector', 'quality'] as const) {
			for (const action of adminActions) expect(can(staff(role), action)).toBe(false);
		}
		for (const action of adminActions) expect(can(person('supplier', SUPPLIER_A), action, { supplierId: SUPPLIER_A })).toBe(false);
	});

	it('suppliers never write lots, parts or readings, even their own', () => {
		const supplier = person('supplier', SUPPLIER_A);
		for (const action of ['lot:create', 'lot:edit', 'lot:cancel', 'reading:write', 'part:edit', 'lot:decide'] as Action[]) {
			expect(can(supplier, action, { supplierId: SUPPLIER_A })).toBe(false);
		}
	});
});
