// The lot evaluated in the browser while the inspector types, by the same two cores the server runs
// (electrochem's evaluateReadings, then the inspection core's evaluateLot) on the same inputs the
// server's evaluation reports. Per-unit flags that depend on the whole lot (outliers) therefore come
// out as the server will give them once the row is saved. The server's evaluation stays the verdict.
import { evaluateReadings, type LastDirection, type OcvModel } from '$lib/electrochem';
import { evaluateLot, type Disposition, type LotInfo, type PartLimits, type SamplingPlan, type Severity } from '$lib/inspection';

/** What the server's evaluation reports as its inputs (GET …/evaluation `inputs`, without the readings). */
export interface BenchInputs {
	lot: LotInfo & { last_direction?: LastDirection };
	part: { cells_in_series: number; meter_accuracy_v: number; aql: number };
	limits: PartLimits;
	model: OcvModel;
	plan: SamplingPlan;
	severity: Severity;
}

export interface BenchReading {
	serial: string;
	ocv_v: number;
	temperature_c: number;
	measured_at: string;
	cell_group_voltages?: number[] | null;
}

/** The disposition of the given readings, computed as the server computes it. */
export function benchDisposition(inputs: BenchInputs, readings: readonly BenchReading[]): Disposition {
	const results = evaluateReadings(
		inputs.model,
		readings.map((r) => ({ ocv_v: r.ocv_v, temperature_c: r.temperature_c })),
		{
			cells_in_series: inputs.part.cells_in_series,
			declared_soc: inputs.lot.declared_soc,
			meter_accuracy_v: inputs.part.meter_accuracy_v,
			last_direction: inputs.lot.last_direction ?? 'unknown'
		}
	);
	const { last_direction: _direction, ...lot } = inputs.lot;
	return evaluateLot({
		lot,
		plan: inputs.plan,
		severity: inputs.severity,
		limits: inputs.limits,
		readings: results.map((result, i) => ({
			serial: readings[i].serial,
			measured_at: readings[i].measured_at,
			result,
			cell_group_voltages: readings[i].cell_group_voltages ?? null
		})),
		aql: inputs.part.aql,
		cells_in_series: inputs.part.cells_in_series,
		cell_limits: { min_safe_v: inputs.model.min_safe_v, max_v: inputs.model.max_v }
	});
}

/** True when a reading's numbers are ones the cores can evaluate (the grid's typed row may be half-typed). */
export function evaluable(ocvV: number, temperatureC: number): boolean {
	return Number.isFinite(ocvV) && Number.isFinite(temperatureC) && ocvV >= 0 && temperatureC > -60 && temperatureC < 120;
}

/** A reading the page holds: stored ones have an id, rows typed in this visit a client key. */
export type KeyedReading = BenchReading & { id?: number; client_key?: string | null };

/**
 * The lot's readings as the browser knows them: the stored ones, then rows typed in this visit that
 * the page data does not have yet, then the row being typed (which replaces a reading brought back
 * to be fixed).
 */
export function benchReadings(
	stored: readonly KeyedReading[],
	session: readonly KeyedReading[],
	typed: BenchReading | null,
	replacing: { id: number; client_key: string } | null
): KeyedReading[] {
	const storedKeys = new Set(stored.flatMap((r) => (r.client_key ? [r.client_key] : [])));
	const all: KeyedReading[] = [...stored, ...session.filter((r) => !r.client_key || !storedKeys.has(r.client_key))];
	if (!typed) return all;
	const kept = replacing ? all.filter((r) => r.id !== replacing.id && r.client_key !== replacing.client_key) : all;
	return [...kept, typed];
}
