// Nernst equation and the thermodynamic relations between E, ΔG and K.
//   E = E° − (RT/nF)·ln Q = E° − (ln10·RT/nF)·log10 Q
//   ΔG° = −nFE°,  ΔG = −nFE,  K = exp(nFE°/RT),  E° = (RT/nF)·ln K
import { FARADAY, celsiusToKelvin, thermalVoltage } from './constants';
import { type ElectrochemErrorInfo, type Result, checkFinite, checkPositive, checkPositiveInteger } from './errors';

function firstError(...checks: Array<ElectrochemErrorInfo | null>): ElectrochemErrorInfo | null {
	return checks.find((c) => c !== null) ?? null;
}

function nernstInputError(e0_v: number, n: number, temperature_k: number): ElectrochemErrorInfo | null {
	return firstError(checkFinite(e0_v, 'e0_v'), checkPositiveInteger(n, 'n'), checkPositive(temperature_k, 'temperature_k'));
}

/** E = E° − (RT/nF)·ln Q. */
export function nernstPotential(args: { e0_v: number; n: number; temperature_k: number; q: number }): Result<number> {
	const error = firstError(nernstInputError(args.e0_v, args.n, args.temperature_k), checkPositive(args.q, 'q'));
	if (error) return { ok: false, error };
	return { ok: true, value: args.e0_v - (thermalVoltage(args.temperature_k) / args.n) * Math.log(args.q) };
}

/** Same relation written with log10 Q, the form used in most textbooks at 25 °C. */
export function nernstPotentialLog10(args: { e0_v: number; n: number; temperature_k: number; log10_q: number }): Result<number> {
	const error = firstError(nernstInputError(args.e0_v, args.n, args.temperature_k), checkFinite(args.log10_q, 'log10_q'));
	if (error) return { ok: false, error };
	const slope = (Math.LN10 * thermalVoltage(args.temperature_k)) / args.n;
	return { ok: true, value: args.e0_v - slope * args.log10_q };
}

/** ΔG = −nFE in J/mol. */
export function gibbsEnergyJPerMol(n: number, e_v: number): number {
	return -n * FARADAY * e_v;
}

/** log10 K = nFE°/(RT·ln10); returned as log10 so very large K stay exact. */
export function log10EquilibriumConstant(e0_v: number, n: number, temperature_k: number): number {
	return (n * e0_v) / (thermalVoltage(temperature_k) * Math.LN10);
}

/** E° = (RT/nF)·ln K. */
export function standardPotentialFromK(args: { k: number; n: number; temperature_k: number }): Result<number> {
	const error = firstError(
		checkPositive(args.k, 'k'),
		checkPositiveInteger(args.n, 'n'),
		checkPositive(args.temperature_k, 'temperature_k')
	);
	if (error) return { ok: false, error };
	return { ok: true, value: (thermalVoltage(args.temperature_k) / args.n) * Math.log(args.k) };
}

function renameTemperatureField(error: ElectrochemErrorInfo): ElectrochemErrorInfo {
	if (error.field !== 'temperature_k') return error;
	return { ...error, field: 'temperature_c', message: 'temperature_c must be above −273.15 °C' };
}

/** E, ΔG°, ΔG and K of a cell reaction at a temperature given in °C. */
export function cellPotentialReport(args: { e0_v: number; n: number; temperature_c: number; q: number }): Result<{
	e_v: number;
	delta_g0_kj_per_mol: number;
	delta_g_kj_per_mol: number;
	k: number;
	log10_k: number;
}> {
	const temperature_k = celsiusToKelvin(args.temperature_c);
	const e = nernstPotential({ e0_v: args.e0_v, n: args.n, temperature_k, q: args.q });
	if (!e.ok) return { ok: false, error: renameTemperatureField(e.error) };
	const log10_k = log10EquilibriumConstant(args.e0_v, args.n, temperature_k);
	return {
		ok: true,
		value: {
			e_v: e.value,
			delta_g0_kj_per_mol: gibbsEnergyJPerMol(args.n, args.e0_v) / 1000,
			delta_g_kj_per_mol: gibbsEnergyJPerMol(args.n, e.value) / 1000,
			k: Math.pow(10, log10_k),
			log10_k
		}
	};
}
