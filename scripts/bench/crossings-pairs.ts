// The self-crossing check by its definition: every pair of edges, O(n²) time. The sweep line is
// tested against it and timed against it. Tests and bench only.
type XY = [number, number];

function orient(a: XY, b: XY, c: XY): number {
	return (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]);
}

function within(a: XY, b: XY, p: XY): boolean {
	return Math.min(a[0], b[0]) <= p[0] && p[0] <= Math.max(a[0], b[0]) && Math.min(a[1], b[1]) <= p[1] && p[1] <= Math.max(a[1], b[1]);
}

function meet(p1: XY, p2: XY, q1: XY, q2: XY): boolean {
	const d1 = orient(q1, q2, p1), d2 = orient(q1, q2, p2), d3 = orient(p1, p2, q1), d4 = orient(p1, p2, q2);
	if (d1 * d2 < 0 && d3 * d4 < 0) return true;
	return (d1 === 0 && within(q1, q2, p1)) || (d2 === 0 && within(q1, q2, p2)) || (d3 === 0 && within(p1, p2, q1)) || (d4 === 0 && within(p1, p2, q2));
}

/**
 * True when the closed rings cross or touch themselves or each other. Neighbouring edges of a ring
 * may share their vertex; folding back over each other is a crossing.
 */
export function crossesByAllPairs(rings: XY[][]): boolean {
	const edges = rings.flatMap((ring, r) => ring.slice(0, -1).map((a, i) => ({ a, b: ring[i + 1], r, i, n: ring.length - 1 })));
	for (let u = 0; u < edges.length; u++) {
		for (let v = u + 1; v < edges.length; v++) {
			const s = edges[u], q = edges[v];
			const next = s.r === q.r && (q.i === s.i + 1 || (s.i === 0 && q.i === s.n - 1));
			if (!next) {
				if (meet(s.a, s.b, q.a, q.b)) return true;
				continue;
			}
			const [p0, p1, p2] = q.i === s.i + 1 ? [s.a, s.b, q.b] : [q.a, q.b, s.b];
			const dot = (p0[0] - p1[0]) * (p2[0] - p1[0]) + (p0[1] - p1[1]) * (p2[1] - p1[1]);
			if (orient(p0, p1, p2) === 0 && dot > 0) return true;
		}
	}
	return false;
}

/**
 * A closed star ring of `corners` corners (metres) alternating between a 10-m inner circle and a
 * 1-km rim: every edge spans much of the outline, the worst case for a grid of buckets.
 */
export function spikyRing(corners: number): XY[] {
	const ring: XY[] = [];
	for (let i = 0; i < corners; i++) {
		const angle = (2 * Math.PI * i) / corners;
		const r = i % 2 === 0 ? 1000 : 10;
		ring.push([r * Math.cos(angle), r * Math.sin(angle)]);
	}
	ring.push(ring[0]);
	return ring;
}
