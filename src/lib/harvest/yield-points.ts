// Yield-monitor points: read from CSV, cleaned by documented rules, set into lanes, summarised per lane.
//
// Cleaning rules (common practice in yield-map cleaning; the thresholds are ours and are listed here):
// 1. unreadable — a position, yield or flow, moisture or time that is not a number (or a time that
//    cannot be read), a moisture outside 5–40 %, or a yield or flow below zero.
// 2. stopped — ground speed under 0.5 mph (from the speed column, else from positions and times):
//    grain still flowing while the machine stands piles onto a point that has no area.
// 3. pass start — the first 8 s of each pass: the header fills and the grain reaches the sensor
//    several seconds after cutting begins, so the first readings ramp up from zero. A pass starts
//    at the first point, after a gap of more than 5 s between points, or where the heading turns by
//    more than 90° (the headland turn).
// 4. overlap — a point whose centre lies within half a swath of a point logged earlier on another
//    pass: at least half of its swath was already cut, so the monitor divides its grain by too much area.
// 5. no flow — a yield or flow of exactly zero while moving (header up, or an empty row).
// Points outside every grain lane of the plan (headland, pasture lanes, outside the field) are counted
// separately and never shape a lane's mean.
import Papa from 'papaparse';
import { booleanPointInPolygon, geojsonRbush } from '@turf/turf';
import type { Feature, MultiPolygon, Polygon } from 'geojson';
import { GRAIN_STANDARDS, standardMoistureWeight } from '../agronomy/index.js';
import { isGrainCrop, HARVEST_MOISTURE } from './entry.js';
import type { YieldMapping } from './yield-columns.js';

import { CLEANING } from './cleaning-rules.js';

export { CLEANING };

export const DROP_REASONS = ['unreadable', 'stopped', 'passStart', 'overlap', 'noFlow'] as const;
export type DropReason = (typeof DROP_REASONS)[number];

export class YieldFileError extends Error {
	constructor(message: string, readonly code: string) {
		super(message);
	}
}

/** Points as columns of numbers (NaN where unreadable), in file order. */
export interface YieldPoints {
	count: number;
	lng: Float64Array;
	lat: Float64Array;
	value: Float64Array; // yield bu/ac, or flow lb/s
	moisture: Float64Array;
	swathFt: Float64Array; // NaN when the file has none
	time: Float64Array; // seconds
	speedMph: Float64Array; // NaN when the file has none
}

export interface ReadResult {
	headers: string[];
	delimiter: string;
	points: YieldPoints;
}

/** Only the header row, for mapping before the whole file is read. */
export function readHeaders(text: string): { headers: string[]; delimiter: string } {
	const firstLines = text.slice(0, 64 * 1024).split(/\r?\n/).slice(0, 6).join('\n');
	const parsed = Papa.parse<string[]>(firstLines, { skipEmptyLines: true, preview: 5 });
	const headers = (parsed.data[0] ?? []).map((h) => h.trim());
	if (!headers.length || headers.every((h) => !h)) throw new YieldFileError('The file has no header row: its first line must name the columns.', 'no_header');
	if (headers.length < 4) {
		throw new YieldFileError(`The first line has ${headers.length} column${headers.length === 1 ? '' : 's'} (${headers.join(' | ')}); a yield file needs at least position, yield, moisture and time. Is it separated by commas, semicolons or tabs?`, 'too_few_columns');
	}
	return { headers, delimiter: parsed.meta.delimiter };
}

/** A number as a yield monitor writes it: "43.71", "43,71" (decimal comma) or "-94.3". */
function parseNumber(raw: string | undefined, decimalComma: boolean): number {
	if (raw === undefined) return NaN;
	const s = raw.trim();
	if (!s) return NaN;
	const n = Number(decimalComma ? s.replace(',', '.') : s);
	return Number.isFinite(n) ? n : NaN;
}

function parseTime(raw: string | undefined, decimalComma: boolean): number {
	if (raw === undefined) return NaN;
	const n = parseNumber(raw, decimalComma);
	if (!Number.isNaN(n)) return n > 1e11 ? n / 1000 : n; // epoch milliseconds or seconds
	const ms = Date.parse(raw.trim());
	return Number.isNaN(ms) ? NaN : ms / 1000;
}

