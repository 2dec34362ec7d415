// The season map's packed projection: the same pixels Leaflet's spherical Web Mercator gives,
// lanes that cannot be drawn left out without shifting the others, and clicks matched to lanes.
import { describe, expect, it } from 'vitest';
import type { MultiPolygon, Polygon } from 'geojson';
import { laneAt, projectLanes } from '$lib/components/farm/lane-projection';

const square = (lng: number, lat: number, d: number): Polygon => ({
	type: 'Polygon',
	coordinates: [[[lng, lat], [lng + d, lat], [lng + d, lat + d], [lng, lat + d], [lng, lat]]]
});

/** Leaflet's EPSG:3857 at zoom z, written out the long way (R = 6,378,137 m, 256-px tiles). */
function leafletPixel(lng: number, lat: number, zoom: number): [number, number] {
	const R = 6378137;
	const x = R * (lng * Math.PI) / 180;
	const y = R * Math.log(Math.tan(Math.PI / 4 + (lat * Math.PI) / 360));
	const scale = 256 * 2 ** zoom;
	const s = 0.5 / (Math.PI * R);
	return [scale * (s * x + 0.5), scale * (-s * y + 0.5)];
}

describe('projectLanes', () => {
	it('gives the pixels Leaflet gives, relative to the pixel origin', () => {
		const origin = { x: 1000, y: 2000 };
		const p = projectLanes([square(-94.5, 43.9, 0.001)], 15, origin);
		expect(p.count).toBe(1);
		expect(p.ringLength[0]).toBe(5);
		const [x, y] = leafletPixel(-94.5, 43.9, 15);
		expect(p.points[0]).toBeCloseTo(x - origin.x, 6);
		expect(p.points[1]).toBeCloseTo(y - origin.y, 6);
		const [x2, y2] = leafletPixel(-94.499, 43.901, 15);
		expect(p.points[4]).toBeCloseTo(x2 - origin.x, 6);
		expect(p.points[5]).toBeCloseTo(y2 - origin.y, 6);
		// The box runs from the south-west corner (largest y) to the north-east one.
		expect([...p.boxes]).toEqual([p.points[0], p.points[5], p.points[4], p.points[1]]);
	});

	it('leaves out an outline that is not a polygon and keeps the others in order, holes with their lane', () => {
		const withHole: Polygon = { type: 'Polygon', coordinates: [square(0, 0, 1).coordinates[0], square(0.25, 0.25, 0.5).coordinates[0]] };
		const multi: MultiPolygon = { type: 'MultiPolygon', coordinates: [square(2, 0, 1).coordinates, square(4, 0, 1).coordinates] };
		const broken = { type: 'Polygon', coordinates: 'nonsense' } as unknown as Polygon;
		const empty: Polygon = { type: 'Polygon', coordinates: [] };
		const p = projectLanes([withHole, broken, null, multi, empty], 3, { x: 0, y: 0 });
		expect(p.count).toBe(2);
		expect([...p.source.slice(0, 2)]).toEqual([0, 3]);
		expect([...p.laneRing.slice(0, 3)]).toEqual([0, 2, 4]);
		expect(p.points.length).toBe(4 * 5 * 2);
	});

	it('matches a point to the lane under it, a hole to none', () => {
		const withHole: Polygon = { type: 'Polygon', coordinates: [square(0, 0, 1).coordinates[0], square(0.25, 0.25, 0.5).coordinates[0]] };
		const p = projectLanes([withHole, square(2, 0, 1)], 8, { x: 0, y: 0 });
		const pixel = (lng: number, lat: number) => leafletPixel(lng, lat, 8);
		expect(laneAt(p, ...pixel(0.1, 0.1))).toBe(0);
		expect(laneAt(p, ...pixel(0.5, 0.5))).toBe(-1);
		expect(laneAt(p, ...pixel(2.5, 0.5))).toBe(1);
		expect(laneAt(p, ...pixel(1.5, 0.5))).toBe(-1);
	});
});
