/**
 * Who may do what. Every load, action and API handler asks `can(user, action, resource)`;
 * anything not listed here is denied. Suppliers only ever see their own organisation.
 */
import type { Role, SessionUser } from '$lib/roles';

export type { Role, SessionUser };
export { ROLES } from '$lib/roles';

export type Action =
	| 'lot:read'
	| 'lot:create'
	| 'lot:edit'
	| 'lot:cancel'
	| 'document:upload'
	| 'document:read'
	| 'reading:write'
	| 'lot:submit'
	| 'lot:decide'
	| 'review:read'
	| 'part:read'
	| 'part:edit'
	| 'part:limits'
	| 'supplier:read'
	| 'supplier:edit'
	| 'model:read'
	| 'model:fit'
	| 'model:approve'
	| 'notice:read'
	| 'notice:acknowledge'
	| 'scorecard:read'
	| 'report:read'
	| 'electrochem:use'
	| 'sampling:resume'
	| 'admin:users'
	| 'admin:orgs'
	| 'admin:tokens'
	| 'admin:outbox'
	| 'admin:webhooks'
	| 'self:read';

/** Actions about the signed-in person themself: every role, no resource needed. */
const SELF_ACTIONS: readonly Action[] = ['self:read'];

/** What each role may do, before resource checks. */
const GRANTS: Record<Role, readonly Action[]> = {
	buyer: [
		'lot:read',
		'lot:create',
		'lot:edit',
		'lot:cancel',
		'document:upload',
		'document:read',
		'part:read',
		'part:edit',
		'supplier:read',
		'supplier:edit',
		'model:read',
		'notice:read',
		'scorecard:read',
		'report:read',
		'electrochem:use'
	],
	inspector: [
		'lot:read',
		'document:read',
		'reading:write',
		'lot:submit',
		'part:read',
		'supplier:read',
		'model:read',
		'notice:read',
		'report:read',
		'electrochem:use',
		'scorecard:read'
	],
	quality: [
		'lot:read',
		'document:read',
		'lot:submit',
		'lot:decide',
		'review:read',
		'part:read',
		'part:limits',
		'supplier:read',
		'model:read',
		'model:fit',
		'model:approve',
		'notice:read',
		'scorecard:read',
		'report:read',
		'electrochem:use',
		'sampling:resume'
	],
	supplier: ['lot:read', 'document:read', 'notice:read', 'notice:acknowledge', 'report:read'],
	admin: ['admin:users', 'admin:orgs', 'admin:tokens', 'admin:outbox', 'admin:webhooks', 'electrochem:use']
};

/** Whether a role has an action at all, before resource checks (e.g. which token scopes a person may hold). */
export const roleHas = (role: Role, action: Action): boolean => GRANTS[role].includes(action);

/** The resource being touched, when it belongs to a supplier organisation. */
export interface Resource {
	supplierId?: string | null;
}

/** What a supplier's request is limited to: their own organisation. Staff: nothing, the role decides. */
export const ownOrganisation = (user: SessionUser | null | undefined): Resource | undefined =>
	user?.role === 'supplier' ? { supplierId: user.organisationId } : undefined;

export function can(user: SessionUser | null, action: Action, resource?: Resource): boolean {
	if (!user) return false;
	if (SELF_ACTIONS.includes(action)) return true;
	if (!GRANTS[user.role].includes(action)) return false;
	if (user.role === 'supplier') {
		// A supplier acts only on its own organisation's things, and only on things that name one.
		return !!resource?.supplierId && resource.supplierId === user.organisationId;
	}
	return true;
}
