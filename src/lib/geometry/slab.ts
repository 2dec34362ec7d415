import type { Position } from 'geojson';
import { ringSignedArea, type PlaneShape } from './clip';

type Pt = [number, number];
type Side = 'L' | 'R';
interface Chain { points: Pt[]; startSide: Side; startY: number; endSide: Side; endY: number; used: boolean }

/** Rings with less area than this (m²) are the trace of a ring running along a cut line: dropped. */
const EMPTY_RING_M2 = 1e-9;

/**
 * Pieces of one ring inside the band left ≤ x ≤ right: whole (`ring`) when it never leaves the band,
 * otherwise chains from where it enters to where it leaves. Crossing points are computed from the
 * edge in ring order, so two neighbouring bands get bit-identical points on their shared line.
 */
function ringInBand(ring: Position[], left: number, right: number): { ring?: Pt[]; chains: Chain[] } {
	const n = ring.length - 1;
	const outside = (x: number) => x < left || x > right;
	let start = -1;
	for (let i = 0; i < n; i++) if (outside(ring[i][0])) { start = i; break; }
	if (start < 0) return { ring: ring.map((p) => [p[0], p[1]] as Pt), chains: [] };

	const chains: Chain[] = [];
	let current: Pt[] | null = null;
	let entrySide: Side = 'L';
	const cut = (p: Position, q: Position, x: number): Pt => [x, p[1] + ((x - p[0]) / (q[0] - p[0])) * (q[1] - p[1])];
	const push = (pt: Pt) => {
		const last = current![current!.length - 1];
		if (!last || last[0] !== pt[0] || last[1] !== pt[1]) current!.push(pt);
	};
	for (let k = 0; k < n; k++) {
		const p = ring[(start + k) % n];
		const q = ring[(start + k + 1) % n];
		const [px] = p;
		const [qx] = q;
		if (current === null) {
			// p is outside; does the edge reach into the band?
			if (px < left && qx >= left) {
				current = [];
				entrySide = 'L';
				push(qx === left ? [q[0], q[1]] : cut(p, q, left));
			} else if (px > right && qx <= right) {
				current = [];
				entrySide = 'R';
				push(qx === right ? [q[0], q[1]] : cut(p, q, right));
			} else continue;
		}
		// Inside (or just entered): follow the edge to q or to where it leaves.
		if (qx < left || qx > right) {
			const exitSide: Side = qx < left ? 'L' : 'R';
			const x = exitSide === 'L' ? left : right;
			push(px === x ? [p[0], p[1]] : cut(p, q, x));
			const pts = current;
			chains.push({ points: pts, startSide: entrySide, startY: pts[0][1], endSide: exitSide, endY: pts[pts.length - 1][1], used: false });
			current = null;
		} else {
			push([q[0], q[1]]);
		}
	}
	return { chains };
}

function pointInRing(pt: Pt, ring: Pt[]): boolean {
	let inside = false;
	for (let i = 0, j = ring.length - 2; i < ring.length - 1; j = i++) {
		const [xi, yi] = ring[i];
		const [xj, yj] = ring[j];
		if (yi > pt[1] !== yj > pt[1] && pt[0] < ((xj - xi) * (pt[1] - yi)) / (yj - yi) + xi) inside = !inside;
	}
	return inside;
}

/**
 * Part of a planar shape inside the band left ≤ x ≤ right, as valid polygons. Rings must be
 * oriented exterior counter-clockwise, holes clockwise, and must not cross. Along each cut line the
 * region's boundary runs downward on the left line and upward on the right line, which links each
 * chain's exit to the next entry.
 *
 * @param shape planar shape (metres), oriented
 * @param left band's left x
 * @param right band's right x
 * @returns polygons inside the band
 * @example clipToBand(square, 0, 10)
 */
export function clipToBand(shape: PlaneShape, left: number, right: number): PlaneShape {
	const outers: Pt[][] = [];
	const holes: Pt[][] = [];
	const chains: Chain[] = [];
	for (const rings of shape) {
		for (const ring of rings) {
			let lo = Infinity, hi = -Infinity;
			for (const p of ring) { if (p[0] < lo) lo = p[0]; if (p[0] > hi) hi = p[0]; }
			if (hi < left || lo > right) continue;
			const part = ringInBand(ring, left, right);
			if (part.ring) (ringSignedArea(part.ring) > 0 ? outers : holes).push(part.ring);
			chains.push(...part.chains);
		}
	}
	const starts = { L: chains.filter((c) => c.startSide === 'L'), R: chains.filter((c) => c.startSide === 'R') };
	const nextChain = (c: Chain, first: Chain): Chain | undefined => {
		let best: Chain | undefined;
		const open = (d: Chain) => !d.used || d === first;
		if (c.endSide === 'L') {
			// Walk down the left line to the nearest entry at or below.
			for (const d of starts.L) if (open(d) && d.startY <= c.endY && (!best || d.startY > best.startY)) best = d;
		} else {
			for (const d of starts.R) if (open(d) && d.startY >= c.endY && (!best || d.startY < best.startY)) best = d;
		}
		return best;
	};
	for (const first of chains) {
		if (first.used) continue;
		const ring: Pt[] = [];
		let c: Chain | undefined = first;
		first.used = true;
		while (c) {
			for (const p of c.points) {
				const last = ring[ring.length - 1];
				if (!last || last[0] !== p[0] || last[1] !== p[1]) ring.push(p);
			}
			const next = nextChain(c, first);
			if (!next || next === first) break;
			next.used = true;
			c = next;
		}
		if (ring.length < 3) continue;
		if (ring[0][0] !== ring[ring.length - 1][0] || ring[0][1] !== ring[ring.length - 1][1]) ring.push([ring[0][0], ring[0][1]]);
		if (ring.length < 4) continue;
		const a = ringSignedArea(ring);
		if (Math.abs(a) < EMPTY_RING_M2) continue;
		(a > 0 ? outers : holes).push(ring);
	}
	const polygons: Pt[][][] = outers.map((o) => [o]);
	for (const hole of holes) {
		if (polygons.length === 1) { polygons[0].push(hole); continue; }
		const probe = hole.find((p) => p[0] > left && p[0] < right) ?? hole[0];
		const owner = polygons.find((poly) => pointInRing(probe, poly[0]));
		if (owner) owner.push(hole);
	}
	return polygons;
}
