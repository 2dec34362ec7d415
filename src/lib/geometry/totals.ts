import type { CropTotals, Lane } from './types';

/**
 * Sets each lane's `borderRows`: one for each side where the next band across the field holds a
 * lane of a different crop. A side with no lane (field edge, or the band there has no planted
 * ground) has no neighbour. Never more than the lane's rows.
 *
 * @param lanes lanes in left-to-right order (mutated: borderRows is filled in)
 * @param slots each lane's band number across the field; neighbours differ by exactly 1
 * @example countBorderRows(lanes, [0, 1, 2])
 */
export function countBorderRows(lanes: Lane[], slots: number[]): void {
	for (let i = 0; i < lanes.length; i++) {
		let sides = 0;
		if (i > 0 && slots[i - 1] === slots[i] - 1 && lanes[i - 1].crop !== lanes[i].crop) sides++;
		if (i + 1 < lanes.length && slots[i + 1] === slots[i] + 1 && lanes[i + 1].crop !== lanes[i].crop) sides++;
		lanes[i].borderRows = Math.min(sides, lanes[i].rows);
	}
}

/**
 * Totals per crop: acres, lane count, rows, row-feet and the share of rows that are border rows.
 *
 * @param lanes the layout's lanes
 * @returns totals keyed by crop name
 * @example summariseByCrop(layout.lanes).corn.acres
 */
export function summariseByCrop(lanes: Lane[]): Record<string, CropTotals> {
	// A Map, so crop names such as "constructor" cannot collide with object internals.
	const totals = new Map<string, CropTotals & { border: number }>();
	for (const lane of lanes) {
		let t = totals.get(lane.crop);
		if (!t) totals.set(lane.crop, (t = { acres: 0, lanes: 0, rows: 0, rowFeet: 0, borderRowShare: 0, border: 0 }));
		t.acres += lane.acres;
		t.lanes += 1;
		t.rows += lane.rows;
		t.rowFeet += lane.rowFeet;
		t.border += lane.borderRows;
	}
	return Object.fromEntries(
		[...totals].map(([crop, { border, ...t }]) => [crop, { ...t, borderRowShare: t.rows > 0 ? border / t.rows : 0 }])
	);
}
