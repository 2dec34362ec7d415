// Checks a drawn or imported field outline and measures it. Pure: runs in the browser while
// drawing and on the server before anything is stored.
import { featureCollection, intersect, union } from '@turf/turf';
import type { Feature, MultiPolygon, Polygon } from 'geojson';
import { checkOutline, checkVertexCount, countPositions, geodesicAcres, GeometryError } from '../geometry/index';
import { MAX_FIELD_ACRES } from '../geometry/validate';

/** Smaller than this is a drawing slip, not a field. */
export const MIN_FIELD_ACRES = 0.01;

export const EXCLUSION_KINDS = ['waterway', 'wet spot', 'yard', 'building', 'tree line', 'other'] as const;
export type ExclusionKind = (typeof EXCLUSION_KINDS)[number];

export interface Exclusion {
	name: string;
	kind: ExclusionKind;
	geometry: Polygon | MultiPolygon;
}

export interface FieldShape {
	boundary: Polygon | MultiPolygon;
	exclusions: Exclusion[];
}

export interface FieldMeasure {
	acres: number;
	excludedAcres: number;
	/** Boundary minus exclusions (before any headland). */
	netAcres: number;
}


/**
 * Validates a field's boundary and exclusions and measures them on the WGS84 ellipsoid.
 * @throws GeometryError with a message saying what is wrong and where
 */
export function measureFieldShape(shape: FieldShape): FieldMeasure {
	const corners = shape.exclusions.reduce((n, x) => n + countPositions(x.geometry), countPositions(shape.boundary));
	checkVertexCount(corners, shape.exclusions.length ? 'field boundary with its exclusions' : 'field boundary');
	checkOutline(shape.boundary, 'field boundary');
	const acres = geodesicAcres(shape.boundary);
	if (!(acres >= MIN_FIELD_ACRES)) {
		throw new GeometryError(
			'invalid-geometry',
			`The field boundary encloses ${acres.toFixed(2)} acres; a field needs at least ${MIN_FIELD_ACRES} acre. Draw at least three corners that are apart.`
		);
	}
	if (acres > MAX_FIELD_ACRES) {
		throw new GeometryError(
			'field-too-large',
			`The field boundary encloses ${Math.round(acres).toLocaleString('en-US')} acres, more than the ${MAX_FIELD_ACRES.toLocaleString('en-US')}-acre limit. Split it into several fields.`
		);
	}
	if (shape.exclusions.length === 0) return { acres, excludedAcres: 0, netAcres: acres };

	const inside: Feature<Polygon | MultiPolygon>[] = [];
	shape.exclusions.forEach((x, i) => {
		const what = `exclusion ${i + 1} (${x.name || x.kind})`;
		checkOutline(x.geometry, what);
		const clipped = intersect(featureCollection([{ type: 'Feature', properties: {}, geometry: shape.boundary }, { type: 'Feature', properties: {}, geometry: x.geometry }]));
		if (!clipped) throw new GeometryError('invalid-geometry', `The ${what} lies outside the field boundary.`);
		inside.push(clipped);
	});
	const merged = inside.length === 1 ? inside[0] : union(featureCollection(inside));
	const excludedAcres = merged ? geodesicAcres(merged.geometry) : 0;
	if (excludedAcres >= acres * 0.9999) {
		throw new GeometryError('nothing-to-plant', 'The exclusions cover the whole field: nothing is left to plant.');
	}
	return { acres, excludedAcres, netAcres: acres - excludedAcres };
}
