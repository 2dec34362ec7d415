import fc from 'fast-check';
import { featureCollection, multiPolygon, union } from '@turf/turf';
import type { MultiPolygon, Polygon, Position } from 'geojson';
import { describe, expect, it } from 'vitest';
import { layoutStrips, type LaneSpec, type LayoutInput } from '../../../src/lib/geometry/index';
import { GEOD, distanceM, geographicLibAcres, positionsOf, rectangleField, signedOffsetM, squareAround, travel } from './geodesy';

const FT = 0.3048;
const RUNS = 12;

const laneSpec: fc.Arbitrary<LaneSpec> = fc.oneof(
	fc.record({ kind: fc.constant('crop' as const), crop: fc.constantFrom('corn', 'soybean', 'wheat'), rows: fc.integer({ min: 2, max: 16 }), rowSpacingIn: fc.constantFrom(15, 20, 30, 36, 60, 72, 90) }),
	fc.record({ kind: fc.constant('crop' as const), crop: fc.constant('corn'), rows: fc.integer({ min: 2, max: 6 }), rowSpacingIn: fc.constantFrom(30, 60, 72), twinSpacingIn: fc.constant(8) }),
	fc.record({ kind: fc.constantFrom('pasture' as const, 'buffer' as const, 'cover' as const), crop: fc.constantFrom('pasture', 'grass'), widthFt: fc.double({ min: 5, max: 60, noNaN: true }) })
);

/** Star-shaped field around a centre: convex when the radii are equal, concave otherwise. */
const fieldArb = fc.record({
	lng: fc.double({ min: -120, max: 30, noNaN: true }),
	lat: fc.double({ min: -55, max: 65, noNaN: true }),
	radiusFt: fc.double({ min: 500, max: 2500, noNaN: true }),
	wobble: fc.array(fc.double({ min: 0.55, max: 1, noNaN: true }), { minLength: 5, maxLength: 14 }),
	convex: fc.boolean(),
	hole: fc.boolean(),
	exclusions: fc.array(fc.record({ az: fc.double({ min: 0, max: 360, noNaN: true }), dist: fc.double({ min: 0, max: 0.7, noNaN: true }), size: fc.double({ min: 40, max: 300, noNaN: true }) }), { maxLength: 2 }),
	abAzimuth: fc.double({ min: 0, max: 360, noNaN: true }),
	abFrom: fc.double({ min: 0, max: 1.2, noNaN: true }),
	pattern: fc.array(laneSpec, { minLength: 1, maxLength: 4 }),
	offsetFt: fc.double({ min: -500, max: 500, noNaN: true }),
	headlandFt: fc.oneof(fc.constant(0), fc.double({ min: 10, max: 60, noNaN: true }))
});

type FieldCase = typeof fieldArb extends fc.Arbitrary<infer T> ? T : never;

function buildInput(c: FieldCase): LayoutInput {
	const centre: [number, number] = [c.lng, c.lat];
	const n = c.wobble.length;
	const ring: Position[] = [];
	for (let i = 0; i < n; i++) ring.push(travel(centre, (360 * i) / n, c.radiusFt * (c.convex ? 1 : c.wobble[i])));
	ring.reverse();
	ring.push(ring[0]);
	const rings = [ring];
	// Hole: a small square at the centre, clockwise (inner radius ≥ 0.55 R, so it lies inside).
	if (c.hole) rings.push([...squareAround(centre, c.radiusFt * 0.2).coordinates[0]].reverse());
	const boundary: Polygon = { type: 'Polygon', coordinates: rings };
	const exclusions = c.exclusions.map((e) => squareAround(travel(centre, e.az, e.dist * c.radiusFt), e.size));
	const a = travel(centre, c.abAzimuth + 90, c.abFrom * c.radiusFt);
	return { boundary, exclusions, guidance: { a, b: travel(a, c.abAzimuth, 300) }, pattern: c.pattern, offsetFt: c.offsetFt, headlandFt: c.headlandFt };
}

const acresOfUnion = (gs: (Polygon | MultiPolygon)[]) => {
	const u = union(featureCollection(gs.map((g) => multiPolygon(g.type === 'Polygon' ? [g.coordinates] : g.coordinates))));
	return u ? geographicLibAcres(u.geometry) : 0;
};

