import { readFileSync } from 'node:fs';
import type { MultiPolygon, Polygon, Position } from 'geojson';
import { describe, expect, it } from 'vitest';
import { layoutStrips, rotationMatrix, type LaneSpec, type LayoutInput } from '../../../src/lib/geometry/index';
import { distanceM, geographicLibAcres, positionsOf, rectangleField, signedOffsetM, squareAround, travel } from './geodesy';

const FT = 0.3048;
const origin: [number, number] = [-93.6, 42];
const corn: LaneSpec = { kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 };
const soy: LaneSpec = { kind: 'crop', crop: 'soybean', rows: 8, rowSpacingIn: 30 };
const north = (o: [number, number], ft: number) => ({ a: o, b: travel(o, 0, ft) });
const sum = (xs: number[]) => xs.reduce((s, x) => s + x, 0);

describe('a quarter-quarter in 8-row corn and soybean strips', () => {
	// 1,320-ft square (40 ac nominal, US Public Land Survey), A-B up the west edge: 66 lanes of 20 ft.
	const layout = layoutStrips({ boundary: rectangleField(origin, 1320, 1320), guidance: north(origin, 1320), pattern: [corn, soy] });

	it('fills the field with 66 lanes numbered left to right, alternating crops', () => {
		expect(layout.lanes).toHaveLength(66);
		expect(layout.lanes.map((l) => l.index)).toEqual([...Array(66).keys()]);
		expect(layout.lanes.map((l) => l.offsetFt)).toEqual([...Array(66).keys()].map((i) => i * 20));
		expect(layout.lanes.slice(0, 4).map((l) => l.crop)).toEqual(['corn', 'soybean', 'corn', 'soybean']);
		expect(layout.lanes.every((l) => l.widthFt === 20 && l.rows === 8 && l.openMiddleIn === 30)).toBe(true);
	});

	it('gives each lane 1/66 of 40 acres and its row-feet', () => {
		// 20 ft × 1,320 ft = 26,400 sq ft = 0.60606 ac; 8 rows × 1,320 ft = 10,560 row-ft.
		expect(layout.lanes[0].acres).toBeCloseTo(26_400 / 43_560, 5);
		expect(layout.lanes[0].rowFeet).toBeCloseTo(10_560, 0);
		expect(layout.fieldAcres).toBeCloseTo(40, 2);
		expect(layout.plantedAcres).toBeCloseTo(layout.fieldAcres, 9);
		expect(layout.headlandAcres).toBe(0);
		expect(layout.excludedAcres).toBe(0);
	});

	it('counts border rows and totals by crop', () => {
		expect(layout.lanes[0].borderRows).toBe(1);
		expect(layout.lanes[1].borderRows).toBe(2);
		expect(layout.lanes[65].borderRows).toBe(1);
		const c = layout.byCrop.corn;
		expect(c.lanes).toBe(33);
		expect(c.rows).toBe(264);
		expect(c.borderRowShare).toBeCloseTo((32 * 2 + 1) / 264, 12);
		expect(Math.abs((c.acres + layout.byCrop.soybean.acres) / layout.plantedAcres - 1)).toBeLessThan(1e-9);
		expect(c.rowFeet).toBeCloseTo(33 * 10_560, -1);
	});

	it('lane acres agree with GeographicLib', () => {
		for (const lane of layout.lanes.filter((_, i) => i % 11 === 0)) {
			expect(Math.abs(lane.acres / geographicLibAcres(lane.geometry) - 1)).toBeLessThan(1e-6);
		}
	});
});

