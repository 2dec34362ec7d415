// Leaflet touches window at import time: load it only in the browser, once.
import type * as Leaflet from 'leaflet';

export type L = typeof Leaflet;
let loading: Promise<L> | undefined;

export function loadLeaflet(withDrawing = false): Promise<L> {
	loading ??= (async () => {
		const L = (await import('leaflet')).default;
		(window as unknown as { L: L }).L = L;
		return L;
	})();
	return withDrawing ? loading.then(async (L) => (await import('@geoman-io/leaflet-geoman-free'), L)) : loading;
}

export interface MapSettings {
	tileUrl: string | null;
	attribution: string;
}

/** A map with our base layer (or a plain background when no tiles are set) and a scale bar. */
export function createBaseMap(L: L, element: HTMLElement, settings: MapSettings) {
	const map = L.map(element, { zoomSnap: 0.25, maxZoom: 21, tapTolerance: 20 });
	if (settings.tileUrl) {
		L.tileLayer(settings.tileUrl, { maxZoom: 21, maxNativeZoom: 19, attribution: settings.attribution }).addTo(map);
	}
	L.control.scale({ imperial: true, metric: true, maxWidth: 160 }).addTo(map);
	return map;
}

/** One colour per field, from a fixed set picked for contrast against the grid background. */
export const FIELD_COLORS = ['#1a2634', '#8a4b08', '#1d4e89', '#7a1f5c', '#4d5d0f', '#7c2d12'];

/**
 * Creates the map once Leaflet has loaded and removes it when the component goes away (returns
 * the cleanup for onMount). `setup` draws the component's own layers.
 */
export function mountMap(element: HTMLElement, settings: MapSettings, setup: (L: L, map: import('leaflet').Map) => void, withDrawing = false): () => void {
	let map: import('leaflet').Map | undefined;
	let destroyed = false;
	loadLeaflet(withDrawing).then((L) => {
		if (destroyed) return;
		map = createBaseMap(L, element, settings);
		setup(L, map);
	});
	return () => {
		destroyed = true;
		map?.remove();
	};
}
