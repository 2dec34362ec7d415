import type { LaneSpec } from '../geometry/index';
import { EquipmentError } from './errors';
import { isPlantingLane, resolveLanes, sameCrop, type LaneInput, type LaneRows, type PlanLane } from './lanes';
import { checkPlanter, unitOffsetFt, type CheckedPlanter, type FieldEnd } from './planter';
import type { PlanterSetup, RowUnit } from './types';
import { unitList } from './words';

/** A unit lands "on" a row when within this distance of the row's centre (half an inch, in feet). */
const ROW_TOLERANCE_FT = 0.5 / 12;
/** Lane edges closer than this (≈ 0.3 mm) count as the same line. */
const EDGE_TOLERANCE_FT = 0.001;

/**
 * How the starting end of each pass is chosen.
 * - 'match-seed' (default): passes alternate ends, except where the other end is the only way to
 *   put seed boxes over lanes of their own crop (or plants more rows); units over another crop's
 *   rows are shut off.
 * - 'alternate': strictly back and forth with every unit that carries seed planting whatever row
 *   it lands on, as an operator who just turns around would. Shows what goes wrong; checks flag it.
 */
export type EndChoice = 'match-seed' | 'alternate';

/** Why a row unit is shut off on a pass. */
export type UnitOffReason =
	| 'outside-lanes'
	| 'non-planting-lane'
	| 'between-rows'
	| 'empty-seed-box'
	| 'row-already-planted'
	| 'other-crop';

/** One row unit on one pass. */
export interface PassUnit {
	/** 1-based, from the operator's left facing forward. */
	unit: number;
	/** Where the unit runs: feet right of A→B. */
	positionFt: number;
	/** Lane under the unit, or null when it runs outside every lane. */
	laneIndex: number | null;
	/** Row of that lane the unit runs on, 1-based from the lane's left edge looking from A to B. */
	rowNumber: number | null;
	on: boolean;
	offReason: UnitOffReason | null;
	/** What the seed box carries (whether or not the unit is on). */
	seed: RowUnit['seed'];
	/** Fertilizer line ids flowing at this unit on this pass (none when the unit is off). */
	fertilizerOn: string[];
}

/** One trip across the field with the planter, in driving order. */
export interface PlannedPass {
	/** 1-based driving order. */
	number: number;
	startsAt: FieldEnd;
	endsAt: FieldEnd;
	/** The planter's field-left edge, feet right of A→B (whatever the driving direction). */
	leftEdgeFt: number;
	rightEdgeFt: number;
	/** Every lane the planter's width reaches, left to right. */
	laneIndexes: number[];
	/** Lanes where at least one unit plants. */
	plantsLaneIndexes: number[];
	/** All row units, in unit-number order. */
	units: PassUnit[];
	unitsOn: number;
	/** True when this pass starts from the same end as the previous one: drive back empty. */
	sameEndAsPrevious: boolean;
	/** For the cab: "Lanes 1–2: units 1–8 corn (hybrid A) on lane 1, units 9–16 soybean on lane 2". */
	summary: string;
}

export interface UnplantedRows {
	laneIndex: number;
	crop: string;
	rowNumbers: number[];
}

export interface PassPlan {
	passes: PlannedPass[];
	/** Lanes with their rows resolved; give these to `checkPasses` and the quantities. */
	lanes: PlanLane[];
	planterWidthFt: number;
	startSide: 'left' | 'right';
	ends: EndChoice;
	/** Rows of planting lanes that no pass plants (no unit carries their crop). */
	unplantedRows: UnplantedRows[];
	/** Plain notes for the operator: passes that start from the same end, rows left for another planting. */
	warnings: string[];
}

