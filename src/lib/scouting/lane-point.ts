// Points on a plan's lanes for scouting notes: which lane a map point lies in, and the point a
// given distance along a lane (the keyboard alternative to clicking the map). Pure: no I/O.
import { booleanPointInPolygon, point as turfPoint } from '@turf/turf';
import type { MultiPolygon, Polygon } from 'geojson';

type LngLat = [number, number];
export interface LaneShape {
	index: number;
	geometry: Polygon | MultiPolygon;
}

const FEET_PER_METRE = 1 / 0.3048;
// Metres per degree of latitude near the middle latitudes; a flat local frame is well within a
// scouting point's needs (a few feet over a mile).
const METRES_PER_DEGREE = 111_320;

interface Frame {
	toLocal(p: LngLat): [number, number]; // feet along A→B, feet to the right of A→B
	toLngLat(along: number, right: number): LngLat;
}

function frame(a: LngLat, b: LngLat): Frame {
	const k = Math.cos((a[1] * Math.PI) / 180);
	const east = (p: LngLat) => (p[0] - a[0]) * k * METRES_PER_DEGREE * FEET_PER_METRE;
	const north = (p: LngLat) => (p[1] - a[1]) * METRES_PER_DEGREE * FEET_PER_METRE;
	const dx = east(b);
	const dy = north(b);
	const len = Math.hypot(dx, dy) || 1;
	const u = [dx / len, dy / len];
	const r = [u[1], -u[0]]; // to the right of A→B
	return {
		toLocal: (p) => {
			const x = east(p);
			const y = north(p);
			return [x * u[0] + y * u[1], x * r[0] + y * r[1]];
		},
		toLngLat: (along, right) => {
			const x = along * u[0] + right * r[0];
			const y = along * u[1] + right * r[1];
			return [a[0] + x / (k * METRES_PER_DEGREE * FEET_PER_METRE), a[1] + y / (METRES_PER_DEGREE * FEET_PER_METRE)];
		}
	};
}

function outerVertices(g: Polygon | MultiPolygon): LngLat[] {
	const polygons = g.type === 'Polygon' ? [g.coordinates] : g.coordinates;
	return polygons.flatMap((p) => p[0] as LngLat[]);
}

/** The lane's extent in the A-B frame: from its end nearest A to its far end, and its middle across. */
export function laneExtent(geometry: Polygon | MultiPolygon, guidance: { a: LngLat; b: LngLat }) {
	const f = frame(guidance.a, guidance.b);
	const local = outerVertices(geometry).map(f.toLocal);
	const along = local.map((p) => p[0]);
	const across = local.map((p) => p[1]);
	const start = Math.min(...along);
	return { start, lengthFt: Math.max(...along) - start, middle: (Math.min(...across) + Math.max(...across)) / 2, frame: f };
}

export type LanePointResult = { ok: true; point: LngLat } | { ok: false; reason: string };

/**
 * The point in the middle of the lane, `positionFt` from its end nearest point A of the A-B line.
 * Refused when the lane is shorter or that spot is outside the lane (a notch or an exclusion).
 */
export function pointAlongLane(geometry: Polygon | MultiPolygon, guidance: { a: LngLat; b: LngLat }, positionFt: number): LanePointResult {
	const e = laneExtent(geometry, guidance);
	if (!(positionFt >= 0) || positionFt > e.lengthFt) {
		return { ok: false, reason: `The lane is ${Math.round(e.lengthFt).toLocaleString('en-US')} ft long; give a position from 0 to ${Math.floor(e.lengthFt).toLocaleString('en-US')} ft.` };
	}
	const p = e.frame.toLngLat(e.start + positionFt, e.middle);
	if (!booleanPointInPolygon(turfPoint(p), geometry)) {
		return { ok: false, reason: `${Math.round(positionFt)} ft along, the middle of the lane is outside its planted area; pick another position or a point on the map.` };
	}
	return { ok: true, point: p };
}

/** How far along the lane a point lies, in feet from the end nearest point A. */
export function positionAlongLane(geometry: Polygon | MultiPolygon, guidance: { a: LngLat; b: LngLat }, p: LngLat): number {
	const e = laneExtent(geometry, guidance);
	return Math.min(Math.max(e.frame.toLocal(p)[0] - e.start, 0), e.lengthFt);
}

/** The index of the lane holding the point, or null when it is on none. */
export function laneAtPoint(lanes: LaneShape[], p: LngLat): number | null {
	const pt = turfPoint(p);
	for (const lane of lanes) if (booleanPointInPolygon(pt, lane.geometry)) return lane.index;
	return null;
}

export function isInLane(lane: LaneShape, p: LngLat): boolean {
	return booleanPointInPolygon(turfPoint(p), lane.geometry);
}
