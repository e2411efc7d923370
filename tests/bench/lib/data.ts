/**
 * The synthetic data set, written straight into PostgreSQL: the lots at scale come from
 * INSERT … SELECT generate_series (one statement each, not row by row), the benchmark lots from
 * the chemistry's own forward model so their readings look like a real, in-spec delivery.
 */
import { randomBytes } from 'node:crypto';
import pg from 'pg';
import { getLibraryModel, ocvAt } from '$lib/electrochem';
import { mulberry32 } from '../../../seed/random';

function sizeFrom(name: string, fallback: number): number {
	const value = Number(process.env[name] ?? fallback);
	if (!Number.isSafeInteger(value) || value < 1) throw new Error(`${name} must be a whole number above 0`);
	return value;
}

/** The data set at scale: 500,000 lots × 20 readings = 10 million readings unless BENCH_LOTS / BENCH_READINGS_PER_LOT say otherwise. */
export const SCALE_LOTS = sizeFrom('BENCH_LOTS', 500_000);
export const READINGS_PER_SCALE_LOT = sizeFrom('BENCH_READINGS_PER_LOT', 20);
/** Lots whose readings go in per statement: each statement's trigger bumps these lots' revisions once. */
const LOTS_PER_READINGS_STATEMENT = 50_000;

/** A short label for line names: 500000 → "500k", 10000000 → "10m". */
export function sizeLabel(n: number): string {
	if (n >= 1e6 && n % 1e5 === 0) return `${n / 1e6}m`;
	if (n >= 1e3 && n % 100 === 0) return `${n / 1e3}k`;
	return String(n);
}

/** The lot code of scale lot number g (1-based): S-0000001 … */
export const scaleLotCode = (g: number) => `S-${String(g).padStart(7, '0')}`;
/** The serial of reading i (1-based) of scale lot g, as loadScaleData writes it. */
export const scaleSerial = (g: number, i: number) => `${scaleLotCode(g)}-${i}`;

/** The bench part: an NMC 18650-size cell of the demo scenario (seed/scenario.ts). */
export const BENCH_PART_NUMBER = 'VC-18650-35E';
export const BENCH_DECLARED_SOC = 0.3;

export interface BenchPart {
	id: string;
	supplierId: string;
	chemistry: string;
}

import { withClient } from '../../helpers/db';

export { withClient };

export async function benchPart(client: pg.Client): Promise<BenchPart> {
	const { rows } = await client.query('select id, supplier_id, chemistry from parts where part_number = $1', [BENCH_PART_NUMBER]);
	if (!rows[0]) throw new Error(`the demo part ${BENCH_PART_NUMBER} is not seeded`);
	return { id: rows[0].id, supplierId: rows[0].supplier_id, chemistry: rows[0].chemistry };
}

/** A received lot in inspection, ready for readings (or, with `awaiting_arrival`, one whose first reading records its arrival). */
export async function createBenchLot(
	client: pg.Client,
	part: BenchPart,
	quantity: number,
	label: string,
	status: 'in_inspection' | 'awaiting_arrival' = 'in_inspection'
): Promise<string> {
	const code = `BENCH-${label}-${randomBytes(4).toString('hex')}`;
	const { rows } = await client.query(
		`insert into lots (lot_code, po_number, supplier_id, part_id, quantity, declared_soc, transport, un_number, status, received_at)
		 values ($1, $2, $3, $4, $5, $6, 'sea', 'UN3480', $7::lot_status, case when $7::lot_status = 'in_inspection' then now() end) returning id`,
		[code, `PO-${code}`, part.supplierId, part.id, quantity, BENCH_DECLARED_SOC, status]
	);
	return rows[0].id;
}

export interface SyntheticReading {
	serial: string;
	ocv_v: number;
	temperature_c: number;
}

/** Readings of an in-spec NMC delivery near the declared SOC: ±2 % SOC spread, 20–26 °C. */
export function syntheticReadings(count: number, seed = 1): SyntheticReading[] {
	const model = getLibraryModel('NMC');
	const random = mulberry32(seed); // seeded: every run measures the same data
	const out: SyntheticReading[] = [];
	for (let i = 0; i < count; i++) {
		const soc = BENCH_DECLARED_SOC + (random() - 0.5) * 0.04;
		const temperature = Math.round((20 + random() * 6) * 10) / 10;
		const ocv = ocvAt(model, soc, temperature) + (random() - 0.5) * 0.002;
		out.push({
			serial: `BX${String(seed).padStart(2, '0')}-${String(i + 1).padStart(6, '0')}`,
			ocv_v: Math.round(ocv * 10_000) / 10_000,
			temperature_c: temperature
		});
	}
	return out;
}

/** Insert readings for a lot in one statement (unnest of arrays). */
export async function insertReadings(client: pg.Client, lotId: string, readings: SyntheticReading[]): Promise<void> {
	await client.query(
		`insert into readings (lot_id, serial, ocv_v, temperature_c, measured_at, source)
		 select $1, s, v, t, now(), 'import' from unnest($2::text[], $3::float8[], $4::float8[]) as r(s, v, t)`,
		[lotId, readings.map((r) => r.serial), readings.map((r) => r.ocv_v), readings.map((r) => r.temperature_c)]
	);
}

