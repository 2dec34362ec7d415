// Inputs that once froze or exhausted the server: each is answered, quickly, with a clear refusal
// or a normal layout.
import type { Polygon, Position } from 'geojson';
import { describe, expect, it } from 'vitest';
import { checkOutline, GeometryError, layoutStrips, MAX_FIELD_VERTICES, MAX_LANES, type LayoutInput } from '../../../src/lib/geometry/index';
import { measureFieldShape } from '../../../src/lib/fields/shape';
import { rectangleField, travel } from './geodesy';

const origin: [number, number] = [-93.9, 44.1];
const oneLane = [{ kind: 'crop' as const, crop: 'corn', widthFt: 20 }];

function field(offsetFt: number, headlandFt = 0): LayoutInput {
	return {
		boundary: rectangleField(origin, 1320, 1320),
		guidance: { a: origin, b: travel(origin, 0, 660) },
		pattern: oneLane,
		offsetFt,
		headlandFt
	};
}

function refusal(fn: () => unknown): GeometryError {
	try {
		fn();
	} catch (e) {
		if (e instanceof GeometryError) return e;
		throw e;
	}
	throw new Error('expected a GeometryError');
}

/** A closed ring of `n` positions (closing one included) around a circle of about 300 m. */
function circle(n: number, centre: [number, number] = origin): Polygon {
	const ring: Position[] = [];
	for (let i = 0; i < n - 1; i++) {
		const a = (2 * Math.PI * i) / (n - 1);
		ring.push([centre[0] + 0.004 * Math.cos(a), centre[1] + 0.003 * Math.sin(a)]);
	}
	ring.push(ring[0]);
	return { type: 'Polygon', coordinates: [ring] };
}

describe('lane loop bounds', () => {
	it('lays out a 1e300-ft offset (once an endless loop) as the same lanes as its place within the repeat', () => {
		const huge = layoutStrips(field(1e300, 500));
		const plain = layoutStrips(field(1e300 % 20, 500));
		expect(plain.lanes.length).toBe(16); // 320 ft left inside the headland ÷ 20 ft, plus a part lane
		expect(huge.lanes.length).toBe(plain.lanes.length);
		expect(huge.lanes.map((l) => Math.round(l.acres * 1e6))).toEqual(plain.lanes.map((l) => Math.round(l.acres * 1e6)));
	}, 5_000);

	it('keeps an offset many repeats away exact: 4e12 ft + 5 ft lays lanes where 5 ft does', () => {
		const far = layoutStrips(field(4e12 + 5));
		const near = layoutStrips(field(5));
		expect(far.lanes.map((l) => l.offsetFt)).toEqual(near.lanes.map((l) => l.offsetFt));
	}, 5_000);

	it(`refuses more than ${MAX_LANES.toLocaleString('en-US')} lanes before cutting any`, () => {
		const input = { ...field(0), pattern: [{ kind: 'buffer' as const, crop: 'grass', widthFt: 0.01 }] };
		const e = refusal(() => layoutStrips(input));
		expect(e.code).toBe('too-many-lanes');
		// 1,320 ft across ÷ 0.01 ft = 132,000 lanes.
		expect(e.message).toBe(
			'This pattern would cut the field into about 132,000 lanes (1,320 ft across the rows); a layout may have at most 20,000. Use wider lanes or split the field.'
		);
	}, 5_000);

	it('refuses a lane width so small the count is not finite', () => {
		const input = { ...field(0), pattern: [{ kind: 'buffer' as const, crop: 'grass', widthFt: 1e-320 }] };
		expect(refusal(() => layoutStrips(input)).code).toBe('too-many-lanes');
	});
});

