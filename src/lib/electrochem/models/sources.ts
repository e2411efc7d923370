// Source notes shared by the library models (kept honest: what is recalled is marked "from memory").
export const COMBINED_FORM_NOTE =
	"Form: Plett's combined model K0 − K1/s − K2·s + K3·ln s + K4·ln(1−s) with s = ε + (1−2ε)z " +
	'(G. L. Plett, Battery Management Systems Vol. I, 2015; from memory).';
export const RK_FORM_NOTE =
	'Form: Nernst term plus Redlich–Kister excess terms (e.g. Karthikeyan, Sikha & White, J. Power Sources 185 (2008) 1398; from memory).';
export const ANCHOR_NOTE =
	'Coefficients: least-squares fit (ends weighted) to anchor points read off typical published rested-OCV curves at 25 °C (from memory); ' +
	'treat as a generic curve and refit to the supplier reference curve where available.';
export const ENTROPIC_NOTE = 'Entropic coefficient: order of magnitude of published dU/dT measurements (from memory).';
export const ENTROPIC_ASSUMED_ZERO = 'Entropic coefficient: no published value at hand, assumed 0 mV/K.';
