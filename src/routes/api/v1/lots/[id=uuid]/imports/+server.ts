import { json } from '@sveltejs/kit';
import { importMappingSchema, MAX_IMPORT_BYTES } from '$lib/schemas/readings';
import { getDb } from '$lib/server/db';
import { api, authorize, badRequest, notFound, parseWith, unprocessable } from '$lib/server/http';
import { importCellGroups } from '$lib/server/services/cell-group-import';
import { commitImport, previewImport, type MeterFile } from '$lib/server/services/imports';
import { getLotForUser } from '$lib/server/services/lots';
import { acceptUpload, incomingFile, UploadRefused } from '$lib/server/services/uploads';
import type { RequestHandler } from './$types';

async function readForm(request: Request): Promise<FormData> {
	try {
		return await request.formData();
	} catch {
		throw badRequest('Send the meter file as multipart/form-data with a `file` field');
	}
}

/** The `file` field through the one upload path (CSV or XLSX by content, size limit, cleaned name). */
async function fileOf(form: FormData): Promise<MeterFile> {
	const value = form.get('file');
	if (!(value instanceof File))
		throw unprocessable('The `file` field is missing', [{ path: 'file', message: 'choose a CSV or XLSX file' }]);
	const incoming = await incomingFile(value);
	if (!incoming) throw new UploadRefused('malformed', 'empty_file', `“${value.name || 'the file'}” is empty.`);
	const accepted = acceptUpload('meter_file', incoming);
	return { name: accepted.fileName, bytes: accepted.bytes, format: accepted.type === 'xlsx' ? 'xlsx' : 'csv' };
}

function mappingOf(form: FormData) {
	const raw = form.get('mapping');
	if (raw === null || raw === '') return null;
	let value: unknown;
	try {
		value = JSON.parse(String(raw));
	} catch {
		throw badRequest('`mapping` is not valid JSON');
	}
	return parseWith(importMappingSchema, value, 'The column mapping');
}

/**
 * POST /api/v1/lots/{id}/imports — multipart `file` (CSV or XLSX) and `mapping` (JSON).
 * `?preview=true` (or a `preview` field) parses and maps without writing: header, guessed mapping,
 * first rows and row-level errors. Otherwise the readings are stored all or nothing; the same file
 * twice answers 200 with `already_imported_at` and stores nothing.
 * `kind=cell_groups` (form field): a BMS readout instead, `serial,group_1,…,group_N` in volts (N = the
 * part's cells in series), setting the cell-group voltages of each unit's latest reading; 200 {updated,
 * readings}. Layout: services/cell-group-import.ts.
 */
export const POST: RequestHandler = api(async (event) => {
	const user = authorize(event, 'reading:write');
	const db = getDb();
	const lot = await getLotForUser(db, user, event.params.id);
	if (!lot) throw notFound('lot');
	// Refuse an oversized upload before reading it (multipart framing adds a little).
	if (Number(event.request.headers.get('content-length') ?? 0) > MAX_IMPORT_BYTES + 64 * 1024) {
		throw new UploadRefused('too_large', 'file_too_large', `Meter files are limited to ${MAX_IMPORT_BYTES / 1024 / 1024} MB`);
	}
	const form = await readForm(event.request);
	const file = await fileOf(form);
	if (form.get('kind') === 'cell_groups') return json(await importCellGroups(db, user, lot.id, file));
	const mapping = mappingOf(form);
	const preview = event.url.searchParams.get('preview') === 'true' || form.get('preview') === 'true';
	if (preview) return json(await previewImport(db, lot.id, file, mapping));
	if (!mapping) throw unprocessable('Send the column `mapping` to import (run a preview to get a guess)');
	const result = await commitImport(db, user, lot.id, file, mapping);
	return json(result, { status: result.already_imported_at ? 200 : 201 });
});
