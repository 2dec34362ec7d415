// Turns the features read from any format into checked field shapes: only polygons are kept,
// each one is validated, named and measured, and one bad shape refuses the whole upload.
import type { MultiPolygon, Polygon, Position } from 'geojson';
import { geodesicAcres } from '../../geometry/index';
import { MAX_FIELD_ACRES, MAX_FIELD_VERTICES } from '../../geometry/validate';
import { ImportError } from './errors';
import { checkRings, fmt, rightHanded } from './rings';

export interface ImportedShape {
	name: string;
	acres: number;
	geometry: Polygon | MultiPolygon;
	sourceIndex: number;
	properties: Record<string, unknown>;
}

/** One feature as read from the file, before any checking. */
export interface SourceFeature {
	geometry: unknown;
	properties: Record<string, unknown>;
	sourceIndex: number;
}

export interface Candidate {
	label: string;
	name: string;
	sourceIndex: number;
	properties: Record<string, unknown>;
	/** Polygons as lists of rings, positions cut to [lng, lat]. */
	polygons: Position[][][];
}

export interface Skipped {
	points: number;
	lines: number;
	empty: number;
}

const NAME_KEYS = ['name', 'Name', 'NAME', 'FIELD_NAME', 'field', 'title'];

function shapeName(properties: Record<string, unknown>, sourceIndex: number): string {
	for (const key of NAME_KEYS) {
		const value = properties[key];
		if ((typeof value === 'string' && value.trim() !== '') || typeof value === 'number') return String(value).trim();
	}
	return `Shape ${sourceIndex + 1}`;
}

function shapeLabel(name: string, sourceIndex: number): string {
	const generic = name === `Shape ${sourceIndex + 1}`;
	return generic ? `Shape ${sourceIndex + 1}` : `Shape ${sourceIndex + 1} ("${name}")`;
}

function invalid(label: string, what: string): ImportError {
	return new ImportError('invalid_geometry', `${label} is not a valid polygon: ${what}.`);
}

function readPosition(p: unknown, label: string): Position {
	if (!Array.isArray(p) || p.length < 2 || typeof p[0] !== 'number' || typeof p[1] !== 'number' || !Number.isFinite(p[0]) || !Number.isFinite(p[1])) {
		throw invalid(label, `a corner is not a pair of numbers (${JSON.stringify(p)?.slice(0, 40)})`);
	}
	// Boundaries are flat: heights from GPS or KML carry no meaning here.
	return [p[0], p[1]];
}

function readPolygon(rings: unknown, label: string): Position[][] {
	if (!Array.isArray(rings) || rings.length === 0) throw invalid(label, 'it has no rings of coordinates');
	return rings.map((ring) => {
		if (!Array.isArray(ring)) throw invalid(label, 'a ring is not a list of positions');
		return ring.map((p) => readPosition(p, label));
	});
}

function geometryType(g: unknown): string | undefined {
	return g && typeof g === 'object' && typeof (g as { type?: unknown }).type === 'string' ? (g as { type: string }).type : undefined;
}

/** Adds the polygons of one geometry to `out`, counting what is not a polygon. */
function gather(g: unknown, label: string, out: Position[][][], skipped: Skipped): void {
	const type = geometryType(g);
	const coordinates = (g as { coordinates?: unknown })?.coordinates;
	const count = () => (Array.isArray(coordinates) ? coordinates.length : 0);
	switch (type) {
		case 'Polygon':
			out.push(readPolygon(coordinates, label));
			return;
		case 'MultiPolygon':
			if (!Array.isArray(coordinates)) throw invalid(label, 'its coordinates are not a list of polygons');
			for (const p of coordinates) out.push(readPolygon(p, label));
			return;
		case 'GeometryCollection': {
			const members = (g as { geometries?: unknown }).geometries;
			if (!Array.isArray(members)) throw invalid(label, 'its geometry collection has no list of geometries');
			for (const m of members) gather(m, label, out, skipped);
			return;
		}
		case 'Point':
			skipped.points += 1;
			return;
		case 'MultiPoint':
			skipped.points += count();
			return;
		case 'LineString':
			skipped.lines += 1;
			return;
		case 'MultiLineString':
			skipped.lines += count();
			return;
		case undefined:
			skipped.empty += 1;
			return;
		default:
			throw invalid(label, `its geometry type "${type}" is not a GeoJSON geometry`);
	}
}

function plural(n: number, one: string, many: string): string {
	return `${n} ${n === 1 ? one : many}`;
}