/** Reads every row with the mapping; throws {@link YieldFileError} for a file that cannot be used at all. */
export function readYieldCsv(text: string, mapping: YieldMapping, onProgress?: (share: number) => void): ReadResult {
	const { headers, delimiter } = readHeaders(text);
	const column = (name: string | null | undefined) => (name ? headers.indexOf(name) : -1);
	const missing = [mapping.longitude, mapping.latitude, mapping.moisture, mapping.time, mapping.yield ?? mapping.massFlow]
		.filter((c) => !c || headers.indexOf(c) < 0);
	if (missing.length) {
		throw new YieldFileError(`The file lacks column${missing.length === 1 ? '' : 's'} ${missing.map((m) => `"${m ?? '?'}"`).join(', ')} named in the mapping; its columns are ${headers.map((h) => `"${h}"`).join(', ')}.`, 'missing_columns');
	}
	const parsed = Papa.parse<string[]>(text, { delimiter, skipEmptyLines: true });
	const rows = parsed.data;
	const n = Math.max(rows.length - 1, 0);
	if (n === 0) throw new YieldFileError('The file has a header row but no points.', 'no_points');
	// A decimal comma is only possible when commas do not separate the columns.
	const decimalComma = delimiter !== ',';
	const idx = {
		lng: column(mapping.longitude), lat: column(mapping.latitude), value: column(mapping.yield ?? mapping.massFlow),
		moisture: column(mapping.moisture), swath: column(mapping.swathWidth), time: column(mapping.time), speed: column(mapping.speed)
	};
	const swathFactor = mapping.swathUnit === 'in' ? 1 / 12 : mapping.swathUnit === 'm' ? 1 / 0.3048 : 1;
	const speedFactor = mapping.speedUnit === 'km/h' ? 1 / 1.609344 : 1;
	const points: YieldPoints = {
		count: n, lng: new Float64Array(n), lat: new Float64Array(n), value: new Float64Array(n), moisture: new Float64Array(n),
		swathFt: new Float64Array(n), time: new Float64Array(n), speedMph: new Float64Array(n)
	};
	const step = Math.max(1, Math.floor(n / 10));
	for (let i = 0; i < n; i++) {
		const r = rows[i + 1];
		points.lng[i] = parseNumber(r[idx.lng], decimalComma);
		points.lat[i] = parseNumber(r[idx.lat], decimalComma);
		points.value[i] = parseNumber(r[idx.value], decimalComma);
		points.moisture[i] = parseNumber(r[idx.moisture], decimalComma);
		points.swathFt[i] = idx.swath >= 0 ? parseNumber(r[idx.swath], decimalComma) * swathFactor : NaN;
		points.time[i] = parseTime(r[idx.time], decimalComma);
		points.speedMph[i] = idx.speed >= 0 ? parseNumber(r[idx.speed], decimalComma) * speedFactor : NaN;
		if (onProgress && i % step === 0) onProgress(i / n);
	}
	const readable = countWhere(n, (i) => Number.isFinite(points.lng[i]) && Number.isFinite(points.lat[i]));
	if (readable === 0) throw new YieldFileError('No row has a readable position: check the longitude and latitude columns (and the decimal separator).', 'no_positions');
	return { headers, delimiter, points };
}

function countWhere(n: number, test: (i: number) => boolean): number {
	let c = 0;
	for (let i = 0; i < n; i++) if (test(i)) c++;
	return c;
}

const FT_PER_DEG_LAT = 364_000; // ≈ 110.95 km per degree, in feet: enough for distances between neighbouring points

export interface Cleaned {
	/** reason a point is dropped, or null when it is kept */
	dropped: (DropReason | null)[];
	/** feet travelled since the previous point of the pass (for area and coverage) */
	distanceFt: Float64Array;
	/** seconds the point stands for */
	seconds: Float64Array;
}

