/**
 * What a supplier notice states about the finding: the nonconforming units (serial, value, reason)
 * and the sampling rule with its source, read from the lot's latest stored evaluation, so the
 * notice says exactly what the decision was based on.
 */
import { desc, eq } from 'drizzle-orm';
import type { Tx } from '../db';
import { evaluations } from '../db/schema';
import type { NonconformingUnit } from '../mail/templates';

/** Plain words for the per-unit findings the engine flags (unit_flags and electrochemistry flags). */
const FLAG_WORDS: Record<string, string> = {
	deep_discharge: 'rested below its minimum safe voltage (deep discharge)',
	over_voltage: 'above the maximum cell voltage',
	below_window: 'below the part’s voltage window',
	above_window: 'above the part’s voltage window',
	outside_part_window: 'outside the part’s voltage window',
	residual_over_tolerance: 'voltage differs from the expected rest voltage by more than the tolerance',
	self_discharge_over_limit: 'self-discharge above the part’s limit',
	imbalance_over_limit: 'cell-group imbalance above the part’s limit',
	outlier: 'statistical outlier in the sample',
	temperature_out_of_range: 'measured outside the temperature range',
	soc_indeterminate: 'state of charge cannot be told from this voltage'
};

/** ISO 2859-1:1999 master tables per inspection severity (Table II-A normal, II-B tightened, II-C reduced). */
const TABLE_OF: Record<string, string> = { normal: 'II-A', tightened: 'II-B', reduced: 'II-C' };

interface StoredUnit {
	serial: string;
	nonconforming: boolean;
	flags?: string[];
	unit_flags?: string[];
	ocv_cell_v?: number;
}

interface StoredInputs {
	readings?: { serial: string[]; ocv_v: number[] };
	plan_request?: { aql: number; level: string; severity: string };
}

export interface NoticeFacts {
	nonconforming: NonconformingUnit[];
	rule: string | null;
}

/** The voltage as read at the terminals of each serial (its last reading), volts. */
function ocvBySerial(inputs: StoredInputs): Map<string, number> {
	const out = new Map<string, number>();
	inputs.readings?.serial.forEach((serial, i) => out.set(serial, inputs.readings!.ocv_v[i]));
	return out;
}

function ruleText(plan: Record<string, unknown>, inputs: StoredInputs): string | null {
	const request = inputs.plan_request;
	if (!request || typeof plan.sample_size !== 'number') return null;
	const table = TABLE_OF[request.severity];
	const source = table ? `ISO 2859-1:1999, Table I and Table ${table}` : 'ISO 2859-1:1999, Table I';
	return (
		`Sampling by attributes, ${request.severity} inspection, level ${request.level}, AQL ${request.aql}: ` +
		`code letter ${String(plan.code_letter)}, sample of ${plan.sample_size}, accept with ${String(plan.accept)} ` +
		`or fewer nonconforming units, reject with ${String(plan.reject)} or more (${source}).`
	);
}

export async function noticeFacts(tx: Tx, lotId: string): Promise<NoticeFacts> {
	const [row] = await tx
		.select({ result: evaluations.result, inputs: evaluations.inputs, plan: evaluations.plan })
		.from(evaluations)
		.where(eq(evaluations.lotId, lotId))
		.orderBy(desc(evaluations.id))
		.limit(1);
	if (!row) return { nonconforming: [], rule: null };
	const inputs = row.inputs as StoredInputs;
	const volts = ocvBySerial(inputs);
	const units = ((row.result as { units?: StoredUnit[] }).units ?? []).filter((u) => u.nonconforming);
	return {
		nonconforming: units.map((u) => {
			const codes = [...new Set([...(u.unit_flags ?? []), ...(u.flags ?? [])])];
			const words = codes.map((c) => FLAG_WORDS[c]).filter((w): w is string => !!w);
			return { serial: u.serial, ocvV: volts.get(u.serial) ?? null, reason: words.join('; ') || 'nonconforming' };
		}),
		rule: ruleText(row.plan as Record<string, unknown>, inputs)
	};
}
