import type { MultiPolygon, Polygon } from 'geojson';

export type { MultiPolygon, Polygon } from 'geojson';

/** A GeoJSON position: [longitude, latitude] in degrees on WGS84 (RFC 7946). */
export type LngLat = [number, number];

export type LaneKind = 'crop' | 'pasture' | 'cover' | 'buffer';

/** One lane of the repeating pattern. */
export interface LaneSpec {
	kind: LaneKind;
	crop: string;
	/** Number of rows; a twin pair counts as one row. */
	rows?: number;
	/** Centre-to-centre spacing of rows (or of twin pairs), inches. */
	rowSpacingIn?: number;
	/** Distance between the two rows of a twin pair, inches. */
	twinSpacingIn?: number;
	/** Lane width in feet; required for lanes without rows, overrides rows × spacing otherwise. */
	widthFt?: number;
}

export interface LayoutInput {
	boundary: Polygon | MultiPolygon;
	exclusions?: (Polygon | MultiPolygon)[];
	guidance: { a: LngLat; b: LngLat };
	pattern: LaneSpec[];
	offsetFt?: number;
	headlandFt?: number;
}

export interface Lane {
	/** 0, 1, 2 … left to right across the field, as seen looking from A to B. */
	index: number;
	/** Position of this lane's spec in the input pattern. */
	patternIndex: number;
	kind: LaneKind;
	crop: string;
	widthFt: number;
	rows: number;
	/** Signed distance of the lane's left edge to the right of A→B, feet. */
	offsetFt: number;
	geometry: Polygon | MultiPolygon;
	/** Ellipsoidal (WGS84) area. */
	acres: number;
	/** rows × lane length along the rows, feet (length = lane area ÷ lane width). */
	rowFeet: number;
	/** Rows standing next to a lane of a different crop: 0, 1 or 2 (never more than rows). */
	borderRows: number;
	/**
	 * Open width between neighbouring rows (or twin pairs) left for interseeding a cover, inches:
	 * rowSpacingIn − twinSpacingIn for twin rows, rowSpacingIn for single rows.
	 * Absent for lanes without row spacing.
	 */
	openMiddleIn?: number;
}

export interface CropTotals {
	acres: number;
	lanes: number;
	rows: number;
	rowFeet: number;
	/** Border rows ÷ rows (0 when the crop has no rows). */
	borderRowShare: number;
}

export interface Layout {
	lanes: Lane[];
	fieldAcres: number;
	plantedAcres: number;
	headlandAcres: number;
	excludedAcres: number;
	byCrop: Record<string, CropTotals>;
}
