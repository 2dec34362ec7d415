import type { XY } from '../../../src/lib/geometry/projection';

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
