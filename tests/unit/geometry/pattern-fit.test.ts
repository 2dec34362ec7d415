import { describe, expect, it } from 'vitest';
import { equipmentFit, GeometryError, laneWidthFt, openMiddleIn, rowPositionsIn } from '../../../src/lib/geometry/index';

/** The error `fn` throws; fails the test when it throws nothing. */
function thrownBy(fn: () => unknown): unknown {
	try {
		fn();
	} catch (e) {
		return e;
	}
	throw new Error('expected the call to throw, and it returned normally');
}

describe('lane widths from rows', () => {
	it('8 rows of 30 in make a 20-ft lane, 4 rows a 10-ft lane', () => {
		// Arithmetic: rows × spacing, 8 × 30 in = 240 in = 20 ft; 4 × 30 in = 10 ft; 16 × 30 in = 40 ft.
		expect(laneWidthFt({ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 })).toBe(20);
		expect(laneWidthFt({ kind: 'crop', crop: 'corn', rows: 4, rowSpacingIn: 30 })).toBe(10);
		expect(laneWidthFt({ kind: 'crop', crop: 'corn', rows: 16, rowSpacingIn: 30 })).toBe(40);
	});

	it('a twin pair counts as one row and an explicit width overrides', () => {
		expect(laneWidthFt({ kind: 'crop', crop: 'corn', rows: 4, rowSpacingIn: 72, twinSpacingIn: 8 })).toBe(24);
		expect(laneWidthFt({ kind: 'pasture', crop: 'pasture', widthFt: 33 })).toBe(33);
		expect(laneWidthFt({ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30, widthFt: 21 })).toBe(21);
	});

	it('72-in twin rows 8 in apart leave 64 in between pairs', () => {
		// Common practice (no published source): 72-in centres less the 8-in twin gap leave 64 in.
		expect(openMiddleIn({ kind: 'crop', crop: 'corn', rows: 4, rowSpacingIn: 72, twinSpacingIn: 8 })).toBe(64);
		expect(openMiddleIn({ kind: 'crop', crop: 'corn', rows: 4, rowSpacingIn: 60 })).toBe(60);
		expect(openMiddleIn({ kind: 'pasture', crop: 'pasture', widthFt: 30 })).toBeUndefined();
	});

	it('places twin rows centred in their share', () => {
		expect(rowPositionsIn({ kind: 'crop', crop: 'corn', rows: 2, rowSpacingIn: 60, twinSpacingIn: 8 })).toEqual([26, 34, 86, 94]);
		expect(rowPositionsIn({ kind: 'crop', crop: 'soybean', rows: 3, rowSpacingIn: 30 })).toEqual([15, 45, 75]);
	});
});

describe('equipmentFit', () => {
	it('a 15-ft drill in a 10-ft lane overhangs 30 in on each side', () => {
		expect(equipmentFit(10, 15)).toEqual({ passes: 1, fits: false, overlapInEachSide: 30, lastPassCoverage: 10 / 15 });
	});

	it('a 40-ft lane takes three passes of a 15-ft implement, the last covering 10/15', () => {
		const fit = equipmentFit(40, 15);
		expect(fit.passes).toBe(3);
		expect(fit.fits).toBe(false);
		expect(fit.overlapInEachSide).toBe(0);
		expect(fit.lastPassCoverage).toBeCloseTo(0.6667, 4);
	});

	it('fits when passes divide the lane evenly', () => {
		expect(equipmentFit(20, 20)).toEqual({ passes: 1, fits: true, overlapInEachSide: 0, lastPassCoverage: 1 });
		expect(equipmentFit(60, 20)).toEqual({ passes: 3, fits: true, overlapInEachSide: 0, lastPassCoverage: 1 });
		// 8-row 30-in planter (20 ft) on a 16-row lane (40 ft): two passes.
		expect(equipmentFit(40, 20).passes).toBe(2);
		// Widths computed from inches that land a hair off a whole multiple still fit.
		expect(equipmentFit((16 * 30) / 12, (8 * 30) / 12 + 1e-9).fits).toBe(true);
	});

	it('refuses widths that are not positive numbers', () => {
		for (const [lane, tool] of [[0, 10], [10, -1], [Number.NaN, 10], [10, Infinity]]) {
			expect(() => equipmentFit(lane, tool)).toThrow(GeometryError);
		}
		const error = thrownBy(() => equipmentFit(-5, 10));
		expect(error).toBeInstanceOf(GeometryError);
		expect((error as GeometryError).code).toBe('invalid-number');
		expect((error as GeometryError).message).toBe('The lane width is -5 ft; it must be more than zero.');
	});
});
