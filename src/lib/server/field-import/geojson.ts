import { ImportError, shortReason } from './errors';
import type { SourceFeature } from './shapes';

const GEOMETRY_TYPES = new Set(['Point', 'MultiPoint', 'LineString', 'MultiLineString', 'Polygon', 'MultiPolygon', 'GeometryCollection']);

function isObject(v: unknown): v is Record<string, unknown> {
	return typeof v === 'object' && v !== null && !Array.isArray(v);
}

function propertiesOf(feature: Record<string, unknown>): Record<string, unknown> {
	return isObject(feature.properties) ? feature.properties : {};
}

/**
 * Reads GeoJSON text (RFC 7946): a FeatureCollection, a Feature, or a bare geometry.
 * @param fileLabel e.g. ".geojson file", used in messages
 * @throws ImportError unreadable (not JSON) or not_geojson (JSON of another kind)
 */
export function readGeoJson(text: string, fileLabel: string): SourceFeature[] {
	let doc: unknown;
	try {
		doc = JSON.parse(text);
	} catch (e) {
		throw new ImportError('unreadable', `The file could not be read as GeoJSON: ${shortReason(e)}.`);
	}
	const notGeoJson = (why: string) =>
		new ImportError('not_geojson', `This ${fileLabel} is JSON but not GeoJSON: ${why}. Export the boundary as a GeoJSON FeatureCollection.`);
	if (!isObject(doc)) throw notGeoJson('it is not an object with a "type"');
	const type = doc.type;
	if (type === 'FeatureCollection') {
		if (!Array.isArray(doc.features)) throw notGeoJson('its FeatureCollection has no "features" list');
		return doc.features.map((f, i) => {
			if (!isObject(f) || f.type !== 'Feature') throw notGeoJson(`item ${i + 1} of "features" is not a Feature`);
			return { geometry: f.geometry, properties: propertiesOf(f), sourceIndex: i };
		});
	}
	if (type === 'Feature') return [{ geometry: doc.geometry, properties: propertiesOf(doc), sourceIndex: 0 }];
	if (typeof type === 'string' && GEOMETRY_TYPES.has(type)) return [{ geometry: doc, properties: {}, sourceIndex: 0 }];
	throw notGeoJson(typeof type === 'string' ? `its "type" is "${type.slice(0, 40)}"` : 'it has no "type" of FeatureCollection, Feature or geometry');
}