describe('layout invariants on random fields', () => {
	it('lanes never overlap and, with headland and exclusions, make up the field', () => {
		fc.assert(
			fc.property(fieldArb, (c) => {
				const input = buildInput(c);
				const layout = layoutStrips(input);
				const lanesAcres = layout.lanes.reduce((s, l) => s + l.acres, 0);
				// No overlap: the union of all lanes (Turf, measured by GeographicLib) has their summed area.
				expect(Math.abs(acresOfUnion(layout.lanes.map((l) => l.geometry)) - lanesAcres) / lanesAcres).toBeLessThan(1e-4);
				// No gap: lanes + headland + exclusions = field, within 0.01 %.
				const whole = lanesAcres + layout.headlandAcres + layout.excludedAcres;
				expect(Math.abs(whole - layout.fieldAcres) / layout.fieldAcres).toBeLessThan(1e-4);
				expect(Math.abs(layout.fieldAcres - geographicLibAcres(input.boundary)) / layout.fieldAcres).toBeLessThan(1e-4);
				// Lanes run left to right without repeats.
				layout.lanes.forEach((l, i) => {
					expect(l.index).toBe(i);
					if (i > 0) expect(l.offsetFt).toBeGreaterThan(layout.lanes[i - 1].offsetFt);
					expect(l.borderRows).toBeLessThanOrEqual(Math.min(2, l.rows));
				});
			}),
			{ numRuns: RUNS, seed: 20260101 }
		);
	}, 60_000);

	it('every lane is rows × spacing wide, measured geodesically across its middle, within 1 cm', () => {
		let measured = 0;
		fc.assert(
			fc.property(fieldArb, (c) => {
				const input = buildInput(c);
				const { a, b } = input.guidance;
				const layout = layoutStrips(input);
				const sample = layout.lanes.filter((_, i) => i % Math.max(1, Math.floor(layout.lanes.length / 4)) === 0);
				for (const lane of sample) {
					const spec = input.pattern[lane.patternIndex];
					const expectedFt = spec.widthFt ?? ((spec.rows ?? 0) * (spec.rowSpacingIn ?? 0)) / 12;
					// Corners on each edge, found by their GeographicLib offset from A-B.
					const pts = positionsOf(lane.geometry).map((p) => ({ p, off: signedOffsetM(a, b, p) / FT }));
					const left = pts.filter((q) => Math.abs(q.off - lane.offsetFt) < 0.5).map((q) => q.p);
					const right = pts.filter((q) => Math.abs(q.off - lane.offsetFt - expectedFt) < 0.5).map((q) => q.p);
					if (left.length < 2 || right.length < 2) continue;
					const [l1, l2] = farthestPair(left);
					const [r1, r2] = farthestPair(right);
					if (distanceM(r1, r2) < 1) continue;
					// Middle of the left edge → distance to the right edge's geodesic.
					const mid = midpoint(l1, l2);
					const width = Math.abs(signedOffsetM(r1, r2, mid));
					expect(Math.abs(width - expectedFt * FT)).toBeLessThan(0.01);
					measured++;
				}
			}),
			{ numRuns: 8, seed: 7 }
		);
		expect(measured).toBeGreaterThan(8);
	}, 60_000);

	it('moving the offset by one whole pattern width gives the same lanes', () => {
		fc.assert(
			fc.property(fieldArb, fc.integer({ min: -3, max: 3 }), (c, k) => {
				const input = buildInput(c);
				const repeat = input.pattern.reduce((s, p) => s + (p.widthFt ?? ((p.rows ?? 0) * (p.rowSpacingIn ?? 0)) / 12), 0);
				const one = layoutStrips(input);
				const two = layoutStrips({ ...input, offsetFt: input.offsetFt! + k * repeat });
				expect(two.lanes.length).toBe(one.lanes.length);
				one.lanes.forEach((l, i) => {
					const m = two.lanes[i];
					expect(m.patternIndex).toBe(l.patternIndex);
					expect(m.offsetFt).toBeCloseTo(l.offsetFt, 6);
					expect(Math.abs(m.acres - l.acres)).toBeLessThan(1e-9 * Math.max(1, one.plantedAcres));
				});
			}),
			{ numRuns: RUNS, seed: 99 }
		);
	}, 60_000);

	it('survives two exclusions drawn almost on top of each other', () => {
		// Found by the properties above: nearly coincident squares made polygon clipping fail.
		const c = { lng: 0, lat: 0, radiusFt: 500, wobble: [0.61, 0.83, 0.55, 0.6, 0.55], convex: false, hole: false,
			exclusions: [{ az: 0, dist: 7.6e-15, size: 299.9999999997669 }, { az: 0, dist: 0, size: 299.99999999977484 }],
			abAzimuth: 0, abFrom: 0, pattern: [{ kind: 'pasture' as const, crop: 'pasture', widthFt: 5 }], offsetFt: 0, headlandFt: 10 };
		const layout = layoutStrips(buildInput(c));
		expect(layout.excludedAcres).toBeCloseTo(300 ** 2 / 43_560, 3);
		const lanes = layout.lanes.reduce((s, l) => s + l.acres, 0);
		expect(Math.abs(lanes + layout.headlandAcres + layout.excludedAcres - layout.fieldAcres) / layout.fieldAcres).toBeLessThan(1e-4);
	});

	it("a rectangular lane's row-feet are its rows times its length", () => {
		fc.assert(
			fc.property(
				fc.double({ min: -60, max: 60, noNaN: true }),
				fc.double({ min: 200, max: 2640, noNaN: true }),
				fc.array(laneSpec, { minLength: 1, maxLength: 3 }),
				(lat, lengthFt, pattern) => {
					const sw: [number, number] = [-90, lat];
					const layout = layoutStrips({ boundary: rectangleField(sw, 1000, lengthFt), guidance: { a: sw, b: travel(sw, 0, lengthFt) }, pattern });
					for (const lane of layout.lanes.slice(1, -1)) {
						// Rectangle sides are geodesics of lengthFt (GeographicLib Direct).
						expect(Math.abs(lane.rowFeet - lane.rows * lengthFt)).toBeLessThanOrEqual(1e-4 * lane.rows * lengthFt + 1e-9);
					}
				}
			),
			{ numRuns: RUNS, seed: 3 }
		);
	}, 60_000);
});

function farthestPair(ps: Position[]): [Position, Position] {
	let best: [Position, Position] = [ps[0], ps[1]];
	let d = -1;
	for (let i = 0; i < ps.length; i++) for (let j = i + 1; j < ps.length; j++) {
		const dd = distanceM(ps[i], ps[j]);
		if (dd > d) { d = dd; best = [ps[i], ps[j]]; }
	}
	return best;
}

/** Geodesic midpoint of p and q (GeographicLib). */
function midpoint(p: Position, q: Position): Position {
	const inv = GEOD.Inverse(p[1], p[0], q[1], q[0]);
	return travel(p, inv.azi1 as number, (inv.s12 as number) / 2 / FT);
}
