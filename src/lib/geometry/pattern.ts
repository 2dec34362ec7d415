import type { LaneSpec } from './types';
import { INCHES_PER_FOOT } from './units';

/**
 * Width of one lane of the pattern, feet: `widthFt` when given, otherwise rows × rowSpacingIn ÷ 12
 * (a twin pair counts as one row, centred in its share of the lane). Assumes a validated spec.
 *
 * @param spec the lane's spec
 * @returns width in feet
 * @example laneWidthFt({ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 }) // 20
 */
export function laneWidthFt(spec: LaneSpec): number {
	if (spec.widthFt !== undefined) return spec.widthFt;
	return ((spec.rows ?? 0) * (spec.rowSpacingIn ?? 0)) / INCHES_PER_FOOT;
}

/**
 * Open width between neighbouring rows, or between twin pairs, where a cover crop can be seeded:
 * rowSpacingIn − twinSpacingIn for twin rows, rowSpacingIn for single rows; undefined without spacing.
 *
 * @param spec the lane's spec
 * @returns inches, or undefined
 * @example openMiddleIn({ kind: 'crop', crop: 'corn', rows: 4, rowSpacingIn: 72, twinSpacingIn: 8 }) // 64
 */
export function openMiddleIn(spec: LaneSpec): number | undefined {
	if (spec.rowSpacingIn === undefined) return undefined;
	return spec.rowSpacingIn - (spec.twinSpacingIn ?? 0);
}

/**
 * Offsets (inches from the lane's left edge) of every row in a lane, twins as two rows; the seeding
 * sheet uses them to place row units. Each row or twin pair sits centred in its share.
 *
 * @param spec the lane's spec
 * @returns row positions in inches, left to right
 * @example rowPositionsIn({ kind: 'crop', crop: 'corn', rows: 2, rowSpacingIn: 60, twinSpacingIn: 8 }) // [26, 34, 86, 94]
 */
export function rowPositionsIn(spec: LaneSpec): number[] {
	const rows = spec.rows ?? 0;
	const spacing = spec.rowSpacingIn ?? 0;
	const twin = spec.twinSpacingIn ?? 0;
	const positions: number[] = [];
	for (let i = 0; i < rows; i++) {
		const centre = (i + 0.5) * spacing;
		if (twin > 0) positions.push(centre - twin / 2, centre + twin / 2);
		else positions.push(centre);
	}
	return positions;
}

/** Left edge of each lane within one repeat of the pattern, feet, plus the repeat's total width. */
export function patternEdgesFt(pattern: LaneSpec[]): { starts: number[]; widths: number[]; repeatFt: number } {
	const starts: number[] = [];
	const widths: number[] = [];
	let x = 0;
	for (const spec of pattern) {
		starts.push(x);
		const w = laneWidthFt(spec);
		widths.push(w);
		x += w;
	}
	return { starts, widths, repeatFt: x };
}
