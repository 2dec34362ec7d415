// shpjs ships no types; only the two low-level readers used by the shapefile import are declared.
declare module 'shpjs' {
	import type { Geometry } from 'geojson';
	/** Reads .shp records; with no projection the coordinates are returned as stored. */
	export function parseShp(shp: DataView | ArrayBuffer | Uint8Array, prj?: string | false): (Geometry | null)[];
	/** Reads the .dbf attribute table, one object per record. */
	export function parseDbf(dbf: DataView | ArrayBuffer | Uint8Array, cpg?: string): Record<string, unknown>[];
}