describe('corner count cap', () => {
	it(`accepts ${MAX_FIELD_VERTICES.toLocaleString('en-US')} corners and refuses one more, naming the limit`, () => {
		expect(() => checkOutline(circle(MAX_FIELD_VERTICES), 'field boundary')).not.toThrow();
		const e = refusal(() => checkOutline(circle(MAX_FIELD_VERTICES + 1), 'field boundary'));
		expect(e.code).toBe('too-many-vertices');
		expect(e.message).toBe(
			'The field boundary has 50,001 points; a field may have at most 50,000. Simplify the outline (most GIS programs can thin points to a tolerance of about 0.1 m) and try again.'
		);
	}, 10_000);

	it('counts the exclusions with the boundary', () => {
		const boundary = circle(30_000);
		const exclusion = { name: 'pond', kind: 'waterway' as const, geometry: circle(30_000, [origin[0] + 0.001, origin[1]]) };
		const e = refusal(() => measureFieldShape({ boundary, exclusions: [exclusion] }));
		expect(e.code).toBe('too-many-vertices');
		expect(e.message).toMatch(/^The field boundary with its exclusions has 60,000 points;/);
		const input: LayoutInput = { ...field(0), boundary, exclusions: [exclusion.geometry] };
		expect(refusal(() => layoutStrips(input)).code).toBe('too-many-vertices');
	});
});

describe('outlines the local plane cannot hold', () => {
	const square = (lng0: number, lng1: number, lat0: number, lat1: number): Polygon => ({
		type: 'Polygon',
		coordinates: [[[lng0, lat0], [lng1, lat0], [lng1, lat1], [lng0, lat1], [lng0, lat0]]]
	});

	it('refuses an outline across the 180th meridian, saying where', () => {
		const e = refusal(() => checkOutline(square(179.998, -179.998, -17.01, -17), 'field boundary'));
		expect(e.code).toBe('crosses-antimeridian');
		expect(e.message).toBe('The field boundary crosses the 180th meridian (the date line) near latitude -17.0100; a field must lie on one side of it. Split it there into two fields.');
		expect(e.where).toEqual([180, -17.01]);
	});

	it('accepts a field right beside the 180th meridian on either side', () => {
		expect(() => checkOutline(square(179.994, 179.999, -17.01, -17), 'field boundary')).not.toThrow();
		expect(() => checkOutline(square(-179.999, -179.994, -17.01, -17), 'field boundary')).not.toThrow();
	});

	it('refuses a ring around the North Pole, however its longitudes are written', () => {
		const around: Position[] = [];
		for (let lng = -180; lng < 180; lng += 30) around.push([lng, 89.9]);
		around.push(around[0]);
		const e = refusal(() => checkOutline({ type: 'Polygon', coordinates: [around] }, 'field boundary'));
		expect(e.code).toBe('encloses-pole');
		expect(e.message).toBe('The field boundary goes all the way around the North Pole; a field outline must not enclose a pole.');
	});

	it('refuses a corner on the South Pole', () => {
		const e = refusal(() => checkOutline({ type: 'Polygon', coordinates: [[[0, -89.99], [10, -89.99], [10, -90], [0, -89.99]]] }, 'exclusion 1'));
		expect(e.code).toBe('encloses-pole');
		expect(e.message).toBe('The exclusion 1 has a corner on the South Pole; a field outline cannot reach a pole.');
	});

	it('refuses the same in a layout request', () => {
		const input: LayoutInput = { ...field(0), boundary: square(179.998, -179.998, -17.01, -17), guidance: { a: [179.999, -17.01], b: [179.999, -17] } };
		expect(refusal(() => layoutStrips(input)).code).toBe('crosses-antimeridian');
	});
});

describe('work bound', () => {
	it('refuses a many-cornered outline cut into thousands of lanes before cutting any', () => {
		// 20,000 corners × ~10,500 one-foot lanes once took half a minute.
		const input: LayoutInput = { ...field(0), boundary: circle(20_000), pattern: [{ kind: 'buffer', crop: 'grass', widthFt: 0.25 }] };
		const e = refusal(() => layoutStrips(input));
		expect(e.code).toBe('too-many-lanes');
		expect(e.message).toMatch(/^The field's outline has 20,\d{3} corners and this pattern cuts it into about 8,\d{3} lanes: too much to lay out at once\./);
	}, 5_000);
});