const STATUSES = [
	'draft',
	'awaiting_arrival',
	'in_inspection',
	'pending_decision',
	'accepted',
	'accepted',
	'on_hold',
	'rejected',
	'accepted',
	'cancelled'
];

/**
 * SCALE_LOTS lots over the seeded parts (one every 2 minutes back from now: about two years at the
 * default size, mixed statuses) and READINGS_PER_SCALE_LOT readings each, in INSERT … SELECT
 * generate_series statements; `log` reports progress.
 */
export async function loadScaleData(
	client: pg.Client,
	log: (text: string) => void
): Promise<{ lots: number; readings: number; reused: boolean }> {
	const counts = async () =>
		(await client.query(`select (select count(*) from lots)::int as lots, (select count(*) from readings)::bigint::float8 as readings`))
			.rows[0];
	const before = await counts();
	if (before.lots >= SCALE_LOTS) return { ...before, reused: true }; // a database kept from an earlier run
	await client.query(
		`with p as (
			select id, supplier_id, chemistry, (row_number() over (order by part_number) - 1)::int as k, count(*) over ()::int as n from parts
		), s as (select $2::text[] as statuses)
		insert into lots (lot_code, po_number, supplier_id, part_id, quantity, declared_soc, transport, un_number, status,
			received_at, decided_at, created_at, updated_at)
		select 'S-' || lpad(g::text, 7, '0'), 'PO-' || (400000 + g / 3), p.supplier_id, p.id, 200 + (g % 40) * 250, 0.3,
			(array['sea','road','air','rail'])[1 + g % 4]::transport_mode,
			case when p.chemistry in ('LCO','NMC','NCA','LMO','LFP','LTO') then 'UN3480'
				when p.chemistry in ('LIMNO2','LISOCL2') then 'UN3090' end,
			s.statuses[1 + g % array_length(s.statuses, 1)]::lot_status,
			now() - g * interval '2 minutes' + interval '1 day',
			case when s.statuses[1 + g % array_length(s.statuses, 1)] in ('accepted','on_hold','rejected')
				then now() - g * interval '2 minutes' + interval '2 days' end,
			now() - g * interval '2 minutes', now() - g * interval '2 minutes'
		from generate_series(1, $1::int) g cross join s join p on p.k = g % p.n`,
		[SCALE_LOTS, STATUSES]
	);
	log(`${SCALE_LOTS.toLocaleString('en')} lots inserted`);
	const restoreIndexes = await dropSecondaryIndexes(client, 'readings');
	for (let first = 1; first <= SCALE_LOTS; first += LOTS_PER_READINGS_STATEMENT) {
		const last = Math.min(SCALE_LOTS, first + LOTS_PER_READINGS_STATEMENT - 1);
		await client.query(
			`insert into readings (lot_id, serial, ocv_v, temperature_c, measured_at, source)
			select l.id, l.lot_code || '-' || i, 3.55 + ((i * 7 + length(l.lot_code)) % 40) / 1000.0, 21 + (i % 5), l.created_at + interval '1 day', 'import'
			from lots l cross join generate_series(1, $1::int) i where l.lot_code between $2 and $3`,
			[READINGS_PER_SCALE_LOT, scaleLotCode(first), scaleLotCode(last)]
		);
		log(`readings of lots ${first.toLocaleString('en')}–${last.toLocaleString('en')} inserted`);
	}
	await restoreIndexes();
	log('readings indexes built');
	return { ...(await counts()), reused: false };
}

/**
 * Drop a table's indexes other than its primary key (unique constraints included) and return what
 * builds them again exactly as the migrations defined them. Building an index once over 10 million
 * rows is a sort; keeping it up to date through the bulk insert is 10 million random inserts, which
 * took most of the load time on the development machine. Only the bench's own database is touched.
 */
async function dropSecondaryIndexes(client: pg.Client, table: string): Promise<() => Promise<void>> {
	const { rows } = await client.query<{ name: string; definition: string; constraint_definition: string | null }>(
		`select i.relname as name, pg_get_indexdef(i.oid) as definition, pg_get_constraintdef(c.oid) as constraint_definition
		from pg_index x
		join pg_class i on i.oid = x.indexrelid
		left join pg_constraint c on c.conindid = x.indexrelid and c.contype = 'u'
		where x.indrelid = $1::regclass and not x.indisprimary`,
		[table]
	);
	for (const index of rows) {
		await client.query(index.constraint_definition ? `alter table ${table} drop constraint ${index.name}` : `drop index ${index.name}`);
	}
	return async () => {
		await client.query(`set maintenance_work_mem = '256MB'`);
		for (const index of rows) {
			await client.query(
				index.constraint_definition ? `alter table ${table} add constraint ${index.name} ${index.constraint_definition}` : index.definition
			);
		}
		await client.query('reset maintenance_work_mem');
	};
}

/**
 * After bulk loads: vacuum and analyse now and write the dirty pages out, so that autovacuum and the
 * checkpointer do not wake up later on PostgreSQL's core in the middle of a timed operation.
 * CHECKPOINT needs a superuser: `superUrl` is the bench database as the cluster's superuser.
 */
export async function settleDatabase(superUrl: string): Promise<void> {
	await withClient(superUrl, async (client) => {
		await client.query('vacuum (analyze)');
		await client.query('checkpoint');
	});
}
