// Whole-farm totals for a season, summed from each field's stored lanes and plan totals. Pure.
import type { LaneKind } from '../geometry/index';

export interface CropAcres {
	acres: number;
	lanes: number;
}

/** One group of stored lanes of one field: all lanes of one crop and kind. */
export interface LaneGroup {
	fieldId: string;
	crop: string;
	kind: LaneKind;
	acres: number;
	lanes: number;
}

export const LANE_KINDS: readonly LaneKind[] = ['crop', 'pasture', 'cover', 'buffer'];

function byKey<T>(map: Map<string, T>): Record<string, T> {
	return Object.fromEntries([...map].sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)));
}

/**
 * Acres and lane counts per crop over lane groups (all of one field, or of the farm).
 * Keys are crop names as stored; a Map keeps names like "constructor" harmless.
 * @example cropTotals([{ fieldId, crop: 'corn', kind: 'crop', acres: 40, lanes: 16 }]).corn // { acres: 40, lanes: 16 }
 */
export function cropTotals(groups: readonly Pick<LaneGroup, 'crop' | 'acres' | 'lanes'>[]): Record<string, CropAcres> {
	const totals = new Map<string, CropAcres>();
	for (const g of groups) {
		const t = totals.get(g.crop) ?? { acres: 0, lanes: 0 };
		t.acres += g.acres;
		t.lanes += g.lanes;
		totals.set(g.crop, t);
	}
	return byKey(totals);
}

/** Sums several fields' crop totals into one. */
export function sumCropTotals(list: readonly Record<string, CropAcres>[]): Record<string, CropAcres> {
	return cropTotals(list.flatMap((byCrop) => Object.entries(byCrop).map(([crop, t]) => ({ crop, ...t }))));
}

/** Lanes and acres per lane kind; every kind is listed, zero when absent. */
export function kindTotals(groups: readonly Pick<LaneGroup, 'kind' | 'acres' | 'lanes'>[]): Record<LaneKind, CropAcres> {
	const totals = Object.fromEntries(LANE_KINDS.map((k) => [k, { acres: 0, lanes: 0 }])) as Record<LaneKind, CropAcres>;
	for (const g of groups) {
		const t = totals[g.kind];
		if (!t) continue;
		t.acres += g.acres;
		t.lanes += g.lanes;
	}
	return totals;
}

export interface CropChange {
	crop: string;
	acres: number;
	previousAcres: number;
	/** acres − previousAcres */
	change: number;
	lanes: number;
	previousLanes: number;
}

/**
 * What changed per crop from the season before: every crop grown in either season, sorted by
 * name. A crop gone this season shows 0 acres and a negative change.
 */
export function cropChange(current: Record<string, CropAcres>, previous: Record<string, CropAcres>): CropChange[] {
	const crops = [...new Set([...Object.keys(current), ...Object.keys(previous)])].sort();
	return crops.map((crop) => {
		const now = Object.hasOwn(current, crop) ? current[crop] : { acres: 0, lanes: 0 };
		const then = Object.hasOwn(previous, crop) ? previous[crop] : { acres: 0, lanes: 0 };
		return { crop, acres: now.acres, previousAcres: then.acres, change: now.acres - then.acres, lanes: now.lanes, previousLanes: then.lanes };
	});
}
