import { error } from '@sveltejs/kit';
import { can } from '$lib/server/policy';
import { getDb } from '$lib/server/db';
import { listSuppliers } from '$lib/server/services/suppliers';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	if (!can(locals.user, 'supplier:read')) error(403, 'Your role may not read suppliers');
	const suppliers = await listSuppliers(getDb());
	return {
		suppliers: suppliers.map((s) => ({
			id: s.id,
			name: s.name,
			country: s.country,
			partCount: s.partCount,
			contacts: s.contacts.length,
			noticeContacts: s.contacts.filter((c) => c.receivesNotices).length
		}))
	};
};