/** Applies the cleaning rules above; points keep their order. */
export function cleanPoints(p: YieldPoints): Cleaned {
	const n = p.count;
	const dropped: (DropReason | null)[] = new Array(n).fill(null);
	const distanceFt = new Float64Array(n);
	const seconds = new Float64Array(n).fill(1);
	const pass = new Int32Array(n).fill(-1);
	const x = new Float64Array(n);
	const y = new Float64Array(n);
	let refLat = NaN;
	for (let i = 0; i < n; i++) {
		const bad = !Number.isFinite(p.lng[i]) || !Number.isFinite(p.lat[i]) || !Number.isFinite(p.value[i]) || p.value[i] < 0 || !Number.isFinite(p.time[i])
			|| !(p.moisture[i] >= HARVEST_MOISTURE.min && p.moisture[i] <= HARVEST_MOISTURE.max);
		if (bad) dropped[i] = 'unreadable';
		else if (Number.isNaN(refLat)) refLat = p.lat[i];
	}
	const ftPerDegLng = FT_PER_DEG_LAT * Math.cos(((Number.isNaN(refLat) ? 0 : refLat) * Math.PI) / 180);
	let prev = -1;
	let passNo = -1;
	let passStartTime = 0;
	let prevHeading = NaN;
	for (let i = 0; i < n; i++) {
		if (dropped[i]) continue;
		x[i] = p.lng[i] * ftPerDegLng;
		y[i] = p.lat[i] * FT_PER_DEG_LAT;
		let newPass = prev < 0;
		let dt = 1;
		let dist = 0;
		if (prev >= 0) {
			dt = p.time[i] - p.time[prev];
			dist = Math.hypot(x[i] - x[prev], y[i] - y[prev]);
			if (!(dt > 0) || dt > CLEANING.passGapSeconds) newPass = true;
			if (dist > 1.5) {
				const heading = Math.atan2(x[i] - x[prev], y[i] - y[prev]);
				if (!Number.isNaN(prevHeading)) {
					let turn = Math.abs(heading - prevHeading) * (180 / Math.PI);
					if (turn > 180) turn = 360 - turn;
					if (turn > CLEANING.passTurnDegrees) newPass = true;
				}
				prevHeading = heading;
			}
		}
		if (newPass) {
			passNo++;
			passStartTime = p.time[i];
			prevHeading = NaN;
			dt = prev >= 0 && dt > 0 && dt <= CLEANING.passGapSeconds ? dt : 1;
			dist = prev >= 0 && dt > 0 && dt <= CLEANING.passGapSeconds ? dist : NaN;
		}
		pass[i] = passNo;
		seconds[i] = dt;
		const speed = Number.isFinite(p.speedMph[i]) ? p.speedMph[i] : Number.isFinite(dist) ? (dist / dt) * (3600 / 5280) : NaN;
		distanceFt[i] = Number.isFinite(p.speedMph[i]) ? p.speedMph[i] * (5280 / 3600) * dt : Number.isFinite(dist) ? dist : 0;
		prev = i;
		if (Number.isFinite(speed) && speed < CLEANING.minSpeedMph) dropped[i] = 'stopped';
		else if (p.time[i] - passStartTime < CLEANING.passStartSeconds) dropped[i] = 'passStart';
		else if (p.value[i] === 0) dropped[i] = 'noFlow';
	}
	// Overlap: a hash grid of earlier points, cells one swath wide.
	const swath = medianSwath(p);
	if (Number.isFinite(swath) && swath > 0) {
		const cell = swath;
		const grid = new Map<number, number[]>();
		const key = (cx: number, cy: number) => cx * 1_000_003 + cy;
		for (let i = 0; i < n; i++) {
			if (pass[i] < 0) continue;
			const w = Number.isFinite(p.swathFt[i]) && p.swathFt[i] > 0 ? p.swathFt[i] : swath;
			const limit = w * CLEANING.overlapShareOfSwath;
			const cx = Math.floor(x[i] / cell);
			const cy = Math.floor(y[i] / cell);
			if (!dropped[i]) {
				search: for (let ox = -1; ox <= 1; ox++) {
					for (let oy = -1; oy <= 1; oy++) {
						const list = grid.get(key(cx + ox, cy + oy));
						if (!list) continue;
						for (const j of list) {
							if (pass[j] !== pass[i] && Math.hypot(x[i] - x[j], y[i] - y[j]) < limit) {
								dropped[i] = 'overlap';
								break search;
							}
						}
					}
				}
			}
			const k = key(cx, cy);
			const list = grid.get(k);
			if (list) list.push(i);
			else grid.set(k, [i]);
		}
	}
	return { dropped, distanceFt, seconds };
}

function medianSwath(p: YieldPoints): number {
	const sample: number[] = [];
	const step = Math.max(1, Math.floor(p.count / 1000));
	for (let i = 0; i < p.count; i += step) if (Number.isFinite(p.swathFt[i]) && p.swathFt[i] > 0) sample.push(p.swathFt[i]);
	if (!sample.length) return NaN;
	sample.sort((a, b) => a - b);
	return sample[Math.floor(sample.length / 2)];
}

export interface ImportLane {
	laneIndex: number;
	kind: string;
	crop: string;
	acres: number;
	variety: string | null;
	trialLabel: string | null;
	geometry: Polygon | MultiPolygon;
}