describe('offsets and edges', () => {
	it('puts lane 0 of the pattern offsetFt to the right of A→B, repeating on both sides', () => {
		// A-B up the middle of a 1,320-ft square, pattern moved 5 ft right.
		const a = travel(origin, 90, 660);
		const layout = layoutStrips({ boundary: rectangleField(origin, 1320, 1320), guidance: north(a, 1320), pattern: [corn, soy], offsetFt: 5 });
		const at5 = layout.lanes.find((l) => l.offsetFt === 5)!;
		expect(at5.patternIndex).toBe(0);
		expect(layout.lanes[at5.index - 1]).toMatchObject({ offsetFt: -15, crop: 'soybean' });
		// Leftmost lane −675 … −655 ft is cut by the west edge at −660 ft, leaving 5 ft × 1,320 ft; the
		// west edge runs along a meridian that converges on A-B by 0.04 ft over the field, hence 1 %.
		expect(layout.lanes[0].offsetFt).toBe(-675);
		expect(layout.lanes[0].acres / ((5 * 1320) / 43_560)).toBeCloseTo(1, 2);
	});

	it('places lane edges within 1 cm of the exact offset across a one-mile field', () => {
		// A-B at an angle across a section; offsets measured with GeographicLib (Karney 2013).
		const sw: [number, number] = [-94.2, 44.3];
		const a = travel(sw, 45, 100);
		const b = travel(a, 30, 5000);
		const layout = layoutStrips({ boundary: rectangleField(sw, 5280, 5280), guidance: { a, b }, pattern: [corn, soy], offsetFt: 3.5 });
		let checked = 0;
		for (const lane of layout.lanes.filter((_, i) => i % 37 === 5)) {
			for (const p of positionsOf(lane.geometry)) {
				const off = signedOffsetM(a, b, p) / FT;
				const edge = [lane.offsetFt, lane.offsetFt + lane.widthFt].find((e) => Math.abs(off - e) < 0.5);
				if (edge === undefined) continue; // a corner on the field boundary
				expect(Math.abs(off - edge) * FT).toBeLessThan(0.01);
				checked++;
			}
		}
		expect(checked).toBeGreaterThan(10);
	});
});

describe('headland, holes and exclusions', () => {
	const field = rectangleField(origin, 2640, 2640);
	const pond = squareAround(travel(travel(origin, 0, 1800), 90, 1800), 200);
	const wetSpot = squareAround(travel(travel(origin, 0, 900), 90, 700), 300);
	const withHole = { type: 'Polygon' as const, coordinates: [field.coordinates[0], [...pond.coordinates[0]].reverse()] };
	const layout = layoutStrips({ boundary: withHole, exclusions: [wetSpot], guidance: north(origin, 2640), pattern: [corn, soy], headlandFt: 40 });

	it('keeps a band of headlandFt inside the boundary and around holes', () => {
		// Band along the outer edge: 2,640² − 2,560² sq ft; around the 200-ft pond: 280² − 200² minus the
		// rounded corners' share (4 × (1 − π/4) × 40²).
		const outer = (2640 ** 2 - 2560 ** 2) / 43_560;
		const aroundPond = (280 ** 2 - 200 ** 2 - 4 * (1 - Math.PI / 4) * 40 ** 2) / 43_560;
		expect(layout.headlandAcres).toBeCloseTo(outer + aroundPond, 2);
		expect(layout.excludedAcres).toBeCloseTo(300 ** 2 / 43_560, 3);
		expect(layout.fieldAcres).toBeCloseTo((2640 ** 2 - 200 ** 2) / 43_560, 2);
	});

	it('lanes plus headland plus exclusions make up the field', () => {
		const lanes = sum(layout.lanes.map((l) => l.acres));
		expect(Math.abs(lanes - layout.plantedAcres) / layout.plantedAcres).toBeLessThan(1e-7);
		expect(Math.abs(lanes + layout.headlandAcres + layout.excludedAcres - layout.fieldAcres) / layout.fieldAcres).toBeLessThan(1e-4);
	});

	it('keeps every lane corner at least the headland width from the outer edge', () => {
		const ring = field.coordinates[0];
		for (const lane of layout.lanes) {
			for (const p of positionsOf(lane.geometry)) {
				let nearest = Infinity;
				for (let i = 0; i < 4; i++) nearest = Math.min(nearest, Math.abs(signedOffsetM(ring[i], ring[i + 1], p)));
				expect(nearest / FT).toBeGreaterThan(40 - 0.01);
			}
		}
	}, 60_000);
});

