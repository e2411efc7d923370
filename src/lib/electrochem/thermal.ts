// Temperature correction through the entropic coefficient dU/dT(z):
//   U(z, T) = U(z, 25 °C) + (T − 25)·dU/dT(z)    (dU/dT = ΔS/nF, Gibbs–Helmholtz)
import { REFERENCE_TEMPERATURE_C } from './constants';
import { piecewiseAt } from './piecewise';

export type EntropicTable = ReadonlyArray<readonly [number, number]>;

/** dU/dT at z in mV/K, piecewise linear over the table, constant beyond its ends. */
export function entropicMvPerK(table: EntropicTable, z: number): number {
	return piecewiseAt(table, z);
}

/** OCV shift in volts from 25 °C to temperatureC at z. */
export function entropicShiftV(table: EntropicTable, z: number, temperatureC: number): number {
	return ((temperatureC - REFERENCE_TEMPERATURE_C) * entropicMvPerK(table, z)) / 1000;
}

/** ocv_at_25c = ocv − (T − 25)·dU/dT(z)/1000. */
export function correctTo25C(ocvV: number, table: EntropicTable, z: number, temperatureC: number): number {
	return ocvV - entropicShiftV(table, z, temperatureC);
}
