import { describe, expect, it } from 'vitest';
import { layoutStrips } from '$lib/geometry/index';
import { cleanPoints, readHeaders, readYieldCsv, summariseByLane, YieldFileError, type ImportLane } from '$lib/harvest/yield-points';
import { guessMapping, mappingProblems, type YieldMapping } from '$lib/harvest/yield-columns';
import { generateYieldFile, YIELD_HEADERS } from '../fixtures/yield-file';
import { rectangle } from '../fixtures/rectangle';

const LNG = -94.1;
const LAT = 43.8;
const MAPPING: YieldMapping = { longitude: 'Longitude', latitude: 'Latitude', yield: 'Yld Vol(Dry)(bu/ac)', moisture: 'Moisture(%)', swathWidth: 'Swath Width(ft)', speed: 'Speed(mph)', time: 'Time' };

function lanes(): ImportLane[] {
	const boundary = rectangle(159, 1000, LNG, LAT);
	const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
	const layout = layoutStrips({ boundary, guidance: { a: sw, b: nw }, pattern: [{ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 }, { kind: 'crop', crop: 'soybean', rows: 8, rowSpacingIn: 30 }] });
	return layout.lanes.map((l) => ({ laneIndex: l.index, kind: l.kind, crop: l.crop, acres: l.acres, variety: null, trialLabel: null, geometry: l.geometry }));
}

describe('column mapping', () => {
	it('guesses the usual names and names what is missing', () => {
		expect(guessMapping(YIELD_HEADERS)).toEqual(MAPPING);
		expect(mappingProblems(MAPPING, YIELD_HEADERS)).toEqual({});
		expect(mappingProblems({ ...MAPPING, yield: null, massFlow: 'Flow' }, [...YIELD_HEADERS, 'Flow'])).toEqual({});
		expect(mappingProblems({ ...MAPPING, yield: null }, YIELD_HEADERS)).toEqual({ yield: ['Choose a yield column (bu/ac) or a grain-flow column (lb/s).'] });
		expect(Object.keys(mappingProblems({ ...MAPPING, yield: null, massFlow: 'Flow', swathWidth: null }, [...YIELD_HEADERS, 'Flow']))).toEqual(['swathWidth']);
	});

	it('refuses a file without a usable header row', () => {
		expect(() => readHeaders('')).toThrow(YieldFileError);
		expect(() => readHeaders('a;b\n1;2\n')).toThrow('The first line has 2 columns (a | b)');
		expect(readHeaders('A\tB\tC\tD\n1\t2\t3\t4\n')).toEqual({ headers: ['A', 'B', 'C', 'D'], delimiter: '\t' });
	});
});

describe('points to lanes on a generated file', () => {
	const yieldOf = (i: number) => (i % 2 ? 61 : 203);

	it('assigns every kept point to its own lane and drops ramps, the stop and the overlap by the written rules', () => {
		const file = generateYieldFile({ lng: LNG, lat: LAT, lanes: 8, laneWidthFt: 20, lengthFt: 1000, yieldOf, mishaps: true });
		const read = readYieldCsv(file.csv, MAPPING);
		expect(read.points.count).toBe(file.expected.total);
		const cleaned = cleanPoints(read.points);
		const summary = summariseByLane(read.points, cleaned, lanes(), MAPPING);
		expect(summary.counts).toEqual({
			read: file.expected.total, kept: file.expected.total - file.expected.ramp - 4 - 32 - 30, outsideLanes: 30,
			dropped: { unreadable: 0, stopped: 4, passStart: file.expected.ramp, overlap: 32, noFlow: 0 }
		});
		expect(summary.lanes.map((l) => Number(l.meanBushelsPerAcre!.toFixed(9)))).toEqual([203, 61, 203, 61, 203, 61, 203, 61]);
		// its own ramp, the overlapping pass's ramp, and the overlap
		expect(summary.lanes[0].dropped).toBe(8 + 8 + 32);
		expect(summary.lanes[1].dropped).toBe(8 + 4);
	});

	it('reads grain flow (lb/s wet) into dry bu/ac at the lane crop\u2019s standard moisture', () => {
		// Flow chosen for 200 bu/ac of dry corn from wet grain at 18.5 %, 4 mph over a 20-ft swath:
		// lb/s = 200 × 56 × 84.5 ÷ 81.5 × (20 × 5.8667 ÷ 43,560)
		const areaAc = (20 * 4 * (5280 / 3600)) / 43_560;
		const flow = 200 * 56 * (84.5 / 81.5) * areaAc;
		const file = generateYieldFile({ lng: LNG, lat: LAT, lanes: 1, laneWidthFt: 20, lengthFt: 1000, yieldOf: () => flow });
		const mapping: YieldMapping = { ...MAPPING, yield: null, massFlow: 'Yld Vol(Dry)(bu/ac)' };
		const read = readYieldCsv(file.csv, mapping);
		const summary = summariseByLane(read.points, cleanPoints(read.points), lanes(), mapping);
		// the file keeps two decimals of flow
		expect(summary.lanes[0].meanBushelsPerAcre).toBeCloseTo(200, 0);
		// 940 of the 1,000 ft are driven (30-ft ends), less the first 8 s: about 0.90 of the lane
		expect(summary.lanes[0].coverage).toBeGreaterThan(0.88);
		expect(summary.lanes[0].coverage).toBeLessThan(0.92);
	});

	it('reads semicolons with decimal commas the same as commas with points', () => {
		const a = generateYieldFile({ lng: LNG, lat: LAT, lanes: 4, laneWidthFt: 20, lengthFt: 1000, yieldOf });
		const b = generateYieldFile({ lng: LNG, lat: LAT, lanes: 4, laneWidthFt: 20, lengthFt: 1000, yieldOf, delimiter: ';', decimalComma: true });
		const ra = readYieldCsv(a.csv, MAPPING);
		const rb = readYieldCsv(b.csv, MAPPING);
		expect(rb.delimiter).toBe(';');
		expect(Array.from(rb.points.lat)).toEqual(Array.from(ra.points.lat));
		expect(Array.from(rb.points.value)).toEqual(Array.from(ra.points.value));
	});

	it('names missing columns, and marks unreadable rows without stopping', () => {
		expect(() => readYieldCsv('Longitude,Latitude,Yld Vol(Dry)(bu/ac),Time\n1,2,3,4\n', MAPPING)).toThrow('The file lacks column "Moisture(%)" named in the mapping');
		const text = `${YIELD_HEADERS.join(',')}\n${LNG},${LAT},abc,18,20,4,2026-10-05T14:00:00Z\n`;
		const read = readYieldCsv(text, MAPPING);
		expect(cleanPoints(read.points).dropped).toEqual(['unreadable']);
	});
});
