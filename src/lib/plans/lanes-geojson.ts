// Lanes as an RFC 7946 FeatureCollection for guidance displays and other tools, outlines to 1 cm. Pure.
import type { Feature, FeatureCollection, LineString, MultiPolygon, Polygon } from 'geojson';
import type { Lane, LngLat } from '../geometry/index';
import type { LaneAssignment } from './types';
import { roundGeometry } from './coordinates';

interface PlanLike {
	season: number;
	variant: string;
	guidance: { a: LngLat; b: LngLat };
	lanes: (Lane & { assignment: LaneAssignment | null })[];
}

const round = (n: number, d: number) => Math.round(n * 10 ** d) / 10 ** d;

export function lanesFeatureCollection(fieldName: string, plan: PlanLike): FeatureCollection<Polygon | MultiPolygon | LineString> {
	const lanes: Feature<Polygon | MultiPolygon>[] = plan.lanes.map((l) => ({
		type: 'Feature',
		id: `lane-${l.index + 1}`,
		geometry: roundGeometry(l.geometry),
		properties: {
			feature: 'lane',
			field: fieldName,
			season: plan.season,
			variant: plan.variant,
			lane: l.index + 1,
			patternLane: l.patternIndex + 1,
			kind: l.kind,
			crop: l.crop,
			widthFt: round(l.widthFt, 4),
			rows: l.rows,
			offsetFt: round(l.offsetFt, 4),
			acres: round(l.acres, 4),
			rowFeet: round(l.rowFeet, 1),
			borderRows: l.borderRows,
			variety: l.assignment?.variety ?? null,
			populationPerAcre: l.assignment?.populationPerAcre ?? null,
			seedLot: l.assignment?.seedLot ?? null,
			trialLabel: l.assignment?.trialLabel ?? null
		}
	}));
	const ab: Feature<LineString> = {
		type: 'Feature',
		id: 'ab-line',
		geometry: { type: 'LineString', coordinates: [plan.guidance.a, plan.guidance.b] },
		properties: { feature: 'ab-line', field: fieldName, season: plan.season }
	};
	return { type: 'FeatureCollection', features: [ab, ...lanes] };
}
