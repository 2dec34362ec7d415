import type { XY } from './projection';

function orient(a: XY, b: XY, c: XY): number {
	return (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]);
}

function onSegment(a: XY, b: XY, p: XY): boolean {
	return (
		Math.min(a[0], b[0]) <= p[0] && p[0] <= Math.max(a[0], b[0]) &&
		Math.min(a[1], b[1]) <= p[1] && p[1] <= Math.max(a[1], b[1])
	);
}

/** Where segments p1p2 and q1q2 meet (a point of the overlap when collinear), or null. */
function segmentMeeting(p1: XY, p2: XY, q1: XY, q2: XY): XY | null {
	const d1 = orient(q1, q2, p1);
	const d2 = orient(q1, q2, p2);
	const d3 = orient(p1, p2, q1);
	const d4 = orient(p1, p2, q2);
	if (((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0))) {
		const t = d1 / (d1 - d2);
		return [p1[0] + t * (p2[0] - p1[0]), p1[1] + t * (p2[1] - p1[1])];
	}
	if (d1 === 0 && onSegment(q1, q2, p1)) return p1;
	if (d2 === 0 && onSegment(q1, q2, p2)) return p2;
	if (d3 === 0 && onSegment(p1, p2, q1)) return q1;
	if (d4 === 0 && onSegment(p1, p2, q2)) return q2;
	return null;
}

/**
 * First place where the rings of one polygon cross or touch themselves or each other, in the same
 * planar coordinates as the input, or null when the rings are simple and apart. Neighbouring edges
 * of a ring may share their common vertex; a ring folding back on itself counts as a crossing.
 * Segments are bucketed on a grid so typical fields cost about O(n).
 *
 * @param rings closed rings (first position repeated last), consecutive duplicates removed
 * @returns the crossing point, or null
 * @example findCrossing([[[0,0],[1,1],[1,0],[0,1],[0,0]]]) // [0.5, 0.5]
 */
export function findCrossing(rings: XY[][]): XY | null {
	const segs: { a: XY; b: XY; ring: number; i: number; n: number }[] = [];
	let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
	rings.forEach((ring, r) => {
		const n = ring.length - 1;
		for (let i = 0; i < n; i++) {
			const a = ring[i];
			const b = ring[i + 1];
			segs.push({ a, b, ring: r, i, n });
			minX = Math.min(minX, a[0]); maxX = Math.max(maxX, a[0]);
			minY = Math.min(minY, a[1]); maxY = Math.max(maxY, a[1]);
		}
	});
	if (segs.length < 2) return null;
	const side = Math.max(1, Math.ceil(Math.sqrt(segs.length)));
	const cellW = (maxX - minX) / side || 1;
	const cellH = (maxY - minY) / side || 1;
	const cells = new Map<number, number[]>();
	const cx = (x: number) => Math.min(side - 1, Math.max(0, Math.floor((x - minX) / cellW)));
	const cy = (y: number) => Math.min(side - 1, Math.max(0, Math.floor((y - minY) / cellH)));
	for (let k = 0; k < segs.length; k++) {
		const { a, b } = segs[k];
		const x0 = cx(Math.min(a[0], b[0])), x1 = cx(Math.max(a[0], b[0]));
		const y0 = cy(Math.min(a[1], b[1])), y1 = cy(Math.max(a[1], b[1]));
		for (let x = x0; x <= x1; x++) {
			for (let y = y0; y <= y1; y++) {
				const key = x * side + y;
				const list = cells.get(key);
				if (list) list.push(k);
				else cells.set(key, [k]);
			}
		}
	}
	for (const list of cells.values()) {
		for (let u = 0; u < list.length; u++) {
			for (let v = u + 1; v < list.length; v++) {
				const s = segs[list[u]];
				const q = segs[list[v]];
				const adjacent =
					s.ring === q.ring &&
					(Math.abs(s.i - q.i) === 1 || Math.abs(s.i - q.i) === s.n - 1);
				if (adjacent) {
					// Shared vertex is fine; a fold back along the previous edge is not.
					const shared = s.b === q.a || (s.b[0] === q.a[0] && s.b[1] === q.a[1]) ? 'sb' : 'sa';
					const [p0, p1, p2] = shared === 'sb' ? [s.a, s.b, q.b] : [q.a, q.b, s.b];
					if (s.n > 2 && orient(p0, p1, p2) === 0) {
						const dot = (p0[0] - p1[0]) * (p2[0] - p1[0]) + (p0[1] - p1[1]) * (p2[1] - p1[1]);
						if (dot > 0) return p1;
					}
					continue;
				}
				const hit = segmentMeeting(s.a, s.b, q.a, q.b);
				if (hit) return hit;
			}
		}
	}
	return null;
}
