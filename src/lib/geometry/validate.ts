import type { MultiPolygon, Polygon, Position } from 'geojson';
import { GeometryError } from './errors';
import type { LaneSpec, LayoutInput } from './types';

/** Corners of one field, boundary and exclusions together: the checks stay well under a second. */
export const MAX_FIELD_VERTICES = 50_000;
export const MAX_FIELD_ACRES = 20_000;
const LANE_KINDS = new Set(['crop', 'pasture', 'cover', 'buffer']);

const fmt = (n: number) => (Number.isFinite(n) ? String(Math.round(n * 1e6) / 1e6) : String(n));

/** Checks one position: finite, in WGS84 ranges, and not latitude/longitude swapped. */
function checkPosition(p: unknown, what: string): void {
	if (!Array.isArray(p) || p.length < 2) {
		throw new GeometryError('invalid-geometry', `The ${what} has a point that is not a [longitude, latitude] pair.`);
	}
	const [lng, lat] = p as number[];
	if (typeof lng !== 'number' || typeof lat !== 'number' || !Number.isFinite(lng) || !Number.isFinite(lat)) {
		throw new GeometryError('not-finite', `The ${what} has a point whose coordinates are not numbers (${String(lng)}, ${String(lat)}).`);
	}
	if (Math.abs(lat) > 90 && Math.abs(lng) <= 90) {
		throw new GeometryError(
			'swapped-coordinates',
			`The ${what} has a point at longitude ${fmt(lng)}, latitude ${fmt(lat)}; latitude and longitude look swapped (GeoJSON lists longitude first).`,
			[lat, lng]
		);
	}
	if (Math.abs(lat) > 90 || Math.abs(lng) > 180) {
		throw new GeometryError(
			'out-of-range',
			`The ${what} has a point at longitude ${fmt(lng)}, latitude ${fmt(lat)}, outside the Earth's ranges (longitude −180…180, latitude −90…90).`
		);
	}
}

function checkRing(ring: unknown, what: string): number {
	if (!Array.isArray(ring)) throw new GeometryError('invalid-geometry', `The ${what} has a ring that is not a list of points.`);
	for (const p of ring) checkPosition(p, what);
	const pts = ring as Position[];
	if (pts.length < 4) {
		throw new GeometryError('too-few-positions', `The ${what} has a ring with ${pts.length} points; an outline needs at least 3 corners plus the first point repeated at the end.`);
	}
	const first = pts[0];
	const last = pts[pts.length - 1];
	if (first[0] !== last[0] || first[1] !== last[1]) {
		throw new GeometryError('open-ring', `The ${what} is not closed: its last point must repeat the first (longitude ${fmt(first[0])}, latitude ${fmt(first[1])}).`, [first[0], first[1]]);
	}
	checkSphereSide(pts, what);
	return pts.length;
}

/**
 * Refuses rings the local plane cannot hold. Longitude steps are taken the short way round: a
 * ring whose steps add up to a full turn goes around a pole; otherwise a step of more than 180°
 * as written crosses the 180th meridian (RFC 7946 §3.1.9 has such shapes cut there).
 */
function checkSphereSide(pts: Position[], what: string): void {
	let turn = 0;
	let dateLine: [number, number] | undefined;
	for (let i = 1; i < pts.length; i++) {
		const [lng0, lat0] = pts[i - 1];
		const [lng1, lat1] = pts[i];
		if (Math.abs(lat1) === 90) {
			throw new GeometryError('encloses-pole', `The ${what} has a corner on the ${lat1 > 0 ? 'North' : 'South'} Pole; a field outline cannot reach a pole.`, [lng1, lat1]);
		}
		const step = lng1 - lng0;
		if (Math.abs(step) <= 180) {
			turn += step;
			continue;
		}
		turn += step > 0 ? step - 360 : step + 360;
		if (!dateLine) {
			// Where the short way round meets ±180°.
			const edge = lng0 > 0 ? 180 : -180;
			const t = (edge - lng0) / (lng1 + 2 * edge - lng0);
			dateLine = [edge, lat0 + t * (lat1 - lat0)];
		}
	}
	if (Math.abs(turn) > 180) {
		const north = pts.reduce((s, p) => s + p[1], 0) > 0;
		throw new GeometryError('encloses-pole', `The ${what} goes all the way around the ${north ? 'North' : 'South'} Pole; a field outline must not enclose a pole.`);
	}
	if (dateLine) {
		throw new GeometryError(
			'crosses-antimeridian',
			`The ${what} crosses the 180th meridian (the date line) near latitude ${dateLine[1].toFixed(4)}; a field must lie on one side of it. Split it there into two fields.`,
			dateLine
		);
	}
}

