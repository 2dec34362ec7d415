// Everything the cab seeding sheet shows, already computed. The page and the PDF both draw this.
import type { MultiPolygon, Polygon } from 'geojson';
import type { CheckFinding } from '../equipment/types';
import type { LngLat } from '../geometry/index';
import type { CondensedWarning } from '../farm/condense';

export interface SheetLane {
	index: number; // 0-based; shown to people as index + 1
	kind: 'crop' | 'pasture' | 'cover' | 'buffer';
	crop: string;
	widthFt: number;
	rows: number;
	rowSpacingIn: number | null;
	acres: number;
	variety: string | null;
	populationPerAcre: number | null;
	trialLabel: string | null;
	geometry: Polygon | MultiPolygon;
}

export interface SheetPassUnit {
	unit: number;
	laneIndex: number | null; // null when the unit runs outside every lane
	seed: string | null; // "corn — hybrid B" or null when off
	fertilizer: string[]; // names of lines on
}

export interface SheetPass {
	number: number; // 1-based, driving order
	startsAt: 'A' | 'B'; // which end of the field the pass starts from
	laneIndexes: number[];
	summary: string; // e.g. "Lanes 1–2: units 1–8 corn (hybrid A), 9–16 soybean"
	unitsOn: number;
	units: SheetPassUnit[];
}

/** A check as the sheet lists it: the equipment module's finding, unchanged. */
export type SheetCheck = CheckFinding;

export interface SheetQuantity {
	label: string; // "Corn — hybrid A" or "UAN 32 %"
	amount: string; // formatted with units, e.g. "34.0 units (2,720,000 seeds)"
	detail: string | null; // how it was computed
}

export interface SheetData {
	farmName: string;
	fieldName: string;
	season: number;
	planName: string;
	printedAt: Date;
	preparedBy: string;
	fieldAcres: number;
	plantedAcres: number;
	guidance: { a: LngLat; b: LngLat };
	headlandFt: number;
	boundary: Polygon | MultiPolygon;
	exclusions: { name: string; geometry: Polygon | MultiPolygon }[];
	lanes: SheetLane[];
	/** null when the farm has no planter yet: the sheet still lists lanes, widths, crops, acres. */
	equipment: { name: string; widthFt: number; rowSpacingIn: number | null; units: { unit: number; seed: string | null; fertilizer: { name: string; on: boolean }[] }[] } | null;
	passes: SheetPass[];
	/** Every finding, as found: the appendix prints these in full. */
	checks: SheetCheck[];
	/**
	 * One line per kind of problem with what it costs, STOP first: what the sheet itself prints.
	 * The builder always sets it; without it the page and PDF condense `checks` (checkGroupsOf).
	 */
	checkGroups?: CondensedWarning[];
	hazards: string[];
	quantities: SheetQuantity[];
	cautions: string[];
}
