// Naming a yield monitor's CSV columns: which header holds which value. A mapping is saved per source
// (a combine's display or export format) and used again for that source's next file.

export const YIELD_ROLES = ['longitude', 'latitude', 'yield', 'massFlow', 'moisture', 'swathWidth', 'time', 'speed'] as const;
export type YieldRole = (typeof YIELD_ROLES)[number];

export interface YieldMapping {
	longitude: string;
	latitude: string;
	/** dry yield at the crop's standard moisture, bu/ac (or wet, see yieldBasis) */
	yield?: string | null;
	/** wet grain flow, lb/s; needs the swath width and the speed or positions */
	massFlow?: string | null;
	moisture: string;
	swathWidth?: string | null;
	time: string;
	speed?: string | null;
	yieldBasis?: 'dry' | 'wet';
	swathUnit?: 'ft' | 'in' | 'm';
	speedUnit?: 'mph' | 'km/h';
}

export const ROLE_LABELS: Record<YieldRole, string> = {
	longitude: 'Longitude (°)',
	latitude: 'Latitude (°)',
	yield: 'Yield (bu/ac)',
	massFlow: 'Grain flow (lb/s)',
	moisture: 'Moisture (%)',
	swathWidth: 'Swath width',
	time: 'Time',
	speed: 'Speed'
};

const GUESSES: Record<YieldRole, RegExp> = {
	longitude: /^(lon|lng|long|longitude|x)\b/i,
	latitude: /^(lat|latitude|y)\b/i,
	yield: /yield|bu.?\/?.?ac/i,
	massFlow: /mass.?flow|flow|lb.?\/.?s/i,
	moisture: /moist|h2o|water/i,
	swathWidth: /swath|width|header/i,
	time: /time|date|stamp|utc/i,
	speed: /speed|velocity|mph|km.?h/i
};

/** A first guess at the mapping from the header names; the user confirms it. */
export function guessMapping(headers: string[]): Partial<YieldMapping> {
	const out: Partial<Record<YieldRole, string>> = {};
	const taken = new Set<string>();
	for (const role of YIELD_ROLES) {
		const hit = headers.find((h) => !taken.has(h) && GUESSES[role].test(h.trim()));
		if (hit) {
			out[role] = hit;
			taken.add(hit);
		}
	}
	return out;
}

/** Problems with a mapping against a file's headers, keyed by role; empty when it can be used. */
export function mappingProblems(mapping: Partial<YieldMapping>, headers: string[]): Record<string, string[]> {
	const fields: Record<string, string[]> = {};
	const add = (k: string, m: string) => (fields[k] ??= []).push(m);
	const present = new Set(headers);
	for (const role of ['longitude', 'latitude', 'moisture', 'time'] as const) {
		if (!mapping[role]) add(role, `Choose the column that holds ${ROLE_LABELS[role].toLowerCase()}.`);
	}
	if (!mapping.yield && !mapping.massFlow) add('yield', 'Choose a yield column (bu/ac) or a grain-flow column (lb/s).');
	if (!mapping.yield && mapping.massFlow && !mapping.swathWidth) add('swathWidth', 'Grain flow needs the swath width column to turn pounds into pounds per acre.');
	for (const role of YIELD_ROLES) {
		const column = mapping[role];
		if (column && !present.has(column)) add(role, `The file has no column "${column}"; its columns are ${headers.map((h) => `"${h}"`).join(', ')}.`);
	}
	return fields;
}

/** The columns a mapping reads, for a message about a file that lacks some of them. */
export function missingColumns(mapping: Partial<YieldMapping>, headers: string[]): string[] {
	const present = new Set(headers);
	return YIELD_ROLES.map((r) => mapping[r]).filter((c): c is string => !!c && !present.has(c));
}