/**
 * Checks that a value is a GeoJSON Polygon or MultiPolygon with closed rings of ≥ 4 finite WGS84
 * positions. Self-intersections are checked later in the local plane.
 *
 * @param g the geometry to check
 * @param what how to name it in the message ("field boundary", "exclusion 2")
 * @returns number of positions
 * @example validatePolygonal(boundary, 'field boundary') // 5
 */
export function validatePolygonal(g: unknown, what: string): number {
	const geom = g as Polygon | MultiPolygon | undefined;
	if (!geom || typeof geom !== 'object' || (geom.type !== 'Polygon' && geom.type !== 'MultiPolygon') || !Array.isArray(geom.coordinates)) {
		throw new GeometryError('invalid-geometry', `The ${what} must be a GeoJSON Polygon or MultiPolygon.`);
	}
	const polygons = geom.type === 'Polygon' ? [geom.coordinates] : geom.coordinates;
	if (polygons.length === 0) throw new GeometryError('invalid-geometry', `The ${what} has no outline.`);
	let count = 0;
	for (const rings of polygons) {
		if (!Array.isArray(rings) || rings.length === 0) throw new GeometryError('invalid-geometry', `The ${what} has a part with no outline.`);
		for (const ring of rings) count += checkRing(ring, what);
	}
	return count;
}

/** Positions in a polygonal geometry, tolerating any shape (0 for what is not one). */
export function countPositions(g: unknown): number {
	const coordinates = (g as { type?: unknown; coordinates?: unknown } | null)?.coordinates;
	if (!Array.isArray(coordinates)) return 0;
	const polygons = (g as { type: unknown }).type === 'MultiPolygon' ? coordinates : [coordinates];
	let count = 0;
	for (const rings of polygons) if (Array.isArray(rings)) for (const ring of rings) if (Array.isArray(ring)) count += ring.length;
	return count;
}

/**
 * Refuses more than MAX_FIELD_VERTICES corners for one field.
 *
 * @param count positions counted (closing positions included)
 * @param what how to name the outlines in the message
 * @example checkVertexCount(60_000, 'field boundary') // throws too-many-vertices
 */
export function checkVertexCount(count: number, what: string): void {
	if (count > MAX_FIELD_VERTICES) {
		throw new GeometryError(
			'too-many-vertices',
			`The ${what} has ${count.toLocaleString('en-US')} points; a field may have at most ${MAX_FIELD_VERTICES.toLocaleString('en-US')}. Simplify the outline (most GIS programs can thin points to a tolerance of about 0.1 m) and try again.`
		);
	}
}

function checkFiniteOptional(value: unknown, name: string): void {
	if (value === undefined) return;
	if (typeof value !== 'number' || !Number.isFinite(value)) {
		throw new GeometryError('not-finite', `${name} must be a number, got ${String(value)}.`);
	}
}

/**
 * Checks one lane of the pattern: kind, crop, whole rows with spacing, positive widths, twins
 * narrower than their spacing.
 *
 * @param spec the lane spec
 * @param i its position in the pattern (for the message)
 * @example validateLaneSpec({ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 }, 0)
 */
