import geographiclib from 'geographiclib-geodesic';
import type { Polygon, Position } from 'geojson';

const GEOD = geographiclib.Geodesic.WGS84;
const FT = 0.3048;

/** Point reached from [lng, lat] along a geodesic (GeographicLib Direct). */
export function travel([lng, lat]: Position, azimuthDeg: number, feet: number): [number, number] {
	const r = GEOD.Direct(lat, lng, azimuthDeg, feet * FT);
	return [r.lon2 as number, r.lat2 as number];
}

/** A rectangle with its south-west corner at `origin`, sides along north and east, in feet. */
export function rectangleField(origin: Position, eastFt: number, northFt: number): Polygon {
	const se = travel(origin, 90, eastFt);
	const nw = travel(origin, 0, northFt);
	const ne = travel(nw, 90, eastFt);
	return { type: 'Polygon', coordinates: [[origin as [number, number], se, ne, nw, origin as [number, number]]] };
}

/** A closed ring of `n` points around `centre`, radius varying smoothly (an irregular, non-convex field). */
export function irregularField(centre: Position, meanRadiusFt: number, n: number, seed = 1): Polygon {
	const ring: [number, number][] = [];
	for (let i = 0; i < n; i++) {
		const az = (360 * i) / n;
		const th = (az * Math.PI) / 180;
		const r = meanRadiusFt * (1 + 0.18 * Math.sin(3 * th + seed) + 0.08 * Math.cos(7 * th + 2 * seed) + 0.03 * Math.sin(23 * th));
		ring.push(travel(centre, az, r));
	}
	ring.reverse(); // clockwise azimuths → counter-clockwise ring
	ring.push(ring[0]);
	return { type: 'Polygon', coordinates: [ring] };
}

/** A small square (side in feet) centred at `centre`, counter-clockwise. */
export function squareAround(centre: Position, sideFt: number): Polygon {
	const h = sideFt / 2;
	const sw = travel(travel(centre, 180, h), 270, h);
	return rectangleField(sw, sideFt, sideFt);
}

/** Area of a polygon by GeographicLib (Karney 2013), m². */
export function geographicLibSquareMeters(g: Polygon): number {
	let total = 0;
	g.coordinates.forEach((ring, i) => {
		const p = GEOD.Polygon(false);
		for (const [lng, lat] of ring.slice(0, -1)) p.AddPoint(lat, lng);
		const a = Math.abs(p.Compute(false, true).area as number);
		total += i === 0 ? a : -a;
	});
	return total;
}
