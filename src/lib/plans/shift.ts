// How far next season's strips move. Pure.
import { laneWidthFt, type LaneSpec } from '../geometry/index';

export type ShiftChoice = 'default' | 'lane' | 'lane-and-half' | 'half-row' | number;

/** Rows on centres this wide or wider are wide rows with a cover middle (common practice). */
export const WIDE_ROW_MIN_IN = 60;

export function patternWidthFt(pattern: LaneSpec[]): number {
	return pattern.reduce((s, l) => s + laneWidthFt(l), 0);
}

function widestRowSpacingIn(pattern: LaneSpec[]): number {
	return Math.max(0, ...pattern.filter((l) => l.kind === 'crop' && l.rowSpacingIn).map((l) => l.rowSpacingIn!));
}

export function isWideRowPattern(pattern: LaneSpec[]): boolean {
	return widestRowSpacingIn(pattern) >= WIDE_ROW_MIN_IN;
}

/**
 * The shift in feet for a choice. Default: half the row spacing for wide rows (new rows land in
 * last year's cover middles), otherwise one lane width (each crop moves onto its neighbour's lane).
 * @example shiftFeet([{ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 }, …], 'lane') // 20
 */
export function shiftFeet(pattern: LaneSpec[], choice: ShiftChoice): number {
	if (typeof choice === 'number') return choice;
	const firstLane = laneWidthFt(pattern[0]);
	switch (choice) {
		case 'lane':
			return firstLane;
		case 'lane-and-half':
			return firstLane * 1.5;
		case 'half-row':
			return widestRowSpacingIn(pattern) / 2 / 12;
		case 'default':
			return isWideRowPattern(pattern) ? widestRowSpacingIn(pattern) / 2 / 12 : firstLane;
	}
}

export function describeShift(pattern: LaneSpec[], choice: ShiftChoice): string {
	const ft = shiftFeet(pattern, choice);
	const label = typeof choice === 'number' ? 'chosen distance' : { default: isWideRowPattern(pattern) ? 'half a row' : 'one lane', lane: 'one lane', 'lane-and-half': 'one and a half lanes', 'half-row': 'half a row' }[choice];
	return `${label}: ${ft.toFixed(2)} ft to the right of A→B`;
}
