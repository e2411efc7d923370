/** One history line in plain words, from an audit event's action and details. */
const FIELD_WORDS: Record<string, string> = { name: 'name', country: 'country', address: 'address' };

const shown = (value: unknown) =>
	value === null || value === undefined || value === '' ? 'empty' : `“${String(value).replace(/\n/g, ', ')}”`;

interface Change {
	field: string;
	from: unknown;
	to: unknown;
}

export function historyText(action: string, details: Record<string, unknown>): string {
	switch (action) {
		case 'organisation.created':
			return `Added the organisation as ${shown(details.name)}`;
		case 'organisation.updated': {
			const changes = (Array.isArray(details.changes) ? details.changes : []) as Change[];
			return `Changed ${changes.map((c) => `${FIELD_WORDS[c.field] ?? c.field} from ${shown(c.from)} to ${shown(c.to)}`).join('; ')}`;
		}
		case 'supplier.contact.create':
			return `Added the notice contact ${shown(details.email)}${details.receivesNotices === false ? ' (no notices)' : ''}`;
		case 'supplier.contact.update':
			return `Edited the notice contact ${shown(details.email)}${details.receivesNotices === false ? ' (no notices)' : ' (receives notices)'}`;
		default:
			return action;
	}
}
