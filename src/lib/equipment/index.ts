/**
 * Stripwright equipment planning: planter passes across strip lanes, checks of seed and fertilizer
 * plumbing against the lanes, implement fit per lane, and seed and fertilizer amounts.
 * Pure functions, no I/O, relative imports only: runs in the browser, the server and plain Node.
 * Amounts are arithmetic on the farmer's entered rates, never recommendations.
 */
export type { CheckFinding, CheckKind, CheckSeverity, Equipment, EquipmentKind, FertilizerLine, PlanterSetup, RowUnit } from './types';
export { EQUIPMENT_KINDS, EQUIPMENT_KIND_LABELS } from './types';
export { EquipmentError, type EquipmentErrorCode } from './errors';
export { resolveLanes, type LaneInput, type LaneRows, type PlanLane } from './lanes';
export { checkPlanter, seedLabel, unitOffsetFt, type CheckedPlanter, type FieldEnd } from './planter';
export {
	planPasses,
	passSummary,
	type EndChoice,
	type PassPlan,
	type PassUnit,
	type PlannedPass,
	type PlanPassesInput,
	type UnitOffReason,
	type UnplantedRows
} from './passes';
export { checkPasses, type CheckProblem, type EquipmentCheck } from './checks';
export { implementChecks, implementFitChecks, IMPLEMENT_LANE_KINDS, type ImplementFitReport, type ImplementInput, type ImplementLaneFit } from './implements';
export {
	seedAndFertilizerQuantities,
	seedQuantities,
	type FertilizerAnalysis,
	type FertilizerQuantity,
	type FieldQuantities,
	type LineRate,
	type QuantityOptions,
	type VarietyQuantity
} from './quantities';
export { formatNumber } from './words';