export interface LaneSummary {
	laneIndex: number;
	kind: string;
	crop: string;
	variety: string | null;
	trialLabel: string | null;
	acres: number;
	/** points kept in the lane */
	points: number;
	/** points in the lane dropped by a cleaning rule */
	dropped: number;
	/** area-weighted mean of the kept points, bu/ac at the crop's standard moisture; null without points */
	meanBushelsPerAcre: number | null;
	/** acres the kept points stand for (swath × distance); null when the file has no swath width */
	coveredAcres: number | null;
	/** coveredAcres ÷ lane acres, at most 1 */
	coverage: number | null;
}

export interface ImportCounts {
	read: number;
	kept: number;
	outsideLanes: number;
	dropped: Record<DropReason, number>;
}

export interface ImportSummary {
	counts: ImportCounts;
	lanes: LaneSummary[];
}

/**
 * Sets every point into the lane that holds it (point in polygon, through an R-tree of the lanes'
 * bounding boxes) and summarises each lane. Point yields are brought to the lane crop's standard
 * moisture: flow (lb/s wet) over the area cut in that time; a wet bu/ac through its moisture; a dry
 * bu/ac as given.
 */
export function summariseByLane(p: YieldPoints, cleaned: Cleaned, lanes: ImportLane[], mapping: YieldMapping, onProgress?: (share: number) => void): ImportSummary {
	const grain = lanes.filter((l) => l.kind === 'crop' && isGrainCrop(l.crop));
	const tree = geojsonRbush<Polygon | MultiPolygon, { i: number }>();
	tree.load(grain.map((l, i): Feature<Polygon | MultiPolygon, { i: number }> => ({ type: 'Feature', properties: { i }, geometry: l.geometry })));
	const acc = grain.map(() => ({ points: 0, dropped: 0, weighted: 0, weight: 0, sum: 0, area: 0 }));
	const counts: ImportCounts = { read: p.count, kept: 0, outsideLanes: 0, dropped: { unreadable: 0, stopped: 0, passStart: 0, overlap: 0, noFlow: 0 } };
	const useFlow = !mapping.yield && !!mapping.massFlow;
	const step = Math.max(1, Math.floor(p.count / 10));
	const coord: [number, number] = [0, 0];
	for (let i = 0; i < p.count; i++) {
		if (onProgress && i % step === 0) onProgress(i / p.count);
		const reason = cleaned.dropped[i];
		if (reason === 'unreadable') {
			counts.dropped.unreadable++;
			continue;
		}
		coord[0] = p.lng[i];
		coord[1] = p.lat[i];
		let lane = -1;
		for (const f of tree.search([coord[0], coord[1], coord[0], coord[1]]).features) {
			if (booleanPointInPolygon(coord, f.geometry)) {
				lane = f.properties.i;
				break;
			}
		}
		if (lane < 0) {
			counts.outsideLanes++;
			continue;
		}
		const a = acc[lane];
		if (reason) {
			counts.dropped[reason]++;
			a.dropped++;
			continue;
		}
		const standard = GRAIN_STANDARDS[grain[lane].crop as keyof typeof GRAIN_STANDARDS];
		const areaAc = Number.isFinite(p.swathFt[i]) ? (p.swathFt[i] * cleaned.distanceFt[i]) / 43_560 : NaN;
		let buAc: number;
		if (useFlow) {
			if (!(areaAc > 0)) {
				counts.dropped.stopped++;
				a.dropped++;
				continue;
			}
			const wetLbPerAc = (p.value[i] * cleaned.seconds[i]) / areaAc;
			buAc = standardMoistureWeight(wetLbPerAc, p.moisture[i], standard.standardMoisturePct) / standard.poundsPerBushel;
		} else if (mapping.yieldBasis === 'wet') {
			buAc = standardMoistureWeight(p.value[i] * standard.poundsPerBushel, p.moisture[i], standard.standardMoisturePct) / standard.poundsPerBushel;
		} else {
			buAc = p.value[i];
		}
		counts.kept++;
		a.points++;
		a.sum += buAc;
		if (areaAc > 0) {
			a.weighted += buAc * areaAc;
			a.weight += areaAc;
			a.area += areaAc;
		}
	}
	return {
		counts,
		lanes: grain.map((l, i) => {
			const a = acc[i];
			const hasArea = a.weight > 0;
			return {
				laneIndex: l.laneIndex, kind: l.kind, crop: l.crop, variety: l.variety, trialLabel: l.trialLabel, acres: l.acres,
				points: a.points, dropped: a.dropped,
				meanBushelsPerAcre: a.points ? (hasArea ? a.weighted / a.weight : a.sum / a.points) : null,
				coveredAcres: hasArea ? a.area : null,
				coverage: hasArea && l.acres > 0 ? Math.min(1, a.area / l.acres) : null
			};
		})
	};
}