describe('wide rows, twin rows and pasture lanes', () => {
	it('lays 72-in twin-row corn beside a pasture lane and reports the open middle', () => {
		const twin: LaneSpec = { kind: 'crop', crop: 'corn', rows: 4, rowSpacingIn: 72, twinSpacingIn: 8 };
		const pasture: LaneSpec = { kind: 'pasture', crop: 'pasture', widthFt: 30 };
		const layout = layoutStrips({ boundary: rectangleField(origin, 1080, 1320), guidance: north(origin, 1320), pattern: [twin, pasture] });
		// 24 ft + 30 ft = 54 ft per repeat; 1,080 ft = 20 repeats.
		expect(layout.lanes).toHaveLength(40);
		expect(layout.lanes[0]).toMatchObject({ widthFt: 24, rows: 4, openMiddleIn: 64, borderRows: 1 });
		expect(layout.lanes[1]).toMatchObject({ kind: 'pasture', widthFt: 30, rows: 0, borderRows: 0 });
		expect(layout.lanes[1].openMiddleIn).toBeUndefined();
		expect(layout.lanes[2].borderRows).toBe(2);
		expect(layout.byCrop.pasture.borderRowShare).toBe(0);
		expect(layout.byCrop.corn.acres).toBeCloseTo((20 * 24 * 1320) / 43_560, 2);
	});

	it('a lane next to the same crop has no border row on that side', () => {
		const corn4 = { ...corn, rows: 4 };
		const layout = layoutStrips({ boundary: rectangleField(origin, 400, 660), guidance: north(origin, 660), pattern: [corn, corn4, soy] });
		expect(layout.lanes.slice(0, 4).map((l) => l.borderRows)).toEqual([0, 1, 2, 1]);
	});
});

describe('rotation between seasons', () => {
	const boundary = rectangleField(origin, 1320, 1320);
	const pattern = [corn, soy];
	const season = (offsetFt: number) => layoutStrips({ boundary, guidance: north(origin, 1320), pattern, offsetFt, headlandFt: 30 });
	const first = season(0);
	const total = (m: { acres: number }[]) => sum(m.map((c) => c.acres));

	it('shifting an alternating pattern by one lane width puts every acre on the other crop', () => {
		const next = season(20);
		const m = rotationMatrix(first.lanes, next.lanes);
		const same = total(m.filter((c) => c.from === c.to));
		expect(same).toBeLessThan(1e-6);
		expect(total(m)).toBeCloseTo(first.plantedAcres, 6);
		expect(m.find((c) => c.from === 'corn' && c.to === 'soybean')!.acres).toBeCloseTo(first.byCrop.corn.acres, 6);
	});

	it('no shift keeps every acre on the same crop; half a lane splits it evenly', () => {
		const m0 = rotationMatrix(first.lanes, season(0).lanes);
		expect(total(m0.filter((c) => c.from !== c.to))).toBeLessThan(1e-6);
		expect(total(m0)).toBeCloseTo(first.plantedAcres, 6);
		const half = rotationMatrix(first.lanes, season(10).lanes);
		const same = total(half.filter((c) => c.from === c.to));
		expect(same / total(half)).toBeCloseTo(0.5, 2);
	});
});

