import { buffer, difference, featureCollection, intersect, multiPolygon, union } from '@turf/turf';
import type { Feature, MultiPolygon, Polygon, Position } from 'geojson';
import { GeometryError } from './errors';

/**
 * Polygons in a local plane (metres), as MultiPolygon coordinates. Turf's clipping (polyclip-ts)
 * is purely planar, so it is fed these and never raw longitude/latitude.
 */
export type PlaneShape = Position[][][];

function asShape(f: Feature<Polygon | MultiPolygon> | null | undefined): PlaneShape {
	if (!f) return [];
	return f.geometry.type === 'Polygon' ? [f.geometry.coordinates] : f.geometry.coordinates;
}

function snap(shape: PlaneShape, grid: number): PlaneShape {
	return shape.map((rings) => rings.map((ring) => ring.map(([x, y]) => [Math.round(x / grid) * grid, Math.round(y / grid) * grid])));
}

/**
 * Runs a polygon operation; polyclip-ts occasionally fails to close a ring when edges nearly
 * coincide (two exclusions drawn on top of each other). It is then retried with every point
 * snapped to a 1-mm, then 1-cm grid, which moves nothing a farmer could measure.
 */
function robust(shapes: PlaneShape[], op: (s: PlaneShape[]) => PlaneShape): PlaneShape {
	try {
		return op(shapes);
	} catch (first) {
		for (const grid of [0.001, 0.01]) {
			try {
				return op(shapes.map((s) => snap(s, grid)));
			} catch {
				// try a coarser grid
			}
		}
		throw new GeometryError('invalid-geometry', 'The outlines could not be combined: some edges lie almost on top of each other. Redraw the overlapping exclusions or boundary parts.', undefined, first);
	}
}

/** Intersection of two planar shapes. @example intersectShapes(field, band) */
export function intersectShapes(a: PlaneShape, b: PlaneShape): PlaneShape {
	if (a.length === 0 || b.length === 0) return [];
	return robust([a, b], ([x, y]) => asShape(intersect(featureCollection([multiPolygon(x), multiPolygon(y)]))));
}

/** `a` minus every shape in `bs`. @example subtractShapes(field, [ponds]) */
export function subtractShapes(a: PlaneShape, bs: PlaneShape[]): PlaneShape {
	const rest = bs.filter((b) => b.length > 0);
	if (a.length === 0 || rest.length === 0) return a;
	return robust([a, ...rest], (all) => asShape(difference(featureCollection(all.map((s) => multiPolygon(s))))));
}

/** Union of planar shapes (also cleans overlapping parts of one shape). @example unionShapes([a, b]) */
export function unionShapes(shapes: PlaneShape[]): PlaneShape {
	const parts = shapes.filter((s) => s.length > 0);
	if (parts.length === 0) return [];
	// A single shape is unioned with itself so that overlapping parts are still merged.
	if (parts.length === 1) parts.push(parts[0]);
	return robust(parts, (all) => asShape(union(featureCollection(all.map((s) => multiPolygon(s))))));
}

/** Shoelace area of a ring, positive when counter-clockwise. */
export function ringSignedArea(ring: Position[]): number {
	let sum = 0;
	for (let i = 0, n = ring.length - 1; i < n; i++) {
		sum += ring[i][0] * ring[i + 1][1] - ring[i + 1][0] * ring[i][1];
	}
	return sum / 2;
}

/**
 * Copy of a shape with exterior rings counter-clockwise and holes clockwise (RFC 7946 order).
 * @example orientShape(shape)[0][0] // counter-clockwise exterior
 */
export function orientShape(shape: PlaneShape): PlaneShape {
	return shape.map((rings) =>
		rings.map((ring, i) => {
			const ccw = ringSignedArea(ring) > 0;
			return ccw === (i === 0) ? ring : [...ring].reverse();
		})
	);
}

/** Planar area of a shape, holes subtracted, m². @example shapeArea([[[[0,0],[1,0],[1,1],[0,0]]]]) // 0.5 */
export function shapeArea(shape: PlaneShape): number {
	let total = 0;
	for (const rings of shape) {
		rings.forEach((ring, i) => {
			const a = Math.abs(ringSignedArea(ring));
			total += i === 0 ? a : -a;
		});
	}
	return total;
}

// Metres per degree of great-circle arc on Turf's sphere (earthRadius 6,371,008.8 m).
const TURF_M_PER_DEG = (6_371_008.8 * Math.PI) / 180;

/**
 * Shrinks a planar shape by `meters` from every edge, outer rings and holes alike (an inside
 * buffer). Turf's buffer expects longitude/latitude, so the plane (centred near 0, 0) is handed to
 * it as tiny angles at the equator, where its sphere and our plane agree to ~1e-7 over ±5 km.
 *
 * @param shape planar shape centred near the origin, metres
 * @param meters inward distance, > 0
 * @param steps segments per quarter circle on rounded inside corners
 * @returns the eroded shape (empty when nothing remains)
 * @example erodeShape(field, 9.144) // a 30-ft headland removed
 */
export function erodeShape(shape: PlaneShape, meters: number, steps = 8): PlaneShape {
	if (shape.length === 0 || meters <= 0) return shape;
	const toDeg = (s: PlaneShape) => s.map((rings) => rings.map((ring) => ring.map(([x, y]) => [x / TURF_M_PER_DEG, y / TURF_M_PER_DEG])));
	const out = buffer(multiPolygon(toDeg(shape)), -meters, { units: 'meters', steps });
	if (!out || !out.geometry) return [];
	const g = out.geometry as Polygon | MultiPolygon;
	const coords = g.type === 'Polygon' ? [g.coordinates] : g.coordinates;
	return coords
		.filter((rings) => rings.length > 0 && rings[0].length >= 4)
		.map((rings) => rings.map((ring) => ring.map(([x, y]) => [x * TURF_M_PER_DEG, y * TURF_M_PER_DEG])));
}
