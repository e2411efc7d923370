// Public API of the pure inspection core (acceptance sampling, switching, statistics, disposition).
export * from './types';
export { AQL_SERIES, LETTERS, SAMPLE_SIZE, REDUCED_SAMPLE_SIZE } from './iso2859/tables';
export { samplingPlan, codeLetter, aqlIndex, type PlanRequest } from './iso2859/plan';
export {
	switchingState,
	nextSwitchingScore,
	type LotOutcome,
	type ResumeEvent,
	type SwitchingEntry,
	type SwitchingOptions,
	type SwitchingStep,
	type SwitchingResult
} from './switching';
export {
	lotStatistics,
	median,
	robustOutliers,
	spreadCheck,
	selfDischargeMvPerDay,
	selfDischargeOfParsed,
	robustCentre,
	type RobustCentre,
	MAD_TO_SIGMA,
	type LotStatistics,
	type TimedVoltage
} from './statistics';
export { variablesCheck, formK, moments, bimodalityCoefficient, jarqueBera, type VariablesCheck, type Moments } from './variables';
export {
	checkCellGroups,
	cellGroupProblems,
	MAX_GROUP_V,
	GROUP_SUM_TOLERANCE,
	type CellGroupCheck,
	type CellGroupLimits
} from './cell-groups';
export {
	decideLot,
	evaluateLot,
	AIR_SOC_LIMIT,
	type DispositionInput,
	type Disposition,
	type Reason,
	type ReasonCode,
	type PartLimits,
	type LotInfo,
	type UnitInput,
	type UnitDisposition,
	type UnitFlag,
	type TimedUnitReading,
	type EvaluateLotInput,
	type Transport,
	type LotDocument
} from './disposition';
