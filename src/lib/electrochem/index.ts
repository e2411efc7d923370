/**
 * Restvolt electrochemistry core — pure TypeScript (no I/O), safe on server and client.
 *
 *   constants.ts   CODATA 2018 exact F and R, RT/F.
 *   errors.ts      One error shape {code, message, field}: returned as Result<T> where the API
 *                  returns a Result (Nernst relations), thrown as ElectrochemError elsewhere.
 *   nernst.ts      Nernst equation (ln and log10 forms), ΔG° = −nFE°, ΔG = −nFE, K ⇄ E°.
 *   types.ts       ChemistryCode, OcvModel (JSON data), reading/result types, flag codes.
 *   forms.ts       The OCV forms at 25 °C: Plett's combined model, Redlich–Kister, tabulated.
 *   models/        The library: one JSON-shaped model per chemistry, with source notes.
 *   thermal.ts     Entropic-coefficient temperature correction to/from 25 °C.
 *   ocv.ts         Forward model ocvAt / curve.
 *   invert.ts      SOC from OCV: tabulated bracket + safeguarded Newton, σ_SOC, ±2σ interval.
 *   evaluate.ts    One reading (or many) → SOC, interval, determinacy, expected OCV, residual, flags.
 *   fit.ts         Linear least-squares (QR) fit of the combined model to a reference curve.
 *   tabulated.ts   The tabulated form: Steffen's monotone cubic interpolant of a supplier's points.
 *   fit-part.ts    Part models: Nernst-type or tabulated, chosen and σ-rated by leave-one-out CV.
 *   validate.ts    Check of models loaded from JSON.
 *
 * Conventions: OCV values are per cell unless named otherwise; z ∈ [0, 1] is state of charge for
 * rechargeable cells and fraction of capacity remaining for primary cells (model.soc_meaning).
 */
export { FARADAY, GAS_CONSTANT, KELVIN_OFFSET, thermalVoltage, celsiusToKelvin } from './constants';
export { ElectrochemError, type ElectrochemErrorCode, type ElectrochemErrorInfo, type Result } from './errors';
export {
	nernstPotential,
	nernstPotentialLog10,
	cellPotentialReport,
	gibbsEnergyJPerMol,
	log10EquilibriumConstant,
	standardPotentialFromK
} from './nernst';
export {
	CHEMISTRY_CODES,
	type ChemistryCode,
	type OcvModel,
	type OcvForm,
	type OcvInformation,
	type CombinedParams,
	type RedlichKisterParams,
	type FitMetadata,
	type FlagCode,
	type ReadingInput,
	type EvaluateOptions,
	type UnitResult,
	type EvaluatedUnit,
	type UncertaintyBudget,
	type LastDirection,
	type InversionResult
} from './types';
export { getLibraryModel, isChemistryCode, listChemistries, leadAcidOcvFromSpecificGravity } from './models';
export { entropicMvPerK, correctTo25C } from './thermal';
export { ocvAt, curve } from './ocv';
export { invertSoc, NO_INFORMATION_SIGMA } from './invert';
export {
	evaluateReading,
	evaluateReadings,
	DEFAULT_METER_ACCURACY_V,
	DEFAULT_INDETERMINATE_WIDTH,
	DEFAULT_TEMPERATURE_UNCERTAINTY_K
} from './evaluate';
export { fitCombinedModel, type CurvePoint } from './fit';
export {
	fitPartModel,
	METER_RESOLUTION_V,
	CV_SOC_RANGE,
	type FitFormChoice,
	type FittedForm,
	type PartFit,
	type PartFitInput
} from './fit-part';
export { checkModel, validateModel } from './validate';
export { modelErrorSummary, type ModelErrorSummary } from './model-error';
