// Coordinates rounded for sending, never for storing. Pure.
// Seven decimals of a degree are at most 1.1 cm on the ground, well inside RTK guidance error, and
// cut the digits Turf leaves (15–17) by more than a third.
import type { MultiPolygon, Polygon, Position } from 'geojson';

export const TRANSPORT_DECIMALS = 7;

const roundPosition = (p: Position, scale: number): Position => p.map((v) => Math.round(v * scale) / scale);

/** A copy of the polygon with every coordinate rounded to `decimals` (default 7) decimals of a degree. */
export function roundGeometry<G extends Polygon | MultiPolygon>(geometry: G, decimals = TRANSPORT_DECIMALS): G {
	const scale = 10 ** decimals;
	const ring = (r: Position[]) => r.map((p) => roundPosition(p, scale));
	if (geometry.type === 'Polygon') return { ...geometry, coordinates: geometry.coordinates.map(ring) };
	return { ...geometry, coordinates: (geometry as MultiPolygon).coordinates.map((poly) => poly.map(ring)) };
}

/** Lanes with their outlines rounded for sending; every other value is kept as it is. */
export function lanesForTransport<L extends { geometry: Polygon | MultiPolygon }>(lanes: L[], decimals = TRANSPORT_DECIMALS): L[] {
	return lanes.map((l) => ({ ...l, geometry: roundGeometry(l.geometry, decimals) }));
}
