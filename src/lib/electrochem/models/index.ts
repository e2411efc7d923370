// The chemistry model library: one model per chemistry code, looked up by code.
import { ElectrochemError } from '../errors';
import { CHEMISTRY_CODES, type ChemistryCode, type OcvModel } from '../types';
import { NICD, NIMH, PBACID } from './aqueous';
import { LCO, LFP, LMO, LTO, NCA, NMC } from './lithium-ion';
import { ALKALINE, LIMNO2, LISOCL2 } from './primary';
import { SIB } from './sodium-ion';

const LIBRARY: Readonly<Record<ChemistryCode, OcvModel>> = Object.freeze({
	LCO,
	NMC,
	NCA,
	LMO,
	LFP,
	LTO,
	SIB,
	NIMH,
	NICD,
	PBACID,
	ALKALINE,
	LIMNO2,
	LISOCL2
});

export function isChemistryCode(x: unknown): x is ChemistryCode {
	return typeof x === 'string' && (CHEMISTRY_CODES as readonly string[]).includes(x);
}

/** A deep copy, so callers may change it without touching the library. */
export function getLibraryModel(code: ChemistryCode): OcvModel {
	if (!isChemistryCode(code)) {
		throw new ElectrochemError({ code: 'unknown_chemistry', field: 'chemistry', message: `unknown chemistry code: ${String(code)}` });
	}
	return structuredClone(LIBRARY[code]);
}

export function listChemistries(): Array<{
	code: ChemistryCode;
	name: string;
	nominal_v: number;
	ocv_empty_v: number;
	ocv_full_v: number;
	min_safe_v: number;
	max_v: number;
	rechargeable: boolean;
}> {
	return CHEMISTRY_CODES.map((code) => {
		const m = LIBRARY[code];
		return {
			code,
			name: m.name,
			nominal_v: m.nominal_v,
			ocv_empty_v: m.ocv_empty_v,
			ocv_full_v: m.ocv_full_v,
			min_safe_v: m.min_safe_v,
			max_v: m.max_v,
			rechargeable: m.rechargeable
		};
	});
}

export { leadAcidOcvFromSpecificGravity, LEAD_ACID_SG_OFFSET_V } from './aqueous';
