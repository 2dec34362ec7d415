import type { XY } from './projection';
import { SweepOrder, type OrderNode } from './sweep-order';

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

const same = (p: XY, q: XY) => p[0] === q[0] && p[1] === q[1];
/** Sweep order of points: by x, then by y (a vertical edge runs from its lower end). */
const before = (p: XY, q: XY) => p[0] < q[0] || (p[0] === q[0] && p[1] < q[1]);

interface Edge {
	/** As the ring runs. */
	a: XY;
	b: XY;
	/** Ends in sweep order. */
	left: XY;
	right: XY;
	ring: number;
	i: number;
	/** Edges in the ring. */
	n: number;
	id: number;
	node?: OrderNode<Edge>;
}

/** Where two edges meet in a way an outline may not, or null: ring neighbours may share their vertex. */
function badMeeting(s: Edge, q: Edge): XY | null {
	const adjacent = s.ring === q.ring && (Math.abs(s.i - q.i) === 1 || Math.abs(s.i - q.i) === s.n - 1);
	if (!adjacent) return segmentMeeting(s.a, s.b, q.a, q.b);
	// Shared vertex is fine; a fold back along the previous edge is not.
	const [p0, p1, p2] = same(s.b, q.a) ? [s.a, s.b, q.b] : [q.a, q.b, s.b];
	if (s.n > 2 && orient(p0, p1, p2) === 0) {
		const dot = (p0[0] - p1[0]) * (p2[0] - p1[0]) + (p0[1] - p1[1]) * (p2[1] - p1[1]);
		if (dot > 0) return p1;
	}
	return null;
}

/**
 * Order of edges crossed by the sweep line, decided where the newer edge `s` starts: below when
 * its start lies below `t`'s line, else by its far end; collinear edges by id. Exact orientation
 * tests rather than y-at-x keep vertical edges and shared vertices consistent.
 */
function below(s: Edge, t: Edge): boolean {
	const o = orient(t.left, t.right, s.left);
	if (o !== 0) return o < 0;
	const o2 = orient(t.left, t.right, s.right);
	if (o2 !== 0) return o2 < 0;
	return s.id < t.id;
}

/**
 * First place found where the rings of one polygon cross or touch themselves or each other, in
 * the same planar coordinates as the input, or null when the rings are simple and apart.
 * Neighbouring edges of a ring may share their common vertex; a ring folding back on itself
 * counts as a crossing.
 *
 * A Shamos–Hoey sweep: O(n log n) time and O(n) memory whatever the shape, since only edges
 * that become neighbours on the sweep line are compared (M. I. Shamos and D. Hoey, "Geometric
 * intersection problems", 17th Annual Symposium on Foundations of Computer Science, IEEE, 1976).
 * Edges that start at a point are added before edges that end there are removed, so rings
 * touching at a single vertex are seen.
 *
 * @param rings closed rings (first position repeated last), consecutive duplicates removed
 * @returns a crossing point, or null
 * @example findCrossing([[[0,0],[1,1],[1,0],[0,1],[0,0]]]) // [0.5, 0.5]
 */
export function findCrossing(rings: XY[][]): XY | null {
	const edges: Edge[] = [];
	rings.forEach((ring, r) => {
		const n = ring.length - 1;
		for (let i = 0; i < n; i++) {
			const a = ring[i];
			const b = ring[i + 1];
			const [left, right] = before(b, a) ? [b, a] : [a, b];
			edges.push({ a, b, left, right, ring: r, i, n, id: edges.length });
		}
	});
	if (edges.length < 2) return null;

	// Events as numbers: 2·id for an edge's start, 2·id + 1 for its end.
	const xs = new Float64Array(edges.length * 2);
	const ys = new Float64Array(edges.length * 2);
	const events: number[] = new Array(edges.length * 2);
	for (let k = 0; k < events.length; k++) {
		const p = (k & 1) === 0 ? edges[k >>> 1].left : edges[k >>> 1].right;
		xs[k] = p[0];
		ys[k] = p[1];
		events[k] = k;
	}
	events.sort((e, f) => xs[e] - xs[f] || ys[e] - ys[f] || (e & 1) - (f & 1));

	const status = new SweepOrder<Edge>(below);
	for (const e of events) {
		const edge = edges[e >>> 1];
		if ((e & 1) === 0) {
			const node = status.insert(edge);
			edge.node = node;
			const hit = (node.prev && badMeeting(node.prev.value, edge)) || (node.next && badMeeting(edge, node.next.value));
			if (hit) return hit;
		} else {
			const node = edge.node!;
			const { prev, next } = node;
			status.remove(node);
			if (prev && next) {
				const hit = badMeeting(prev.value, next.value);
				if (hit) return hit;
			}
		}
	}
	return null;
}
