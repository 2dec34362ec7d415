// Every lane of the farm on one canvas, drawn in one pass: thousands of polygons redraw on a
// season step without a Leaflet layer (and its bookkeeping) per lane. Clicks are matched back to
// a lane by point-in-polygon on the projected outlines.
import type { Feature, MultiPolygon, Polygon, Position } from 'geojson';
import type { L } from '$lib/components/map/leaflet';
import type { Map as LeafletMap, LeafletMouseEvent } from 'leaflet';

export interface CanvasLane<P> {
	feature: Feature<Polygon | MultiPolygon, P>;
	fill: string | CanvasPattern;
}

interface Projected<P> {
	lane: CanvasLane<P>;
	/** Rings in layer pixels, flat [x0, y0, x1, y1, …]; holes follow their outer ring. */
	rings: Float64Array[];
	box: [number, number, number, number];
}

export interface LaneCanvas<P> {
	setLanes(lanes: CanvasLane<P>[]): void;
	redraw(): void;
	remove(): void;
}

const PADDING = 0.25;

/**
 * Adds a lane canvas to the map, in a pane of its own under the other overlays.
 * @param onclick called with the lane under a click, if any
 */
export function addLaneCanvas<P>(Leaflet: L, map: LeafletMap, onclick: (lane: CanvasLane<P>) => void): LaneCanvas<P> {
	const pane = map.getPane('farm-lanes') ?? map.createPane('farm-lanes');
	pane.style.zIndex = '390';
	pane.style.pointerEvents = 'none';
	const canvas = Leaflet.DomUtil.create('canvas', 'leaflet-zoom-hide', pane) as HTMLCanvasElement;
	const ctx = canvas.getContext('2d')!;
	let lanes: CanvasLane<P>[] = [];
	let projected: Projected<P>[] = [];
	let origin = Leaflet.point(0, 0);

	// Web Mercator to layer pixels by hand (what map.latLngToLayerPoint does, without two objects
	// per point): the numbers Leaflet's EPSG:3857 gives, to well under a pixel.
	const project = () => {
		const scale = 256 * 2 ** map.getZoom();
		const pixelOrigin = map.getPixelOrigin();
		const maxLat = 85.0511287798;
		const d2r = Math.PI / 180;
		projected = [];
		for (const lane of lanes) {
			const g = lane.feature.geometry;
			// A stored outline that is not a polygon is left off the map rather than stopping it.
			if (!g || (g.type !== 'Polygon' && g.type !== 'MultiPolygon') || !Array.isArray(g.coordinates)) continue;
			const polys: Position[][][] = g.type === 'Polygon' ? [g.coordinates] : g.coordinates;
			const rings: Float64Array[] = [];
			const box: [number, number, number, number] = [Infinity, Infinity, -Infinity, -Infinity];
			for (const poly of polys) {
				if (!Array.isArray(poly)) continue;
				for (const ring of poly) {
					if (!Array.isArray(ring)) continue;
					const flat = new Float64Array(ring.length * 2);
					for (let i = 0; i < ring.length; i++) {
						if (!Array.isArray(ring[i])) continue;
						const lat = Math.max(Math.min(maxLat, ring[i][1]), -maxLat);
						const sin = Math.sin(lat * d2r);
						const x = scale * (0.5 + ring[i][0] / 360) - pixelOrigin.x;
						const y = scale * (0.5 - Math.log((1 + sin) / (1 - sin)) / (4 * Math.PI)) - pixelOrigin.y;
						flat[2 * i] = x;
						flat[2 * i + 1] = y;
						if (x < box[0]) box[0] = x;
						if (y < box[1]) box[1] = y;
						if (x > box[2]) box[2] = x;
						if (y > box[3]) box[3] = y;
					}
					rings.push(flat);
				}
			}
			if (Number.isFinite(box[0]) && Number.isFinite(box[3])) projected.push({ lane, rings, box });
		}
	};

	const draw = () => {
		const size = map.getSize();
		const pad = size.multiplyBy(PADDING).round();
		origin = map.containerPointToLayerPoint([0, 0]).subtract(pad);
		const width = size.x + 2 * pad.x;
		const height = size.y + 2 * pad.y;
		const dpr = window.devicePixelRatio || 1;
		Leaflet.DomUtil.setPosition(canvas, origin);
		canvas.width = Math.round(width * dpr);
		canvas.height = Math.round(height * dpr);
		canvas.style.width = `${width}px`;
		canvas.style.height = `${height}px`;
		ctx.setTransform(dpr, 0, 0, dpr, -origin.x * dpr, -origin.y * dpr);
		ctx.clearRect(origin.x, origin.y, width, height);
		// One path per fill: a few canvas calls, whatever the lane count.
		const byFill = new Map<string | CanvasPattern, Projected<P>[]>();
		const right = origin.x + width;
		const bottom = origin.y + height;
		for (const p of projected) {
			if (p.box[2] < origin.x || p.box[0] > right || p.box[3] < origin.y || p.box[1] > bottom) continue;
			const list = byFill.get(p.lane.fill) ?? [];
			list.push(p);
			byFill.set(p.lane.fill, list);
		}
		const trace = (p: Projected<P>) => {
			for (const r of p.rings) {
				ctx.moveTo(r[0], r[1]);
				for (let i = 2; i < r.length; i += 2) ctx.lineTo(r[i], r[i + 1]);
				ctx.closePath();
			}
		};
		// Each fill's path traced once, filled, then its edges stroked.
		ctx.strokeStyle = 'rgba(255, 255, 255, 0.9)';
		ctx.lineWidth = 0.5;
		for (const [fill, list] of byFill) {
			ctx.beginPath();
			for (const p of list) trace(p);
			ctx.globalAlpha = 0.85;
			ctx.fillStyle = fill;
			ctx.fill('evenodd');
			ctx.globalAlpha = 1;
			ctx.stroke();
		}
	};

	const inside = (p: Projected<P>, x: number, y: number) => {
		let hit = false;
		for (const r of p.rings) {
			for (let i = 0, j = r.length - 2; i < r.length; j = i, i += 2) {
				const xi = r[i], yi = r[i + 1], xj = r[j], yj = r[j + 1];
				if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) hit = !hit;
			}
		}
		return hit;
	};

	const click = (e: LeafletMouseEvent) => {
		const { x, y } = e.layerPoint;
		for (const p of projected) {
			if (x < p.box[0] || x > p.box[2] || y < p.box[1] || y > p.box[3]) continue;
			if (inside(p, x, y)) return onclick(p.lane);
		}
	};
	const reproject = () => {
		project();
		draw();
	};
	const hide = () => (canvas.style.visibility = 'hidden');
	const show = () => {
		canvas.style.visibility = '';
		reproject();
	};
	map.on('moveend', draw);
	map.on('zoomstart', hide);
	map.on('zoomend viewreset', show);
	map.on('resize', draw);
	map.on('click', click);

	return {
		setLanes(next) {
			lanes = next;
			reproject();
		},
		redraw: draw,
		remove() {
			map.off('moveend', draw);
			map.off('zoomstart', hide);
			map.off('zoomend viewreset', show);
			map.off('resize', draw);
			map.off('click', click);
			canvas.remove();
		}
	};
}
