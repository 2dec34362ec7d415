import { describe, expect, it } from 'vitest';
import { GeometryError, layoutStrips, rotationMatrix, type LayoutInput } from '../../../src/lib/geometry/index';
import { rectangleField, travel } from './geodesy';

const origin: [number, number] = [-93.9, 44.1];
const corn = { kind: 'crop' as const, crop: 'corn', rows: 8, rowSpacingIn: 30 };
const soy = { kind: 'crop' as const, crop: 'soybean', rows: 8, rowSpacingIn: 30 };

function good(): LayoutInput {
	return {
		boundary: rectangleField(origin, 1320, 1320),
		guidance: { a: origin, b: travel(origin, 0, 1320) },
		pattern: [corn, soy],
		headlandFt: 30
	};
}

function codeOf(fn: () => unknown): { code: string; message: string; where?: [number, number] } {
	try {
		fn();
	} catch (e) {
		expect(e).toBeInstanceOf(GeometryError);
		const g = e as GeometryError;
		return { code: g.code, message: g.message, where: g.where };
	}
	throw new Error('expected a GeometryError');
}

describe('layoutStrips refuses bad input with a clear GeometryError', () => {
	it('self-intersecting boundary, saying where it crosses', () => {
		// A bow-tie: corners 2 and 3 swapped, crossing at the square's middle.
		const [p0, p1, p2, p3] = rectangleField(origin, 1320, 1320).coordinates[0];
		const input = { ...good(), boundary: { type: 'Polygon' as const, coordinates: [[p0, p1, p3, p2, p0]] } };
		const err = codeOf(() => layoutStrips(input));
		expect(err.code).toBe('self-intersection');
		const centre = travel(travel(origin, 0, 660), 90, 660);
		expect(err.where![0]).toBeCloseTo(centre[0], 4);
		expect(err.where![1]).toBeCloseTo(centre[1], 4);
		expect(err.message).toContain(`longitude ${centre[0].toFixed(3)}`);
	});

	it('a hole crossing the outer ring', () => {
		const outer = rectangleField(origin, 1320, 1320).coordinates[0];
		const hole = rectangleField(travel(origin, 90, 1000), 600, 300).coordinates[0];
		const err = codeOf(() => layoutStrips({ ...good(), boundary: { type: 'Polygon', coordinates: [outer, hole] } }));
		expect(err.code).toBe('self-intersection');
	});

	it('A and B the same point, or far from the field', () => {
		expect(codeOf(() => layoutStrips({ ...good(), guidance: { a: origin, b: [...origin] as [number, number] } })).code).toBe('ab-same-point');
		const far = travel(origin, 0, 30_000);
		const err = codeOf(() => layoutStrips({ ...good(), guidance: { a: far, b: travel(far, 0, 1000) } }));
		expect(err.code).toBe('ab-far-from-field');
		expect(err.message).toMatch(/Point A .* miles from the field/);
	});

	it('empty pattern, zero or negative widths, rows without spacing', () => {
		expect(codeOf(() => layoutStrips({ ...good(), pattern: [] })).code).toBe('empty-pattern');
		expect(codeOf(() => layoutStrips({ ...good(), pattern: [{ kind: 'pasture', crop: 'pasture', widthFt: 0 }] })).message).toMatch(/0 ft wide/);
		expect(codeOf(() => layoutStrips({ ...good(), pattern: [{ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: -30 }] })).code).toBe('invalid-lane');
		const noSpacing = codeOf(() => layoutStrips({ ...good(), pattern: [{ kind: 'crop', crop: 'corn', rows: 8 }] }));
		expect(noSpacing.code).toBe('invalid-lane');
		expect(noSpacing.message).toMatch(/8 rows but no row spacing/);
		expect(codeOf(() => layoutStrips({ ...good(), pattern: [{ kind: 'pasture', crop: 'pasture' }] })).message).toMatch(/no width/);
		expect(codeOf(() => layoutStrips({ ...good(), pattern: [{ ...corn, twinSpacingIn: 30 }] })).message).toMatch(/twin/);
		expect(codeOf(() => layoutStrips({ ...good(), pattern: [{ ...corn, rows: 2.5 }] })).message).toMatch(/whole number/);
	});

	it('fields over 20,000 acres or with more than 100,000 points', () => {
		const huge = rectangleField(origin, 6 * 5280, 6 * 5280); // a township, ≈ 23,040 ac
		const err = codeOf(() => layoutStrips({ ...good(), boundary: huge }));
		expect(err.code).toBe('field-too-large');
		expect(err.message).toMatch(/23,0\d\d acres/);
		const ring: [number, number][] = [];
		for (let i = 0; i < 100_001; i++) {
			const t = (2 * Math.PI * i) / 100_001;
			ring.push([origin[0] + 0.01 * Math.cos(t), origin[1] + 0.01 * Math.sin(t)]);
		}
		ring.push(ring[0]);
		expect(codeOf(() => layoutStrips({ ...good(), boundary: { type: 'Polygon', coordinates: [ring] } })).code).toBe('too-many-vertices');
	});

	it('coordinates out of range, or latitude and longitude swapped', () => {
		const ring = rectangleField(origin, 1320, 1320).coordinates[0];
		const swapped = ring.map(([lng, lat]) => [lat, lng]);
		const err = codeOf(() => layoutStrips({ ...good(), boundary: { type: 'Polygon', coordinates: [swapped] } }));
		expect(err.code).toBe('swapped-coordinates');
		expect(err.message).toMatch(/look swapped/);
		const outOfRange = ring.map(([lng, lat]) => [lng - 200, lat]);
		expect(codeOf(() => layoutStrips({ ...good(), boundary: { type: 'Polygon', coordinates: [outOfRange] } })).code).toBe('out-of-range');
		expect(codeOf(() => layoutStrips({ ...good(), guidance: { a: [44.1, -93.9], b: origin } })).code).toBe('swapped-coordinates');
	});

	it('exclusions that cover the whole field, or a headland that leaves nothing', () => {
		const cover = rectangleField(travel(travel(origin, 180, 100), 270, 100), 1600, 1600);
		const err = codeOf(() => layoutStrips({ ...good(), exclusions: [cover] }));
		expect(err.code).toBe('nothing-to-plant');
		expect(err.message).toMatch(/exclusions cover the whole field/);
		expect(codeOf(() => layoutStrips({ ...good(), headlandFt: 700 })).message).toMatch(/700-ft headland/);
		expect(codeOf(() => layoutStrips({ ...good(), headlandFt: -1 })).code).toBe('invalid-number');
	});

	it('non-finite numbers anywhere', () => {
		const ring = rectangleField(origin, 1320, 1320).coordinates[0].map((p) => [...p]);
		ring[1][1] = Number.NaN;
		expect(codeOf(() => layoutStrips({ ...good(), boundary: { type: 'Polygon', coordinates: [ring] } })).code).toBe('not-finite');
		expect(codeOf(() => layoutStrips({ ...good(), offsetFt: Infinity })).code).toBe('not-finite');
		expect(codeOf(() => layoutStrips({ ...good(), pattern: [{ ...corn, rowSpacingIn: Number.NaN }] })).code).toBe('not-finite');
		expect(codeOf(() => layoutStrips({ ...good(), guidance: { a: [Number.NaN, 44], b: origin } })).code).toBe('not-finite');
	});

	it('open rings and rings with fewer than 4 positions', () => {
		const ring = rectangleField(origin, 1320, 1320).coordinates[0];
		expect(codeOf(() => layoutStrips({ ...good(), boundary: { type: 'Polygon', coordinates: [ring.slice(0, -1)] } })).code).toBe('open-ring');
		expect(codeOf(() => layoutStrips({ ...good(), boundary: { type: 'Polygon', coordinates: [[ring[0], ring[1], ring[0]]] } })).code).toBe('too-few-positions');
		// Four positions but only two distinct corners.
		expect(codeOf(() => layoutStrips({ ...good(), boundary: { type: 'Polygon', coordinates: [[ring[0], ring[1], ring[1], ring[0]]] } })).code).toBe('too-few-positions');
		expect(codeOf(() => layoutStrips({ ...good(), exclusions: [{ type: 'Polygon', coordinates: [ring.slice(0, -1)] }] })).message).toMatch(/exclusion 1 is not closed/);
	});

	it('geometry that is not a polygon', () => {
		const line = { type: 'LineString', coordinates: [origin, travel(origin, 0, 100)] } as unknown as LayoutInput['boundary'];
		expect(codeOf(() => layoutStrips({ ...good(), boundary: line })).code).toBe('invalid-geometry');
		expect(codeOf(() => layoutStrips(undefined as unknown as LayoutInput)).code).toBe('invalid-geometry');
	});

	it('rotationMatrix refuses lanes without geometry', () => {
		const lanes = layoutStrips(good()).lanes;
		const broken = [{ ...lanes[0], geometry: { type: 'Polygon', coordinates: [[[0, 0], [1, 1]]] } }] as typeof lanes;
		expect(codeOf(() => rotationMatrix(lanes, broken)).code).toBe('too-few-positions');
	});
});

describe('inputs are never changed', () => {
	it('layoutStrips and rotationMatrix leave their arguments as they were', () => {
		const input = { ...good(), exclusions: [rectangleField(travel(travel(origin, 0, 400), 90, 400), 200, 200)], offsetFt: 7 };
		const before = structuredClone(input);
		const layout = layoutStrips(input);
		expect(input).toEqual(before);
		const lanesBefore = structuredClone(layout.lanes);
		rotationMatrix(layout.lanes, layout.lanes);
		expect(layout.lanes).toEqual(lanesBefore);
		Object.freeze(input.boundary.coordinates[0]);
		expect(() => layoutStrips(input)).not.toThrow();
	});
});
