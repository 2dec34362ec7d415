import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { findCrossing } from '../../../src/lib/geometry/crossings';
import type { XY } from '../../../src/lib/geometry/projection';
// The definition itself, every pair of edges: the sweep must agree with it on every input.
import { crossesByAllPairs, spikyRing } from '../../../scripts/bench/crossings-pairs';

function orient(a: XY, b: XY, c: XY): number {
	return (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]);
}
function within(a: XY, b: XY, p: XY): boolean {
	return Math.min(a[0], b[0]) <= p[0] && p[0] <= Math.max(a[0], b[0]) && Math.min(a[1], b[1]) <= p[1] && p[1] <= Math.max(a[1], b[1]);
}

/** Closed ring without consecutive repeats, as findCrossing expects. */
function closed(points: XY[]): XY[] | null {
	const out: XY[] = [];
	for (const p of points) if (!out.length || out[out.length - 1][0] !== p[0] || out[out.length - 1][1] !== p[1]) out.push(p);
	while (out.length > 1 && out[0][0] === out[out.length - 1][0] && out[0][1] === out[out.length - 1][1]) out.pop();
	return out.length >= 3 ? [...out, out[0]] : null;
}

// Small integer grids make shared vertices, collinear edges and vertical edges common, where a
// sweep is easiest to get wrong; integer orientation tests are exact there.
const point = (max: number) => fc.tuple(fc.integer({ min: 0, max }), fc.integer({ min: 0, max })) as fc.Arbitrary<XY>;
const anyRing = (max: number) => fc.array(point(max), { minLength: 3, maxLength: 14 }).map(closed);
/** Corners sorted by angle around a centre: often simple, sometimes touching or collinear. */
const starRing = fc.array(point(12), { minLength: 3, maxLength: 16 }).map((pts) => {
	const sorted = [...pts].sort((p, q) => Math.atan2(p[1] - 6.5, p[0] - 6.5) - Math.atan2(q[1] - 6.5, q[0] - 6.5));
	return closed(sorted);
});
const ringsArb = fc
	.array(fc.oneof(anyRing(6), anyRing(30), starRing), { minLength: 1, maxLength: 3 })
	.map((rs) => rs.filter((r): r is XY[] => r !== null))
	.filter((rs) => rs.length > 0);

describe('findCrossing (sweep line)', () => {
	it('agrees with the all-pairs check on random rings', () => {
		let simple = 0;
		fc.assert(
			fc.property(ringsArb, (rings) => {
				const expected = crossesByAllPairs(rings);
				if (!expected) simple++;
				expect(findCrossing(rings) !== null).toBe(expected);
			}),
			{ numRuns: 4000, seed: 20261202 }
		);
		// The sample must hold both answers in numbers, or the agreement says little.
		expect(simple).toBeGreaterThan(300);
	});

	it('returns a point where the crossing edges actually meet', () => {
		fc.assert(
			fc.property(ringsArb, (rings) => {
				const hit = findCrossing(rings);
				if (!hit) return;
				const edges = rings.flatMap((ring) => ring.slice(0, -1).map((a, i) => [a, ring[i + 1]] as const));
				const onEdges = edges.filter(([a, b]) => Math.abs(orient(a, b, hit)) < 1e-9 * (1 + Math.hypot(b[0] - a[0], b[1] - a[1])) && within(a, b, hit));
				expect(onEdges.length).toBeGreaterThanOrEqual(2);
			}),
			{ numRuns: 1000, seed: 7 }
		);
	});

	it('finds the crossing of a bow-tie, two rings touching at one corner, and a fold back', () => {
		expect(findCrossing([[[0, 0], [1, 1], [1, 0], [0, 1], [0, 0]]])).toEqual([0.5, 0.5]);
		const outer: XY[] = [[0, 0], [10, 0], [10, 10], [0, 10], [0, 0]];
		expect(findCrossing([outer, [[10, 5], [5, 4], [5, 6], [10, 5]]])).toEqual([10, 5]);
		expect(findCrossing([[[0, 0], [4, 0], [2, 0], [2, 3], [0, 0]]])).toEqual([4, 0]);
		expect(findCrossing([outer, [[2, 2], [2, 4], [4, 4], [4, 2], [2, 2]]])).toBeNull();
	});

	it('checks a 20,000-corner spiky ring, the worst case of the old grid check, in linearithmic time', () => {
		const ring = spikyRing(20_000);
		expect(findCrossing([ring])).toBeNull();
		// One spike pushed over its neighbour is found.
		const bent = ring.map((p) => [...p] as XY);
		bent[1001] = [bent[1003][0] * 1.001, bent[1003][1] * 1.001];
		expect(findCrossing([bent])).not.toBeNull();
	}, 5_000);
});