export function validateLaneSpec(spec: LaneSpec, i: number): void {
	const name = `Lane ${i + 1} of the pattern`;
	if (!spec || typeof spec !== 'object') throw new GeometryError('invalid-lane', `${name} is missing.`);
	if (!LANE_KINDS.has(spec.kind)) throw new GeometryError('invalid-lane', `${name} has kind "${String(spec.kind)}"; use crop, pasture, cover or buffer.`);
	if (typeof spec.crop !== 'string' || spec.crop.trim() === '') throw new GeometryError('invalid-lane', `${name} needs a crop name.`);
	checkFiniteOptional(spec.rows, `${name}: rows`);
	checkFiniteOptional(spec.rowSpacingIn, `${name}: row spacing`);
	checkFiniteOptional(spec.twinSpacingIn, `${name}: twin spacing`);
	checkFiniteOptional(spec.widthFt, `${name}: width`);
	if (spec.rows !== undefined && (spec.rows < 0 || !Number.isInteger(spec.rows))) {
		throw new GeometryError('invalid-lane', `${name} has ${spec.rows} rows; rows must be a whole number, 0 or more.`);
	}
	if (spec.rowSpacingIn !== undefined && spec.rowSpacingIn <= 0) {
		throw new GeometryError('invalid-lane', `${name} has a row spacing of ${spec.rowSpacingIn} in; it must be more than zero.`);
	}
	if (spec.rows !== undefined && spec.rows > 0 && spec.rowSpacingIn === undefined) {
		throw new GeometryError('invalid-lane', `${name} has ${spec.rows} rows but no row spacing; give rowSpacingIn (e.g. 30).`);
	}
	if (spec.twinSpacingIn !== undefined) {
		if (spec.twinSpacingIn <= 0) throw new GeometryError('invalid-lane', `${name} has a twin-row spacing of ${spec.twinSpacingIn} in; it must be more than zero.`);
		if (spec.rowSpacingIn === undefined || spec.twinSpacingIn >= spec.rowSpacingIn) {
			throw new GeometryError('invalid-lane', `${name}: the two rows of a twin (${spec.twinSpacingIn} in apart) must be closer than the spacing between pairs.`);
		}
	}
	if (spec.widthFt !== undefined && spec.widthFt <= 0) {
		throw new GeometryError('invalid-lane', `${name} is ${spec.widthFt} ft wide; a lane must be wider than zero.`);
	}
	if (spec.widthFt === undefined && !((spec.rows ?? 0) > 0 && spec.rowSpacingIn !== undefined)) {
		throw new GeometryError('invalid-lane', `${name} has no width: give rows and row spacing, or widthFt.`);
	}
}

/**
 * Structural checks on a layout request before any geometry is computed.
 *
 * @param input the request
 * @returns total vertex count of boundary and exclusions
 * @example validateLayoutInput(input)
 */
export function validateLayoutInput(input: LayoutInput): number {
	if (!input || typeof input !== 'object') throw new GeometryError('invalid-geometry', 'No layout request was given.');
	let vertices = validatePolygonal(input.boundary, 'field boundary');
	if (input.exclusions !== undefined && !Array.isArray(input.exclusions)) {
		throw new GeometryError('invalid-geometry', 'Exclusions must be a list of polygons.');
	}
	(input.exclusions ?? []).forEach((ex, i) => {
		vertices += validatePolygonal(ex, `exclusion ${i + 1}`);
	});
	checkVertexCount(vertices, 'field boundary and its exclusions');
	const g = input.guidance;
	if (!g || typeof g !== 'object') throw new GeometryError('invalid-geometry', 'The A-B line is missing.');
	checkPosition(g.a, 'A-B line (point A)');
	checkPosition(g.b, 'A-B line (point B)');
	if (!Array.isArray(input.pattern) || input.pattern.length === 0) {
		throw new GeometryError('empty-pattern', 'The lane pattern is empty; add at least one lane.');
	}
	input.pattern.forEach(validateLaneSpec);
	checkFiniteOptional(input.offsetFt, 'The pattern offset');
	checkFiniteOptional(input.headlandFt, 'The headland width');
	if ((input.headlandFt ?? 0) < 0) {
		throw new GeometryError('invalid-number', `The headland width is ${input.headlandFt} ft; it cannot be negative.`);
	}
	return vertices;
}
