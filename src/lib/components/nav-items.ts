import type { Role } from '$lib/roles';

export interface NavItem {
	href: string;
	label: string;
}

/** Navigation per role: each role sees the places where its work is, in the order it does it. */
export const NAV: Record<Role, NavItem[]> = {
	buyer: [
		{ href: '/lots', label: 'Lots' },
		{ href: '/lots/new', label: 'Register lot' },
		{ href: '/parts', label: 'Parts' },
		{ href: '/suppliers', label: 'Suppliers' },
		{ href: '/models', label: 'OCV models' }
	],
	inspector: [
		{ href: '/inspect', label: 'Receiving bench' },
		{ href: '/lots', label: 'Lots' },
		{ href: '/models', label: 'OCV models' }
	],
	quality: [
		{ href: '/review', label: 'Hold review' },
		{ href: '/lots', label: 'Lots' },
		{ href: '/parts', label: 'Parts' },
		{ href: '/suppliers', label: 'Suppliers' },
		{ href: '/models', label: 'OCV models' }
	],
	admin: [
		{ href: '/admin/users', label: 'People' },
		{ href: '/admin/organisations', label: 'Organisations' },
		{ href: '/admin/tokens', label: 'API tokens' },
		{ href: '/admin/outbox', label: 'Mail outbox' },
		{ href: '/admin/webhooks', label: 'Webhooks' },
		{ href: '/models', label: 'OCV models' }
	],
	supplier: [{ href: '/portal', label: 'Our lots & notices' }]
};

export const ROLE_LABEL: Record<Role, string> = {
	buyer: 'Buyer',
	inspector: 'Receiving inspector',
	quality: 'Quality manager',
	supplier: 'Supplier',
	admin: 'Administrator'
};
