// Lane outlines projected to Leaflet layer pixels, packed into a few typed arrays: a season of
// 5,000 lanes is one Float64Array of points, not 5,000 small arrays for the collector to chase.
// Pure: no DOM, no Leaflet; the canvas code draws and hit-tests from these arrays.
import type { MultiPolygon, Polygon, Position } from 'geojson';

export interface ProjectedLanes {
	/** Lanes kept (an outline that is not a polygon is left off). */
	count: number;
	/** Index into the input of each kept lane. */
	source: Uint32Array;
	/** Points of every ring, [x0, y0, x1, y1, …] in layer pixels. */
	points: Float64Array;
	/** Ring r spans points[2·ringStart[r] …) for ringLength[r] points. */
	ringStart: Uint32Array;
	ringLength: Uint32Array;
	/** Lane k owns rings laneRing[k] … laneRing[k + 1] − 1. */
	laneRing: Uint32Array;
	/** Lane k's box: [minX, minY, maxX, maxY] at 4k. */
	boxes: Float64Array;
}

const MAX_LAT = 85.0511287798;
const D2R = Math.PI / 180;

type Outline = Polygon | MultiPolygon | null | undefined;

function polygonsOf(g: Outline): Position[][][] | null {
	if (!g || (g.type !== 'Polygon' && g.type !== 'MultiPolygon') || !Array.isArray(g.coordinates)) return null;
	return g.type === 'Polygon' ? [g.coordinates] : g.coordinates;
}

const isPoint = (p: unknown): p is Position => Array.isArray(p) && typeof p[0] === 'number' && typeof p[1] === 'number';

/**
 * Projects outlines with spherical Web Mercator (Leaflet's EPSG:3857) at `zoom`, relative to the
 * map's pixel origin: what map.latLngToLayerPoint gives, without two objects per point.
 */
export function projectLanes(outlines: readonly Outline[], zoom: number, pixelOrigin: { x: number; y: number }): ProjectedLanes {
	// First pass: sizes, so every array is allocated once.
	let ringCount = 0;
	let pointCount = 0;
	for (const g of outlines) {
		const polys = polygonsOf(g);
		if (!polys) continue;
		for (const poly of polys) {
			if (!Array.isArray(poly)) continue;
			for (const ring of poly) {
				if (!Array.isArray(ring)) continue;
				ringCount++;
				pointCount += ring.length;
			}
		}
	}
	const scale = 256 * 2 ** zoom;
	const points = new Float64Array(pointCount * 2);
	const ringStart = new Uint32Array(ringCount);
	const ringLength = new Uint32Array(ringCount);
	const source = new Uint32Array(outlines.length);
	const laneRing = new Uint32Array(outlines.length + 1);
	const boxes = new Float64Array(outlines.length * 4);
	let count = 0;
	let r = 0;
	let p = 0;
	for (let i = 0; i < outlines.length; i++) {
		const polys = polygonsOf(outlines[i]);
		if (!polys) continue;
		const firstRing = r;
		const firstPoint = p;
		let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
		for (const poly of polys) {
			if (!Array.isArray(poly)) continue;
			for (const ring of poly) {
				if (!Array.isArray(ring)) continue;
				ringStart[r] = p;
				let n = 0;
				for (const pt of ring) {
					// A stored point that is not a pair of numbers is skipped rather than stopping the map.
					if (!isPoint(pt)) continue;
					const lat = Math.max(Math.min(MAX_LAT, pt[1]), -MAX_LAT);
					const sin = Math.sin(lat * D2R);
					const x = scale * (0.5 + pt[0] / 360) - pixelOrigin.x;
					const y = scale * (0.5 - Math.log((1 + sin) / (1 - sin)) / (4 * Math.PI)) - pixelOrigin.y;
					points[2 * (p + n)] = x;
					points[2 * (p + n) + 1] = y;
					n++;
					if (x < minX) minX = x;
					if (y < minY) minY = y;
					if (x > maxX) maxX = x;
					if (y > maxY) maxY = y;
				}
				ringLength[r] = n;
				p += n;
				r++;
			}
		}
		if (!Number.isFinite(minX) || !Number.isFinite(maxY)) {
			// Nothing drawable: take its rings back.
			r = firstRing;
			p = firstPoint;
			continue;
		}
		source[count] = i;
		laneRing[count] = firstRing;
		boxes[4 * count] = minX;
		boxes[4 * count + 1] = minY;
		boxes[4 * count + 2] = maxX;
		boxes[4 * count + 3] = maxY;
		count++;
	}
	laneRing[count] = r;
	return { count, source, points, ringStart, ringLength, laneRing, boxes };
}

/** The kept lane (index into `count`) under the layer point, or −1; even-odd rule, holes count. */
export function laneAt(lanes: ProjectedLanes, x: number, y: number): number {
	const { boxes, laneRing, ringStart, ringLength, points } = lanes;
	for (let k = 0; k < lanes.count; k++) {
		if (x < boxes[4 * k] || y < boxes[4 * k + 1] || x > boxes[4 * k + 2] || y > boxes[4 * k + 3]) continue;
		let hit = false;
		for (let ring = laneRing[k]; ring < laneRing[k + 1]; ring++) {
			const start = 2 * ringStart[ring];
			const end = start + 2 * ringLength[ring];
			for (let i = start, j = end - 2; i < end; j = i, i += 2) {
				const xi = points[i], yi = points[i + 1], xj = points[j], yj = points[j + 1];
				if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) hit = !hit;
			}
		}
		if (hit) return k;
	}
	return -1;
}
