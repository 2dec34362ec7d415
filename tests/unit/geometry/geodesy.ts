// Independent geodesic measurements for checks (GeographicLib, Karney 2013). Tests only.
import geographiclib from 'geographiclib-geodesic';
import type { MultiPolygon, Polygon, Position } from 'geojson';

export const GEOD = geographiclib.Geodesic.WGS84;
export { geographicLibSquareMeters, rectangleField, irregularField, squareAround, travel } from '../../../scripts/bench/fields';

export function distanceM(p: Position, q: Position): number {
	return GEOD.Inverse(p[1], p[0], q[1], q[0]).s12 as number;
}

/**
 * Signed distance (m) of `p` from the geodesic through a and b, positive to the right of a→b:
 * the closest point on the line is found by golden-section search on GeographicLib distances.
 */
export function signedOffsetM(a: Position, b: Position, p: Position): number {
	const line = GEOD.InverseLine(a[1], a[0], b[1], b[0]);
	const len = line.s13 as number;
	const at = (s: number) => {
		const r = line.Position(s);
		return { lat2: r.lat2 as number, lon2: r.lon2 as number, azi2: r.azi2 as number };
	};
	const dist = (s: number) => {
		const q = at(s);
		return GEOD.Inverse(q.lat2, q.lon2, p[1], p[0]).s12 as number;
	};
	let lo = -3 * len, hi = 4 * len;
	const g = (Math.sqrt(5) - 1) / 2;
	for (let i = 0; i < 90; i++) {
		const m1 = hi - g * (hi - lo);
		const m2 = lo + g * (hi - lo);
		if (dist(m1) < dist(m2)) hi = m2;
		else lo = m1;
	}
	const s = (lo + hi) / 2;
	const foot = at(s);
	const inv = GEOD.Inverse(foot.lat2, foot.lon2, p[1], p[0]);
	const side = Math.sin((((inv.azi1 as number) - foot.azi2) * Math.PI) / 180) >= 0 ? 1 : -1;
	return side * (inv.s12 as number);
}

export function geographicLibAcres(g: Polygon | MultiPolygon): number {
	const polys = g.type === 'Polygon' ? [g.coordinates] : g.coordinates;
	let m2 = 0;
	for (const rings of polys) {
		rings.forEach((ring, i) => {
			const p = GEOD.Polygon(false);
			for (const [lng, lat] of ring.slice(0, -1)) p.AddPoint(lat, lng);
			const a = Math.abs(p.Compute(false, true).area as number);
			m2 += i === 0 ? a : -a;
		});
	}
	return m2 / 4046.8564224;
}

export function positionsOf(g: Polygon | MultiPolygon): Position[] {
	const polys = g.type === 'Polygon' ? [g.coordinates] : g.coordinates;
	return polys.flatMap((rings) => rings.flatMap((r) => r.slice(0, -1)));
}
