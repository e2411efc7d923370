/** How people are named wherever the product shows who did something: name and role, one way. */
import { ROLE_LABEL } from '$lib/components/nav-items';
import type { Role } from '$lib/roles';

/** "Ana Petrov (Quality manager)"; the e-mail stands in only when no name is recorded. */
export function personLabel(person: { name: string | null; email: string; role: Role }): string {
	return `${person.name?.trim() || person.email} (${ROLE_LABEL[person.role]})`;
}
