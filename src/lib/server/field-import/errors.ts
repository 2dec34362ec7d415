/** Every reason an uploaded boundary file is refused. */
export type ImportErrorCode =
	| 'too_large'
	| 'zip_too_large'
	| 'zip_too_many_files'
	| 'empty_file'
	| 'unsupported_format'
	| 'wrong_content'
	| 'unreadable'
	| 'not_geojson'
	| 'not_kml'
	| 'not_taskdata'
	| 'no_shapefile'
	| 'no_polygons'
	| 'invalid_geometry'
	| 'projected_coordinates'
	| 'swapped_coordinates'
	| 'unknown_projection'
	| 'open_ring'
	| 'too_few_positions'
	| 'self_intersection'
	| 'zero_area'
	| 'area_too_large'
	| 'too_many_vertices'
	| 'crosses_antimeridian'
	| 'encloses_pole';

/**
 * The only error `parseFieldFile` throws. `code` is stable for programs, `status` is the HTTP
 * status a route should answer with, and `message` is written for the farmer.
 */
export class ImportError extends Error {
	readonly code: ImportErrorCode;
	readonly status: 400 | 413;

	constructor(code: ImportErrorCode, message: string, status: 400 | 413 = 400) {
		super(message);
		this.name = 'ImportError';
		this.code = code;
		this.status = status;
	}
}

/** First line of a library's error, trimmed, for "could not be read as …: <reason>". */
export function shortReason(e: unknown): string {
	// The engine's own limits ("Maximum call stack size exceeded", "Invalid array length") say nothing about the file.
	if (e instanceof RangeError) return 'it is nested too deeply or is too large to read';
	// A library tripping over a missing part ("Cannot read properties of undefined") speaks of its code, not the file.
	if (e instanceof TypeError) return 'parts of it are missing or not where this kind of file keeps them';
	const text = e instanceof Error ? e.message : String(e);
	const line = text.split('\n').find((l) => l.trim() !== '')?.trim() ?? 'unknown error';
	return line.length > 160 ? `${line.slice(0, 157)}…` : line;
}
