// Reads an uploaded field-boundary file (GeoJSON, KML/KMZ or zipped Shapefile) into checked
// WGS84 polygons. Free of HTTP and database concerns and of `$lib` imports: it runs in the
// geometry worker pool, where parseFieldFile sends it.
import type { FeatureCollection, MultiPolygon, Polygon } from 'geojson';
import { ImportError, shortReason } from './errors';
import { readGeoJson } from './geojson';
import { readKml } from './kml';
import { IMPORT_LIMITS, megabytes } from './limits';
import { readShapefileZip } from './shapefile';
import { findTaskDataEntry, readTaskDataXml, readTaskDataZip } from './taskdata';
import { checkShapes, collectPolygons, requireLongitudeLatitude, type ImportedShape, type SourceFeature } from './shapes';
import { describeContent, sniffContent, type ContentKind } from './sniff';
import { baseName, isArchiveClutter, openZip } from './zip';


export type ImportFormat = 'geojson' | 'kml' | 'shapefile' | 'taskdata';

export interface ImportResult {
	format: ImportFormat;
	shapes: FeatureCollection<Polygon | MultiPolygon, { name: string; acres: number; sourceIndex: number }>;
	warnings: string[];
}

const FORMAT_NAMES: Record<ImportFormat, string> = { geojson: 'GeoJSON', kml: 'KML', shapefile: 'shapefile', taskdata: 'ISO 11783-10 task data' };

const EXTENSIONS: Record<string, { format: ImportFormat; expects: ContentKind[]; what: string }> = {
	geojson: { format: 'geojson', expects: ['json'], what: 'a GeoJSON file' },
	json: { format: 'geojson', expects: ['json'], what: 'a GeoJSON file' },
	kml: { format: 'kml', expects: ['xml'], what: 'a KML file' },
	kmz: { format: 'kml', expects: ['zip'], what: 'a zip archive (KMZ)' },
	zip: { format: 'shapefile', expects: ['zip'], what: 'a zip archive' },
	xml: { format: 'taskdata', expects: ['xml'], what: 'an XML document (ISO 11783-10 TASKDATA.XML)' }
};

function extensionOf(filename: string): string {
	const base = filename.split(/[\\/]/).pop() ?? '';
	const dot = base.lastIndexOf('.');
	return dot > 0 ? base.slice(dot + 1).toLowerCase() : '';
}

function readKmz(bytes: Uint8Array): { features: SourceFeature[]; warnings: string[] } {
	const zip = openZip(bytes, '.kmz file');
	const kmls = zip.entries.filter((e) => !isArchiveClutter(e) && baseName(e).endsWith('.kml'));
	// The KMZ convention is one root document, usually doc.kml, with any others referenced from it.
	const main = kmls.find((e) => e.name.toLowerCase() === 'doc.kml') ?? kmls.find((e) => !e.name.includes('/')) ?? kmls[0];
	if (!main) throw new ImportError('not_kml', 'This .kmz file holds no KML document (.kml). Export the boundary again as KML or KMZ.');
	const warnings = kmls.length > 1 ? [`The .kmz file holds ${kmls.length} KML documents; only ${main.name} was read.`] : [];
	return { features: readKml(zip.read(main), '.kmz file'), warnings };
}

function read(format: ImportFormat, extension: string, bytes: Uint8Array): { features: SourceFeature[]; warnings: string[]; format: ImportFormat } {
	const fileLabel = `.${extension} file`;
	if (format === 'geojson') return { features: readGeoJson(new TextDecoder().decode(bytes), fileLabel), warnings: [], format };
	if (format === 'kml') return { ...(extension === 'kmz' ? readKmz(bytes) : { features: readKml(bytes, fileLabel), warnings: [] }), format };
	if (format === 'taskdata') return { ...readTaskDataXml(new TextDecoder('utf-8').decode(bytes), fileLabel), format };
	const zip = openZip(bytes, fileLabel);
	// A zip holds either a shapefile or an ISO 11783-10 TASKDATA folder.
	if (findTaskDataEntry(zip)) return { ...readTaskDataZip(zip, fileLabel), format: 'taskdata' };
	return { ...readShapefileZip(zip, fileLabel), format };
}

function toResult(format: ImportFormat, shapes: ImportedShape[], warnings: string[]): ImportResult {
	return {
		format,
		warnings,
		shapes: {
			type: 'FeatureCollection',
			features: shapes.map((s) => ({
				type: 'Feature',
				properties: { name: s.name, acres: s.acres, sourceIndex: s.sourceIndex },
				geometry: s.geometry
			}))
		}
	};
}

/**
 * Reads an uploaded boundary file into checked field polygons on WGS84.
 *
 * The extension picks the format (.geojson/.json, .kml, .kmz, .zip with a shapefile) and the
 * bytes must agree with it. Points and lines are skipped with a warning; every polygon is checked
 * (closed rings, at least 4 positions, no self-crossing, area above 0 and at most 20,000 acres)
 * and one bad polygon refuses the whole file.
 *
 * @param filename the uploaded file's name; only its extension is used
 * @param bytes the file's content
 * @returns the polygons with name, acres (WGS84 ellipsoid, 2 decimals) and position in the file
 * @throws ImportError for every problem with the file (status 413 for size limits, else 400)
 * @example
 * const { shapes } = readFieldFile('farm.kml', bytes);
 * shapes.features[0].properties.acres // 40
 */
export function readFieldFile(filename: string, bytes: Uint8Array): ImportResult {
	if (bytes.length > IMPORT_LIMITS.maxUploadBytes) {
		throw new ImportError(
			'too_large',
			`The file is ${(bytes.length / (1024 * 1024)).toFixed(1)} MB, over the ${megabytes(IMPORT_LIMITS.maxUploadBytes)} limit. Boundary files are usually far smaller: upload only the fields you need.`,
			413
		);
	}
	const extension = extensionOf(filename);
	const kind = EXTENSIONS[extension];
	if (!kind) {
		throw new ImportError(
			'unsupported_format',
			`${extension ? `A .${extension} file` : 'A file without an extension'} cannot be imported. Upload a GeoJSON (.geojson or .json), KML (.kml or .kmz) or zipped shapefile (.zip).`
		);
	}
	if (bytes.length === 0) throw new ImportError('empty_file', `The .${extension} file is empty.`);
	const content = sniffContent(bytes);
	if (!kind.expects.includes(content)) {
		throw new ImportError('wrong_content', `This .${extension} file is not ${kind.what}: it holds ${describeContent(content)}.`);
	}
	try {
		const { features, warnings, format } = read(kind.format, extension, bytes);
		const fileLabel = `${FORMAT_NAMES[format]} file`;
		const collected = collectPolygons(features, fileLabel);
		requireLongitudeLatitude(collected.candidates, fileLabel);
		const shapes = checkShapes(collected.candidates);
		return toResult(format, shapes, [...warnings, ...collected.warnings]);
	} catch (e) {
		if (e instanceof ImportError) throw e;
		// Libraries fail on damaged input in their own words; the caller only ever sees ImportError.
		throw new ImportError('unreadable', `The file could not be read as ${FORMAT_NAMES[kind.format]}: ${shortReason(e)}.`);
	}
}
