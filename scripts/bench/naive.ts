import { area, difference, featureCollection, intersect, polygon } from '@turf/turf';
import type { Feature, MultiPolygon, Polygon } from 'geojson';
import type { LayoutInput } from '../../src/lib/geometry/index';

const M_PER_DEG_LAT = 111_320; // from memory: rough metres per degree, as quick scripts use
const FT = 0.3048;

/**
 * The obvious way to lay out lanes, kept as a yardstick: lane rectangles drawn directly in
 * longitude/latitude with a flat-earth degree conversion, one Turf intersect per lane, area by
 * turf.area (a sphere). Headland is ignored.
 */
export function naiveLayout(input: LayoutInput): { geometry: Polygon | MultiPolygon; squareMeters: number }[] {
	const [ax, ay] = input.guidance.a;
	const [bx, by] = input.guidance.b;
	const kx = M_PER_DEG_LAT * Math.cos((ay * Math.PI) / 180);
	const ky = M_PER_DEG_LAT;
	const ex = (bx - ax) * kx, ey = (by - ay) * ky;
	const len = Math.hypot(ex, ey);
	const ux = ex / len, uy = ey / len;
	const nx = uy, ny = -ux;
	let planted: Feature<Polygon | MultiPolygon> | null = { type: 'Feature', properties: {}, geometry: input.boundary };
	if (input.exclusions?.length) {
		planted = difference(featureCollection([planted, ...input.exclusions.map((g) => ({ type: 'Feature' as const, properties: {}, geometry: g }))]));
	}
	if (!planted) return [];
	const widths = input.pattern.map((p) => (p.widthFt ?? ((p.rows ?? 0) * (p.rowSpacingIn ?? 0)) / 12) * FT);
	const repeat = widths.reduce((s, w) => s + w, 0);
	// Extent across and along the line, from the boundary's corners.
	let s0 = Infinity, s1 = -Infinity, t0 = Infinity, t1 = -Infinity;
	const rings = input.boundary.type === 'Polygon' ? [input.boundary.coordinates] : input.boundary.coordinates;
	for (const r of rings) for (const [x, y] of r[0]) {
		const dx = (x - ax) * kx, dy = (y - ay) * ky;
		const s = dx * nx + dy * ny, t = dx * ux + dy * uy;
		s0 = Math.min(s0, s); s1 = Math.max(s1, s); t0 = Math.min(t0, t); t1 = Math.max(t1, t);
	}
	const toLngLat = (s: number, t: number) => [ax + (s * nx + t * ux) / kx, ay + (s * ny + t * uy) / ky];
	const out: { geometry: Polygon | MultiPolygon; squareMeters: number }[] = [];
	const offset = (input.offsetFt ?? 0) * FT;
	for (let r = Math.floor((s0 - offset) / repeat) - 1; r * repeat + offset < s1; r++) {
		let left = offset + r * repeat;
		for (const w of widths) {
			const right = left + w;
			if (right > s0 && left < s1) {
				const rect = polygon([[toLngLat(left, t0 - 1), toLngLat(right, t0 - 1), toLngLat(right, t1 + 1), toLngLat(left, t1 + 1), toLngLat(left, t0 - 1)]]);
				const piece = intersect(featureCollection([planted, rect]));
				if (piece) out.push({ geometry: piece.geometry, squareMeters: area(piece) });
			}
			left = right;
		}
	}
	return out;
}
