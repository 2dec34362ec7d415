// Reads an uploaded field-boundary file (GeoJSON, KML/KMZ or zipped Shapefile) into checked
// WGS84 polygons, in the geometry worker pool: a big or tangled file never stalls other requests.
// A route passes the bytes and answers an ImportError with its `status` and `message`.
import { geometryPool } from './geometry-pool';
import type { ImportResult } from './field-import/read';

export { ImportError, type ImportErrorCode } from './field-import/errors';
export { IMPORT_LIMITS } from './field-import/limits';
export type { ImportedShape } from './field-import/shapes';
export type { ImportFormat, ImportResult } from './field-import/read';

/**
 * Reads an uploaded boundary file into checked field polygons on WGS84; see `readFieldFile` for
 * the formats and checks.
 *
 * @param filename the uploaded file's name; only its extension is used
 * @param bytes the file's content
 * @returns the polygons with name, acres (WGS84 ellipsoid, 2 decimals) and position in the file
 * @throws ImportError for every problem with the file (status 413 for size limits, else 400);
 *   AppError 503 when reading it takes longer than the pool's time limit
 * @example
 * const { shapes } = await parseFieldFile('farm.kml', bytes);
 * shapes.features[0].properties.acres // 40
 */
export async function parseFieldFile(filename: string, bytes: Uint8Array): Promise<ImportResult> {
	return geometryPool().run({ kind: 'import', filename, bytes });
}
