import { rowPositionsIn, type LaneKind, type LaneSpec } from '../geometry/index';
import { EquipmentError } from './errors';

/**
 * The parts of a lane (as `layoutStrips` returns it) that passes and checks need. A `Lane` from the
 * geometry module fits as is. `rowSpacingIn` and `rowPositionsIn` may be filled in by the caller;
 * otherwise they come from the pattern or, failing that, from rows spread evenly over the width.
 */
export interface LaneInput {
	index: number;
	kind: LaneKind;
	crop: string;
	widthFt: number;
	rows: number;
	/** Left edge's signed distance right of A→B, feet. */
	offsetFt: number;
	patternIndex?: number;
	acres?: number | null;
	rowSpacingIn?: number | null;
	/** Row centres (a twin pair counts as one row), inches from the lane's left edge. */
	rowPositionsIn?: number[];
}

/** Row spacing and row centres of one lane, for callers that know them better than the layout. */
export interface LaneRows {
	laneIndex: number;
	rowSpacingIn: number | null;
	rowPositionsIn: number[];
}

/** A lane with its rows resolved: what every function of this module works with. */
export interface PlanLane {
	index: number;
	kind: LaneKind;
	crop: string;
	widthFt: number;
	rows: number;
	offsetFt: number;
	acres: number | null;
	rowSpacingIn: number | null;
	/** Row centres, inches from the lane's left edge; empty for lanes a planter never plants. */
	rowPositionsIn: number[];
}

/** Crop and cover lanes are planted; pasture and buffer lanes never are. */
export function isPlantingLane(kind: LaneKind): boolean {
	return kind === 'crop' || kind === 'cover';
}

/** Crop names compared the way people write them: "Corn" and "corn " are the same crop. */
export function sameCrop(a: string, b: string): boolean {
	return a.trim().toLowerCase() === b.trim().toLowerCase();
}

function requireFinite(what: string, value: unknown, laneNumber: number): number {
	if (typeof value !== 'number' || !Number.isFinite(value)) {
		throw new EquipmentError('invalid-lane', `Lane ${laneNumber}: the ${what} must be a number, got ${String(value)}.`);
	}
	return value;
}

/**
 * Resolves each lane's row spacing and row centres, in this order: `laneRows` for that lane, the
 * lane's own `rowSpacingIn`/`rowPositionsIn`, the pattern spec at `patternIndex`, and last rows
 * spread evenly over the lane's width. Twin pairs count as one row at the pair's centre (the
 * geometry contract counts them so), so a twin-row unit is one row unit. Lanes come back sorted
 * left to right; inputs are not changed.
 *
 * @throws EquipmentError('invalid-lane') for a lane with a missing or impossible width, offset or index
 * @example resolveLanes(layout.lanes, { pattern })[0].rowPositionsIn // [15, 45, … 225] for 8 rows of 30 in
 */
export function resolveLanes(lanes: readonly LaneInput[], options: { pattern?: readonly LaneSpec[]; laneRows?: readonly LaneRows[] } = {}): PlanLane[] {
	if (!Array.isArray(lanes)) throw new EquipmentError('invalid-lane', 'The lanes must be a list.');
	const byIndex = new Map<number, LaneRows>();
	for (const r of options.laneRows ?? []) byIndex.set(r.laneIndex, r);
	const seen = new Set<number>();
	const resolved = lanes.map((lane) => {
		if (!Number.isInteger(lane?.index) || lane.index < 0) {
			throw new EquipmentError('invalid-lane', `Every lane needs a whole-number index from 0 up, got ${String(lane?.index)}.`);
		}
		const n = lane.index + 1;
		if (seen.has(lane.index)) throw new EquipmentError('invalid-lane', `Lane ${n} appears twice in the lane list.`);
		seen.add(lane.index);
		const widthFt = requireFinite('width', lane.widthFt, n);
		if (widthFt <= 0) throw new EquipmentError('invalid-lane', `Lane ${n} is ${widthFt} ft wide; a lane must be wider than zero.`);
		const offsetFt = requireFinite('offset', lane.offsetFt, n);
		const rows = lane.rows ?? 0;
		if (!Number.isInteger(rows) || rows < 0) throw new EquipmentError('invalid-lane', `Lane ${n} has ${String(rows)} rows; rows must be a whole number.`);

		let rowSpacingIn: number | null = null;
		let positions: number[] = [];
		const given = byIndex.get(lane.index);
		const spec = lane.patternIndex !== undefined ? options.pattern?.[lane.patternIndex] : undefined;
		if (given) {
			rowSpacingIn = given.rowSpacingIn;
			positions = [...given.rowPositionsIn];
		} else if (lane.rowPositionsIn || (lane.rowSpacingIn !== undefined && lane.rowSpacingIn !== null)) {
			rowSpacingIn = lane.rowSpacingIn ?? (rows > 0 ? (widthFt * 12) / rows : null);
			positions = lane.rowPositionsIn ? [...lane.rowPositionsIn] : evenRows(rows, rowSpacingIn);
		} else if (spec) {
			rowSpacingIn = spec.rowSpacingIn ?? null;
			positions = rowPositionsIn({ ...spec, twinSpacingIn: undefined });
		} else if (rows > 0) {
			rowSpacingIn = (widthFt * 12) / rows;
			positions = evenRows(rows, rowSpacingIn);
		}
		if (rowSpacingIn !== null && !(Number.isFinite(rowSpacingIn) && rowSpacingIn > 0)) {
			throw new EquipmentError('invalid-lane', `Lane ${n}: the row spacing must be more than zero inches, got ${String(rowSpacingIn)}.`);
		}
		for (const p of positions) requireFinite('row position', p, n);
		return {
			index: lane.index,
			kind: lane.kind,
			crop: lane.crop,
			widthFt,
			rows,
			offsetFt,
			acres: typeof lane.acres === 'number' ? lane.acres : null,
			rowSpacingIn,
			rowPositionsIn: isPlantingLane(lane.kind) ? positions.sort((a, b) => a - b) : []
		};
	});
	return resolved.sort((a, b) => a.offsetFt - b.offsetFt);
}

function evenRows(rows: number, spacingIn: number | null): number[] {
	if (!spacingIn) return [];
	return Array.from({ length: rows }, (_, i) => (i + 0.5) * spacingIn);
}
