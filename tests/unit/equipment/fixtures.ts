// Test fields and planters: a rectangle laid out from a point in southern Minnesota with small
// geodesic offsets (GeographicLib Direct), and planters built unit by unit.
import geographiclib from 'geographiclib-geodesic';
import type { Polygon } from 'geojson';
import { layoutStrips, type LaneSpec, type Layout, type LngLat } from '../../../src/lib/geometry/index';
import type { FertilizerLine, PlanterSetup, RowUnit } from '../../../src/lib/equipment/index';

const GEOD = geographiclib.Geodesic.WGS84;
const FOOT_M = 0.3048;

/** South-west corner of the test fields, in Faribault County, Minnesota. */
export const ORIGIN: LngLat = [-93.95, 43.65];

function travel([lng, lat]: LngLat, azimuthDeg: number, feet: number): LngLat {
	const r = GEOD.Direct(lat, lng, azimuthDeg, feet * FOOT_M);
	return [r.lon2 as number, r.lat2 as number];
}

/** A field `eastFt` wide and `northFt` long; A at the south-west corner, B due north of it. */
export function rectangleLayout(pattern: LaneSpec[], eastFt: number, northFt = 1320, offsetFt = 0): Layout {
	const se = travel(ORIGIN, 90, eastFt);
	const nw = travel(ORIGIN, 0, northFt);
	const ne = travel(nw, 90, eastFt);
	const boundary: Polygon = { type: 'Polygon', coordinates: [[ORIGIN, se, ne, nw, ORIGIN]] };
	return layoutStrips({ boundary, guidance: { a: ORIGIN, b: nw }, pattern, offsetFt });
}

export const corn8: LaneSpec = { kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 };
export const soy8: LaneSpec = { kind: 'crop', crop: 'soybean', rows: 8, rowSpacingIn: 30 };

export const nitrogenLine: FertilizerLine = { id: 'n', name: 'Nitrogen', product: 'UAN 32 %', forCrops: ['corn'] };
export const starterLine: FertilizerLine = { id: 'starter', name: 'Starter', product: null, forCrops: ['corn', 'soybean'] };

/** `count` units at `rowSpacingIn`; `carry(unit)` gives each unit's seed and fertilizer lines. */
export function planter(
	count: number,
	carry: (unit: number) => Pick<RowUnit, 'seed' | 'fertilizerOn'>,
	rowSpacingIn = 30,
	fertilizerLines: FertilizerLine[] = [nitrogenLine, starterLine]
): PlanterSetup {
	return { rowSpacingIn, rowUnits: Array.from({ length: count }, (_, i) => ({ unit: i + 1, ...carry(i + 1) })), fertilizerLines };
}

export const corn = (variety: string | null = 'hybrid A') => ({ crop: 'corn', variety });
export const soybean = (variety: string | null = 'variety S') => ({ crop: 'soybean', variety });

/** 16 units: 1–8 corn with nitrogen, 9–16 soybean (the split planter). */
export const splitPlanter16 = (): PlanterSetup =>
	planter(16, (u) => (u <= 8 ? { seed: corn(), fertilizerOn: ['n'] } : { seed: soybean(), fertilizerOn: [] }));

/** Units on, by lane index: { 0: [1..8], 1: [9..16] }. */
export function unitsOnByLane(units: readonly { unit: number; on: boolean; laneIndex: number | null }[]): Record<number, number[]> {
	const out: Record<number, number[]> = {};
	for (const u of units) if (u.on && u.laneIndex !== null) (out[u.laneIndex] ??= []).push(u.unit);
	return out;
}

export const range = (from: number, to: number): number[] => Array.from({ length: to - from + 1 }, (_, i) => from + i);

/** A deep, frozen copy: passing it to a function shows whether the function writes to its input. */
export function frozen<T>(value: T): T {
	const copy = structuredClone(value);
	const freeze = (v: unknown): void => {
		if (v && typeof v === 'object') {
			Object.values(v).forEach(freeze);
			Object.freeze(v);
		}
	};
	freeze(copy);
	return copy;
}
