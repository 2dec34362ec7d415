import type { MultiPolygon, Polygon, Position } from 'geojson';
import { intersectShapes, ringSignedArea, shapeArea, type PlaneShape } from './clip';
import { GeometryError } from './errors';
import { localProjection, type XY } from './projection';
import type { Lane } from './types';
import { squareMetersToAcres } from './units';
import { validatePolygonal } from './validate';

export interface RotationCell {
	from: string;
	to: string;
	acres: number;
}

type Box = [number, number, number, number];

function planeLanes(lanes: Lane[], forward: (p: Position) => XY): { crop: string; shape: PlaneShape; box: Box }[] {
	return lanes.map((lane) => {
		const g = lane.geometry;
		const polys = g.type === 'Polygon' ? [g.coordinates] : g.coordinates;
		const shape = polys.map((rings) => rings.map((ring) => ring.map(forward)));
		const box: Box = [Infinity, Infinity, -Infinity, -Infinity];
		for (const rings of shape) for (const [x, y] of rings[0]) {
			box[0] = Math.min(box[0], x); box[1] = Math.min(box[1], y);
			box[2] = Math.max(box[2], x); box[3] = Math.max(box[3], y);
		}
		return { crop: lane.crop, shape, box };
	});
}

function isConvex(ring: Position[]): boolean {
	let sign = 0;
	const n = ring.length - 1;
	for (let i = 0; i < n; i++) {
		const [ax, ay] = ring[i];
		const [bx, by] = ring[(i + 1) % n];
		const [cx, cy] = ring[(i + 2) % n];
		const cross = (bx - ax) * (cy - by) - (by - ay) * (cx - bx);
		if (cross === 0) continue;
		if (sign === 0) sign = Math.sign(cross);
		else if (Math.sign(cross) !== sign) return false;
	}
	return true;
}

/** Area of `subject` ∩ a convex ring (Sutherland & Hodgman, CACM 17(1), 1974): exact for area even where the clipped ring touches itself. */
function areaInConvex(subject: Position[], clip: Position[]): number {
	const ccw = ringSignedArea(clip) > 0 ? 1 : -1;
	let out = subject.slice(0, -1);
	const n = clip.length - 1;
	for (let i = 0; i < n && out.length > 0; i++) {
		const [ax, ay] = clip[i];
		const [bx, by] = clip[i + 1];
		const side = (p: Position) => ccw * ((bx - ax) * (p[1] - ay) - (by - ay) * (p[0] - ax));
		const input = out;
		out = [];
		for (let k = 0; k < input.length; k++) {
			const cur = input[k];
			const prev = input[(k + input.length - 1) % input.length];
			const sc = side(cur);
			const sp = side(prev);
			if (sc >= 0) {
				if (sp < 0) out.push(cross(prev, cur, sp, sc));
				out.push(cur);
			} else if (sp >= 0) out.push(cross(prev, cur, sp, sc));
		}
	}
	if (out.length < 3) return 0;
	return Math.abs(ringSignedArea([...out, out[0]]));
}

function cross(p: Position, q: Position, sp: number, sq: number): Position {
	const t = sp / (sp - sq);
	return [p[0] + t * (q[0] - p[0]), p[1] + t * (q[1] - p[1])];
}

/**
 * Planar area of a ∩ b. Lane pieces are nearly always convex strips, clipped directly; otherwise
 * Turf's polygon clipping, retried on a 1-mm grid if it trips over nearly coincident edges.
 */
function overlapArea(a: PlaneShape, b: PlaneShape): number {
	const convexB = b.every((poly) => poly.length === 1 && isConvex(poly[0]));
	const convexA = a.every((poly) => poly.length === 1 && isConvex(poly[0]));
	if (convexA || convexB) {
		const [subject, clip] = convexB ? [a, b] : [b, a];
		let total = 0;
		for (const c of clip) for (const poly of subject) poly.forEach((ring, i) => {
			const part = areaInConvex(ring, c[0]);
			total += i === 0 ? part : -part;
		});
		return total;
	}
	try {
		return shapeArea(intersectShapes(a, b));
	} catch {
		const snap = (s: PlaneShape) => s.map((rings) => rings.map((ring) => ring.map(([x, y]) => [Math.round(x * 1000) / 1000, Math.round(y * 1000) / 1000])));
		return shapeArea(intersectShapes(snap(a), snap(b)));
	}
}

/**
 * Acres of each (previous crop → next crop) pair: where last season's lanes and next season's
 * overlap on the ground. Lanes are overlaid in a transverse Mercator plane centred on them, whose
 * areas match the ellipsoid's to ~1e-7 over a few kilometres. Pairs with no overlap are left out.
 *
 * @param previous last season's lanes (only `crop` and `geometry` are read)
 * @param next next season's lanes
 * @returns one entry per crop pair, sorted by from then to
 * @throws GeometryError when a lane has no valid geometry or crop
 * @example rotationMatrix(lastYear.lanes, thisYear.lanes) // [{ from: 'corn', to: 'soybean', acres: 40 }, …]
 */
export function rotationMatrix(previous: Lane[], next: Lane[]): RotationCell[] {
	if (!Array.isArray(previous) || !Array.isArray(next)) {
		throw new GeometryError('invalid-geometry', 'Both seasons must be given as lists of lanes.');
	}
	let minLng = Infinity, maxLng = -Infinity, minLat = Infinity, maxLat = -Infinity;
	for (const [season, lanes] of [['previous', previous], ['next', next]] as const) {
		lanes.forEach((lane, i) => {
			if (!lane || typeof lane.crop !== 'string') throw new GeometryError('invalid-lane', `Lane ${i + 1} of the ${season} season has no crop.`);
			validatePolygonal(lane.geometry, `lane ${i + 1} of the ${season} season`);
			const g = lane.geometry as Polygon | MultiPolygon;
			for (const rings of g.type === 'Polygon' ? [g.coordinates] : g.coordinates) for (const [lng, lat] of rings[0]) {
				minLng = Math.min(minLng, lng); maxLng = Math.max(maxLng, lng);
				minLat = Math.min(minLat, lat); maxLat = Math.max(maxLat, lat);
			}
		});
	}
	if (previous.length === 0 || next.length === 0) return [];
	const proj = localProjection((minLng + maxLng) / 2, (minLat + maxLat) / 2);
	const before = planeLanes(previous, proj.forward);
	const after = planeLanes(next, proj.forward).sort((p, q) => p.box[0] - q.box[0]);

	const acres = new Map<string, RotationCell>();
	for (const p of before) {
		for (const q of after) {
			if (q.box[0] > p.box[2]) break;
			if (q.box[2] < p.box[0] || q.box[1] > p.box[3] || q.box[3] < p.box[1]) continue;
			const m2 = overlapArea(p.shape, q.shape);
			if (m2 <= 0) continue;
			const a = squareMetersToAcres(m2);
			const key = JSON.stringify([p.crop, q.crop]);
			const cell = acres.get(key);
			if (cell) cell.acres += a;
			else acres.set(key, { from: p.crop, to: q.crop, acres: a });
		}
	}
	return [...acres.values()].sort((x, y) => (x.from === y.from ? (x.to < y.to ? -1 : 1) : x.from < y.from ? -1 : 1));
}
