import type { MultiPolygon, Polygon, Position } from 'geojson';
import { geodesicAcres } from './area';
import { intersectShapes, shapeArea, type PlaneShape } from './clip';
import { GeometryError } from './errors';
import { localProjection, type XY } from './projection';
import type { Lane } from './types';
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

/**
 * Acres of each (previous crop → next crop) pair: where last season's lanes and next season's
 * overlap on the ground. Lanes are overlaid in a transverse Mercator plane centred on them; each
 * overlap's area is then measured on the WGS84 ellipsoid. Pairs with no overlap are left out.
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
			const overlap = intersectShapes(p.shape, q.shape);
			if (overlap.length === 0 || shapeArea(overlap) <= 0) continue;
			const lngLat = overlap.map((rings) => rings.map((ring) => ring.map((pt) => proj.inverse(pt as XY))));
			const a = geodesicAcres({ type: 'MultiPolygon', coordinates: lngLat });
			const key = JSON.stringify([p.crop, q.crop]);
			const cell = acres.get(key);
			if (cell) cell.acres += a;
			else acres.set(key, { from: p.crop, to: q.crop, acres: a });
		}
	}
	return [...acres.values()].sort((x, y) => (x.from === y.from ? (x.to < y.to ? -1 : 1) : x.from < y.from ? -1 : 1));
}