export interface PlanPassesInput {
	/** Lanes from `layoutStrips` (or anything with the same fields). */
	lanes: readonly LaneInput[];
	/** The plan's pattern: gives each lane its row spacing through `patternIndex`. */
	pattern?: readonly LaneSpec[];
	/** Row spacing and positions per lane, when known better than the pattern. */
	laneRows?: readonly LaneRows[];
	planter: PlanterSetup;
	/** Side of the field (looking from A to B) where planting begins. Default 'left'. */
	startSide?: 'left' | 'right';
	/** End the first pass starts from. Default 'A'. */
	firstPassStartsAt?: FieldEnd;
	/** Default 'match-seed'. */
	ends?: EndChoice;
}

interface RowSlot {
	laneIndex: number;
	rowNumber: number;
	xFt: number;
	crop: string;
	planted: boolean;
	unplantable: boolean;
}

const other = (end: FieldEnd): FieldEnd => (end === 'A' ? 'B' : 'A');

/**
 * Plans planter passes across a field in driving order.
 *
 * Geometry: positions are feet right of the A→B line. Units are numbered from the operator's
 * left; on a pass driven A→B unit 1 runs at the field-left side of the planter, on a pass driven
 * B→A at the field-right side. Each pass is placed so that the unit nearest the unplanted ground
 * that carries the next unplanted row's crop runs on that row; the planter's width then decides
 * which other rows its units reach. A unit is on only when it runs on a not-yet-planted row of a
 * crop or cover lane and its seed box carries something (in 'match-seed' mode, also the lane's crop).
 * Lanes that are not a whole number of planter widths get partial passes with units shut off.
 *
 * Ends: passes alternate (A→B, B→A, …) unless, in 'match-seed' mode, the other end puts seed boxes
 * over their own crop and the alternating end does not (a split planter over corn/soybean lanes).
 * Such a pass starts from the same end as the one before it and is reported: drive back empty.
 *
 * @throws EquipmentError for a planter without row units or seed, or an invalid lane or option
 * @example
 * const plan = planPasses({ lanes: layout.lanes, pattern, planter: sixteenRowSplit });
 * plan.passes[1].startsAt // 'A' — the return pass would put corn units over soybean
 */
export function planPasses(input: PlanPassesInput): PassPlan {
	const planter = checkPlanter(input.planter);
	const startSide = input.startSide ?? 'left';
	const firstEnd = input.firstPassStartsAt ?? 'A';
	const ends = input.ends ?? 'match-seed';
	if (startSide !== 'left' && startSide !== 'right') throw new EquipmentError('invalid-option', `The starting side must be 'left' or 'right', got ${String(startSide)}.`);
	if (firstEnd !== 'A' && firstEnd !== 'B') throw new EquipmentError('invalid-option', `The first pass must start from A or B, got ${String(firstEnd)}.`);
	if (ends !== 'match-seed' && ends !== 'alternate') throw new EquipmentError('invalid-option', `The end choice must be 'match-seed' or 'alternate', got ${String(ends)}.`);
	if (!planter.units.some((u) => u.seed)) {
		throw new EquipmentError('no-seed', 'No seed box on the planter carries seed. Fill in what each row unit carries before planning passes.');
	}

	const lanes = resolveLanes(input.lanes, { pattern: input.pattern, laneRows: input.laneRows });
	const rowsByLane = new Map<number, RowSlot[]>();
	const allRows: RowSlot[] = [];
	for (const lane of lanes) {
		const slots = lane.rowPositionsIn.map((p, i) => ({ laneIndex: lane.index, rowNumber: i + 1, xFt: lane.offsetFt + p / 12, crop: lane.crop, planted: false, unplantable: false }));
		rowsByLane.set(lane.index, slots);
		allRows.push(...slots);
	}
	allRows.sort((a, b) => (startSide === 'left' ? a.xFt - b.xFt : b.xFt - a.xFt));

	const passes: PlannedPass[] = [];
	let previous: FieldEnd | null = null;
	for (const target of allRows) {
		if (target.planted || target.unplantable) continue;
		const preferred: FieldEnd = previous === null ? firstEnd : other(previous);
		const candidates: FieldEnd[] = ends === 'alternate' ? [preferred] : [preferred, other(preferred)];
		let best: { startsAt: FieldEnd; units: PassUnit[]; planted: RowSlot[]; leftEdgeFt: number } | null = null;
		for (const startsAt of candidates) {
			const anchor = anchorUnit(planter, startsAt, startSide, ends === 'alternate' ? null : target.crop);
			if (!anchor) continue;
			const leftEdgeFt = target.xFt - unitOffsetFt(anchor.unit, planter.units.length, planter.rowSpacingIn, startsAt);
			const placed = placeUnits(planter, lanes, rowsByLane, leftEdgeFt, startsAt, ends);
			if (!best || placed.planted.length > best.planted.length) best = { startsAt, leftEdgeFt, ...placed };
		}
		if (!best || best.planted.length === 0) {
			target.unplantable = true;
			continue;
		}
		for (const row of best.planted) row.planted = true;
		passes.push(describePass(passes.length + 1, best.startsAt, best.leftEdgeFt, planter, lanes, best.units, previous));
		previous = best.startsAt;
	}

	const unplantedRows: UnplantedRows[] = [];
	for (const lane of lanes) {
		const left = (rowsByLane.get(lane.index) ?? []).filter((r) => !r.planted);
		if (left.length > 0) unplantedRows.push({ laneIndex: lane.index, crop: lane.crop, rowNumbers: left.map((r) => r.rowNumber) });
	}
	const warnings = [
		...passes.filter((p) => p.sameEndAsPrevious).map(driveBackEmptyMessage),
		...unplantedRows.map((u) => `Lane ${u.laneIndex + 1} (${u.crop}): ${u.rowNumbers.length} row${u.rowNumbers.length === 1 ? '' : 's'} left unplanted by this planter setup; no row unit carries ${u.crop}.`)
	];
	return { passes, lanes, planterWidthFt: planter.widthFt, startSide, ends, unplantedRows, warnings };
}

