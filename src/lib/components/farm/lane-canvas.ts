// Every lane of the farm on one canvas, drawn in one pass: thousands of polygons redraw on a
// season step without a Leaflet layer (and its bookkeeping) per lane. Outlines are projected once
// per season and zoom into typed arrays (lane-projection.ts) and traced once into one Path2D per
// fill; a pan only repaints those paths. Clicks are matched back to a lane by point-in-polygon.
import type { Feature, MultiPolygon, Polygon } from 'geojson';
import type { L } from '$lib/components/map/leaflet';
import type { Map as LeafletMap, LeafletMouseEvent } from 'leaflet';
import { laneAt, projectLanes, type ProjectedLanes } from './lane-projection';

export interface CanvasLane<P> {
	feature: Feature<Polygon | MultiPolygon, P>;
	fill: string | CanvasPattern;
}

export interface LaneCanvas<P> {
	setLanes(lanes: CanvasLane<P>[]): void;
	redraw(): void;
	remove(): void;
}

const PADDING = 0.25;

/** One Path2D per fill, each lane's rings traced into its fill's path (rings end on their first point). */
function pathsByFill<P>(lanes: CanvasLane<P>[], projected: ProjectedLanes): Map<string | CanvasPattern, Path2D> {
	const paths = new Map<string | CanvasPattern, Path2D>();
	const { points, ringStart, ringLength, laneRing, source } = projected;
	for (let k = 0; k < projected.count; k++) {
		const fill = lanes[source[k]].fill;
		let path = paths.get(fill);
		if (!path) paths.set(fill, (path = new Path2D()));
		for (let r = laneRing[k]; r < laneRing[k + 1]; r++) {
			const start = 2 * ringStart[r];
			const end = start + 2 * ringLength[r];
			if (end - start < 6) continue;
			path.moveTo(points[start], points[start + 1]);
			for (let i = start + 2; i < end; i += 2) path.lineTo(points[i], points[i + 1]);
			// GeoJSON rings repeat their first point; closing only when one does not keeps the
			// path free of an extra segment per ring.
			if (points[end - 2] !== points[start] || points[end - 1] !== points[start + 1]) path.closePath();
		}
	}
	return paths;
}

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
	let projected: ProjectedLanes = projectLanes([], 0, { x: 0, y: 0 });
	let paths = new Map<string | CanvasPattern, Path2D>();

	const project = () => {
		projected = projectLanes(lanes.map((l) => l.feature.geometry), map.getZoom(), map.getPixelOrigin());
		paths = pathsByFill(lanes, projected);
	};

	const draw = () => {
		const size = map.getSize();
		const pad = size.multiplyBy(PADDING).round();
		const origin = map.containerPointToLayerPoint([0, 0]).subtract(pad);
		const width = size.x + 2 * pad.x;
		const height = size.y + 2 * pad.y;
		const dpr = window.devicePixelRatio || 1;
		Leaflet.DomUtil.setPosition(canvas, origin);
		const w = Math.round(width * dpr);
		const h = Math.round(height * dpr);
		// Resizing a canvas reallocates it: only when the map's size changed.
		if (canvas.width !== w || canvas.height !== h) {
			canvas.width = w;
			canvas.height = h;
			canvas.style.width = `${width}px`;
			canvas.style.height = `${height}px`;
		}
		ctx.setTransform(1, 0, 0, 1, 0, 0);
		ctx.clearRect(0, 0, w, h);
		ctx.setTransform(dpr, 0, 0, dpr, -origin.x * dpr, -origin.y * dpr);
		// Each fill's path filled, then its edges stroked: a few canvas calls, whatever the lane count.
		ctx.strokeStyle = 'rgba(255, 255, 255, 0.9)';
		ctx.lineWidth = 0.5;
		for (const [fill, path] of paths) {
			ctx.globalAlpha = 0.85;
			ctx.fillStyle = fill;
			ctx.fill(path, 'evenodd');
			ctx.globalAlpha = 1;
			ctx.stroke(path);
		}
	};

	const click = (e: LeafletMouseEvent) => {
		const k = laneAt(projected, e.layerPoint.x, e.layerPoint.y);
		if (k >= 0) onclick(lanes[projected.source[k]]);
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
