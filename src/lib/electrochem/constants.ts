// Physical constants (CODATA 2018 exact values since the 2019 SI redefinition) and derived helpers.

/** Faraday constant F = N_A·e, C/mol (exact). */
export const FARADAY = 96485.33212;
/** Molar gas constant R = N_A·k_B, J/(mol·K) (exact). */
export const GAS_CONSTANT = 8.314462618;
/** 0 °C in kelvin. */
export const KELVIN_OFFSET = 273.15;
/** Reference temperature of every OCV model: 25 °C. */
export const REFERENCE_TEMPERATURE_C = 25;
export const REFERENCE_TEMPERATURE_K = REFERENCE_TEMPERATURE_C + KELVIN_OFFSET;

/** RT/F in volts at absolute temperature T_K (25.693 mV at 298.15 K). */
export function thermalVoltage(T_K: number): number {
	return (GAS_CONSTANT * T_K) / FARADAY;
}

export function celsiusToKelvin(t_c: number): number {
	return t_c + KELVIN_OFFSET;
}
