// The same ground through the years: each of this season's lanes with the yields harvested on the
// ground under it in earlier seasons. Strips shift every year, so lanes are matched by outline
// (area-weighted overlap), never by lane number.
import { area, intersect, featureCollection, feature } from '@turf/turf';
import type { MultiPolygon, Polygon } from 'geojson';

export interface GroundLane {
	laneIndex: number;
	crop: string;
	geometry: Polygon | MultiPolygon;
}

/** A past lane with its whole-lane yield as stored with that season's harvest. */
export interface PastLane extends GroundLane {
	season: number;
	bushelsPerAcre: number | null;
}

export interface PastOnGround {
	season: number;
	/** crops under this lane that season, largest share first, with their share of the lane's area */
	crops: { crop: string; share: number }[];
	/** area-weighted yield of the overlapping harvested lanes; null when none was weighed */
	bushelsPerAcre: number | null;
	/** share of this lane's area covered by weighed lanes of that season */
	weighedShare: number;
}

export interface GroundHistory {
	laneIndex: number;
	crop: string;
	seasons: PastOnGround[];
}

function overlapArea(a: Polygon | MultiPolygon, b: Polygon | MultiPolygon): number {
	const hit = intersect(featureCollection([feature(a), feature(b)]));
	return hit ? area(hit) : 0;
}

/** Bounding box of a geometry, for skipping pairs that cannot overlap. */
function bbox(g: Polygon | MultiPolygon): [number, number, number, number] {
	let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
	const rings = g.type === 'Polygon' ? [g.coordinates[0]] : g.coordinates.map((p) => p[0]);
	for (const ring of rings) for (const [x, y] of ring) {
		if (x < minX) minX = x;
		if (y < minY) minY = y;
		if (x > maxX) maxX = x;
		if (y > maxY) maxY = y;
	}
	return [minX, minY, maxX, maxY];
}

const touches = (a: number[], b: number[]) => a[0] <= b[2] && b[0] <= a[2] && a[1] <= b[3] && b[1] <= a[3];

/** For each current lane, every past season's crops and area-weighted yield on the same ground. */
export function groundHistory(current: GroundLane[], past: PastLane[]): GroundHistory[] {
	const seasons = [...new Set(past.map((p) => p.season))].sort((a, b) => b - a);
	const pastBoxes = past.map((p) => bbox(p.geometry));
	return current.map((lane) => {
		const box = bbox(lane.geometry);
		const laneArea = area(feature(lane.geometry));
		return {
			laneIndex: lane.laneIndex,
			crop: lane.crop,
			seasons: seasons.map((season) => {
				const crops = new Map<string, number>();
				let weighedArea = 0;
				let weighted = 0;
				past.forEach((p, i) => {
					if (p.season !== season || !touches(box, pastBoxes[i])) return;
					const overlap = overlapArea(lane.geometry, p.geometry);
					if (overlap <= 0) return;
					crops.set(p.crop, (crops.get(p.crop) ?? 0) + overlap);
					if (p.bushelsPerAcre != null) {
						weighedArea += overlap;
						weighted += overlap * p.bushelsPerAcre;
					}
				});
				return {
					season,
					crops: [...crops].sort((a, b) => b[1] - a[1]).map(([crop, a]) => ({ crop, share: laneArea > 0 ? a / laneArea : 0 })),
					bushelsPerAcre: weighedArea > 0 ? weighted / weighedArea : null,
					weighedShare: laneArea > 0 ? weighedArea / laneArea : 0
				};
			})
		};
	});
}
