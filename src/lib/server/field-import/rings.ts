// Checks on single polygons' rings, shared by every format.
import { checkOutline, GeometryError } from '../../geometry/index';
import type { Position } from 'geojson';
import { ImportError } from './errors';

/** A coordinate as people read it: whole numbers bare, else at most 6 decimals (about 0.1 m). */
export function fmt(n: number): string {
	return Number.isInteger(n) ? String(n) : String(Number(n.toFixed(6)));
}

export function samePosition(a: Position, b: Position): boolean {
	return a[0] === b[0] && a[1] === b[1];
}

function ringName(polygonIndex: number, ringIndex: number, polygonCount: number): string {
	const ring = ringIndex === 0 ? 'outer boundary' : `hole ${ringIndex}`;
	return polygonCount > 1 ? `part ${polygonIndex + 1}'s ${ring}` : `its ${ring}`;
}

/** Twice the planar signed area; positive when the ring runs counter-clockwise. */
function ringTurn(ring: Position[]): number {
	let sum = 0;
	for (let i = 1; i < ring.length; i++) sum += (ring[i][0] - ring[i - 1][0]) * (ring[i][1] + ring[i - 1][1]);
	return -sum;
}

/** RFC 7946 right-hand rule (outer counter-clockwise, holes clockwise); shapefiles store the opposite. */
export function rightHanded(rings: Position[][]): Position[][] {
	return rings.map((ring, i) => ((i === 0) === (ringTurn(ring) > 0) ? ring : [...ring].reverse()));
}

function withoutRepeats(ring: Position[]): Position[] {
	return ring.filter((p, i) => i === 0 || !samePosition(p, ring[i - 1]));
}

/** Checks one polygon's rings and returns them with repeated consecutive positions dropped. */
export function checkRings(label: string, rings: Position[][], polygonIndex: number, polygonCount: number): Position[][] {
	const cleaned = rings.map((ring, ri) => {
		const where = ringName(polygonIndex, ri, polygonCount);
		if (ring.length < 4) {
			throw new ImportError(
				'too_few_positions',
				`${label}: ${where} has only ${ring.length} position${ring.length === 1 ? '' : 's'}; an outline needs at least 3 corners plus the first corner repeated at the end (4 positions).`
			);
		}
		const first = ring[0];
		const last = ring[ring.length - 1];
		if (!samePosition(first, last)) {
			throw new ImportError(
				'open_ring',
				`${label}: ${where} is not closed: it starts at ${fmt(first[0])}, ${fmt(first[1])} but ends at ${fmt(last[0])}, ${fmt(last[1])}. An outline must end on its first position.`
			);
		}
		// Repeated points are common in exported files and harmless, but they read as crossings.
		const distinct = withoutRepeats(ring);
		if (distinct.length < 4) {
			throw new ImportError(
				'too_few_positions',
				`${label}: ${where} has only ${distinct.length - 1} distinct corner${distinct.length === 2 ? '' : 's'}; an outline needs at least 3.`
			);
		}
		return distinct;
	});
	const crossing = crossingOf(cleaned, label);
	if (crossing) {
		const [lng, lat] = crossing;
		throw new ImportError(
			'self_intersection',
			`${label} crosses itself near longitude ${lng.toFixed(6)}, latitude ${lat.toFixed(6)}. Fix the outline so its edges do not cross.`
		);
	}
	return cleaned;
}


/** Where the rings cross (the geometry engine's own check, so imports and layouts agree), or null. */
function crossingOf(rings: Position[][], label: string): [number, number] | null {
	try {
		checkOutline({ type: 'Polygon', coordinates: rings }, 'outline');
		return null;
	} catch (e) {
		if (e instanceof GeometryError && e.code === 'self-intersection' && e.where) return e.where;
		// A flat outline: the area check that follows says so in the import's own words.
		if (e instanceof GeometryError && e.code === 'zero-area') return null;
		if (e instanceof GeometryError && e.code === 'crosses-antimeridian') {
			throw new ImportError('crosses_antimeridian', `${label} ${e.message.replace(/^The outline /, '')}`);
		}
		if (e instanceof GeometryError && e.code === 'encloses-pole') {
			throw new ImportError('encloses_pole', `${label} ${e.message.replace(/^The outline /, '')}`);
		}
		throw e;
	}
}

