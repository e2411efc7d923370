/** The five roles; shared by server policy and client navigation. */
export type Role = 'buyer' | 'inspector' | 'quality' | 'supplier' | 'admin';
export const ROLES: readonly Role[] = ['buyer', 'inspector', 'quality', 'supplier', 'admin'];

/** What the browser may know about the signed-in person. */
export interface SessionUser {
	id: string;
	email: string;
	name: string | null;
	role: Role;
	organisationId: string | null;
}