/** "Pass 2 starts from A again, like pass 1: drive back to A empty …" */
export function driveBackEmptyMessage(pass: Pick<PlannedPass, 'number' | 'startsAt'>): string {
	return `Pass ${pass.number} starts from ${pass.startsAt} again, like pass ${pass.number - 1}: drive back to ${pass.startsAt} with the planter raised. Starting from ${other(pass.startsAt)} would put seed boxes over the wrong crop.`;
}

/**
 * The unit nearest the unplanted side that carries seed (of `crop`, when given). Driving A→B
 * unit 1 is the field-left unit; driving B→A it is the field-right one.
 */
function anchorUnit(planter: CheckedPlanter, startsAt: FieldEnd, startSide: 'left' | 'right', crop: string | null): RowUnit | undefined {
	const leftFirst = startsAt === 'A' ? planter.units : [...planter.units].reverse();
	const order = startSide === 'left' ? leftFirst : [...leftFirst].reverse();
	return order.find((u) => u.seed && (crop === null || sameCrop(u.seed.crop, crop)));
}

/** The lane under a point; lanes are sorted left to right and do not overlap. */
function laneAt(lanes: PlanLane[], xFt: number): PlanLane | null {
	let lo = 0;
	let hi = lanes.length - 1;
	while (lo <= hi) {
		const mid = (lo + hi) >> 1;
		const lane = lanes[mid];
		if (xFt < lane.offsetFt - EDGE_TOLERANCE_FT) hi = mid - 1;
		else if (xFt >= lane.offsetFt + lane.widthFt - EDGE_TOLERANCE_FT) lo = mid + 1;
		else return lane;
	}
	return null;
}

