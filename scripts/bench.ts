// Times layoutStrips against a naive Turf layout on two fields and compares both with GeographicLib,
// and the self-crossing check against the all-pairs check.
// Run: npm run bench
import type { MultiPolygon, Polygon } from 'geojson';
import { layoutStrips, type LayoutInput } from '../src/lib/geometry/index';
import { geographicLibSquareMeters, irregularField, rectangleField, squareAround, travel } from './bench/fields';
import { naiveLayout } from './bench/naive';
import { findCrossing } from '../src/lib/geometry/crossings';
import { crossesByAllPairs, spikyRing } from './bench/crossings-pairs';

const SQ_M_PER_ACRE = 4046.8564224;
const corn = { kind: 'crop' as const, crop: 'corn', rows: 8, rowSpacingIn: 30 };
const soy = { kind: 'crop' as const, crop: 'soybean', rows: 8, rowSpacingIn: 30 };

function geographicLibOf(g: Polygon | MultiPolygon): number {
	const parts = g.type === 'Polygon' ? [g.coordinates] : g.coordinates;
	return parts.reduce((s, coordinates) => s + geographicLibSquareMeters({ type: 'Polygon', coordinates }), 0);
}

function median(xs: number[]): number {
	const s = [...xs].sort((a, b) => a - b);
	return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
}

function time<T>(runs: number, fn: () => T): { ms: number; result: T } {
	let result = fn(); // warm-up
	const ms: number[] = [];
	for (let i = 0; i < runs; i++) {
		const t = performance.now();
		result = fn();
		ms.push(performance.now() - t);
	}
	return { ms: median(ms), result };
}

/** One timed run, no warm-up: for the slow baseline. */
function once<T>(fn: () => T): { ms: number; result: T } {
	const t = performance.now();
	const result = fn();
	return { ms: performance.now() - t, result };
}

const sw: [number, number] = [-94.3, 44.05];
const section: LayoutInput = {
	boundary: rectangleField(sw, 5280, 5280),
	exclusions: [
		squareAround(travel(travel(sw, 0, 1000), 90, 1210), 300),
		squareAround(travel(travel(sw, 0, 3000), 90, 4000), 520),
		squareAround(travel(travel(sw, 0, 4500), 90, 2000), 180)
	],
	guidance: { a: sw, b: travel(sw, 0, 5280) },
	pattern: [corn, soy]
};
const centre: [number, number] = [-96.7, 46.9];
const large: LayoutInput = {
	boundary: irregularField(centre, 8330, 600, 4),
	exclusions: [squareAround(travel(centre, 70, 3000), 800)],
	guidance: { a: travel(centre, 200, 6000), b: travel(travel(centre, 200, 6000), 32, 2000) },
	pattern: [corn, soy, { kind: 'pasture', crop: 'pasture', widthFt: 40 }]
};

const rows: string[] = [];
for (const [name, input, runs] of [['640-ac section, 3 exclusions', section, 9], ['irregular field with waterway', large, 3]] as const) {
	const ours = time(runs, () => layoutStrips(input));
	const naive = time(runs, () => naiveLayout(input));
	const oursAcres = ours.result.lanes.reduce((s, l) => s + l.acres, 0);
	const oursRef = ours.result.lanes.reduce((s, l) => s + geographicLibOf(l.geometry), 0) / SQ_M_PER_ACRE;
	const naiveAcres = naive.result.reduce((s, l) => s + l.squareMeters, 0) / SQ_M_PER_ACRE;
	const naiveRef = naive.result.reduce((s, l) => s + geographicLibOf(l.geometry), 0) / SQ_M_PER_ACRE;
	const worstLane = (pairs: [number, number][]) => Math.max(...pairs.map(([a, b]) => Math.abs(a / b - 1)));
	rows.push(
		[
			`${name}: ${ours.result.fieldAcres.toFixed(1)} ac, ${ours.result.lanes.length} lanes (naive ${naive.result.length})`,
			`  ours   ${ours.ms.toFixed(1)} ms median of ${runs}; lane area vs GeographicLib: total ${((oursAcres / oursRef - 1) * 100).toExponential(2)} %, worst lane ${(worstLane(ours.result.lanes.map((l) => [l.acres, geographicLibOf(l.geometry) / SQ_M_PER_ACRE])) * 100).toExponential(2)} %`,
			`  naive  ${naive.ms.toFixed(1)} ms median of ${runs}; lane area vs GeographicLib: total ${((naiveAcres / naiveRef - 1) * 100).toFixed(3)} %, worst lane ${(worstLane(naive.result.map((l) => [l.squareMeters, geographicLibOf(l.geometry)])) * 100).toFixed(3)} %`,
			`  naive ÷ ours = ${(naive.ms / ours.ms).toFixed(1)}× (ours is ${naive.ms > ours.ms ? 'faster' : 'slower'})`
		].join('\n')
	);
}
console.log(rows.join('\n\n'));

// Self-crossing check: the sweep line against every pair of edges (the O(n²) definition), on a
// spiky star whose long edges were the worst case of the grid of buckets it replaced.
const crossingRows: string[] = ['Self-crossing check on a spiky star (no crossing, so every edge is examined):'];
for (const corners of [10_000, 20_000, 50_000]) {
	const ring = spikyRing(corners);
	const sweep = time(5, () => findCrossing([ring]));
	const pairs = once(() => crossesByAllPairs([ring]));
	if (sweep.result !== null || pairs.result) throw new Error('the star must not cross itself');
	crossingRows.push(
		`  ${corners.toLocaleString('en-US')} corners: sweep ${sweep.ms.toFixed(1)} ms (median of 5), all pairs ${pairs.ms.toFixed(0)} ms (one run): sweep ${(pairs.ms / sweep.ms).toFixed(0)}× faster`
	);
}
console.log(`\n${crossingRows.join('\n')}`);
