import { describe, expect, it } from 'vitest';
import { geodesicAcres, geodesicSquareMeters } from '../../../src/lib/geometry/index';
import { SQ_METERS_PER_ACRE, METERS_PER_FOOT } from '../../../src/lib/geometry/units';
import { geographicLibAcres, irregularField, rectangleField, squareAround } from './geodesy';
import type { Polygon } from 'geojson';

const poly = (ring: number[][]): Polygon => ({ type: 'Polygon', coordinates: [ring] });
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('units', () => {
	it('uses the international foot and the 43,560 sq ft acre', () => {
		// NIST / NOAA-NGS, 85 FR 62698 (2020): 1 ft = 0.3048 m exactly.
		expect(METERS_PER_FOOT).toBe(0.3048);
		// Acre = 43,560 sq ft = 4,046.8564224 m², computed from the international foot of 0.3048 m
		// (NIST and NOAA, Federal Register 85 FR 62698, 2020).
		expect(SQ_METERS_PER_ACRE).toBeCloseTo(43_560 * 0.3048 ** 2, 9);
		expect(SQ_METERS_PER_ACRE).toBe(4046.8564224);
	});
});

describe('geodesicAcres against published worked values', () => {
	it('1°×1° cell at the equator', () => {
		// GeographicLib documentation example: 12,308,778,361.469452 m².
		const m2 = geodesicSquareMeters(poly([[0, 0], [1, 0], [1, 1], [0, 1], [0, 0]]));
		expect(rel(m2, 12_308_778_361.469452)).toBeLessThan(1e-6);
	});

	it('continental four-point polygon', () => {
		// GeographicLib C++ example: (52,0) (41,−74) (−23,−43) (−26,28) → 65,690,027,591,345.7 m².
		const m2 = geodesicSquareMeters(poly([[0, 52], [-74, 41], [-43, -23], [28, -26], [0, 52]]));
		expect(rel(m2, 65_690_027_591_345.7)).toBeLessThan(1e-6);
	});

	it('a quarter-mile square is 40 acres', () => {
		// US Public Land Survey: quarter-quarter section 40 ac nominal (43 U.S.C. §751); 1,320 ft square
		// = 1,742,400 sq ft = 40 ac (arithmetic). Built with GeographicLib's geodesic Direct from 42°N
		// 93.6°W (C. F. F. Karney, "Algorithms for geodesics", Journal of Geodesy 87, Springer, 2013).
		const field = rectangleField([-93.6, 42], 1320, 1320);
		expect(rel(geodesicAcres(field), 40)).toBeLessThan(1e-4);
		expect(rel(geodesicAcres(field), geographicLibAcres(field))).toBeLessThan(1e-7);
	});

	it('a section is 640 acres nominal', () => {
		// 43 U.S.C. §751: a section is "as near as may be 640 acres".
		expect(geodesicAcres(rectangleField([-94, 44], 5280, 5280))).toBeCloseTo(640, 1);
	});
});

describe('geodesicAcres against GeographicLib (Karney, J. Geodesy 2013) to 0.01 %', () => {
	const latitudes = [-62, -35, 0.2, 23, 44, 58, 70];
	const sizesAcres = [1, 10, 160, 1000, 5000];
	for (const lat of latitudes) {
		for (const acres of sizesAcres) {
			it(`${acres}-acre irregular field at ${lat}°`, () => {
				// Mean radius for the wanted area of a circle, in feet.
				const r = Math.sqrt((acres * 43_560) / Math.PI);
				const field = irregularField([-93 + lat, lat], r, 120, lat);
				const ours = geodesicAcres(field);
				const reference = geographicLibAcres(field);
				expect(reference).toBeGreaterThan(acres * 0.7);
				expect(rel(ours, reference)).toBeLessThan(1e-4);
			});
		}
	}

	it('subtracts holes and ignores ring orientation', () => {
		const outer = rectangleField([-93, 44], 2640, 2640).coordinates[0];
		const hole = squareAround([-92.995, 44.0036], 300).coordinates[0];
		const withHole: Polygon = { type: 'Polygon', coordinates: [outer, hole] };
		const reversed: Polygon = { type: 'Polygon', coordinates: [[...outer].reverse(), [...hole].reverse()] };
		expect(rel(geodesicAcres(withHole), geographicLibAcres(withHole))).toBeLessThan(1e-6);
		expect(geodesicAcres(reversed)).toBeCloseTo(geodesicAcres(withHole), 9);
		// 2,640² − 300² sq ft = 158.0 − 2.066 ac.
		expect(geodesicAcres(withHole)).toBeCloseTo((2640 ** 2 - 300 ** 2) / 43_560, 2);
	});

	it('adds the parts of a MultiPolygon', () => {
		const a = rectangleField([-93, 44], 660, 660);
		const b = rectangleField([-92.9, 44], 1320, 660);
		const both = geodesicAcres({ type: 'MultiPolygon', coordinates: [a.coordinates, b.coordinates] });
		expect(both).toBeCloseTo(geodesicAcres(a) + geodesicAcres(b), 10);
		expect(both).toBeCloseTo(30, 2);
	});
});
