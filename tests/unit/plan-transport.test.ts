import { describe, expect, it } from 'vitest';
import geographiclib from 'geographiclib-geodesic';
import type { MultiPolygon, Polygon } from 'geojson';
import { roundGeometry, lanesForTransport } from '$lib/plans/coordinates';
import { formatNumber } from '$lib/plans/number-format';
import { lanesFeatureCollection } from '$lib/plans/lanes-geojson';
import { versionedMemo } from '$lib/server/versioned-memo';

// Ground distance by GeographicLib's inverse solution (C. F. F. Karney, "Algorithms for geodesics",
// Journal of Geodesy 87, 2013), independent of the code under test.
const GEOD = geographiclib.Geodesic.WGS84;
const metres = ([lng1, lat1]: number[], [lng2, lat2]: number[]) => GEOD.Inverse(lat1, lng1, lat2, lng2).s12 as number;
const decimals = (v: number) => (String(v).split('.')[1] ?? '').length;

// Digits as Turf leaves them (15–17 significant), from a lane of the demo's south-Minnesota field.
const LANE: Polygon = {
	type: 'Polygon',
	coordinates: [[[-94.21996874506466, 43.913209738974665], [-94.21989285150248, 43.91320974026122], [-94.21989278009397, 43.920232283285124], [-94.21996868258222, 43.92023228199845], [-94.21996874506466, 43.913209738974665]]]
};

describe('coordinates rounded for sending', () => {
	it('keeps 7 decimals, moves no point more than 1 cm, keeps rings closed and leaves the input alone', () => {
		const before = structuredClone(LANE);
		const rounded = roundGeometry(LANE);
		expect(LANE).toEqual(before);
		expect(rounded.coordinates[0]).toHaveLength(5);
		expect(rounded.coordinates[0][0]).toEqual([-94.2199687, 43.9132097]);
		expect(rounded.coordinates[0][2]).toEqual([-94.2198928, 43.9202323]);
		expect(rounded.coordinates[0][4]).toEqual(rounded.coordinates[0][0]);
		rounded.coordinates[0].forEach((p, i) => {
			expect(Math.max(...p.map(decimals))).toBeLessThanOrEqual(7);
			expect(metres(p, LANE.coordinates[0][i])).toBeLessThan(0.01);
		});
		expect(JSON.stringify(rounded).length).toBeLessThan(JSON.stringify(LANE).length * 0.75);
	});

	it('rounds every ring of every part of a MultiPolygon, holes included', () => {
		const multi: MultiPolygon = {
			type: 'MultiPolygon',
			coordinates: [LANE.coordinates, [[[-94.1, 44.000000049], [-94.09, 44], [-94.09, 44.01], [-94.1, 44.000000049]], [[-94.095, 44.00500000001], [-94.094, 44.005], [-94.094, 44.006], [-94.095, 44.00500000001]]]]
		};
		const rounded = roundGeometry(multi);
		expect(rounded.type).toBe('MultiPolygon');
		expect(rounded.coordinates[1][0][0]).toEqual([-94.1, 44]);
		expect(rounded.coordinates[1][1][0]).toEqual([-94.095, 44.005]);
		expect(rounded.coordinates[0][0][1]).toEqual([-94.2198929, 43.9132097]);
	});

	it('changes only the outline of each lane: acres and widths keep every digit', () => {
		const lane = { index: 0, acres: 12.345678912345, widthFt: 21.123456789, geometry: LANE };
		const [sent] = lanesForTransport([lane]);
		expect(sent.acres).toBe(12.345678912345);
		expect(sent.widthFt).toBe(21.123456789);
		expect(sent.geometry.coordinates[0][1]).toEqual([-94.2198929, 43.9132097]);
	});

	it('exports lanes.geojson outlines to 7 decimals', () => {
		const fc = lanesFeatureCollection('Bench field', {
			season: 2027,
			variant: 'main',
			guidance: { a: [-94.21996874506466, 43.913209738974665], b: [-94.21996868258222, 43.92023228199845] },
			lanes: [{ index: 0, patternIndex: 0, kind: 'crop', crop: 'corn', widthFt: 20, rows: 8, offsetFt: 0, geometry: LANE, acres: 1.23456, rowFeet: 12345.67, borderRows: 1, assignment: null }]
		});
		expect((fc.features[1].geometry as Polygon).coordinates[0][0]).toEqual([-94.2199687, 43.9132097]);
	});
});

describe('numbers as the plan pages show them', () => {
	it('groups thousands and fixes the decimals like en-US toLocaleString', () => {
		expect(formatNumber(1234.5)).toBe('1,234.50');
		expect(formatNumber(0.0049, 3)).toBe('0.005');
		expect(formatNumber(140000, 0)).toBe('140,000');
		expect(formatNumber(12.345, 1)).toBe('12.3');
		expect(formatNumber(-5280, 0)).toBe('-5,280');
		expect(formatNumber(2)).toBe('2.00'); // the default precision stays 2 after other precisions were asked for
	});
});

describe('versioned memo', () => {
	it('computes once for callers asking at the same time and answers later callers from memory', async () => {
		const memo = versionedMemo<number>();
		let runs = 0;
		const compute = async () => {
			runs++;
			await new Promise((r) => setTimeout(r, 10));
			return 42;
		};
		expect(await Promise.all([memo.get('plan-1:v3', compute), memo.get('plan-1:v3', compute), memo.get('plan-1:v3', compute)])).toEqual([42, 42, 42]);
		expect(await memo.get('plan-1:v3', compute)).toBe(42);
		expect(runs).toBe(1);
		expect(await memo.get('plan-1:v4', async () => 43)).toBe(43);
	});

	it('drops the least recently used entry past its limit', async () => {
		const memo = versionedMemo<string>(2);
		await memo.get('a', async () => 'a1');
		await memo.get('b', async () => 'b1');
		await memo.get('a', async () => 'a2'); // a is now the most recently used
		await memo.get('c', async () => 'c1');
		expect(memo.size).toBe(2);
		expect(await memo.get('a', async () => 'a3')).toBe('a1');
		expect(await memo.get('b', async () => 'b2')).toBe('b2');
	});

	it('does not keep a failure: the next caller computes again', async () => {
		const memo = versionedMemo<number>();
		await expect(memo.get('k', async () => Promise.reject(new Error('database went away')))).rejects.toThrow('database went away');
		expect(memo.size).toBe(0);
		expect(await memo.get('k', async () => 7)).toBe(7);
	});
});
