/**
 * What an API token may do, within what its person's role may (policy.ts decides that first). A
 * token is made for the role's rights or fewer:
 *  - role: everything the role may;
 *  - read: reading only (every `…:read` action, and the calculators, which change nothing);
 *  - readings:write: reading, and recording readings (an instrument bridge at the bench);
 *  - webhooks:manage: registering and looking after webhooks only (an integration's set-up script).
 */
import { roleHas, type Action, type Role } from './policy';

export const TOKEN_SCOPES = ['role', 'read', 'readings:write', 'webhooks:manage'] as const;
export type TokenScope = (typeof TOKEN_SCOPES)[number];

export const TOKEN_SCOPE_LABEL: Record<TokenScope, string> = {
	role: "All of the person's role",
	read: 'Read only',
	'readings:write': 'Read and record readings',
	'webhooks:manage': 'Manage webhooks only'
};

const isReading = (action: Action) => action.endsWith(':read') || action === 'electrochem:use';

export function scopeAllows(scope: TokenScope, action: Action): boolean {
	switch (scope) {
		case 'role':
			return true;
		case 'read':
			return isReading(action);
		case 'readings:write':
			return isReading(action) || action === 'reading:write';
		case 'webhooks:manage':
			return action === 'admin:webhooks' || action === 'self:read';
	}
}

/** The action a scope exists for, which the person's role must have (a scope never adds rights). */
const NEEDS: Partial<Record<TokenScope, Action>> = { 'readings:write': 'reading:write', 'webhooks:manage': 'admin:webhooks' };

/** Whether a person with `role` may hold a token of `scope`. */
export function scopeFitsRole(scope: TokenScope, role: Role): boolean {
	const needed = NEEDS[scope];
	return !needed || roleHas(role, needed);
}
