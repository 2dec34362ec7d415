import proj4 from 'proj4';
import type { Position } from 'geojson';

/** Planar point in metres. */
export type XY = [number, number];

export interface LocalProjection {
	forward(p: Position): XY;
	inverse(p: XY): [number, number];
}

/**
 * Transverse Mercator on WGS84 centred on (lng0, lat0), scale 1 on the central meridian. Within a
 * few kilometres of the centre the scale error is under (x/R)²/2 ≈ 1e-7 (0.1 mm per km), so straight
 * parallel lines here are true ground offsets and planar areas are true to ~2e-7.
 * proj4's `tmerc` is the Poder/Engsager extended series, accurate to well under a millimetre.
 *
 * @param lng0 centre longitude, degrees
 * @param lat0 centre latitude, degrees
 * @returns forward ([lng, lat] → metres) and inverse converters
 * @example const p = localProjection(-93.6, 44); p.forward([-93.6, 44]) // [0, 0]
 */
export function localProjection(lng0: number, lat0: number): LocalProjection {
	const def = `+proj=tmerc +lat_0=${lat0} +lon_0=${lng0} +k=1 +x_0=0 +y_0=0 +ellps=WGS84 +units=m +no_defs`;
	const converter = proj4('WGS84', def);
	return {
		forward: (p) => converter.forward([p[0], p[1]]) as XY,
		inverse: (p) => converter.inverse([p[0], p[1]]) as [number, number]
	};
}

/**
 * Frame of the A-B line in the local plane: `s` is the signed distance to the right of A→B, `t` the
 * distance along A→B from A. Lanes are bands of constant `s`.
 */
export interface GuidanceFrame {
	toST(p: XY): XY;
	fromST(p: XY): XY;
}

/**
 * @param a A in the local plane, metres
 * @param b B in the local plane, metres
 * @returns converters between the plane and (s, t)
 * @example guidanceFrame([0, 0], [0, 100]).toST([5, 10]) // [5, 10]: 5 m right of a line heading north
 */
export function guidanceFrame(a: XY, b: XY): GuidanceFrame {
	const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
	const ux = (b[0] - a[0]) / len;
	const uy = (b[1] - a[1]) / len;
	// Right-hand normal of the heading (ux, uy).
	const nx = uy;
	const ny = -ux;
	return {
		toST: ([x, y]) => {
			const dx = x - a[0];
			const dy = y - a[1];
			return [dx * nx + dy * ny, dx * ux + dy * uy];
		},
		fromST: ([s, t]) => [a[0] + s * nx + t * ux, a[1] + s * ny + t * uy]
	};
}
