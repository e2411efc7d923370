/**
 * Test set-up for the readings, evaluation and import specs: lots registered through the real API
 * and readings generated from the library OCV models (the same forward model the server inverts).
 */
import { getLibraryModel, ocvAt, type ChemistryCode, type OcvModel } from '../../src/lib/electrochem';
import { vc21Fit } from '../../seed/vc21-datasheet';

export interface Caller {
	base: string;
	token: string;
}

export async function call(c: Caller, path: string, init: { method?: string; body?: unknown; form?: FormData } = {}) {
	const headers: Record<string, string> = { authorization: `Bearer ${c.token}` };
	let body: BodyInit | undefined;
	// SvelteKit refuses multipart POSTs without a same-site Origin (its CSRF check), even with a token.
	if (init.form) {
		body = init.form;
		headers.origin = c.base;
	} else if (init.body !== undefined) {
		headers['content-type'] = 'application/json';
		body = typeof init.body === 'string' ? init.body : JSON.stringify(init.body);
	}
	const res = await fetch(`${c.base}${path}`, { method: init.method ?? (body ? 'POST' : 'GET'), headers, body });
	const text = await res.text();
	// eslint-disable-next-line @typescript-eslint/no-explicit-any -- tests read JSON answers of many shapes
	let json: any = null;
	try {
		json = text ? JSON.parse(text) : null;
	} catch {
		json = { raw: text };
	}
	return { status: res.status, json, headers: res.headers };
}

export async function partByNumber(c: Caller, partNumber: string): Promise<{ id: string; supplier_id: string }> {
	const { json } = await call(c, '/api/v1/parts');
	const part = json.parts.find((p: { part_number: string }) => p.part_number === partNumber);
	if (!part) throw new Error(`part ${partNumber} not seeded`);
	return part;
}

/** The lot form's fields (registering or editing), as a browser posts them, for a part of the demo supplier. */
export async function lotFormFields(
	c: Caller,
	partNumber: string,
	overrides: Record<string, string> = {}
): Promise<Record<string, string>> {
	const part = await partByNumber(c, partNumber);
	return {
		po_number: 'KM-PO-FORM',
		supplier_id: part.supplier_id,
		part_id: part.id,
		quantity: '250',
		declared_soc_pct: '25',
		transport: 'sea',
		un_number: 'UN3480',
		expected_arrival: '2026-12-20',
		...overrides
	};
}

export interface LotSpec {
	partNumber: string;
	quantity: number;
	declaredSoc: number | null;
	transport?: 'air' | 'sea' | 'road' | 'rail';
	unNumber?: string | null;
	documents?: Array<'coc' | 'un38_3_summary' | 'sds'>;
}

/** A tiny but real PDF header is enough for the document sniffing; each file differs by its text. */
const pdfBytes = (text: string) => new TextEncoder().encode(`%PDF-1.4\n% ${text}\n%%EOF\n`);

/** Register a lot (buyer token; API registrations start awaiting arrival) and upload its documents. */
export async function createLot(buyer: Caller, spec: LotSpec): Promise<{ id: string; lot_code: string }> {
	const part = await partByNumber(buyer, spec.partNumber);
	const res = await call(buyer, '/api/v1/lots', {
		body: {
			po_number: `PO-T-${Math.random().toString(36).slice(2, 8)}`,
			supplier_id: part.supplier_id,
			part_id: part.id,
			quantity: spec.quantity,
			declared_soc: spec.declaredSoc,
			transport: spec.transport ?? 'road',
			un_number: spec.unNumber === undefined ? 'UN3480' : spec.unNumber
		}
	});
	if (res.status !== 201) throw new Error(`lot not created: ${res.status} ${JSON.stringify(res.json)}`);
	for (const kind of spec.documents ?? []) {
		const form = new FormData();
		form.set('kind', kind);
		form.set('file', new Blob([pdfBytes(`${kind} ${res.json.id}`)], { type: 'application/pdf' }), `${kind}.pdf`);
		const up = await call(buyer, `/api/v1/lots/${res.json.id}/documents`, { form });
		if (up.status !== 201) throw new Error(`document ${kind} not uploaded: ${up.status} ${JSON.stringify(up.json)}`);
	}
	return res.json;
}

/** The model the seed gives VC-21700-50G (a tabulated fit to its invented datasheet table, seed/part-models.ts). */
export const VC21_MODEL: OcvModel = vc21Fit().model;

/**
 * n readings of `cells` cells in series at SOC values spread evenly over soc ± halfWidth, at 25 °C,
 * from the library model's forward curve (deterministic: no random numbers).
 */
export function modelReadings(
	chemistryOrModel: ChemistryCode | OcvModel,
	n: number,
	soc: number,
	opts: { cells?: number; halfWidth?: number; prefix?: string; temperatureC?: number } = {}
) {
	const model = typeof chemistryOrModel === 'string' ? getLibraryModel(chemistryOrModel) : chemistryOrModel;
	const half = opts.halfWidth ?? 0.01;
	const t = opts.temperatureC ?? 25;
	return Array.from({ length: n }, (_, i) => {
		const z = n === 1 ? soc : soc - half + (2 * half * i) / (n - 1);
		return {
			serial: `${opts.prefix ?? 'SN'}-${String(i + 1).padStart(5, '0')}`,
			ocv_v: Math.round(ocvAt(model, z, t) * (opts.cells ?? 1) * 10000) / 10000,
			temperature_c: t
		};
	});
}
