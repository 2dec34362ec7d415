// Decides how a shapefile's stored coordinates become WGS84 longitude/latitude, from its .prj.
import proj4 from 'proj4';
import type { Position } from 'geojson';
import { ImportError } from './errors';

export interface Reprojection {
	/** Undefined when the coordinates are already WGS84 longitude/latitude. */
	toLngLat?: (p: Position) => Position;
	warnings: string[];
}

/** The parts of proj4's parsed system that decide what to do. */
interface ParsedSystem {
	projName?: string;
	name?: string;
	datumCode?: string;
	datum?: { datum_type?: number };
	from_greenwich?: number;
}
const parseSystem = proj4.Proj as unknown as new (wkt: string) => ParsedSystem;

// proj4's datum kinds (lib/constants/values.js).
const WGS84_DATUM_TYPE = 4;
const NO_DATUM_TYPE = 5;

const DATUM_NAMES: Record<string, string> = { north_american_1983: 'NAD83', nad83: 'NAD83', north_american_1927: 'NAD27', nad27: 'NAD27' };

function readable(name: string): string {
	return DATUM_NAMES[name.toLowerCase()] ?? name.replace(/_/g, ' ');
}

function unknownSystem(detail: string): ImportError {
	return new ImportError(
		'unknown_projection',
		`The shapefile's coordinate system could not be understood (${detail}), so its coordinates cannot be placed on the map. Export it again in WGS84 longitude/latitude (EPSG:4326), or include the .prj file your mapping program writes.`
	);
}

/**
 * Reads the .prj (WKT) with proj4. WGS84 longitude/latitude passes unchanged; any other system
 * proj4 understands is converted.
 * @param prj the .prj text, or undefined when the archive has none
 * @param sample a few stored coordinates, to judge files without a .prj
 */
export function shapefileReprojection(prj: string | undefined, sample: Position[]): Reprojection {
	if (prj === undefined || prj.trim() === '') {
		const outside = sample.find(([x, y]) => !(Math.abs(x) <= 180 && Math.abs(y) <= 90));
		if (outside) {
			throw new ImportError(
				'unknown_projection',
				`The shapefile's coordinates are not longitude/latitude (e.g. ${outside[0]}, ${outside[1]}) and it has no .prj to say what they are. Add the .prj file from the same export to the zip, or export it again in WGS84 longitude/latitude.`
			);
		}
		return { warnings: ['The shapefile has no .prj file; its coordinates were read as WGS84 longitude/latitude.'] };
	}
	let source: ParsedSystem;
	try {
		source = new parseSystem(prj.trim());
	} catch (e) {
		const text = e instanceof Error ? e.message : String(e ?? '');
		throw unknownSystem(text && text.length < 80 && !text.includes('[') ? text : 'the .prj file is not a coordinate system description this site can read');
	}
	if (!source.projName || source.projName === 'identity') throw unknownSystem('the .prj describes a local grid with no place on Earth');
	const datumType = source.datum?.datum_type;
	const isWgs84 = datumType === WGS84_DATUM_TYPE || source.datumCode?.toLowerCase() === 'wgs84';
	const warnings: string[] = [];
	if (datumType === NO_DATUM_TYPE && !isWgs84) {
		// proj4 has no shift for datums such as NAD83 without parameters; NAD83 and WGS84 agree to
		// within about 1–2 m across the lower 48 states, well inside the precision of a drawn outline.
		warnings.push(`The shapefile's datum (${readable(source.datumCode ?? 'unnamed')}) was taken as WGS84; the two can differ by a metre or two.`);
	}
	if (source.projName === 'longlat' && isWgs84 && !source.from_greenwich) return { warnings };
	const converter = proj4(prj.trim(), 'EPSG:4326');
	warnings.push(`The shapefile's coordinates were converted from ${source.name ? readable(source.name) : 'its coordinate system'} to WGS84 longitude/latitude.`);
	return {
		warnings,
		toLngLat: (p) => {
			const [lng, lat] = converter.forward([p[0], p[1]]);
			if (!Number.isFinite(lng) || !Number.isFinite(lat) || Math.abs(lng) > 180 || Math.abs(lat) > 90) {
				throw unknownSystem(`the position ${p[0]}, ${p[1]} does not convert to a place on Earth with the system in the .prj file`);
			}
			return [lng, lat];
		}
	};
}