function placeUnits(planter: CheckedPlanter, lanes: PlanLane[], rowsByLane: Map<number, RowSlot[]>, leftEdgeFt: number, startsAt: FieldEnd, ends: EndChoice): { units: PassUnit[]; planted: RowSlot[] } {
	const planted: RowSlot[] = [];
	const units = planter.units.map((u): PassUnit => {
		const positionFt = leftEdgeFt + unitOffsetFt(u.unit, planter.units.length, planter.rowSpacingIn, startsAt);
		const lane = laneAt(lanes, positionFt);
		const row = lane ? (rowsByLane.get(lane.index) ?? []).find((r) => Math.abs(r.xFt - positionFt) <= ROW_TOLERANCE_FT) : undefined;
		const base = { unit: u.unit, positionFt, laneIndex: lane?.index ?? null, rowNumber: row?.rowNumber ?? null, seed: u.seed };
		const off = (offReason: UnitOffReason): PassUnit => ({ ...base, on: false, offReason, fertilizerOn: [] });
		if (!lane) return off('outside-lanes');
		if (!isPlantingLane(lane.kind)) return off('non-planting-lane');
		if (!row) return off('between-rows');
		if (!u.seed) return off('empty-seed-box');
		if (row.planted) return off('row-already-planted');
		if (ends === 'match-seed' && !sameCrop(u.seed.crop, lane.crop)) return off('other-crop');
		planted.push(row);
		return { ...base, on: true, offReason: null, fertilizerOn: [...(u.fertilizerOn ?? [])] };
	});
	return { units, planted };
}

function describePass(number: number, startsAt: FieldEnd, leftEdgeFt: number, planter: CheckedPlanter, lanes: PlanLane[], units: PassUnit[], previous: FieldEnd | null): PlannedPass {
	const rightEdgeFt = leftEdgeFt + planter.widthFt;
	const laneIndexes = lanes
		.filter((l) => Math.min(rightEdgeFt, l.offsetFt + l.widthFt) - Math.max(leftEdgeFt, l.offsetFt) > EDGE_TOLERANCE_FT)
		.map((l) => l.index);
	const plantsLaneIndexes = laneIndexes.filter((i) => units.some((u) => u.on && u.laneIndex === i));
	return {
		number,
		startsAt,
		endsAt: other(startsAt),
		leftEdgeFt,
		rightEdgeFt,
		laneIndexes,
		plantsLaneIndexes,
		units,
		unitsOn: units.filter((u) => u.on).length,
		sameEndAsPrevious: previous === startsAt,
		summary: passSummary(plantsLaneIndexes, units)
	};
}

/** "Lanes 1–2: units 1–8 corn (hybrid A) on lane 1, units 9–16 soybean on lane 2; units 13–16 off". */
export function passSummary(plantsLaneIndexes: readonly number[], units: readonly PassUnit[]): string {
	const groups: { lane: number; seed: string; units: number[] }[] = [];
	for (const u of units) {
		if (!u.on || u.laneIndex === null || !u.seed) continue;
		const seed = u.seed.variety ? `${u.seed.crop} (${u.seed.variety})` : u.seed.crop;
		const last = groups[groups.length - 1];
		if (last && last.lane === u.laneIndex && last.seed === seed) last.units.push(u.unit);
		else groups.push({ lane: u.laneIndex, seed, units: [u.unit] });
	}
	const off = units.filter((u) => !u.on).map((u) => u.unit);
	const lanesPart =
		plantsLaneIndexes.length === 0
			? 'Nothing planted'
			: plantsLaneIndexes.length === 1
				? `Lane ${plantsLaneIndexes[0] + 1}`
				: `Lanes ${rangeText(plantsLaneIndexes.map((i) => i + 1))}`;
	const planted = groups.map((g) => `${unitList(g.units).replace(/^row /, '')} ${g.seed} on lane ${g.lane + 1}`).join(', ');
	const offPart = off.length > 0 ? `; ${unitList(off).replace(/^row /, '')} off` : '';
	return `${lanesPart}${planted ? `: ${planted}` : ''}${offPart}`;
}

function rangeText(numbers: number[]): string {
	const contiguous = numbers.every((n, i) => i === 0 || n === numbers[i - 1] + 1);
	return contiguous ? `${numbers[0]}–${numbers[numbers.length - 1]}` : numbers.join(', ');
}