describe('a field with a waterway, checked against values worked out without the layout code', () => {
	// Expected values come from the pattern by hand and from GeographicLib (C. F. F. Karney,
	// "Algorithms for geodesics", Journal of Geodesy 87, Springer, 2013), never from a stored run.
	const input = JSON.parse(readFileSync(new URL('../../fixtures/geometry/field-with-waterway.input.json', import.meta.url), 'utf8')) as LayoutInput;
	const layout = layoutStrips(input);
	const { a, b } = input.guidance;
	// By hand: 12 rows × 30 in = 30 ft (corn), 12 × 30 in = 30 ft (soybean), a 15-ft grass buffer;
	// one repeat is 75 ft, and pattern lane 0 starts 12.5 ft right of A→B.
	const REPEAT_FT = 75;
	const ORIGIN_FT = 12.5;
	const BY_PATTERN = [
		{ crop: 'corn', kind: 'crop', widthFt: 30, rows: 12, startFt: 0 },
		{ crop: 'soybean', kind: 'crop', widthFt: 30, rows: 12, startFt: 30 },
		{ crop: 'grass', kind: 'buffer', widthFt: 15, rows: 0, startFt: 60 }
	];
	/** The lane the pattern puts at a signed offset (ft) from A→B. */
	const bandAt = (offFt: number) => {
		const repeat = Math.floor((offFt - ORIGIN_FT) / REPEAT_FT);
		const within = offFt - ORIGIN_FT - repeat * REPEAT_FT;
		const patternIndex = BY_PATTERN.findIndex((p) => within >= p.startFt && within < p.startFt + p.widthFt);
		const p = BY_PATTERN[patternIndex];
		return { patternIndex, offsetFt: ORIGIN_FT + repeat * REPEAT_FT + p.startFt, distanceToEdgeFt: Math.min(within - p.startFt, p.startFt + p.widthFt - within) };
	};

	it('puts every lane where the pattern says, with the pattern\'s width, rows and crop', () => {
		expect(layout.lanes.length).toBeGreaterThan(40);
		layout.lanes.forEach((lane, i) => {
			const p = BY_PATTERN[lane.patternIndex];
			expect(lane.index).toBe(i);
			expect({ crop: lane.crop, kind: lane.kind, widthFt: lane.widthFt, rows: lane.rows }).toEqual({ crop: p.crop, kind: p.kind, widthFt: p.widthFt, rows: p.rows });
			const repeats = (lane.offsetFt - ORIGIN_FT - p.startFt) / REPEAT_FT;
			expect(Math.abs(repeats - Math.round(repeats))).toBeLessThan(1e-9);
			if (i > 0) expect(lane.offsetFt).toBeGreaterThan(layout.lanes[i - 1].offsetFt);
		});
	});

	it('measures the field and every lane as GeographicLib does, within 0.01 %', () => {
		expect(Math.abs(layout.fieldAcres / geographicLibAcres(input.boundary as Polygon) - 1)).toBeLessThan(1e-4);
		for (const lane of layout.lanes) expect(Math.abs(lane.acres / geographicLibAcres(lane.geometry) - 1)).toBeLessThan(1e-4);
		const lanes = sum(layout.lanes.map((l) => geographicLibAcres(l.geometry)));
		expect(Math.abs(lanes / layout.plantedAcres - 1)).toBeLessThan(1e-4);
	});

	it('keeps every lane corner inside its own band, measured from the A-B line with GeographicLib', () => {
		for (const lane of layout.lanes.filter((_, i) => i % 4 === 0)) {
			for (const p of positionsOf(lane.geometry)) {
				const offFt = signedOffsetM(a, b, p) / FT;
				expect(offFt).toBeGreaterThan(lane.offsetFt - 0.01 / FT);
				expect(offFt).toBeLessThan(lane.offsetFt + lane.widthFt + 0.01 / FT);
			}
		}
	}, 60_000);

	it('puts each sampled point of the planted area in exactly one lane, the one its offset names', () => {
		const ring = (input.boundary as Polygon).coordinates[0];
		const waterway = (input.exclusions![0] as Polygon).coordinates[0];
		const toFeet = localFeet(ring[0]);
		const ringFt = ring.map(toFeet);
		const waterwayFt = waterway.map(toFeet);
		const lngs = ring.map((p) => p[0]);
		const lats = ring.map((p) => p[1]);
		const [west, east, south, northmost] = [Math.min(...lngs), Math.max(...lngs), Math.min(...lats), Math.max(...lats)];
		const steps = 24;
		let planted = 0;
		let unplanted = 0;
		const lanesSeen = new Set<number>();
		for (let i = 0; i <= steps; i++) {
			for (let j = 0; j <= steps; j++) {
				const p: [number, number] = [west + ((east - west) * (i + 0.5)) / (steps + 1), south + ((northmost - south) * (j + 0.5)) / (steps + 1)];
				const pf = toFeet(p);
				const inField = insideRing(pf, ringFt);
				const edgeFt = Math.min(distanceToRingFt(pf, ringFt), distanceToRingFt(pf, waterwayFt));
				const inWaterway = insideRing(pf, waterwayFt);
				const containing = layout.lanes.filter((l) => insideGeometry(p, l.geometry));
				if ((!inField && edgeFt > 2) || (inWaterway && edgeFt > 2)) {
					expect(containing.map((l) => l.index), `unplanted point ${p}`).toEqual([]);
					unplanted++;
					continue;
				}
				// Clear of the 30-ft headland and the waterway by 2 ft of slack for the flat local frame.
				if (!inField || inWaterway || distanceToRingFt(pf, ringFt) < 32 || edgeFt < 2) continue;
				const band = bandAt(signedOffsetM(a, b, p) / FT);
				if (band.distanceToEdgeFt < 0.1) continue;
				expect(containing.map((l) => [l.patternIndex, l.offsetFt]), `planted point ${p}`).toEqual([[band.patternIndex, band.offsetFt]]);
				lanesSeen.add(containing[0].index);
				planted++;
			}
		}
		expect(planted).toBeGreaterThan(100);
		expect(unplanted).toBeGreaterThan(100);
		expect(lanesSeen.size).toBeGreaterThan(30);
	}, 60_000);
});

