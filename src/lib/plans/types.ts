import type { LaneSpec, LngLat } from '../geometry/index';

/** What the farmer chooses for one lane (or each lane of a group): seed and trial details. */
export interface LaneAssignment {
	laneIndex: number;
	variety: string | null;
	relativeMaturity: number | null; // days (corn) or maturity group (soybean)
	populationPerAcre: number | null; // seeds per acre
	seedLot: string | null;
	trialLabel: string | null;
	notes: string | null;
}

export interface PlanSettings {
	guidance: { a: LngLat; b: LngLat };
	pattern: LaneSpec[];
	offsetFt: number;
	headlandFt: number;
}
