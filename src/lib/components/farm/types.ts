import type { MultiPolygon, Polygon } from 'geojson';

/** A field as the farm map outlines it (current outline, whatever the season). */
export interface OutlineField {
	id: string;
	name: string;
	acres: number;
	boundary: Polygon | MultiPolygon;
}