function describeSkipped(s: Skipped): string {
	const parts: string[] = [];
	if (s.points) parts.push(plural(s.points, 'point', 'points'));
	if (s.lines) parts.push(plural(s.lines, 'line', 'lines'));
	if (s.empty) parts.push(plural(s.empty, 'feature without a shape', 'features without a shape'));
	return parts.length > 1 ? `${parts.slice(0, -1).join(', ')} and ${parts[parts.length - 1]}` : parts[0] ?? '';
}

/**
 * Picks the polygons out of the file's features. Points and lines are skipped with a warning.
 * @param fileLabel e.g. "KML file", used in messages
 * @throws ImportError no_polygons when nothing polygonal is left
 */
export function collectPolygons(features: SourceFeature[], fileLabel: string): { candidates: Candidate[]; warnings: string[] } {
	const skipped: Skipped = { points: 0, lines: 0, empty: 0 };
	const candidates: Candidate[] = [];
	for (const f of features) {
		const name = shapeName(f.properties, f.sourceIndex);
		const label = shapeLabel(name, f.sourceIndex);
		const polygons: Position[][][] = [];
		gather(f.geometry, label, polygons, skipped);
		if (polygons.length) candidates.push({ label, name, sourceIndex: f.sourceIndex, properties: f.properties, polygons });
	}
	const what = describeSkipped(skipped);
	if (candidates.length === 0) {
		const has = features.length === 0 ? 'nothing in it' : what ? `only ${what}` : 'no shapes';
		throw new ImportError('no_polygons', `The ${fileLabel} has no polygons: ${has}. A field boundary must be a closed outline (a polygon).`);
	}
	const warnings = what ? [`Skipped ${what}: only polygons can be field boundaries.`] : [];
	return { candidates, warnings };
}

function allPositions(candidates: Candidate[]): Generator<[Candidate, Position]> {
	return (function* () {
		for (const c of candidates) for (const p of c.polygons) for (const r of p) for (const pos of r) yield [c, pos];
	})();
}

/**
 * Refuses coordinates that cannot be longitude/latitude, saying whether they look swapped or
 * projected. The swap test only fires when longitude is beyond ±90°, the only case that shows.
 */
export function requireLongitudeLatitude(candidates: Candidate[], fileLabel: string): void {
	for (const [c, [x, y]] of allPositions(candidates)) {
		if (Math.abs(x) <= 180 && Math.abs(y) <= 90) continue;
		if (Math.abs(x) <= 90 && Math.abs(y) > 90 && Math.abs(y) <= 180) {
			throw new ImportError(
				'swapped_coordinates',
				`The ${fileLabel}'s coordinates look swapped: ${c.label} has ${fmt(x)}, ${fmt(y)}, which reads as latitude, longitude. Boundary files list longitude first, then latitude; export the file again with that order.`
			);
		}
		throw new ImportError(
			'projected_coordinates',
			`The ${fileLabel}'s coordinates look projected (e.g. ${fmt(x)}, ${fmt(y)} in ${c.label}), not longitude/latitude. Export the file again in WGS84 longitude/latitude (EPSG:4326).`
		);
	}
}

function checkCandidate(c: Candidate): ImportedShape {
	const corners = c.polygons.reduce((n, rings) => rings.reduce((m, ring) => m + ring.length, n), 0);
	if (corners > MAX_FIELD_VERTICES) {
		throw new ImportError(
			'too_many_vertices',
			`${c.label} has ${corners.toLocaleString('en-US')} points; a field may have at most ${MAX_FIELD_VERTICES.toLocaleString('en-US')}. Simplify the outline (thin its points to about 0.1 m) and export it again.`,
			413
		);
	}
	const polygons = c.polygons.map((rings, pi) => rightHanded(checkRings(c.label, rings, pi, c.polygons.length)));
	const geometry: Polygon | MultiPolygon =
		polygons.length === 1 ? { type: 'Polygon', coordinates: polygons[0] } : { type: 'MultiPolygon', coordinates: polygons };
	const acres = Math.round(geodesicAcres(geometry) * 100) / 100;
	if (!(acres > 0)) {
		throw new ImportError('zero_area', `${c.label} encloses no area (0 acres): its corners lie on one line or almost on top of each other.`);
	}
	if (acres > MAX_FIELD_ACRES) {
		throw new ImportError(
			'area_too_large',
			`${c.label} encloses ${Math.round(acres).toLocaleString('en-US')} acres, more than the ${MAX_FIELD_ACRES.toLocaleString('en-US')}-acre limit for one field. Split it into several fields.`
		);
	}
	return { name: c.name, acres, geometry, sourceIndex: c.sourceIndex, properties: c.properties };
}

/** Validates every candidate; the first bad one refuses the whole upload. */
export function checkShapes(candidates: Candidate[]): ImportedShape[] {
	return candidates.map(checkCandidate);
}
