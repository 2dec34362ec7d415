// Outline checks shared by the layout, the field editor and file import. Pure.
import type { MultiPolygon, Polygon, Position } from 'geojson';
import { findCrossing } from './crossings';
import { GeometryError } from './errors';
import { localProjection, type XY } from './projection';
import { checkVertexCount, validatePolygonal } from './validate';

type Polygonal = Polygon | MultiPolygon;
/** Polygons of rings of planar points (metres), as the clipping code takes them. */
export type PlaneRings = XY[][][];

export function polygonsOf(g: Polygonal): Position[][][] {
	return g.type === 'Polygon' ? [g.coordinates] : g.coordinates;
}

/** Drops repeated consecutive positions (still closed), without touching the input. */
export function withoutRepeats(ring: Position[]): Position[] {
	const out: Position[] = [ring[0]];
	for (let i = 1; i < ring.length; i++) {
		const p = ring[i];
		const q = out[out.length - 1];
		if (p[0] !== q[0] || p[1] !== q[1]) out.push(p);
	}
	return out;
}

/** Projects a polygonal geometry into the plane and refuses it if any ring crosses itself or another. */
export function toPlane(g: Polygonal, forward: (p: Position) => XY, inverse: (p: XY) => [number, number], what: string): PlaneRings {
	return polygonsOf(g).map((rings) => {
		const plane = rings.map((ring) => withoutRepeats(ring).map(forward));
		for (const ring of plane) {
			if (ring.length < 4) {
				throw new GeometryError('too-few-positions', `The ${what} has a ring with fewer than 3 distinct corners.`);
			}
		}
		// A ring with no width folds back on itself; say that plainly rather than "crosses itself".
		for (const ring of plane) {
			if (isFlat(ring)) {
				throw new GeometryError('zero-area', `The ${what} encloses no area (0 acres): its corners lie on one line.`, inverse(ring[0]));
			}
		}
		const hit = findCrossing(plane);
		if (hit) {
			const [lng, lat] = inverse(hit);
			throw new GeometryError(
				'self-intersection',
				`The ${what} crosses itself near longitude ${lng.toFixed(6)}, latitude ${lat.toFixed(6)}; redraw the outline there.`,
				[lng, lat]
			);
		}
		return plane;
	});
}

/** True when every corner lies within 1 mm of one line: the ring has no width. */
function isFlat(ring: XY[]): boolean {
	const [x0, y0] = ring[0];
	let far = ring[0];
	for (const p of ring) if (Math.hypot(p[0] - x0, p[1] - y0) > Math.hypot(far[0] - x0, far[1] - y0)) far = p;
	const len = Math.hypot(far[0] - x0, far[1] - y0);
	return len === 0 || ring.every((p) => Math.abs((far[0] - x0) * (p[1] - y0) - (far[1] - y0) * (p[0] - x0)) / len < 0.001);
}

/** A plane centred on the middle of the outline's extent, where crossings are found exactly. */
export function centredProjection(g: Polygonal) {
	let minLng = Infinity, maxLng = -Infinity, minLat = Infinity, maxLat = -Infinity;
	for (const rings of polygonsOf(g)) for (const [lng, lat] of rings[0]) {
		minLng = Math.min(minLng, lng); maxLng = Math.max(maxLng, lng);
		minLat = Math.min(minLat, lat); maxLat = Math.max(maxLat, lat);
	}
	return localProjection((minLng + maxLng) / 2, (minLat + maxLat) / 2);
}

/**
 * Checks that an outline is a valid GeoJSON polygon whose rings neither cross themselves nor each
 * other, naming where they do. Outlines across the 180th meridian, around a pole or with more than
 * MAX_FIELD_VERTICES corners are refused.
 *
 * @param g the outline
 * @param what how to name it in messages ("field boundary", "exclusion 2")
 * @throws GeometryError
 * @example checkOutline(bowtie, 'field boundary') // throws: crosses itself near longitude …
 */
export function checkOutline(g: Polygonal, what: string): void {
	checkVertexCount(validatePolygonal(g, what), what);
	const proj = centredProjection(g);
	toPlane(g, proj.forward, proj.inverse, what);
}
