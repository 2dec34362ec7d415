// Times what a worker does with a 100,000-point yield-monitor file — read the CSV, clean the points,
// set them into lanes and summarise per lane — against reading the same file with the CSV parser
// alone, measured in the same run. Goal: the whole import under 10 s on this machine.
// Run: node --import tsx scripts/bench-yield-import.ts
import Papa from 'papaparse';
import { layoutStrips } from '../src/lib/geometry/index';
import { cleanPoints, readYieldCsv, summariseByLane, type ImportLane } from '../src/lib/harvest/yield-points';
import type { YieldMapping } from '../src/lib/harvest/yield-columns';
import { generateYieldFile } from '../tests/fixtures/yield-file';
import { rectangle } from '../tests/fixtures/rectangle';

const POINTS = 100_000;
const LNG = -94.3;
const LAT = 44.0;
const WIDTH_FT = 3960;
const LENGTH_FT = 2640;

const boundary = rectangle(WIDTH_FT, LENGTH_FT, LNG, LAT);
const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
const layout = layoutStrips({
	boundary,
	guidance: { a: sw, b: nw },
	pattern: [{ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 }, { kind: 'crop', crop: 'soybean', rows: 8, rowSpacingIn: 30 }]
});
const lanes: ImportLane[] = layout.lanes.map((l) => ({ laneIndex: l.index, kind: l.kind, crop: l.crop, acres: l.acres, variety: null, trialLabel: null, geometry: l.geometry }));
const file = generateYieldFile({
	lng: LNG, lat: LAT, lanes: Math.floor(WIDTH_FT / 20), laneWidthFt: 20, lengthFt: LENGTH_FT,
	yieldOf: (i) => (i % 2 ? 60 : 200), secondsPerPoint: 0.8, mishaps: true, limit: POINTS
});
if (file.expected.total !== POINTS) throw new Error(`generated ${file.expected.total} points, wanted ${POINTS}`);
const mapping: YieldMapping = { longitude: 'Longitude', latitude: 'Latitude', yield: 'Yld Vol(Dry)(bu/ac)', moisture: 'Moisture(%)', swathWidth: 'Swath Width(ft)', speed: 'Speed(mph)', time: 'Time' };

function median(xs: number[]) {
	const s = [...xs].sort((a, b) => a - b);
	return s[Math.floor(s.length / 2)];
}

function timed(runs: number, fn: () => void): number {
	fn(); // warm-up
	const ms: number[] = [];
	for (let i = 0; i < runs; i++) {
		const t = performance.now();
		fn();
		ms.push(performance.now() - t);
	}
	return median(ms);
}

let kept = 0;
const baseline = timed(3, () => void Papa.parse(file.csv, { skipEmptyLines: true }));
const parts = { read: 0, clean: 0, lanes: 0 };
const whole = timed(3, () => {
	let t = performance.now();
	const read = readYieldCsv(file.csv, mapping);
	parts.read = performance.now() - t;
	t = performance.now();
	const cleaned = cleanPoints(read.points);
	parts.clean = performance.now() - t;
	t = performance.now();
	kept = summariseByLane(read.points, cleaned, lanes, mapping).counts.kept;
	parts.lanes = performance.now() - t;
});

const mb = (Buffer.byteLength(file.csv) / 1024 / 1024).toFixed(1);
console.log(`Yield import: ${POINTS.toLocaleString('en-US')} points (${mb} MB CSV) into ${lanes.length} lanes of a ${layout.fieldAcres.toFixed(0)}-ac field`);
console.log(`  CSV parser alone (baseline)   ${baseline.toFixed(0).padStart(6)} ms`);
console.log(`  whole import                  ${whole.toFixed(0).padStart(6)} ms   ${Math.round(POINTS / (whole / 1000)).toLocaleString('en-US')} points/s   ${(whole / baseline).toFixed(1)}× the baseline`);
console.log(`    read + map columns ${parts.read.toFixed(0)} ms · clean ${parts.clean.toFixed(0)} ms · lanes + summary ${parts.lanes.toFixed(0)} ms (last run)`);
console.log(`  kept ${kept.toLocaleString('en-US')} points; goal under 10,000 ms: ${whole < 10_000 ? 'met' : 'NOT met'}`);
