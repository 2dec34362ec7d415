// Stretches of a lane: distance along a lane (from its start, in the A→B direction) to outline,
// and back. Pure; a local flat projection is plenty for a lane a mile long or less.
import { intersect, featureCollection, feature } from '@turf/turf';
import type { MultiPolygon, Polygon, Position } from 'geojson';
import { geodesicAcres } from '../geometry/index';

const FT = 0.3048;
type LngLat = [number, number];

interface Frame {
	toLocal: (p: Position) => { along: number; across: number };
	toLngLat: (along: number, across: number) => LngLat;
}

/** Feet along and across the A→B direction, around point A. */
function frame(guidance: { a: LngLat; b: LngLat }): Frame {
	const [lng0, lat0] = guidance.a;
	const mLat = 111_132.92 - 559.82 * Math.cos((2 * lat0 * Math.PI) / 180);
	const mLng = 111_412.84 * Math.cos((lat0 * Math.PI) / 180);
	const east = (p: Position) => ((p[0] - lng0) * mLng) / FT;
	const north = (p: Position) => ((p[1] - lat0) * mLat) / FT;
	const bx = east(guidance.b);
	const by = north(guidance.b);
	const len = Math.hypot(bx, by) || 1;
	const ux = bx / len;
	const uy = by / len;
	return {
		toLocal: (p) => {
			const x = east(p);
			const y = north(p);
			return { along: x * ux + y * uy, across: x * uy - y * ux };
		},
		toLngLat: (along, across) => {
			const x = along * ux + across * uy;
			const y = along * uy - across * ux;
			return [lng0 + (x * FT) / mLng, lat0 + (y * FT) / mLat];
		}
	};
}

function positions(g: Polygon | MultiPolygon): Position[] {
	return g.type === 'Polygon' ? g.coordinates.flat() : g.coordinates.flat(2);
}

export interface LaneExtent {
	/** Along-distance of the lane's first and last point from A, ft. */
	startFt: number;
	lengthFt: number;
}

/** Where a lane begins along the A→B direction and how long it is, ft. */
export function laneExtent(lane: Polygon | MultiPolygon, guidance: { a: LngLat; b: LngLat }): LaneExtent {
	const f = frame(guidance);
	let min = Infinity;
	let max = -Infinity;
	for (const p of positions(lane)) {
		const { along } = f.toLocal(p);
		min = Math.min(min, along);
		max = Math.max(max, along);
	}
	return { startFt: min, lengthFt: max - min };
}

/**
 * The part of a lane between `fromFt` and `toFt` along it (0 = the lane's start nearest A), with
 * its geodesic area. Null geometry when the stretch holds no area (past the lane's end).
 */
export function stretchOutline(
	lane: Polygon | MultiPolygon,
	guidance: { a: LngLat; b: LngLat },
	fromFt: number,
	toFt: number
): { geometry: Polygon | MultiPolygon | null; acres: number } {
	const f = frame(guidance);
	const pts = positions(lane).map((p) => f.toLocal(p));
	const start = Math.min(...pts.map((p) => p.along));
	const left = Math.min(...pts.map((p) => p.across)) - 5;
	const right = Math.max(...pts.map((p) => p.across)) + 5;
	const a0 = start + fromFt;
	const a1 = start + toFt;
	const ring = [f.toLngLat(a0, left), f.toLngLat(a1, left), f.toLngLat(a1, right), f.toLngLat(a0, right), f.toLngLat(a0, left)];
	const box = feature<Polygon>({ type: 'Polygon', coordinates: [ring] });
	const cut = intersect(featureCollection([feature(lane), box]));
	if (!cut) return { geometry: null, acres: 0 };
	return { geometry: cut.geometry, acres: geodesicAcres(cut.geometry) };
}