/** A flat frame in feet around `origin` from the WGS84 radii of curvature there; good to ~0.01 % across a field. */
function localFeet(origin: Position) {
	const a = 6_378_137;
	const e2 = 0.00669437999014; // WGS84 (NIMA TR8350.2, 3rd ed., 2000)
	const lat = (origin[1] * Math.PI) / 180;
	const w = Math.sqrt(1 - e2 * Math.sin(lat) ** 2);
	const meridian = (a * (1 - e2)) / w ** 3;
	const primeVertical = a / w;
	return (p: Position): [number, number] => [
		(((p[0] - origin[0]) * Math.PI) / 180) * primeVertical * Math.cos(lat) / FT,
		(((p[1] - origin[1]) * Math.PI) / 180) * meridian / FT
	];
}

function insideRing(p: Position, ring: Position[]): boolean {
	let inside = false;
	for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
		const [xi, yi] = ring[i];
		const [xj, yj] = ring[j];
		if (yi > p[1] !== yj > p[1] && p[0] < ((xj - xi) * (p[1] - yi)) / (yj - yi) + xi) inside = !inside;
	}
	return inside;
}

function insideGeometry(p: Position, g: Polygon | MultiPolygon): boolean {
	const polys = g.type === 'Polygon' ? [g.coordinates] : g.coordinates;
	return polys.some(([outer, ...holes]) => insideRing(p, outer) && !holes.some((h) => insideRing(p, h)));
}

function distanceToRingFt(p: Position, ring: Position[]): number {
	let best = Infinity;
	for (let i = 0; i + 1 < ring.length; i++) {
		const [x1, y1] = ring[i];
		const [x2, y2] = ring[i + 1];
		const t = Math.max(0, Math.min(1, ((p[0] - x1) * (x2 - x1) + (p[1] - y1) * (y2 - y1)) / ((x2 - x1) ** 2 + (y2 - y1) ** 2)));
		best = Math.min(best, Math.hypot(p[0] - (x1 + t * (x2 - x1)), p[1] - (y1 + t * (y2 - y1))));
	}
	return best;
}

describe('distances used above', () => {
	it('the test fields have the sides they claim (GeographicLib)', () => {
		const f = rectangleField(origin, 1320, 1320).coordinates[0];
		expect(distanceM(f[0], f[1]) / FT).toBeCloseTo(1320, 6);
		expect(distanceM(f[0], f[3]) / FT).toBeCloseTo(1320, 6);
	});
});
