import { describe, expect, it } from 'vitest';
import { describeShift, isWideRowPattern, patternWidthFt, shiftFeet } from '$lib/plans/shift';
import { rotationWarnings } from '$lib/plans/rotation-flags';
import { parseLaneList } from '$lib/plans/lane-selection';
import { lanesFeatureCollection } from '$lib/plans/lanes-geojson';
import type { LaneSpec } from '$lib/geometry/index';

const eightEight: LaneSpec[] = [
	{ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 },
	{ kind: 'crop', crop: 'soybean', rows: 8, rowSpacingIn: 30 }
];
const twin72: LaneSpec[] = [{ kind: 'crop', crop: 'corn', rows: 10, rowSpacingIn: 72, twinSpacingIn: 8 }];

describe('yearly shift', () => {
	it('defaults to one lane for 30-in strips and half a row for wide rows', () => {
		// 8 rows × 30 in = 20 ft (common practice).
		expect(shiftFeet(eightEight, 'default')).toBe(20);
		expect(shiftFeet(eightEight, 'lane-and-half')).toBe(30);
		expect(isWideRowPattern(twin72)).toBe(true);
		// Half of 72-in centres = 36 in = 3 ft: new rows land in last year's cover middles.
		expect(shiftFeet(twin72, 'default')).toBe(3);
		expect(shiftFeet(twin72, 'lane')).toBe(60);
		expect(shiftFeet(eightEight, 12.5)).toBe(12.5);
		expect(patternWidthFt(eightEight)).toBe(40);
		expect(describeShift(eightEight, 'default')).toBe('one lane: 20.00 ft to the right of A→B');
	});
});

describe('rotation warnings', () => {
	const lane = (index: number, crop: string, offsetFt: number) => ({ index, crop, offsetFt, widthFt: 20, kind: 'crop' as const });
	it('flags new corn beside old corn, not corn that only follows soybean away from corn', () => {
		const previous = [lane(0, 'corn', 0), lane(1, 'soybean', 20), lane(2, 'corn', 40), lane(3, 'soybean', 60)];
		const next = [lane(0, 'soybean', 0), lane(1, 'corn', 20), lane(2, 'soybean', 40), lane(3, 'corn', 60)];
		const w = rotationWarnings(previous, next, [{ from: 'corn', to: 'soybean', acres: 2 }, { from: 'soybean', to: 'corn', acres: 2 }], true);
		expect(w.map((x) => x.laneIndex)).toEqual([1, 3]);
		expect(w[0].message).toBe("Lane 2 (corn) borders last season's corn: scout its edge row for rootworm.");
	});
	it('reports every crop that follows itself except pasture', () => {
		const w = rotationWarnings([], [], [{ from: 'corn', to: 'corn', acres: 3.25 }, { from: 'pasture', to: 'pasture', acres: 5 }, { from: 'corn', to: 'soybean', acres: 4 }], false);
		expect(w).toEqual([{ kind: 'same_crop', laneIndex: null, message: '3.25 ac of corn follows corn.' }]);
	});
});

describe('lane lists', () => {
	it('reads ranges and single lanes as people count them', () => {
		expect(parseLaneList('1-3, 7', 10)).toEqual({ indexes: [0, 1, 2, 6] });
		expect(parseLaneList('4 to 5', 10)).toEqual({ indexes: [3, 4] });
		expect(parseLaneList('0', 10)).toEqual({ error: 'Lanes run from 1 to 10; "0" is outside that.' });
		expect(parseLaneList('x', 10)).toEqual({ error: '"x" is not a lane number or range like 3-8.' });
	});
});

describe('lanes as GeoJSON', () => {
	it('writes an RFC 7946 collection with the A-B line and lane properties', () => {
		const geometry = { type: 'Polygon' as const, coordinates: [[[-94, 44], [-93.99, 44], [-93.99, 44.01], [-94, 44]]] };
		const fc = lanesFeatureCollection('North 80', {
			season: 2027,
			variant: 'main',
			guidance: { a: [-94, 44], b: [-94, 44.01] },
			lanes: [{ index: 0, patternIndex: 0, kind: 'crop', crop: 'corn', widthFt: 20, rows: 8, offsetFt: 0, geometry, acres: 1.23456, rowFeet: 12345.67, borderRows: 1, assignment: null }]
		});
		expect(fc.type).toBe('FeatureCollection');
		expect(fc).not.toHaveProperty('crs'); // RFC 7946 drops crs
		expect(fc.features[0].geometry).toEqual({ type: 'LineString', coordinates: [[-94, 44], [-94, 44.01]] });
		expect(fc.features[1].properties).toMatchObject({ lane: 1, crop: 'corn', widthFt: 20, rows: 8, acres: 1.2346, season: 2027 });
	});
});
