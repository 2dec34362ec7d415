// ISO 11783-10 (ISOXML) task data, version 4, for guidance displays: one partfield with the field's
// boundary as polygons of line strings, no-plant areas as obstacle polygons, and the season's A-B
// line as a guidance pattern. Element and attribute codes per ISO 11783-10:2015 (from memory;
// check against the standard's XML schema before relying on a new attribute).
import { DOMImplementation, XMLSerializer } from '@xmldom/xmldom';
import type { MultiPolygon, Polygon, Position } from 'geojson';

export interface TaskDataInput {
	fieldName: string;
	farmName: string;
	boundary: Polygon | MultiPolygon;
	exclusions?: { name: string; geometry: Polygon | MultiPolygon }[];
	/** The season's A-B line, [lng, lat] each; left out when the season has no plan. */
	guidance?: { a: [number, number]; b: [number, number] } | null;
	season?: number | null;
	/** Field area in acres (WGS84 ellipsoid); written as square metres. */
	acres: number;
}

/** ISO 11783-10 codes used here. */
export const ISOXML = {
	root: 'ISO11783_TaskData',
	polygonBoundary: '1',
	polygonObstacle: '6',
	lineExterior: '1',
	lineInterior: '2',
	lineGuidance: '5',
	pointOther: '2',
	pointGuidanceA: '6',
	pointGuidanceB: '7',
	patternAB: '1'
} as const;

const SQUARE_METRES_PER_ACRE = 4046.8564224;

/** Degrees to 9 decimals (about 0.1 mm), the precision the standard's decimal type allows. */
const degrees = (value: number) => value.toFixed(9);

/** Closed ring: the first position repeated at the end. */
function closed(ring: Position[]): Position[] {
	if (ring.length === 0) return ring;
	const [first, last] = [ring[0], ring[ring.length - 1]];
	return first[0] === last[0] && first[1] === last[1] ? ring : [...ring, first];
}

const polygonsOf = (g: Polygon | MultiPolygon): Position[][][] => (g.type === 'Polygon' ? [g.coordinates] : g.coordinates);

/**
 * Writes TASKDATA.XML. Root ISO11783_TaskData (VersionMajor 4); a customer-less farm (FRM) and one
 * partfield (PFD, D = area in m²) holding PLN type 1 for each boundary part (LSG type 1 exterior,
 * type 2 interior, PNT with C = latitude, D = longitude), PLN type 6 for each no-plant area, and
 * GGP > GPN (C = 1, AB) > LSG type 5 > PNT type 6 (A) and 7 (B) for the A-B line.
 *
 * @example
 * const xml = taskDataXml({ fieldName: 'North 80', farmName: 'Demo', boundary, acres: 80 });
 */
export function taskDataXml(input: TaskDataInput): string {
	const doc = new DOMImplementation().createDocument(null, ISOXML.root, null);
	const root = doc.documentElement!;
	const attrs = (el: ReturnType<typeof doc.createElement>, values: Record<string, string>) => {
		for (const [k, v] of Object.entries(values)) el.setAttribute(k, v);
		return el;
	};
	const child = (parent: ReturnType<typeof doc.createElement>, name: string, values: Record<string, string>) => {
		const el = attrs(doc.createElement(name), values);
		parent.appendChild(el);
		return el;
	};
	attrs(root, {
		VersionMajor: '4',
		VersionMinor: '3',
		ManagementSoftwareManufacturer: 'Stripwright',
		ManagementSoftwareVersion: '1.0',
		DataTransferOrigin: '1'
	});
	child(root, 'FRM', { A: 'FRM1', B: input.farmName.slice(0, 32) || 'Farm' });
	const pfd = child(root, 'PFD', {
		A: 'PFD1',
		C: input.fieldName.slice(0, 32) || 'Field',
		D: String(Math.round(input.acres * SQUARE_METRES_PER_ACRE)),
		F: 'FRM1'
	});
	const ring = (parent: ReturnType<typeof doc.createElement>, type: string, positions: Position[], pointType: string) => {
		const lsg = child(parent, 'LSG', { A: type });
		for (const p of closed(positions)) child(lsg, 'PNT', { A: pointType, C: degrees(p[1]), D: degrees(p[0]) });
	};
	for (const polygon of polygonsOf(input.boundary)) {
		const pln = child(pfd, 'PLN', { A: ISOXML.polygonBoundary, B: input.fieldName.slice(0, 32) || 'Boundary' });
		polygon.forEach((positions, i) => ring(pln, i === 0 ? ISOXML.lineExterior : ISOXML.lineInterior, positions, ISOXML.pointOther));
	}
	for (const exclusion of input.exclusions ?? []) {
		for (const polygon of polygonsOf(exclusion.geometry)) {
			const pln = child(pfd, 'PLN', { A: ISOXML.polygonObstacle, B: exclusion.name.slice(0, 32) || 'No-plant area' });
			polygon.forEach((positions, i) => ring(pln, i === 0 ? ISOXML.lineExterior : ISOXML.lineInterior, positions, ISOXML.pointOther));
		}
	}
	if (input.guidance) {
		const name = input.season ? `A-B ${input.season}` : 'A-B line';
		const ggp = child(pfd, 'GGP', { A: 'GGP1', B: name });
		const gpn = child(ggp, 'GPN', { A: 'GPN1', B: name, C: ISOXML.patternAB });
		const lsg = child(gpn, 'LSG', { A: ISOXML.lineGuidance });
		child(lsg, 'PNT', { A: ISOXML.pointGuidanceA, C: degrees(input.guidance.a[1]), D: degrees(input.guidance.a[0]) });
		child(lsg, 'PNT', { A: ISOXML.pointGuidanceB, C: degrees(input.guidance.b[1]), D: degrees(input.guidance.b[0]) });
	}
	return `<?xml version="1.0" encoding="UTF-8"?>\n${new XMLSerializer().serializeToString(doc)}\n`;
}
