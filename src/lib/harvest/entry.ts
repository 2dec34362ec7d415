// What a weighed load comes to: harvested area, bushels at the crop's standard, bushels per acre.
import { GRAIN_STANDARDS, standardMoistureWeight, yieldBushelsPerAcre, type GrainCrop } from '../agronomy/index.js';

export const ROW_POSITIONS = ['all', 'outside', 'inside'] as const;
export type RowPosition = (typeof ROW_POSITIONS)[number];

/** Moisture a harvest entry may carry: grain outside this range is not weighed for yield (common practice). */
export const HARVEST_MOISTURE = { min: 5, max: 40 } as const;

export const GRAIN_CROPS = Object.keys(GRAIN_STANDARDS) as GrainCrop[];

export function isGrainCrop(crop: string): crop is GrainCrop {
	return (GRAIN_CROPS as string[]).includes(crop);
}

/** The lane as the entry saw it (copied from the adopted plan). */
export interface HarvestLane {
	laneIndex: number;
	kind: string;
	crop: string;
	acres: number;
	rows: number;
	borderRows: number;
}

export interface HarvestInput {
	crop: GrainCrop;
	wetWeightLb: number;
	moisturePct: number;
	rowPosition: RowPosition;
	lengthFt?: number | null;
	rows?: number | null;
	rowSpacingIn?: number | null;
}

export interface HarvestFigures {
	harvestedAcres: number;
	bushels: number;
	bushelsPerAcre: number;
	standardMoisturePct: number;
	poundsPerBushel: number;
}

/**
 * Acres a load came off: length × rows × row spacing when measured (acres = length × width ÷ 43,560,
 * extension strip-trial calibration guidance), else the lanes' acres — for outside or inside rows only
 * the share of the lanes' rows in that position.
 */
export function harvestedAcres(input: Pick<HarvestInput, 'rowPosition' | 'lengthFt' | 'rows' | 'rowSpacingIn'>, lanes: HarvestLane[]): number {
	if (input.lengthFt != null && input.rows != null && input.rowSpacingIn != null) {
		return (input.lengthFt * ((input.rows * input.rowSpacingIn) / 12)) / 43_560;
	}
	let acres = 0;
	for (const lane of lanes) {
		const rows = Math.max(lane.rows, 1);
		const border = Math.min(lane.borderRows, rows);
		const share = input.rowPosition === 'outside' ? border / rows : input.rowPosition === 'inside' ? (rows - border) / rows : 1;
		acres += lane.acres * share;
	}
	return acres;
}

/**
 * Bushels at the crop's standard moisture and bushel weight, and bushels per acre. Grain drier than
 * standard is raised to it, as the agronomy module does (its sources: Univ. of Wisconsin-Extension,
 * M. Rankin, "Bushels, Test Weight, Shrink, and Storage"; Mulvaney & Devkota, UF/IFAS EDIS SS-AGR-443, 2020).
 */
export function harvestFigures(input: HarvestInput, lanes: HarvestLane[]): HarvestFigures {
	const standard = GRAIN_STANDARDS[input.crop];
	const acres = harvestedAcres(input, lanes);
	const bushels = standardMoistureWeight(input.wetWeightLb, input.moisturePct, standard.standardMoisturePct) / standard.poundsPerBushel;
	return {
		harvestedAcres: acres,
		bushels,
		bushelsPerAcre: yieldBushelsPerAcre(input.crop, input.wetWeightLb, input.moisturePct, acres),
		standardMoisturePct: standard.standardMoisturePct,
		poundsPerBushel: standard.poundsPerBushel
	};
}

/** Plain-language problems with a harvest input against its lanes, keyed by input name; empty when fine. */
export function harvestProblems(input: HarvestInput | (Omit<HarvestInput, 'crop'> & { crop: string }), lanes: HarvestLane[]): Record<string, string[]> {
	const fields: Record<string, string[]> = {};
	const add = (k: string, m: string) => (fields[k] ??= []).push(m);
	if (!isGrainCrop(input.crop)) add('crop', `"${input.crop}" is not a grain crop weighed for yield; choose one of ${GRAIN_CROPS.join(', ')}.`);
	// A weigh wagon or scale ticket reads whole pounds; 1 lb to 10 million lb spans a hand sample to a whole field.
	if (!Number.isFinite(input.wetWeightLb) || input.wetWeightLb < 1 || input.wetWeightLb > 10_000_000) {
		add('wetWeightLb', `The weight must be between 1 lb and 10,000,000 lb; ${input.wetWeightLb} lb is outside it.`);
	}
	if (!Number.isFinite(input.moisturePct) || input.moisturePct < HARVEST_MOISTURE.min || input.moisturePct > HARVEST_MOISTURE.max) {
		add('moisturePct', `Moisture must be between ${HARVEST_MOISTURE.min} % and ${HARVEST_MOISTURE.max} %; ${input.moisturePct} % is outside it.`);
	}
	const measured = [input.lengthFt, input.rows, input.rowSpacingIn].filter((v) => v != null).length;
	if (measured !== 0 && measured !== 3) add('lengthFt', 'Give the length, the rows and the row spacing together, or none of them to use the lanes\u2019 acres.');
	const others = lanes.filter((l) => l.crop !== input.crop);
	if (others.length) {
		add('crop', `Lane ${others.map((l) => l.laneIndex + 1).join(', ')} ${others.length === 1 ? 'is' : 'are'} ${[...new Set(others.map((l) => l.crop))].join(' / ')}, not ${input.crop}.`);
	}
	if (input.rowPosition !== 'all' && measured === 0) {
		const noRows = lanes.filter((l) => (input.rowPosition === 'outside' ? l.borderRows : l.rows - l.borderRows) <= 0);
		if (noRows.length) add('rowPosition', `Lane ${noRows.map((l) => l.laneIndex + 1).join(', ')} has no ${input.rowPosition} rows; give the length, rows and spacing harvested instead.`);
	}
	return fields;
}
