/**
 * superValidate for form actions, with numbers read strictly. Superforms turns a number field's
 * text into a number with parseInt / parseFloat, which read `1e7`, `1,5` and `1e309` as 1 and
 * `12abc` as 12, so a typo would be stored as another quantity. Here every number field of the
 * schema must be written plainly (schemas/fields.ts); anything else reaches the schema as
 * not-a-number, which it refuses with that field's own message (a 400 naming the field).
 * Use it in every action whose schema has a number field; tests/unit/schemas/forms-strict.test.ts
 * checks that they do.
 */
import type { RequestEvent } from '@sveltejs/kit';
import { superValidate, type SuperValidateOptions } from 'sveltekit-superforms';
import type { ValidationAdapter } from 'sveltekit-superforms/adapters';
import { strictNumberFromText } from '$lib/schemas/fields';

type JsonSchemaLike = { type?: unknown; anyOf?: JsonSchemaLike[]; oneOf?: JsonSchemaLike[]; properties?: Record<string, JsonSchemaLike> };

/** The top-level number fields of a form's JSON schema: name → whole (integer) or not. */
export function numberFields(schema: JsonSchemaLike): Map<string, boolean> {
	const fields = new Map<string, boolean>();
	for (const [name, property] of Object.entries(schema.properties ?? {})) {
		const types = typesOf(property);
		if (types.has('integer')) fields.set(name, true);
		else if (types.has('number')) fields.set(name, false);
	}
	return fields;
}

function typesOf(schema: JsonSchemaLike): Set<string> {
	const own = Array.isArray(schema.type) ? schema.type : [schema.type];
	const nested = [...(schema.anyOf ?? []), ...(schema.oneOf ?? [])].flatMap((s) => [...typesOf(s)]);
	return new Set([...own, ...nested].filter((t): t is string => typeof t === 'string'));
}

/** Replace number fields not written plainly by a value superforms reads as NaN. Empty stays empty (missing). */
export function strictNumbers(form: FormData, fields: Map<string, boolean>): FormData {
	for (const [name, whole] of fields) {
		const values = form.getAll(name);
		if (values.some((v) => typeof v === 'string' && v !== '' && strictNumberFromText(v, { whole }) === undefined)) {
			form.set(name, 'not-a-number');
		}
	}
	return form;
}

export async function validateForm<Out extends Record<string, unknown>, In extends Record<string, unknown> = Out>(
	event: Pick<RequestEvent, 'request'>,
	adapter: ValidationAdapter<Out, In>,
	options?: SuperValidateOptions<Out>
) {
	let form: FormData;
	try {
		form = await event.request.formData();
	} catch {
		form = new FormData(); // not a form post: every required field is reported missing
	}
	return superValidate(strictNumbers(form, numberFields(adapter.jsonSchema as JsonSchemaLike)), adapter, options);
}
